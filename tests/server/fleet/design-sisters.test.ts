// GET /api/designs/:id/sisters on the seeded demo family (eight 40 MVA 132/33 kV units, one of them a CHL outlier).
// The demo seed is idempotent on the shared test database (its marker), so rows are found by the scenario's serials.
import { In, Not } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_DESIGNS, CHL_OUTLIER_SERIAL, DEMO_UNITS, RECENT_EVENT_SERIAL } from '../../../server/db/seed/demo-fleet.js';
import { seedDemo } from '../../../server/db/seed/demo-seed.js';
import { Design } from '../../../server/features/designs/design.entity.js';
import { loadCriteria } from '../../../server/features/criteria/criteria.service.js';
import { buildEventCase } from '../../../server/features/events/case-export.service.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { loadCaseReadingSets } from '../../../server/features/readings/readings.service.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import { mergeReadingSets } from '../../../shared/readings/merge.js';
import type { GapsightCase, ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import { designSistersSchema, type DesignSisters } from '../../../shared/schemas/responses/index.js';
import { modifiedZScore, sisterIndicators } from '../../../shared/screening/index.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeDesign, makeUnit } from '../../helpers/factories.js';

const opened = apiForFile(['tester']);
const { api, as } = opened;

const FAMILY_SERIALS = DEMO_UNITS.filter((u) => u.family === 'large').map((u) => u.serial);
let design: Design;
let units: Unit[];

beforeAll(async () => {
  await seedDemo(opened.env.db);
  design = await opened.env.db.getRepository(Design).findOneByOrFail({ reference: DEMO_DESIGNS.large.reference });
  units = await opened.env.db.getRepository(Unit).find({ where: { serial: In(FAMILY_SERIALS) }, relations: { design: true } });
});

/** Each family unit's latest non-post-fault readings, merged (read from the database here, not through the route). */
async function latestReadings(): Promise<Map<string, CaseReadingSet>> {
  const m = opened.env.db.manager;
  const sets = await m.getRepository(ReadingSet).find({ where: { unitId: In(units.map((u) => u.id)), kind: Not('post-fault') }, order: { takenAt: 'ASC', id: 'ASC' } });
  const values = await loadCaseReadingSets(m, sets);
  return new Map(units.map((u) => [u.serial, mergeReadingSets(sets.filter((s) => s.unitId === u.id).map((s) => values.get(s.id)!))!]));
}

async function sisters(query = ''): Promise<DesignSisters> {
  const res = await api().get(`/api/designs/${design.id}/sisters${query}`).set(as.tester);
  expect(res.status).toBe(200);
  return designSistersSchema.parse(res.body);
}

describe('GET /api/designs/:id/sisters', () => {
  it('the design-family route returns the same modified z-scores as the engine for the seeded family', async () => {
    expect(FAMILY_SERIALS).toHaveLength(8);
    const body = await sisters('?quantity=capacitance.CHL');
    const latest = await latestReadings();
    const { criteria } = await loadCriteria(opened.env.db.manager);
    const familyItems = body.items.filter((i) => FAMILY_SERIALS.includes(i.serial));
    expect(familyItems).toHaveLength(8);

    // The same values as the case export takes for a sister (the recent event's case: the seven other units).
    const recent = units.find((u) => u.serial === RECENT_EVENT_SERIAL)!;
    const event = await opened.env.db.getRepository(FaultEvent).findOneOrFail({ where: { unitId: recent.id }, order: { occurredAt: 'DESC' } });
    const exported = await buildEventCase(opened.env.db.manager, event.id);
    for (const s of exported.sisters!) expect(familyItems.find((i) => i.serial === s.serial)!.value, s.serial).toBe(s.capacitancePF!.CHL);

    const all = familyItems.map((i) => i.value);
    for (const item of familyItems) {
      const own = latest.get(item.serial)!;
      expect(item.value).toBe(own.capacitancePF!.CHL);
      // The engine on the same numbers: this unit's value as the screened one, the seven others as its sisters.
      const c: GapsightCase = {
        ...exported,
        unit: { ...exported.unit, serial: item.serial },
        postFault: { capacitancePF: { CHL: item.value } },
        sisters: familyItems.filter((o) => o.serial !== item.serial).map((o) => ({ serial: o.serial, capacitancePF: { CHL: o.value } })),
      };
      const engine = sisterIndicators(c, criteria).find((i) => i.key === 'sisters.capacitance.CHL.modifiedZ')!;
      expect(item.modifiedZ, item.serial).toBeCloseTo(engine.value as number, 12);
      expect(item.outlier, item.serial).toBe(engine.level !== 'ok');
      const direct = modifiedZScore(item.value, all, criteria.sisters.modifiedZConstant, criteria.sisters.madFloorFractionOfMedian);
      expect(body.median).toBe(direct.median);
      expect(body.mad).toBe(direct.mad);
      expect(item.deviationFromMedianPercent).toBeCloseTo((100 * (item.value - direct.median)) / direct.median, 12);
    }
    expect(body).toMatchObject({ quantity: 'capacitance.CHL', label: 'CHL capacitance', unit: 'pF', constant: 0.6745, limit: 3.5, note: null });
  });

  it('flags the demo outlier and no other unit of the family on CHL', async () => {
    const body = await sisters('?quantity=capacitance.CHL');
    const flagged = body.items.filter((i) => i.outlier).map((i) => i.serial);
    expect(flagged).toEqual([CHL_OUTLIER_SERIAL]);
    const outlier = body.items.find((i) => i.serial === CHL_OUTLIER_SERIAL)!;
    expect(Math.abs(outlier.modifiedZ!)).toBeGreaterThanOrEqual(3.5);
    expect(outlier.deviationFromMedianPercent!).toBeGreaterThan(3); // seeded about 5 % above the family (demo-fleet.ts)
    expect(outlier.takenAt).not.toBeNull();
  });

  it('without a quantity, compares on the first one and lists every quantity the family has', async () => {
    const body = await sisters();
    const names = body.quantities.map((q) => q.name);
    expect(body.quantity).toBe(names[0]);
    expect(names).toEqual(expect.arrayContaining(['capacitance.CH', 'capacitance.CHL', 'capacitance.CL', 'reactance.A']));
    expect(names.indexOf('capacitance.CL')).toBeLessThan(names.indexOf('reactance.A'));
    const reactance = await sisters('?quantity=reactance.A');
    expect(reactance).toMatchObject({ label: 'Phase A leakage reactance', unit: '%' });
    expect(reactance.items.length).toBeGreaterThan(0);
  });

  it('answers 400 naming quantity for a quantity the family cannot be compared on', async () => {
    for (const q of ['gas.H2', 'capacitance.CX', 'nonsense']) {
      const res = await api().get(`/api/designs/${design.id}/sisters?quantity=${q}`).set(as.tester);
      expect(res.status, q).toBe(400);
      expect(res.body.error.fields.quantity).toMatch(/not a quantity this family can be compared on.*capacitance\.CHL/);
    }
  });

  it('answers 404 for a missing design, and an empty comparison for a family without readings', async () => {
    const missing = await api().get('/api/designs/999999999/sisters').set(as.tester);
    expect(missing.status).toBe(404);
    const empty = await makeDesign(opened.env.db);
    await makeUnit(opened.env.db, { designId: empty.id });
    const res = await api().get(`/api/designs/${empty.id}/sisters`).set(as.tester);
    expect(res.status).toBe(200);
    expect(designSistersSchema.parse(res.body)).toMatchObject({ quantity: null, items: [], quantities: [], median: null });
  });

  it('needs a signed-in user', async () => {
    expect((await api().get(`/api/designs/${design.id}/sisters`)).status).toBe(401);
  });
});
