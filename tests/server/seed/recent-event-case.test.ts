import { readFileSync, writeFileSync } from 'node:fs';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../../server/db/seed/demo-seed.js';
import { buildEventCase } from '../../../server/features/events/case-export.service.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import { parseCase } from '../../../shared/schemas/case.js';
import { screenCase } from '../../../shared/screening/index.js';
import { openFixedDb } from '../../helpers/fixed-db.js';

// The demo scenario seeded at a fixed instant on a database of its own, so its case export is reproducible to the
// byte: examples/demo/recent-event.case.json is that export, and recent-event.result.json its screening.
// To regenerate after a deliberate change: UPDATE_EXAMPLES=1 npm test -- tests/server/seed/recent-event-case.test.ts

const FIXED_NOW = new Date('2026-12-01T09:00:00Z');
const CASE_FILE = 'examples/demo/recent-event.case.json';
const RESULT_FILE = 'examples/demo/recent-event.result.json';

let db: DataSource;
beforeAll(async () => {
  db = await openFixedDb();
  await seedDemo(db, { now: FIXED_NOW });
});
afterAll(async () => {
  await db.destroy();
});

async function recentEventCase() {
  const unit = await db.getRepository(Unit).findOneByOrFail({ serial: 'KVP-HX-T2' });
  const event = await db.getRepository(FaultEvent).findOneOrFail({ where: { unitId: unit.id }, order: { occurredAt: 'DESC' } });
  return buildEventCase(db.manager, event.id);
}

describe('case export of the seeded recent event', () => {
  it('equals the stored expected case file', async () => {
    const c = JSON.parse(JSON.stringify(await recentEventCase()));
    if (process.env.UPDATE_EXAMPLES === '1') writeFileSync(CASE_FILE, JSON.stringify(c, null, 2) + '\n');
    expect(c).toEqual(JSON.parse(readFileSync(CASE_FILE, 'utf8')));
  });

  it('is a valid gapsight-case/1 that screens conditional, as the stored result says', async () => {
    const parsed = parseCase(JSON.parse(readFileSync(CASE_FILE, 'utf8')));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const result = JSON.parse(JSON.stringify(screenCase(parsed.value)));
    if (process.env.UPDATE_EXAMPLES === '1') writeFileSync(RESULT_FILE, JSON.stringify(result, null, 2) + '\n');
    expect(result.recommendation).toBe('conditional');
    expect(result).toEqual(JSON.parse(readFileSync(RESULT_FILE, 'utf8')));
  });
});

describe('times the seed writes', () => {
  it('are on the story\'s clock: no seeded row or audit entry is dated after the instant the story was seeded at', async () => {
    const columns: [string, string[]][] = [
      ['audit_entry', ['at']],
      ['user', ['createdAt', 'updatedAt']],
      ['site', ['createdAt']],
      ['design', ['createdAt', 'updatedAt']],
      ['unit', ['createdAt', 'updatedAt']],
      ['fault_event', ['createdAt', 'updatedAt']],
      ['reading_set', ['createdAt']],
      ['sweep_trace', ['createdAt']],
      ['screening', ['computedAt']],
      ['decision', ['signedAt']],
      ['follow_up', ['createdAt', 'closedAt']],
      ['finding', ['recordedAt']],
      ['notification', ['createdAt', 'sentAt']],
    ];
    for (const [table, cols] of columns) {
      for (const col of cols) {
        const [row] = await db.query(`SELECT COUNT(*) AS n, MAX(\`${col}\`) AS latest FROM \`${table}\``);
        expect(Number(row.n), table).toBeGreaterThan(0);
        expect(new Date(row.latest).getTime(), `${table}.${col}`).toBeLessThanOrEqual(FIXED_NOW.getTime());
      }
    }
  });
});
