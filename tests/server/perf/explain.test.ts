import { beforeAll, describe, expect, it, vi } from 'vitest';
import { eventListQuery } from '../../../server/features/events/events.query.js';
import { unitListQuery } from '../../../server/features/units/units.service.js';
import { eventListQuerySchema, unitListQuerySchema } from '../../../shared/schemas/fleet.js';
import { correctionsFlow, session } from '../corrections/flow.js';

// The plans and the round trips behind the fleet list, the event list, the event file and the case export, on a
// design family of 5 000 units with 2 events each (bulk INSERT, as the bench seeds its fleet). tests/server/fleet/
// explain.test.ts checks that every list variant uses an index; here: no sort of a whole table where an index gives
// the order, every query of the event file and the case export on an index, and a fixed number of queries whatever
// the number of sessions, sisters or rows on the page.

const f = correctionsFlow();
let eventId = 0;
let unitId = 0;
let designId = 0;

interface ExplainRow {
  table: string;
  type: string;
  key: string | null;
  rows: number | string;
  Extra: string | null;
}

async function explain(sql: string, params: unknown[]): Promise<ExplainRow[]> {
  return f.env.db.query(`EXPLAIN ${sql}`, params);
}

/** Every statement the data source runs while `fn` runs. */
async function queriesOf(fn: () => Promise<unknown>): Promise<{ sql: string; params: unknown[] }[]> {
  const seen: { sql: string; params: unknown[] }[] = [];
  const spy = vi.spyOn(f.env.db.logger, 'logQuery').mockImplementation((sql: string, params?: unknown) => void seen.push({ sql, params: Array.isArray(params) ? params : [] }));
  try {
    await fn();
  } finally {
    spy.mockRestore();
  }
  return seen;
}

async function bulkSisters(n: number, tag: string): Promise<number[]> {
  const [unit] = await f.env.db.query('SELECT siteId FROM unit WHERE id = ?', [unitId]);
  for (let i = 0; i < n; i += 1000) {
    const rows = Array.from({ length: Math.min(1000, n - i) }, (_, k) => [`PERF-${tag}-${String(i + k).padStart(5, '0')}`, 'T1', unit.siteId, designId, 3, 132, 33, 40000, 10.5, 0, 'Cu']);
    await f.env.db.query(
      `INSERT INTO unit (serial, position, siteId, designId, phases, hvKV, lvKV, ratedKVA, impedancePercent, systemImpedancePercent, conductor) VALUES ${rows.map(() => '(?,?,?,?,?,?,?,?,?,?,?)').join(',')}`,
      rows.flat(),
    );
  }
  const ids: number[] = (await f.env.db.query('SELECT id FROM unit WHERE serial LIKE ?', [`PERF-${tag}-%`])).map((r: { id: number }) => r.id);
  for (let i = 0; i < ids.length; i += 500) {
    const rows = ids.slice(i, i + 500).flatMap((id, k) => [0, 1].map((j) => [id, new Date(Date.UTC(2021, 0, 1) + ((i + k) * 2 + j) * 3600_000), 'three-phase', 'lv', '[{"currentKA":3,"durationS":0.1}]', '[]', ['logged', 'testing', 'released'][(k + j) % 3]]));
    await f.env.db.query(`INSERT INTO fault_event (unitId, occurredAt, type, side, shots, protectionOperated, status) VALUES ${rows.map(() => '(?,?,?,?,?,?,?)').join(',')}`, rows.flat());
  }
  return ids;
}

beforeAll(async () => {
  const ev = await f.event();
  eventId = ev.eventId;
  unitId = ev.unitId;
  [{ designId }] = await f.env.db.query('SELECT designId FROM unit WHERE id = ?', [unitId]);
  await bulkSisters(5000, Date.now().toString(36));
  await f.env.db.query('ANALYZE TABLE unit, fault_event, reading_set, reading, screening, decision');
}, 180000);

describe('EXPLAIN: the lists read in index order (no sort of the table)', () => {
  const cases: [string, () => [string, unknown[]]][] = [
    ['fleet, by serial (default)', () => unitListQuery(f.env.db.manager, unitListQuerySchema.parse({})).getQueryAndParameters()],
    ['fleet, newest event first', () => unitListQuery(f.env.db.manager, unitListQuerySchema.parse({ sort: '-lastEventAt' })).getQueryAndParameters()],
    ['fleet, oldest event first', () => unitListQuery(f.env.db.manager, unitListQuerySchema.parse({ sort: 'lastEventAt' })).getQueryAndParameters()],
    ['fleet, by recommendation, descending', () => unitListQuery(f.env.db.manager, unitListQuerySchema.parse({ sort: '-lastRecommendation' })).getQueryAndParameters()],
    ['events, newest first (default)', () => eventListQuery(f.env.db.manager, eventListQuerySchema.parse({})).getQueryAndParameters()],
    ['events, one status, newest first, page 20', () => eventListQuery(f.env.db.manager, eventListQuerySchema.parse({ status: 'released', page: '20' })).getQueryAndParameters()],
  ];
  for (const [name, query] of cases) {
    it(name, async () => {
      const [sql, params] = query();
      const plan = await explain(sql, params);
      const outer = plan[0];
      // Driven by the listed table itself (u: unit, e: fault_event), not by a joined one.
      expect(['u', 'e']).toContain(outer.table);
      for (const row of plan) {
        expect(row.key, `${name}: table ${row.table} has no key`).not.toBeNull();
        expect(row.type, `${name}: table ${row.table}`).not.toBe('ALL');
        expect(row.Extra ?? '', `${name}: table ${row.table}`).not.toMatch(/filesort|temporary/i);
      }
    });
  }
});

describe('the event file and the case export', () => {
  it('take a fixed number of queries, whatever the number of sessions, sisters and earlier faults', async () => {
    const count = async () => ({
      file: (await queriesOf(() => f.api().get(`/api/events/${eventId}`).set(f.as.engineer).expect(200))).length,
      caseDoc: (await queriesOf(() => f.api().get(`/api/events/${eventId}/case`).set(f.as.engineer).expect(200))).length,
    });
    const sisters: number[] = (await f.env.db.query('SELECT id FROM unit WHERE designId = ? AND id <> ? ORDER BY id LIMIT 3', [designId, unitId])).map((r: { id: number }) => r.id);
    const sisterReadings = (id: number) =>
      f.api().post(`/api/units/${id}/reading-sets`).set(f.as.tester).send({ kind: 'routine', takenAt: '2024-05-02', temperatureC: 25, capacitancePF: { CH: 3121, CL: 9872, CHL: 5212 } }).expect(201);
    await sisterReadings(sisters[0]);
    const before = await count();
    // One session more, an earlier fault, two more sisters with readings of their own; then a screening and a decision.
    f.clock.advance(60_000);
    await f.api().post(`/api/events/${eventId}/sessions`).set(f.as.tester).send({ ...session, takenAt: '2026-11-29T09:00:00Z' }).expect(201);
    await f.api().post('/api/events').set(f.as.protection).send({ unitId, occurredAt: '2020-03-01T10:00:00Z', type: 'phase-to-ground', side: 'lv', shots: [{ currentKA: 0.8, durationS: 0.1 }] }).expect(201);
    for (const id of sisters.slice(1)) await sisterReadings(id);
    // A screening and a decision (with a follow-up) on the event.
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.', followUps: [{ task: 'Dissolved-gas sample', dueAt: '2026-12-20T09:00:00.000Z' }] });
    const after = await count();
    const caseBody = (await f.api().get(`/api/events/${eventId}/case`).set(f.as.engineer).expect(200)).body;
    expect(caseBody.sisters).toHaveLength(3);
    expect(caseBody.priorFaults).toHaveLength(1);
    expect(after).toEqual(before);
    // The sign-in check, the event with its unit, then everything on the event id: at most a dozen statements.
    expect(after.file).toBeLessThanOrEqual(14);
    expect(after.caseDoc).toBeLessThanOrEqual(10);
  });

  it('run every query on an index (no full scan of a big table)', async () => {
    for (const url of [`/api/events/${eventId}`, `/api/events/${eventId}/case`]) {
      const queries = await queriesOf(() => f.api().get(url).set(f.as.engineer).expect(200));
      const selects = queries.filter((q) => /^\s*\(?SELECT/i.test(q.sql));
      expect(selects.length, url).toBeGreaterThan(3);
      for (const q of selects) {
        // A full scan only of a small table (a few rows, where the optimiser rightly prefers it); never of the
        // 5 000 units, their 10 000 events, reading sets or readings.
        for (const row of await explain(q.sql, q.params)) {
          if (row.type === 'ALL') expect(Number(row.rows), `${url}: ${row.table} scanned whole in ${q.sql}`).toBeLessThan(100);
        }
      }
    }
  });
});

describe('the fleet and event lists', () => {
  it('take the same few queries for a page of 5 rows and of 200', async () => {
    const n = async (url: string) => (await queriesOf(() => f.api().get(url).set(f.as.engineer).expect(200))).length;
    // Sign-in check, the page with its total, the active restrictions of its units.
    expect(await n('/api/units?pageSize=5')).toBe(3);
    expect(await n('/api/units?pageSize=200&sort=-lastEventAt')).toBe(3);
    // Sign-in check, the page with units, sites, recommendations and its total.
    expect(await n('/api/events?pageSize=5')).toBe(2);
    expect(await n('/api/events?pageSize=200&status=released')).toBe(2);
  });
});
