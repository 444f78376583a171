import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eventListQuery } from '../../../server/features/events/events.query.js';
import { unitListQuery } from '../../../server/features/units/units.service.js';
import { eventListQuerySchema, unitListQuerySchema } from '../../../shared/schemas/fleet.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeDesign, makeSite } from '../../helpers/factories.js';

// The fleet and event lists on a 5 000-unit fleet: EXPLAIN must show an index for every table, no full scan.

let env: TestEnv;
let siteId: number;
let designId: number;
let unitIds: number[] = [];

beforeAll(async () => {
  env = await openTestEnv();
  const sites = [await makeSite(env.db), await makeSite(env.db), await makeSite(env.db)];
  const designs = [await makeDesign(env.db), await makeDesign(env.db)];
  siteId = sites[1].id;
  designId = designs[0].id;
  const tag = Date.now().toString(36);
  const rows: unknown[][] = [];
  for (let i = 0; i < 5000; i++) {
    rows.push([`BIG-${tag}-${String(i).padStart(5, '0')}`, 'T1', sites[i % 3].id, designs[i % 2].id, 3, 132, 33, 40000, 10.5, 0, 'Cu']);
  }
  for (let i = 0; i < rows.length; i += 1000) {
    const chunk = rows.slice(i, i + 1000);
    await env.db.query(
      `INSERT INTO unit (serial, position, siteId, designId, phases, hvKV, lvKV, ratedKVA, impedancePercent, systemImpedancePercent, conductor) VALUES ${chunk.map(() => '(?,?,?,?,?,?,?,?,?,?,?)').join(',')}`,
      chunk.flat(),
    );
  }
  unitIds = (await env.db.query('SELECT id FROM unit WHERE serial LIKE ?', [`BIG-${tag}-%`])).map((r: { id: number }) => r.id);
  const ev: unknown[][] = unitIds.flatMap((id, k) => [0, 1].map((j) => [id, new Date(Date.UTC(2020, 0, 1) + (k * 2 + j) * 3600_000), 'three-phase', 'lv', '[]', '[]', ['logged', 'testing', 'released'][(k + j) % 3]]));
  for (let i = 0; i < ev.length; i += 1000) {
    const chunk = ev.slice(i, i + 1000);
    await env.db.query(`INSERT INTO fault_event (unitId, occurredAt, type, side, shots, protectionOperated, status) VALUES ${chunk.map(() => '(?,?,?,?,?,?,?)').join(',')}`, chunk.flat());
  }
  await env.db.query('ANALYZE TABLE unit, fault_event, site, design');
}, 120000);

afterAll(async () => {
  await env.db.destroy();
});

interface ExplainRow {
  table: string;
  type: string;
  key: string | null;
  rows: number;
}

async function explain(sql: string, params: unknown[]): Promise<ExplainRow[]> {
  return env.db.query(`EXPLAIN ${sql}`, params);
}

function expectIndexed(plan: ExplainRow[]) {
  for (const row of plan) {
    expect({ table: row.table, type: row.type }).not.toEqual({ table: row.table, type: 'ALL' });
    expect(row.key, `table ${row.table} has no key`).not.toBeNull();
  }
}

describe('EXPLAIN of the fleet list on 5 000 units', () => {
  const cases: Record<string, Record<string, string>> = {
    'default (by serial)': {},
    'one site, by serial': { siteId: '' },
    'one design, newest event first': { designId: '', sort: '-lastEventAt' },
    'by last recommendation': { sort: 'lastRecommendation' },
  };
  for (const [name, raw] of Object.entries(cases)) {
    it(`uses indexes: ${name}`, async () => {
      const q = unitListQuerySchema.parse({ ...raw, ...(raw.siteId !== undefined ? { siteId: String(siteId) } : {}), ...(raw.designId !== undefined ? { designId: String(designId) } : {}) });
      const [sql, params] = unitListQuery(env.db.manager, q).getQueryAndParameters();
      expectIndexed(await explain(sql, params));
    });
  }
});

describe('EXPLAIN of the event list on 10 000 events', () => {
  it('uses indexes newest first', async () => {
    const [sql, params] = eventListQuery(env.db.manager, eventListQuerySchema.parse({})).getQueryAndParameters();
    expectIndexed(await explain(sql, params));
  });
  it('uses indexes for one status', async () => {
    const [sql, params] = eventListQuery(env.db.manager, eventListQuerySchema.parse({ status: 'testing' })).getQueryAndParameters();
    expectIndexed(await explain(sql, params));
  });
  it('uses indexes for one unit', async () => {
    const [sql, params] = eventListQuery(env.db.manager, eventListQuerySchema.parse({ unitId: String(unitIds[10]) })).getQueryAndParameters();
    expectIndexed(await explain(sql, params));
  });
  const cases: Record<string, Record<string, string>> = {
    'part of a serial': { q: 'BIG-' },
    'several statuses, one fault type': { status: 'logged,testing', type: 'three-phase' },
    'a date range, oldest first': { from: '2020-01-10', to: '2020-01-20', sort: 'occurredAt' },
    'without relay records': { withoutAttachments: 'true' },
    'by serial': { sort: 'serial' },
    'by status, descending': { sort: '-status' },
    'one site, by serial': { siteId: '', sort: '-serial' },
  };
  for (const [name, raw] of Object.entries(cases)) {
    it(`uses indexes: ${name}`, async () => {
      const q = eventListQuerySchema.parse({ ...raw, ...(raw.siteId !== undefined ? { siteId: String(siteId) } : {}) });
      const [sql, params] = eventListQuery(env.db.manager, q).getQueryAndParameters();
      expectIndexed(await explain(sql, params));
    });
  }
});
