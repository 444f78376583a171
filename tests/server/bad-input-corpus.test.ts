// A bad-input corpus generated from the route table and its zod schemas: every field of every route's params, query
// and body × wrong type, out of range, too long, a lone surrogate, formula text and an unknown extra key; every upload
// route × wrong file type, empty, one byte over the limit, a mislabelled content type and no file part. Each case is
// sent as a role that may call the route, with real ids of rows made for the purpose, and must answer 4xx naming the
// field with the row count of every entity table unchanged (formula text: no 5xx and nothing deleted, as a text field
// may store it — the exports escape it). Invented values.
import { vi } from 'vitest';

// The route table keeps no schemas: record each route's spec as the routers declare it (see corpus/route-specs.ts).
vi.mock('../../server/route-def.js', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../server/route-def.js')>();
  const { recordingRoute } = await import('../helpers/corpus/route-specs.js');
  return { ...real, route: recordingRoute(real.route) };
});

import type { Server } from 'node:http';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/roles.js';
import { FollowUp } from '../../server/features/screenings/follow-up.entity.js';
import { Notification } from '../../server/features/notifications/notification.entity.js';
import { ReadingSet } from '../../server/features/readings/reading-set.entity.js';
import { Unit } from '../../server/features/units/unit.entity.js';
import { routeTable } from '../../server/routes.js';
import { bearer, createTestUser } from '../helpers/db.js';
import { BASES, idParams, PHOTO_PNG, RELAY_TXT, SWEEP_CSV, type Base, type CorpusIds } from '../helpers/corpus/bases.js';
import { jsonText, mutationsOf, SeenSchemas, type Carrier, type FieldMutation, type Part } from '../helpers/corpus/mutations.js';
import { countChanges, countDecreases, countRows, entityTables, type RowCounts } from '../helpers/corpus/row-counts.js';
import { routeKey, schemasOf, type RouteSchemas } from '../helpers/corpus/route-specs.js';
import { fileMutations } from '../helpers/corpus/uploads.js';
import { correctionsFlow } from './corrections/flow.js';

const f = correctionsFlow();

/**
 * Cases a field legitimately accepts (then not a bad case: sent, and only "no 5xx, nothing deleted" is asserted). Each
 * entry names the route, the field (a regular expression on `part.field`), the mutation and why.
 */
const ALLOWED: { route: string; field: RegExp; kind: string; detail: string; reason: string }[] = [
  {
    route: 'POST /screenings/:screeningId/decision',
    field: /^body\.followUps\.0\.dueAt$/,
    kind: 'out-of-range',
    detail: 'year 2099',
    reason: 'a planned date, not one of an event or a test: a follow-up may be due up to 100 years ahead (plannedDate in shared/schemas/bounds.ts); year 10000 is refused',
  },
];

/** Routes whose case runs as a fresh user: an accepted change of one's own password would end the next case's token. */
const FRESH_USER = new Set(['POST /auth/password']);

interface Case {
  route: RouteSchemas;
  key: string;
  part: Part | 'file';
  field: string;
  kind: string;
  detail: string;
  names: string[];
  expect: 'refuse' | 'no-500';
  allowed?: string;
  /** The request's input: the base with this case's change. */
  input(base: Base): Base;
}

// Ids for generating the cases (the real ones exist only once the rows are made; the cases change values, not ids).
const SHAPE_IDS = Object.fromEntries(
  ['siteId', 'designId', 'unitId', 'userId', 'eventId', 'sessionId', 'screeningId', 'readingSetId', 'sweepId', 'eventAttachmentId', 'findingId', 'findingAttachmentId', 'releasedEventId', 'followUpId', 'notificationId', 'criteriaVersion'].map((k) => [k, 1]),
) as unknown as CorpusIds;

/** A route's known-good input with its ids; its params as the path carries them. */
function baseOf(r: RouteSchemas, ids: CorpusIds): Base {
  const b = BASES[routeKey(r)]?.(ids) ?? {};
  const names = [...r.path.matchAll(/:(\w+)/g)].map((m) => m[1]!);
  const all = idParams(ids);
  const params = Object.fromEntries(names.map((n) => [n, String(b.params?.[n] ?? all[n])]));
  return { ...b, params };
}

const specs = routeTable.map((def) => schemasOf(def));
const routes = specs.filter((s): s is RouteSchemas => s !== undefined);
const takesInput = (r: RouteSchemas) => Boolean(r.params || r.query || r.body || r.upload !== undefined);

/** Nested schemas walked so far, across routes (see `firstVisit` in corpus/mutations.ts). */
const SEEN = new SeenSchemas();

function casesOf(r: RouteSchemas): Case[] {
  const key = routeKey(r);
  const shape = baseOf(r, SHAPE_IDS);
  const out: Case[] = [];
  const parts: [Part, Carrier][] = [
    ['params', 'params'],
    ['query', 'query'],
    ['body', r.upload !== undefined ? 'multipart' : 'json'],
  ];
  for (const [part, carrier] of parts) {
    const schema = r[part];
    if (!schema) continue;
    for (const m of mutationsOf(schema, shape[part], part, carrier, SEEN)) out.push(fieldCase(r, key, m));
  }
  if (r.upload !== undefined && shape.file) {
    for (const m of fileMutations(shape.file, r.upload)) {
      out.push({ route: r, key, part: 'file', field: 'file', kind: m.kind, detail: m.detail, names: ['file'], expect: 'refuse', input: (b) => ({ ...b, file: m.file() }) });
    }
  }
  for (const c of out) {
    const allow = ALLOWED.find((a) => a.route === key && a.kind === c.kind && a.detail === c.detail && a.field.test(`${c.part}.${c.field}`));
    if (allow) Object.assign(c, { expect: 'no-500', allowed: allow.reason });
  }
  // Refusals first: a formula text that is stored (a decision signed, a session added) changes what the route answers
  // to the cases after it.
  return [...out.filter((c) => c.expect === 'refuse'), ...out.filter((c) => c.expect !== 'refuse')];
}

function fieldCase(r: RouteSchemas, key: string, m: FieldMutation): Case {
  return { route: r, key, part: m.part, field: m.field, kind: m.kind, detail: m.detail, names: m.names, expect: m.expect, input: (b) => ({ ...b, [m.part]: m.apply(b[m.part]) }) };
}

const CASES = routes.filter(takesInput).flatMap(casesOf);

/** The role a route is sent as: one its access lets in. */
function roleFor(r: RouteSchemas): Role | null {
  if (r.access === 'public') return null;
  if (r.access === 'signed-in') return 'tester';
  return r.access[0]!;
}

/** A query string with repeated keys for lists (`a=1&a=2`, as a browser sends them). */
function queryString(q: Record<string, unknown> | undefined): string {
  if (!q) return '';
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) for (const x of Array.isArray(v) ? v : [v]) if (x !== undefined) p.append(k, String(x));
  const s = p.toString();
  return s ? `?${s}` : '';
}

async function send(c: Case, ids: CorpusIds, auth?: { Authorization: string }) {
  const r = c.route;
  const input = c.input(baseOf(r, ids));
  const url = '/api' + r.path.replace(/:(\w+)/g, (_, n: string) => encodeURIComponent(String(input.params?.[n]))) + queryString(input.query);
  let req = api()[r.method](url);
  const role = roleFor(r);
  if (auth) req = req.set(auth);
  else if (role) req = req.set(f.as[role as keyof typeof f.as]);
  if (r.upload !== undefined) {
    for (const [k, v] of Object.entries(input.body ?? {})) for (const x of Array.isArray(v) ? v : [v]) if (x !== undefined) req = req.field(k, String(x));
    if (input.file) req = req.attach('file', input.file.bytes, { filename: input.file.name, contentType: input.file.type });
    else if (!input.body || !Object.keys(input.body).length) req = req.field('file', '');
    return req;
  }
  return input.body === undefined ? req : req.set('Content-Type', 'application/json').send(jsonText(input.body));
}

/**
 * Whether an error answer names the field: a `fields` key with that segment, or (names of three characters or more) a
 * message with it as a word.
 */
function namesField(body: { error?: { message?: string; fields?: Record<string, string> } }, names: string[]): boolean {
  const e = body?.error;
  if (!e) return false;
  const keys = Object.keys(e.fields ?? {});
  const texts = [e.message, ...Object.values(e.fields ?? {})].map(String);
  const word = (name: string) => new RegExp(`(^|[^A-Za-z0-9_])${name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}($|[^A-Za-z0-9_])`);
  return names.some((name) => keys.some((k) => k === name || k.split('.').includes(name)) || (name.length >= 3 && texts.some((t) => word(name).test(t))));
}

let ids: CorpusIds;
let tables: string[];
/** Row counts of every entity table after the last write the corpus made or watched. */
let counts: RowCounts;
/** One listening server for every case (supertest would start and stop one per request). */
let server: Server;
const api = () => request(server);
const outcomes: { key: string; c: Case; status: number; problems: string[] }[] = [];

beforeAll(async () => {
  const db = f.env.db;
  const a = await f.event();
  const screening = await f.screen(a.eventId);
  const unit = await db.getRepository(Unit).findOneByOrFail({ id: a.unitId });
  const factorySet = await db.getRepository(ReadingSet).findOneByOrFail({ unitId: a.unitId, kind: 'factory' });
  const sweep = await f.api().post(`/api/units/${a.unitId}/sweeps`).set(f.as.tester).field('label', 'HV open circuit A').field('testType', 'open-circuit').field('readingSetId', String(factorySet.id)).attach('file', SWEEP_CSV.bytes, { filename: SWEEP_CSV.name, contentType: SWEEP_CSV.type }).expect(201);
  const relay = await f.api().post(`/api/events/${a.eventId}/attachments`).set(f.as.protection).attach('file', RELAY_TXT.bytes, { filename: RELAY_TXT.name, contentType: RELAY_TXT.type }).expect(201);
  const b = await f.event();
  await f.decide(b.eventId, { outcome: 'release-with-restrictions', reason: 'Readings within limits after the fault', restrictions: 'Load below 80 %', followUps: [{ task: 'Oil sample', dueAt: null }] });
  const followUp = await db.getRepository(FollowUp).findOneOrFail({ where: { eventId: b.eventId }, order: { id: 'ASC' } });
  const finding = await f.api().post(`/api/events/${b.eventId}/findings`).set(f.as.engineer).send({ classification: 'no-damage', text: 'Corpus finding' }).expect(201);
  const photo = await f.api().post(`/api/findings/${finding.body.id}/attachments`).set(f.as.engineer).attach('file', PHOTO_PNG.bytes, { filename: PHOTO_PNG.name, contentType: PHOTO_PNG.type }).expect(201);
  const draft = await f.api().post('/api/criteria').set(f.as.engineer).send({ fromVersion: 2 }).expect(201);
  const notification = await db.getRepository(Notification).findOne({ where: {}, order: { id: 'DESC' } });
  ids = {
    siteId: unit.siteId,
    designId: unit.designId,
    unitId: unit.id,
    userId: (await createTestUser(db, ['tester'])).id,
    eventId: a.eventId,
    sessionId: a.sessionId,
    screeningId: screening.id,
    readingSetId: factorySet.id,
    sweepId: sweep.body.id,
    eventAttachmentId: relay.body.id,
    findingId: finding.body.id,
    findingAttachmentId: photo.body.id,
    releasedEventId: b.eventId,
    followUpId: followUp.id,
    notificationId: notification?.id ?? 1,
    criteriaVersion: draft.body.version,
  };
  tables = entityTables(db);
  counts = await countRows(db, tables);
  server = f.env.app.listen(0, '127.0.0.1');
});

afterAll(async () => {
  await new Promise((done) => server?.close(done));
  const failed = outcomes.filter((o) => o.problems.length);
  if (failed.length) {
    console.log(`\n${failed.length} of ${outcomes.length} corpus cases failed:\n` + failed.map((o) => `  ${o.key} | ${o.c.part}.${o.c.field} | ${o.c.kind} (${o.c.detail}) | ${o.status} | ${o.problems.join('; ')}`).join('\n'));
  }
});

describe('the route table and the known-good inputs', () => {
  it('every row of the route table was declared with route() and its spec recorded', () => {
    expect(specs.every(Boolean)).toBe(true);
    expect(routes.length).toBe(routeTable.length);
  });

  it('every route that takes a query, a body or a file has a known-good input, and no input is kept for a route that is gone', () => {
    const need = routes.filter((r) => r.query || r.body || r.upload !== undefined).map(routeKey);
    expect(need.filter((k) => !BASES[k])).toEqual([]);
    expect(Object.keys(BASES).filter((k) => !routes.some((r) => routeKey(r) === k))).toEqual([]);
  });

  it('every known-good input passes its route schemas (so a refusal is the mutated field’s)', () => {
    const bad: string[] = [];
    for (const r of routes.filter(takesInput)) {
      const b = baseOf(r, ids);
      for (const part of ['params', 'query', 'body'] as const) {
        const schema = r[part];
        if (!schema) continue;
        const res = schema.safeParse(b[part] ?? {});
        if (!res.success) bad.push(`${routeKey(r)} ${part}: ${res.error.issues.map((i) => `${i.path.join('.')} ${i.message}`).join(', ')}`);
      }
    }
    expect(bad).toEqual([]);
  });

  it('generates at least 300 cases, some for every route that takes input (count per route printed)', () => {
    const perRoute = new Map<string, number>();
    for (const c of CASES) perRoute.set(c.key, (perRoute.get(c.key) ?? 0) + 1);
    console.log(`\nBad-input corpus: ${CASES.length} cases over ${perRoute.size} routes\n` + [...perRoute].map(([k, n]) => `  ${String(n).padStart(4)}  ${k}`).join('\n'));
    expect(routes.filter(takesInput).map(routeKey).filter((k) => !perRoute.has(k))).toEqual([]);
    expect(CASES.length).toBeGreaterThanOrEqual(300);
  });
});

const byRoute = new Map<string, Case[]>();
for (const c of CASES) byRoute.set(c.key, [...(byRoute.get(c.key) ?? []), c]);

/**
 * Refused cases of a route go out in batches of up to BATCH at once (they write nothing, so their order does not
 * matter); the row counts are taken after each batch, and a change is reported by the batch's last case naming the
 * batch (unless a case of the batch was accepted, which fails on that already). Formula text (which may be stored) and cases that make their own user go alone, counted before and after.
 * Counting after every single case, one request at a time, takes about three times as long.
 */
const BATCH = 5;
type Answer = { status: number; body: { error?: { message?: string; fields?: Record<string, string> } } };

/** A route's cases in batches: runs of refusals, and each formula or own-user case alone. */
function batchesOf(key: string, cases: Case[]): Case[][] {
  const out: Case[][] = [];
  for (const c of cases) {
    const last = out[out.length - 1];
    const alone = c.expect !== 'refuse' || FRESH_USER.has(key);
    if (!alone && last && last.length < BATCH && last[0]!.expect === 'refuse') last.push(c);
    else out.push([c]);
  }
  return out;
}

const started = new Map<Case[], Promise<Answer[]>>();
/** The answers of a batch, its requests sent together on first ask. */
function answersOf(key: string, batch: Case[]): Promise<Answer[]> {
  let p = started.get(batch);
  if (!p) {
    p = (async () => {
      if (!FRESH_USER.has(key)) return Promise.all(batch.map((c) => send(c, ids) as unknown as Promise<Answer>));
      const auth = bearer(f.env.config, (await createTestUser(f.env.db, ['tester'])).id);
      counts = await countRows(f.env.db, tables);
      return [(await send(batch[0]!, ids, auth)) as unknown as Answer];
    })();
    started.set(batch, p);
  }
  return p;
}

/** Counts every table; the changes since the last count, as problems ("rows changed …", naming the batch). */
async function recount(what: 'changed' | 'deleted', batch: string[]): Promise<string[]> {
  const before = counts;
  counts = await countRows(f.env.db, tables);
  const diff = what === 'changed' ? countChanges(before, counts) : countDecreases(before, counts);
  const by = batch.length > 1 ? ` (by one of the ${batch.length} cases sent together: ${batch.join(' | ')})` : '';
  return diff.length ? [`rows ${what}: ${diff.join(', ')}${by}`] : [];
}

const titleOf = (c: Case) => `${c.part}${c.field ? '.' + c.field : ''} ${c.kind}: ${c.detail}${c.allowed ? ' (accepted: allow-listed)' : ''}`;

for (const [key, cases] of byRoute) {
  describe(key, () => {
    for (const batch of batchesOf(key, cases)) {
      batch.forEach((c, i) => {
        it(titleOf(c), async () => {
          const problems: string[] = [];
          if (FRESH_USER.has(key)) problems.push(...(await recount('changed', [])));
          const res = (await answersOf(key, batch))[i]!;
          const refused = res.status >= 400 && res.status < 500;
          if (res.status >= 500) problems.push(`answered ${res.status}: ${JSON.stringify(res.body).slice(0, 200)}`);
          if (c.expect === 'refuse') {
            if (res.status < 400) problems.push(`accepted (${res.status})`);
            else if (refused && !namesField(res.body, c.names)) problems.push(`${res.status} without naming "${c.names.join('" or "')}": ${JSON.stringify(res.body).slice(0, 200)}`);
            if (i === batch.length - 1) {
              // Rows written by a case of the batch that was accepted are that case's failure already ("accepted").
              const answers = await answersOf(key, batch);
              const accepted = batch.filter((_, j) => answers[j]!.status < 400 || answers[j]!.status >= 500);
              const changed = await recount('changed', batch.map(titleOf));
              if (!accepted.length || accepted.includes(c)) problems.push(...changed);
            }
          } else problems.push(...(await recount('deleted', [])));
          outcomes.push({ key, c, status: res.status, problems });
          expect(problems).toEqual([]);
        });
      });
    }
  });
}
