import request from 'supertest';
import type { EntityTarget, ObjectLiteral } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../server/common/audit-entry.entity.js';
import { CriteriaSet } from '../../server/features/criteria/criteria-set.entity.js';
import { Design } from '../../server/features/designs/design.entity.js';
import { FaultEvent } from '../../server/features/events/fault-event.entity.js';
import { Reading } from '../../server/features/readings/reading.entity.js';
import { ReadingSet } from '../../server/features/readings/reading-set.entity.js';
import { Site } from '../../server/features/sites/site.entity.js';
import { Unit } from '../../server/features/units/unit.entity.js';
import { User } from '../../server/features/users/user.entity.js';
import { routeTable } from '../../server/routes.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../helpers/db.js';
import { makeDesign, makeSite, makeUnit } from '../helpers/factories.js';

// A PATCH changes exactly the fields it is sent: for every PATCH route of the route table, a row with every optional
// field set away from its create default, a one-field PATCH, the row read back from the database (every other column
// as it was) and the audit entry naming that one field. Invented values.

let env: TestEnv;
let admin: { Authorization: string };
const api = () => request(env.app);
const uniq = () => Math.random().toString(36).slice(2, 8);

interface Fixture {
  /** Creates the row; answers the URL to PATCH and the row's id. */
  make(): Promise<{ url: string; id: number }>;
  target: EntityTarget<ObjectLiteral>;
  /** The audit trail's entity name. */
  auditEntity: string;
  /** The one-field body and the column it changes. */
  body: Record<string, unknown>;
  column: string;
  /** Keys the audit entry's `after` may hold besides the field (an identifier). */
  auditIds?: string[];
  /** Other database rows of the record that must not change (e.g. a reading set's readings). */
  children?(id: number): Promise<unknown>;
}

// Columns a write always moves (the time of the change).
const STAMPS = ['updatedAt'];

/** A unit with every optional field away from its create default. */
async function fullUnit() {
  const design = await makeDesign(env.db, { windings: 'three-winding', tvKV: 11, conductor: 'Al', requiredCapacitance: ['CHL', 'CHT'], phases: 1, notes: 'family notes' });
  return makeUnit(env.db, {
    designId: design.id,
    position: 'T7',
    year: 2001,
    phases: 1,
    hvKV: 66,
    lvKV: 11,
    ratedKVA: 20000,
    impedancePercent: 8.5,
    systemImpedancePercent: 0.7,
    conductor: 'Al',
  });
}

const readings = (id: number) => env.db.getRepository(Reading).find({ where: { readingSetId: id }, order: { id: 'ASC' } });
const fullSet = {
  takenAt: '2026-11-29T08:00:00Z',
  temperatureC: 28,
  tapPosition: '9b',
  topOilC: 31,
  bottomOilC: 27,
  ambientC: 12,
  humidityPercent: 40,
  instrument: 'M4100',
  instrumentSerial: 'SN-1',
  testKV: 10,
  testFrequencyHz: 50,
  notes: 'set notes',
  capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 },
  reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } },
};

const FIXTURES: Record<string, Fixture> = {
  '/sites/:siteId': {
    async make() {
      const s = await makeSite(env.db, { timeZone: 'Europe/Berlin', locale: 'de-DE', controlRoomEmail: 'room@example.com' });
      return { url: `/api/sites/${s.id}`, id: s.id };
    },
    target: Site,
    auditEntity: 'site',
    body: { timeZone: 'Asia/Tokyo' },
    column: 'timeZone',
  },
  '/designs/:designId': {
    async make() {
      const d = await makeDesign(env.db, { windings: 'three-winding', tvKV: 11, phases: 1, conductor: 'Al', requiredCapacitance: ['CHL', 'CHT'], notes: 'family notes' });
      return { url: `/api/designs/${d.id}`, id: d.id };
    },
    target: Design,
    auditEntity: 'design',
    body: { maker: 'Other Works' },
    column: 'maker',
  },
  '/units/:unitId': {
    async make() {
      const u = await fullUnit();
      return { url: `/api/units/${u.id}`, id: u.id };
    },
    target: Unit,
    auditEntity: 'unit',
    body: { year: 2004 },
    column: 'year',
  },
  '/users/:userId': {
    async make() {
      const site = await makeSite(env.db);
      const u = await createTestUser(env.db, ['tester', 'engineer'], { allSites: false, sites: [site] });
      return { url: `/api/users/${u.id}`, id: u.id };
    },
    target: User,
    auditEntity: 'user',
    body: { name: `Renamed ${uniq()}` },
    column: 'name',
  },
  '/events/:eventId': {
    async make() {
      const u = await fullUnit();
      const ev = await api()
        .post('/api/events')
        .set(admin)
        .send({
          unitId: u.id,
          occurredAt: '2026-11-28T03:12:00Z',
          type: 'phase-to-ground',
          side: 'hv',
          location: 'lv',
          currentIs: 'winding',
          faultedPhases: 'AN',
          shots: [{ currentKA: 1.2, durationS: 0.1 }],
          transformerTripped: false,
          protectionOperated: ['differential', 'overcurrent'],
          notes: 'event notes',
        })
        .expect(201);
      return { url: `/api/events/${ev.body.id}`, id: ev.body.id as number };
    },
    target: FaultEvent,
    auditEntity: 'fault_event',
    body: { notes: 'corrected notes' },
    column: 'notes',
  },
  '/sessions/:sessionId': {
    async make() {
      const u = await fullUnit();
      const ev = await api().post('/api/events').set(admin).send({ unitId: u.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }] }).expect(201);
      const s = await api().post(`/api/events/${ev.body.id}/sessions`).set(admin).send(fullSet).expect(201);
      return { url: `/api/sessions/${s.body.id}`, id: s.body.id as number };
    },
    target: ReadingSet,
    auditEntity: 'reading_set',
    body: { humidityPercent: 55 },
    column: 'humidityPercent',
    children: readings,
  },
  '/reading-sets/:readingSetId': {
    async make() {
      const u = await fullUnit();
      const s = await api().post(`/api/units/${u.id}/reading-sets`).set(admin).send({ ...fullSet, kind: 'routine', isReference: true }).expect(201);
      return { url: `/api/reading-sets/${s.body.id}`, id: s.body.id as number };
    },
    target: ReadingSet,
    auditEntity: 'reading_set',
    body: { instrument: 'M5200' },
    column: 'instrument',
    children: readings,
  },
  '/criteria/:version': {
    async make() {
      const d = await api().post('/api/criteria').set(admin).send({ fromVersion: 2, name: 'Draft with a name', notes: 'draft notes' }).expect(201);
      return { url: `/api/criteria/${d.body.version}`, id: d.body.id as number };
    },
    target: CriteriaSet,
    auditEntity: 'criteria_set',
    body: { notes: 'changed notes' },
    column: 'notes',
    auditIds: ['version'],
  },
};

const patchRoutes = routeTable.filter((r) => r.method === 'patch').map((r) => r.path);

beforeAll(async () => {
  env = await openTestEnv();
  admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
});
afterAll(async () => {
  await env.db.destroy();
});

describe('PATCH changes exactly the field sent', () => {
  it('has a case for every PATCH route of the route table', () => {
    expect(patchRoutes.length).toBeGreaterThan(0);
    expect([...patchRoutes].sort()).toEqual(Object.keys(FIXTURES).sort());
  });

  it.each(patchRoutes)('PATCH %s', async (path) => {
    const fx = FIXTURES[path];
    expect(fx, `no one-field case for PATCH ${path}`).toBeDefined();
    const { url, id } = await fx.make();
    const repo = env.db.getRepository(fx.target);
    const load = () => repo.findOneOrFail({ where: { id } });
    const before = await load();
    const childrenBefore = await fx.children?.(id);
    const res = await api().patch(url).set(admin).send(fx.body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);

    const after = await load();
    const [field, value] = Object.entries(fx.body)[0];
    expect(after[fx.column]).toEqual(value);
    expect(after[fx.column]).not.toEqual(before[fx.column]);
    const others = (row: ObjectLiteral) => Object.fromEntries(Object.entries(row).filter(([k]) => k !== fx.column && !STAMPS.includes(k)));
    expect(others(after)).toEqual(others(before));
    if (fx.children) expect(await fx.children(id)).toEqual(childrenBefore);

    const entries = await env.db.getRepository(AuditEntry).find({ where: { entity: fx.auditEntity, entityId: String(id), action: 'update' }, order: { id: 'ASC' } });
    expect(entries).toHaveLength(1);
    const ids = fx.auditIds ?? [];
    const named = (o: unknown) => Object.keys(o as object).filter((k) => !ids.includes(k));
    expect(named(entries[0].after)).toEqual([field]);
    expect(named(entries[0].before)).toEqual([field]);
    expect((entries[0].after as Record<string, unknown>)[field]).toEqual(value);
  });
});
