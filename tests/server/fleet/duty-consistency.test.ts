// The unit file's event list and the event file give the same cumulative duty for the same event: both count the
// unit's earlier faults by one rule (shared/screening/duty-history.ts).
import { describe, expect, it } from 'vitest';
import { apiForFile } from '../../helpers/api-file.js';
import { makeUnit } from '../../helpers/factories.js';

const opened = apiForFile(['protection']);
const { api, as } = opened;

type Duty = { i2t: number; cumulativeI2t: number; cumulativeDutyPercent: number; shotsAboveSegment: number };

// Invented values on a 40 MVA 132/33 kV unit: three through-faults, logged out of time order.
async function logFault(unitId: number, occurredAt: string, currentKA: number): Promise<{ id: number; throughFault: Duty }> {
  const res = await api()
    .post('/api/events')
    .set(as.protection)
    .send({ unitId, occurredAt, type: 'three-phase', side: 'lv', shots: [{ currentKA, durationS: 0.1 }], protectionOperated: ['overcurrent'] });
  expect(res.status).toBe(201);
  return res.body;
}

describe('cumulative duty with prior faults', () => {
  it('is the same figure in the unit file and in the event file, counting only the faults before the event', async () => {
    const unit = await makeUnit(opened.env.db);
    const latest = await logFault(unit.id, '2026-11-28T03:12:00Z', 6.3);
    const first = await logFault(unit.id, '2024-05-02T10:00:00Z', 5.1);
    const second = await logFault(unit.id, '2025-02-14T22:40:00Z', 4.2);

    const unitFile = await api().get(`/api/units/${unit.id}`).set(as.protection);
    expect(unitFile.status).toBe(200);
    const listed = new Map<number, Duty>(unitFile.body.events.map((e: { id: number; throughFault: Duty }) => [e.id, e.throughFault]));

    const own = { first: first.throughFault.i2t, second: second.throughFault.i2t };
    for (const [ev, expectedI2t] of [
      [first, own.first],
      [second, own.first + own.second],
      [latest, null],
    ] as const) {
      const file = await api().get(`/api/events/${ev.id}`).set(as.protection);
      expect(file.status).toBe(200);
      const fromFile = file.body.throughFault as Duty;
      const fromUnit = listed.get(ev.id)!;
      expect(fromUnit.cumulativeDutyPercent).toBe(fromFile.cumulativeDutyPercent);
      expect(fromUnit.cumulativeI2t).toBe(fromFile.cumulativeI2t);
      expect(fromUnit.shotsAboveSegment).toBe(fromFile.shotsAboveSegment);
      if (expectedI2t !== null) expect(fromFile.cumulativeI2t).toBeCloseTo(expectedI2t, 9);
    }

    // The latest event counts both earlier faults (two prior faults) on top of its own I²t.
    const latestFile = (await api().get(`/api/events/${latest.id}`).set(as.protection)).body.throughFault as Duty;
    expect(latestFile.cumulativeI2t).toBeCloseTo(own.first + own.second + latestFile.i2t, 9);
    expect(latestFile.cumulativeI2t).toBeGreaterThan(latestFile.i2t);
  });
});
