import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { z } from 'zod';
import { criteriaSchema, type Criteria } from '../../../shared/screening/criteria.js';
import { criteriaPath, diffCriteria } from '../../../shared/screening/criteria-diff.js';
import type { CriteriaSetView } from '../../../shared/schemas/responses/index.js';
import { AppError, conflict, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { User } from '../users/user.entity.js';
import { CriteriaSet } from './criteria-set.entity.js';
import type { criteriaDraftBodySchema, criteriaPatchBodySchema } from './criteria.router.js';

/** A criteria set by version (default: the newest published one), validated before the engine sees it. */
export async function loadCriteria(m: EntityManager, version?: number): Promise<{ version: number; status: 'draft' | 'published'; criteria: Criteria }> {
  const repo = m.getRepository(CriteriaSet);
  const row = version
    ? await repo.findOne({ where: { version } })
    : await repo.findOne({ where: { status: 'published' }, order: { version: 'DESC' } });
  if (!row) throw new AppError('invalid_input', 'Some fields are invalid.', 400, { criteriaVersion: version ? `no criteria set version ${version}` : 'no published criteria set' });
  const parsed = criteriaSchema.safeParse(row.thresholds);
  if (!parsed.success) throw new AppError('invalid_criteria', `Criteria set version ${row.version} does not validate; fix it before screening.`, 409);
  return { version: row.version, status: row.status, criteria: parsed.data };
}

function view(row: CriteriaSet, names: Map<number, string>): CriteriaSetView {
  const thresholds = row.thresholds as unknown as Criteria;
  return {
    id: row.id,
    version: row.version,
    status: row.status,
    name: typeof thresholds.name === 'string' ? thresholds.name : `Criteria set ${row.version}`,
    notes: row.notes,
    createdById: row.createdById,
    createdByName: row.createdById === null ? null : (names.get(row.createdById) ?? null),
    createdAt: row.createdAt.toISOString(),
    publishedAt: row.publishedAt ? row.publishedAt.toISOString() : null,
    thresholds,
  } satisfies CriteriaSetView;
}

async function namesOf(m: EntityManager, rows: CriteriaSet[]): Promise<Map<number, string>> {
  const ids = [...new Set(rows.map((r) => r.createdById).filter((id): id is number => id !== null))];
  if (!ids.length) return new Map();
  const users = await m.getRepository(User).find({ where: { id: In(ids) }, select: { id: true, name: true } });
  return new Map(users.map((u) => [u.id, u.name]));
}

async function rowOf(m: EntityManager, version: number, lock = false): Promise<CriteriaSet> {
  const row = await m.getRepository(CriteriaSet).findOne({ where: { version }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!row) throw notFound(`Criteria set version ${version}`);
  return row;
}

/** Every version, newest first. */
export async function listCriteriaSets(m: EntityManager): Promise<CriteriaSetView[]> {
  const rows = await m.getRepository(CriteriaSet).find({ order: { version: 'DESC' } });
  const names = await namesOf(m, rows);
  return rows.map((r) => view(r, names));
}

/** One version. */
export async function getCriteriaSet(m: EntityManager, version: number): Promise<CriteriaSetView> {
  const row = await rowOf(m, version);
  return view(row, await namesOf(m, [row]));
}

/** Thresholds checked against the schema; a 400 names each bad leaf as `thresholds.capacitance.shiftBands[1].from`. */
function validThresholds(value: unknown, version: number): Criteria {
  const r = criteriaSchema.safeParse(value);
  if (!r.success) {
    const fields: Record<string, string> = {};
    for (const issue of r.error.issues) {
      const key = criteriaPath(['thresholds', ...issue.path.map((p) => (typeof p === 'number' ? p : String(p)))]);
      if (!fields[key]) fields[key] = issue.message;
    }
    throw new AppError('invalid_input', 'Some thresholds are invalid.', 400, fields);
  }
  if (r.data.version !== version) throw new AppError('invalid_input', 'Some thresholds are invalid.', 400, { 'thresholds.version': `must be ${version}, this set's version` });
  return r.data;
}

/** A new draft copied from a version: the next version number, its thresholds' version set to it (audited). */
export async function createDraft(m: EntityManager, clock: Clock, userId: number, body: z.infer<typeof criteriaDraftBodySchema>): Promise<CriteriaSetView> {
  const repo = m.getRepository(CriteriaSet);
  const from = await repo.findOne({ where: { version: body.fromVersion } });
  if (!from) throw new AppError('invalid_input', 'Some fields are invalid.', 400, { fromVersion: `no criteria set version ${body.fromVersion}` });
  const last = await repo.find({ order: { version: 'DESC' }, take: 1, lock: { mode: 'pessimistic_write' } });
  const version = (last[0]?.version ?? 0) + 1;
  const copy = structuredClone(from.thresholds) as Record<string, unknown>;
  copy.version = version;
  copy.name = body.name ?? `Draft from criteria set ${from.version}`;
  const row = await repo
    .save(repo.create({ version, status: 'draft', thresholds: copy, notes: body.notes ?? null, createdById: userId, publishedAt: null, createdAt: clock.now() }))
    .catch((e: unknown) => {
      // Two drafts started at the same moment both took the next number: the unique version refuses the second.
      if ((e as { driverError?: { code?: string } }).driverError?.code === 'ER_DUP_ENTRY') throw conflict(`Version ${version} was created at the same moment; draft again.`);
      throw e;
    });
  await audit(m, clock, { userId, action: 'create', entity: 'criteria_set', entityId: row.id, after: { version, fromVersion: from.version, name: copy.name, notes: row.notes } });
  return view(row, await namesOf(m, [row]));
}

const PUBLISHED = (v: number) => `Criteria set version ${v} is published and can no longer change; draft a new version from it instead.`;

/** Replaces a draft's thresholds, name or notes (409 on a published version; audited with the leaves that changed). */
export async function patchDraft(m: EntityManager, clock: Clock, userId: number, version: number, body: z.infer<typeof criteriaPatchBodySchema>): Promise<CriteriaSetView> {
  const row = await rowOf(m, version, true);
  if (row.status === 'published') throw conflict(PUBLISHED(version));
  const before = { thresholds: row.thresholds, notes: row.notes };
  let thresholds: Record<string, unknown> = body.thresholds === undefined ? row.thresholds : validThresholds(body.thresholds, version);
  if (body.name !== undefined) thresholds = { ...thresholds, name: body.name };
  row.thresholds = thresholds;
  if (body.notes !== undefined) row.notes = body.notes;
  await m.getRepository(CriteriaSet).save(row);
  const changes = diffCriteria(before.thresholds, row.thresholds).map((c) => ({ path: c.path, label: c.label, from: c.from, to: c.to }));
  await audit(m, clock, {
    userId,
    action: 'update',
    entity: 'criteria_set',
    entityId: row.id,
    // Only what the patch named: notes when sent, the changed threshold leaves (the name is one) when thresholds or a name were.
    before: { version, ...(body.notes !== undefined && { notes: before.notes }) },
    after: { version, ...(body.notes !== undefined && { notes: row.notes }), ...((body.thresholds !== undefined || body.name !== undefined) && { changes }) },
  });
  return view(row, await namesOf(m, [row]));
}

/** Publishes a draft after validating it again: it becomes immutable and the newest published set screens (audited). */
export async function publishCriteriaSet(m: EntityManager, clock: Clock, userId: number, version: number): Promise<CriteriaSetView> {
  const row = await rowOf(m, version, true);
  if (row.status === 'published') throw conflict(`Criteria set version ${version} is already published.`);
  validThresholds(row.thresholds, version);
  row.status = 'published';
  row.publishedAt = clock.now();
  await m.getRepository(CriteriaSet).save(row);
  await audit(m, clock, { userId, action: 'publish', entity: 'criteria_set', entityId: row.id, before: { version, status: 'draft' }, after: { version, status: 'published' } });
  return view(row, await namesOf(m, [row]));
}
