import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Reading } from '../../../server/features/readings/reading.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { SweepTrace } from '../../../server/features/readings/sweep-trace.entity.js';
import { parseCase } from '../../../shared/schemas/case.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeUnit } from '../../helpers/factories.js';
import { sweepCsv } from '../../helpers/sweep-csv.js';

// Rules revision 2 fields through the API: stored, exported in the event's case, bad values named (400, nothing written).
// Invented demo values of a 40 MVA 132/33 kV YNd1 unit (Kestrel Valley Power style), not check values.

const opened = apiForFile(['protection', 'tester']);
const { api, as } = opened;
const FAULT_AT = '2026-11-28T03:12:00Z';

async function logFault(unitId: number, over: Record<string, unknown> = {}) {
  const res = await api()
    .post('/api/events')
    .set(as.protection)
    .send({ unitId, occurredAt: FAULT_AT, type: 'three-phase', side: 'lv', shots: [{ currentKA: 6.3, durationS: 0.12 }], protectionOperated: ['overcurrent'], ...over });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; location: string | null; currentIs: string | null; throughFault: Record<string, unknown> };
}

async function exportCase(eventId: number) {
  const res = await api().get(`/api/events/${eventId}/case`).set(as.tester);
  expect(res.status).toBe(200);
  const parsed = parseCase(res.body);
  expect(parsed.ok, JSON.stringify(parsed.ok ? '' : parsed.errors)).toBe(true);
  return res.body;
}

const setsOf = (unitId: number) => opened.env.db.getRepository(ReadingSet).find({ where: { unitId }, order: { takenAt: 'ASC', id: 'ASC' } });

describe('fault location and current basis', () => {
  it('are stored, shown and exported, for the event and for the prior faults', async () => {
    const unit = await makeUnit(opened.env.db);
    const prior = await logFault(unit.id, { occurredAt: '2025-03-01T10:00:00Z', type: 'phase-to-ground', side: 'hv', location: 'lv', currentIs: 'winding', shots: [{ currentKA: 0.9, durationS: 0.3 }] });
    const ev = await logFault(unit.id, { location: 'lv', currentIs: 'line' });
    expect(prior).toMatchObject({ location: 'lv', currentIs: 'winding' });
    expect(await opened.env.db.getRepository(FaultEvent).findOneByOrFail({ id: ev.id })).toMatchObject({ location: 'lv', currentIs: 'line' });
    expect((await api().get(`/api/events/${ev.id}`).set(as.tester)).body).toMatchObject({ location: 'lv', currentIs: 'line' });

    const c = await exportCase(ev.id);
    expect(c.fault).toMatchObject({ side: 'lv', location: 'lv', currentIs: 'line' });
    expect(c.priorFaults).toEqual([{ occurredAt: '2025-03-01T10:00:00.000Z', type: 'phase-to-ground', side: 'hv', location: 'lv', currentIs: 'winding', shots: [{ currentKA: 0.9, durationS: 0.3 }] }]);
  });

  it('are left out of the case when not recorded (the defaults apply)', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    expect(ev).toMatchObject({ location: null, currentIs: null });
    const c = await exportCase(ev.id);
    expect(c.fault).not.toHaveProperty('location');
    expect(c.fault).not.toHaveProperty('currentIs');
  });

  it('reach the duty figures: winding currents are the basis when recorded so, line currents otherwise', async () => {
    const unit = await makeUnit(opened.env.db);
    // Case format, "Winding current" / result `currentBasis`: `winding` when given as winding currents.
    expect((await logFault(unit.id, { currentIs: 'winding' })).throughFault.currentBasis).toBe('winding');
    expect((await logFault(unit.id, { currentIs: 'line', occurredAt: '2026-11-29T03:12:00Z' })).throughFault.currentBasis).not.toBe('winding');
  });

  it('reject other values with 400 naming each field, and store nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const res = await api().post('/api/events').set(as.protection).send({ unitId: unit.id, occurredAt: FAULT_AT, type: 'three-phase', side: 'lv', location: 'mv', currentIs: 'phase', shots: [{ currentKA: 6.3, durationS: 0.12 }] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['currentIs', 'location']);
    expect(await opened.env.db.getRepository(FaultEvent).countBy({ unitId: unit.id })).toBe(0);
  });
});

const bushings = {
  H1: { c1PF: 412.5, c1DissipationPercent: 0.31, c2PF: 3880, c2DissipationPercent: 0.42, winding: 'hv' },
  H2: { c1PF: 409.8 },
  X1: { c1PF: 655.1, winding: 'lv' },
};

describe('post-fault session body', () => {
  it('stores the doubts as columns and every section as rows, and the case postFault carries them', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const body = {
      takenAt: '2026-11-29T08:00:00Z',
      temperatureC: 31,
      demagnetised: true,
      hoursDeEnergised: 29,
      windingTemperatureC: 24.5,
      capacitancePF: { CH: 3131, CL: 9990, CHL: 5405 },
      bushings,
      dissolvedGasPPM: { H2: 41.3, CH4: 17.2, C2H6: 10.9, C2H4: 6.8, C2H2: 0.4, CO: 391, CO2: 2985 },
      excitationCurrentMA: { A: 28.9, B: 19.9, C: 29.3 },
      excitationKV: 10,
      turnsRatio: { A: 2.31, B: 2.309, C: 2.311 },
      windingResistanceOhm: { A: 0.8408, B: 0.8399, C: 0.8419 },
    };
    const res = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ demagnetised: true, hoursDeenergised: 29, windingTemperatureC: 24.5 });
    const row = await opened.env.db.getRepository(ReadingSet).findOneByOrFail({ id: res.body.id });
    expect(row).toMatchObject({ demagnetised: true, hoursDeenergised: 29, windingTemperatureC: 24.5, extra: null });
    const quantities = (await opened.env.db.getRepository(Reading).findBy({ readingSetId: row.id })).map((r) => r.quantity);
    expect(quantities.filter((q) => q.startsWith('bushing-'))).toHaveLength(6); // H1: C1, DF1, C2, DF2; H2: C1; X1: C1

    const c = await exportCase(ev.id);
    const { takenAt: _t, ...values } = body;
    expect(c.postFault).toEqual({ takenAt: '2026-11-29T08:00:00Z', ...values });
  });

  it('still takes the older spelling hoursDeenergised, exported as hoursDeEnergised', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', hoursDeenergised: 7, capacitancePF: { CH: 3131 } }).expect(201);
    await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T09:00:00Z', hoursDeenergised: 8, hoursDeEnergised: 8, capacitancePF: { CL: 9990 } }).expect(201);
    const c = await exportCase(ev.id);
    expect(c.postFault.hoursDeEnergised).toBe(8);
    expect(c.postFault).not.toHaveProperty('hoursDeenergised');
  });

  it('rejects bad values with 400 naming each field, and writes nothing (event stays logged)', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const cases: [Record<string, unknown>, string][] = [
      [{ demagnetised: 'yes' }, 'demagnetised'],
      [{ hoursDeEnergised: -1 }, 'hoursDeEnergised'],
      [{ hoursDeEnergised: 5, hoursDeenergised: 6 }, 'hoursDeEnergised'],
      [{ windingTemperatureC: 293 }, 'windingTemperatureC'],
      [{ bushings: { H1: { c1PF: -412 } } }, 'bushings.H1.c1PF'],
      [{ bushings: { H1: { c1DissipationPercent: 0.3 } } }, 'bushings.H1.c1PF'],
      [{ bushings: { H1: { c1PF: 412, winding: 'mv' } } }, 'bushings.H1.winding'],
      [{ bushings: { H123456789012345678901: { c1PF: 412 } } }, 'bushings.H123456789012345678901'],
      [{ dissolvedGasPPM: { H2: -3 } }, 'dissolvedGasPPM.H2'],
      [{ turnsRatio: { A: 0 } }, 'turnsRatio.A'],
      [{ excitationKV: 'ten' }, 'excitationKV'],
    ];
    for (const [bad, field] of cases) {
      const res = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', capacitancePF: { CH: 3131 }, ...bad });
      expect(res.status, JSON.stringify(bad)).toBe(400);
      expect(Object.keys(res.body.error.fields), JSON.stringify(bad)).toContain(field);
    }
    expect(await setsOf(unit.id)).toHaveLength(0);
    expect((await opened.env.db.getRepository(FaultEvent).findOneByOrFail({ id: ev.id })).status).toBe('logged');
  });
});

describe('pre-fault dissolved-gas sample with a session', () => {
  const preGas = { H2: 34.1, CH4: 16.4, C2H6: 10.6, C2H4: 6.4, C2H2: 0, CO: 366, CO2: 2875 };
  const postGas = { H2: 41.3, CH4: 17.2, C2H6: 10.9, C2H4: 6.8, C2H2: 0.4, CO: 391, CO2: 2985 };

  it('is stored as a routine set of the unit at its sampling time, audited, and is the case previous gas', async () => {
    const unit = await makeUnit(opened.env.db);
    // An older routine set with capacitance and gas: the newer pre-fault sample's gas wins, its capacitance stays.
    await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'routine', takenAt: '2024-06-20', capacitancePF: { CH: 3124 }, dissolvedGasPPM: { H2: 20, C2H2: 0 } }).expect(201);
    const ev = await logFault(unit.id);
    const res = await api()
      .post(`/api/events/${ev.id}/sessions`)
      .set(as.tester)
      .send({ takenAt: '2026-11-29T08:00:00Z', dissolvedGasPPM: postGas, preFaultGas: { takenAt: '2026-09-14T10:30:00Z', dissolvedGasPPM: preGas } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.preFaultGas).toMatchObject({ kind: 'routine', eventId: null, takenAt: '2026-09-14T10:30:00.000Z', values: { dissolvedGasPPM: preGas } });

    const sets = await setsOf(unit.id);
    expect(sets.map((s) => [s.kind, s.takenAt.toISOString(), s.eventId])).toEqual([
      ['routine', '2024-06-20T00:00:00.000Z', null],
      ['routine', '2026-09-14T10:30:00.000Z', null],
      ['post-fault', '2026-11-29T08:00:00.000Z', ev.id],
    ]);
    expect(sets[2].extra).toBeNull(); // the sample is not kept a second time inside the session
    const audited = await opened.env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'reading_set', entityId: String(sets[1].id), action: 'create' });
    expect(audited.note).toMatch(/pre-fault dissolved-gas sample/);

    const c = await exportCase(ev.id);
    expect(c.previous.dissolvedGasPPM).toEqual(preGas);
    expect(c.previous.capacitancePF).toEqual({ CH: 3124 });
    expect(c.previous.takenAt).toBe('2026-09-14T10:30:00Z');
    expect(c.postFault.dissolvedGasPPM).toEqual(postGas);
  });

  it('taken at or after the fault is a 400 naming preFaultGas.takenAt, and nothing is written', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    for (const takenAt of [FAULT_AT, '2026-11-28T09:00:00Z']) {
      const res = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', capacitancePF: { CH: 3131 }, preFaultGas: { takenAt, dissolvedGasPPM: preGas } });
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['preFaultGas.takenAt']);
      expect(res.body.error.fields['preFaultGas.takenAt']).toMatch(/before the fault/);
    }
    expect(await setsOf(unit.id)).toHaveLength(0);
    expect((await opened.env.db.getRepository(FaultEvent).findOneByOrFail({ id: ev.id })).status).toBe('logged');
  });

  it('without a time or a gas is a 400 naming the field', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const noTime = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', preFaultGas: { dissolvedGasPPM: preGas } });
    expect(Object.keys(noTime.body.error.fields)).toEqual(['preFaultGas.takenAt']);
    const noGas = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', preFaultGas: { takenAt: '2026-09-14', dissolvedGasPPM: {} } });
    expect(Object.keys(noGas.body.error.fields)).toEqual(['preFaultGas.dissolvedGasPPM']);
    expect(await setsOf(unit.id)).toHaveLength(0);
  });
});

describe('unit reading-set body', () => {
  it('stores the doubts and bushings of a reference or routine set, and the case baseline and previous carry them', async () => {
    const unit = await makeUnit(opened.env.db);
    const factory = await api()
      .post(`/api/units/${unit.id}/reading-sets`)
      .set(as.tester)
      .send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, capacitancePF: { CH: 3120 }, windingResistanceOhm: { A: 0.84 }, windingTemperatureC: 21, hoursDeEnergised: 48, bushings: { H1: { c1PF: 410.2, c1DissipationPercent: 0.29 } } });
    expect(factory.status, JSON.stringify(factory.body)).toBe(201);
    await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'routine', takenAt: '2024-06-20', demagnetised: false, excitationCurrentMA: { A: 28 }, excitationKV: 10, hoursDeenergised: 12 }).expect(201);
    const ev = await logFault(unit.id);
    await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', capacitancePF: { CH: 3131 } }).expect(201);
    const c = await exportCase(ev.id);
    expect(c.baseline).toMatchObject({ windingTemperatureC: 21, hoursDeEnergised: 48, bushings: { H1: { c1PF: 410.2, c1DissipationPercent: 0.29 } } });
    expect(c.previous).toMatchObject({ demagnetised: false, hoursDeEnergised: 12, excitationKV: 10 });
  });

  it('rejects a bad bushing with 400 naming it, and stores nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const res = await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'routine', takenAt: '2024-06-20', bushings: { H1: { c1PF: 'big' } }, demagnetised: 1 });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['bushings.H1.c1PF', 'demagnetised']);
    expect(await setsOf(unit.id)).toHaveLength(0);
  });
});

describe('readings CSV with the revision-2 quantities', () => {
  it('imports gases, bushings, excitation voltage and the winding temperature into the session and its case', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', windingTemperatureC: 20, bushings: { H2: { c1PF: 409.8, winding: 'hv' } } })).body;
    const csv = [
      'quantity,configuration,phase,value,unit',
      'gas,H2,,41.3,ppm',
      'gas,C2H2,,0.4,ppm',
      'bushing-c1,H1,,412.5,pF',
      'bushing-c2,H1,,3.88,nF',
      'bushing-c1-dissipation,H2,,0.30,%', // H2's C1 is already in the session
      'excitation-voltage,,,10,kV',
      'excitation-current,,A,28.9,mA',
      'winding-temperature,,,18.5,degC',
    ].join('\n');
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from(csv), 'readings.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.imported).toBe(8);
    expect((await opened.env.db.getRepository(ReadingSet).findOneByOrFail({ id: session.id })).windingTemperatureC).toBe(18.5);
    const audit = await opened.env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'reading_set', entityId: String(session.id), action: 'import' });
    expect(audit.before).toEqual({ windingTemperatureC: 20 });
    expect(audit.after).toMatchObject({ rows: 8, windingTemperatureC: 18.5 });

    const c = await exportCase(ev.id);
    expect(c.postFault).toMatchObject({
      dissolvedGasPPM: { H2: 41.3, C2H2: 0.4 },
      bushings: { H1: { c1PF: 412.5, c2PF: 3880 }, H2: { c1PF: 409.8, c1DissipationPercent: 0.3, winding: 'hv' } },
      excitationKV: 10,
      excitationCurrentMA: { A: 28.9 },
      windingTemperatureC: 18.5,
    });
  });

  it('rejects a bushing reading without its C1 (neither in the file nor in the session), and imports nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    const csv = 'quantity,configuration,phase,value,unit\ngas,H2,,41.3,ppm\nbushing-c2,H3,,3700,pF\nwinding-temperature,,,300,degC\n';
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from(csv), 'readings.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      'row 3.configuration': 'bushing H3 has no bushing-c1 row: give its C1 capacitance too',
      'row 4.value': 'must be 250 or less (degC: check the unit)',
    });
    expect(await opened.env.db.getRepository(Reading).countBy({ readingSetId: session.id })).toBe(0);
    expect((await opened.env.db.getRepository(ReadingSet).findOneByOrFail({ id: session.id })).windingTemperatureC).toBeNull();
  });
});

describe('sweep uploads: winding, phase, baseline tap', () => {
  async function withBaselineTrace(tap: string | null) {
    const unit = await makeUnit(opened.env.db);
    const factory = (await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'factory', takenAt: '2019-05-02', capacitancePF: { CH: 3120 } })).body;
    const req = api().post(`/api/units/${unit.id}/sweeps`).set(as.tester).field('label', 'HV-B-open').field('testType', 'open-circuit').field('readingSetId', String(factory.id)).field('winding', 'hv').field('phase', 'B');
    if (tap) req.field('tapPosition', tap);
    const base = await req.attach('file', Buffer.from(sweepCsv()), 'base.csv');
    expect(base.status, JSON.stringify(base.body)).toBe(201);
    expect(base.body).toMatchObject({ winding: 'hv', phase: 'B', tapPosition: tap, baselineTapPosition: null });
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    return { unit, ev, session };
  }

  it('stores them on the trace and exports them in the case sweep', async () => {
    const { ev, session } = await withBaselineTrace('9b');
    const res = await api()
      .post(`/api/sessions/${session.id}/sweeps`)
      .set(as.tester)
      .field('label', 'HV-B-open')
      .field('testType', 'open-circuit')
      .field('winding', 'hv')
      .field('phase', 'B')
      .field('tapPosition', '10')
      .field('baselineTapPosition', '9a')
      .field('demagnetised', 'true')
      .attach('file', Buffer.from(sweepCsv(0.4)), 'post.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ winding: 'hv', phase: 'B', tapPosition: '10', baselineTapPosition: '9a', demagnetised: true });
    expect(await opened.env.db.getRepository(SweepTrace).findOneByOrFail({ id: res.body.id })).toMatchObject({ winding: 'hv', phase: 'B', tapPosition: '10', baselineTapPosition: '9a' });
    const [sweep] = (await exportCase(ev.id)).sweeps;
    expect(sweep).toMatchObject({ label: 'HV-B-open', testType: 'open-circuit', winding: 'hv', phase: 'B', tapPosition: '10', baselineTapPosition: '9a', demagnetised: true });
    expect(sweep.baseline).toHaveLength(60);
  });

  it("default the baseline tap to the baseline trace's own tap, and winding and phase to the baseline trace's", async () => {
    const { ev, session } = await withBaselineTrace('9b');
    await api().post(`/api/sessions/${session.id}/sweeps`).set(as.tester).field('label', 'HV-B-open').field('testType', 'open-circuit').field('tapPosition', '9b').attach('file', Buffer.from(sweepCsv()), 'post.csv').expect(201);
    const [sweep] = (await exportCase(ev.id)).sweeps;
    expect(sweep).toMatchObject({ winding: 'hv', phase: 'B', tapPosition: '9b', baselineTapPosition: '9b' });
  });

  it('leave the baseline tap out when neither trace recorded one', async () => {
    const { ev, session } = await withBaselineTrace(null);
    await api().post(`/api/sessions/${session.id}/sweeps`).set(as.tester).field('label', 'HV-B-open').field('testType', 'open-circuit').attach('file', Buffer.from(sweepCsv()), 'post.csv').expect(201);
    const [sweep] = (await exportCase(ev.id)).sweeps;
    expect(sweep).not.toHaveProperty('baselineTapPosition');
    expect(sweep).not.toHaveProperty('tapPosition');
  });

  it('reject bad values with 400 naming each field, and store no trace', async () => {
    const { session } = await withBaselineTrace('9b');
    const res = await api()
      .post(`/api/sessions/${session.id}/sweeps`)
      .set(as.tester)
      .field('label', 'HV-B-open')
      .field('testType', 'open-circuit')
      .field('winding', 'mv')
      .field('phase', 'D')
      .field('baselineTapPosition', 'x'.repeat(21))
      .attach('file', Buffer.from(sweepCsv()), 'post.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ winding: 'hv, lv or tv', phase: 'A, B or C', baselineTapPosition: 'at most 20 characters' });
    expect(await opened.env.db.getRepository(SweepTrace).countBy({ readingSetId: session.id })).toBe(0);
  });

  it('refuse a baseline tap on a baseline trace (its tap is its tapPosition)', async () => {
    const unit = await makeUnit(opened.env.db);
    const factory = (await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'factory', takenAt: '2019-05-02', capacitancePF: { CH: 3120 } })).body;
    const res = await api().post(`/api/units/${unit.id}/sweeps`).set(as.tester).field('label', 'HV-A-open').field('testType', 'open-circuit').field('readingSetId', String(factory.id)).field('baselineTapPosition', '9b').attach('file', Buffer.from(sweepCsv()), 'base.csv');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['baselineTapPosition']);
    expect(await opened.env.db.getRepository(SweepTrace).countBy({ readingSetId: factory.id })).toBe(0);
  });
});
