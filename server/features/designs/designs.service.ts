import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { designBodySchema, designPatchSchema } from '../../../shared/schemas/fleet.js';
import type { DesignDetail, DesignListItem, DesignView } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { Unit } from '../units/unit.entity.js';
import { Design } from './design.entity.js';

export function designView(d: Design) {
  return {
    id: d.id,
    reference: d.reference,
    maker: d.maker,
    windings: d.windings,
    vectorGroup: d.vectorGroup,
    phases: d.phases,
    hvKV: d.hvKV,
    lvKV: d.lvKV,
    tvKV: d.tvKV,
    coolingStages: d.coolingStages,
    impedancePercent: d.impedancePercent,
    impedanceBaseKVA: d.impedanceBaseKVA,
    conductor: d.conductor,
    requiredCapacitance: d.requiredCapacitance,
    notes: d.notes,
  } satisfies DesignView;
}

/** Every design with its number of units. */
export async function listDesigns(m: EntityManager) {
  const designs = await m.getRepository(Design).find({ order: { reference: 'ASC' } });
  const counts: { designId: number; n: number }[] = await m.query('SELECT designId, COUNT(*) AS n FROM `unit` GROUP BY designId');
  const byId = new Map(counts.map((c) => [Number(c.designId), Number(c.n)]));
  return designs.map((d) => ({ ...designView(d), unitCount: byId.get(d.id) ?? 0 }) satisfies DesignListItem);
}

/** One design with its units (the sister family). */
export async function getDesign(m: EntityManager, id: number) {
  const d = await m.getRepository(Design).findOne({ where: { id } });
  if (!d) throw notFound('Design');
  const units = await m.getRepository(Unit).find({ where: { designId: id }, relations: { site: true }, order: { serial: 'ASC' } });
  return {
    ...designView(d),
    units: units.map((u) => ({ id: u.id, serial: u.serial, position: u.position, siteId: u.siteId, siteName: u.site.name, year: u.year, lastRecommendation: u.lastRecommendation })),
  } satisfies DesignDetail;
}

async function assertReferenceFree(m: EntityManager, reference: string, exceptId?: number) {
  const other = await m.getRepository(Design).findOne({ where: { reference } });
  if (other && other.id !== exceptId) throw new AppError('reference_taken', 'A design with this reference exists.', 409, { reference: 'already in use' });
}

/** Creates a design family (audited). */
export async function createDesign(m: EntityManager, clock: Clock, userId: number, body: z.infer<typeof designBodySchema>) {
  await assertReferenceFree(m, body.reference);
  const d = await m.getRepository(Design).save(m.getRepository(Design).create({ ...body, tvKV: body.tvKV ?? null, notes: body.notes ?? null, createdAt: clock.now(), updatedAt: clock.now() }));
  await audit(m, clock, { userId, action: 'create', entity: 'design', entityId: d.id, after: designView(d) });
  return designView(d);
}

/** Changes a design (audited with before and after). */
export async function updateDesign(m: EntityManager, clock: Clock, userId: number, id: number, patch: z.infer<typeof designPatchSchema>) {
  const d = await m.getRepository(Design).findOne({ where: { id } });
  if (!d) throw notFound('Design');
  const before = designView(d);
  if (patch.reference !== undefined) await assertReferenceFree(m, patch.reference, id);
  Object.assign(d, patch, { updatedAt: clock.now() });
  await m.getRepository(Design).save(d);
  await audit(m, clock, { userId, action: 'update', entity: 'design', entityId: id, before, after: designView(d) });
  return designView(d);
}
