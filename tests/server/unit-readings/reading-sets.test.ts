import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Reading } from '../../../server/features/readings/reading.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { SweepTrace } from '../../../server/features/readings/sweep-trace.entity.js';
import { sweepCsv } from '../../helpers/sweep-csv.js';
import { correctionsFlow } from '../corrections/flow.js';

const f = correctionsFlow();
const patch = (id: number, body: unknown, who = f.as.tester) => f.api().patch(`/api/reading-sets/${id}`).set(who).send(body as object);
const mark = (id: number, who = f.as.tester) => f.api().post(`/api/reading-sets/${id}/reference`).set(who).send({});
const updates = (id: number) => f.env.db.getRepository(AuditEntry).find({ where: { entity: 'reading_set', entityId: String(id), action: 'update' }, order: { id: 'ASC' } });
const stored = (id: number) => f.env.db.getRepository(ReadingSet).findOneByOrFail({ id });
const rowsOf = (id: number) => f.env.db.getRepository(Reading).find({ where: { readingSetId: id }, order: { quantity: 'ASC', configuration: 'ASC', phase: 'ASC' } });

const routine = {
  kind: 'routine',
  takenAt: '2024-04-10',
  temperatureC: 22,
  tapPosition: '9b',
  instrument: 'M4100',
  humidityPercent: 35,
  capacitancePF: { CH: 3125, CL: 9880, CHL: 5215 },
  dissolvedGasPPM: { H2: 12, CO: 210 },
};

/** A unit with a factory set and a logged fault (the flow's), plus one routine set stored by the API. */
async function unitWithSet(body: Record<string, unknown> = {}, opts: { session?: boolean } = { session: false }) {
  const { unitId, eventId } = await f.event(opts);
  const res = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ ...routine, ...body }).expect(201);
  const factory = await f.env.db.getRepository(ReadingSet).findOneByOrFail({ unitId, kind: 'factory' });
  return { unitId, eventId, setId: res.body.id as number, factoryId: factory.id };
}

describe('PATCH /api/reading-sets/:readingSetId', () => {
  it('changes only the fields named; other conditions and reading sections stay', async () => {
    const { setId } = await unitWithSet();
    const res = await patch(setId, { notes: 'Tested in light rain', capacitancePF: { CH: 3125, CL: 9880, CHL: 5290 } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: setId, kind: 'routine', notes: 'Tested in light rain', instrument: 'M4100', humidityPercent: 35, tapPosition: '9b', temperatureC: 22 });
    expect(res.body.values.capacitancePF).toEqual({ CH: 3125, CL: 9880, CHL: 5290 });
    expect(res.body.values.dissolvedGasPPM).toEqual(routine.dissolvedGasPPM);
    expect(await stored(setId)).toMatchObject({ notes: 'Tested in light rain', instrument: 'M4100', humidityPercent: 35, isReference: false });
    const chl = (await rowsOf(setId)).filter((r) => r.quantity === 'capacitance' && r.configuration === 'CHL');
    expect(chl.map((r) => r.value)).toEqual([5290]);
  });

  it('audits the changed fields only, before and after', async () => {
    const { setId } = await unitWithSet();
    await patch(setId, { humidityPercent: 50, dissolvedGasPPM: { H2: 15, CO: 210 }, instrument: 'M4100' }).expect(200);
    const rows = await updates(setId);
    expect(rows).toHaveLength(1);
    expect(rows[0].before).toEqual({ humidityPercent: 35, dissolvedGasPPM: { H2: 12, CO: 210 } });
    expect(rows[0].after).toEqual({ humidityPercent: 50, dissolvedGasPPM: { H2: 15, CO: 210 } });
    expect(rows[0].note).toBe('Reading set corrected');
  });

  it('clears a condition given null and removes a section given null', async () => {
    const { setId } = await unitWithSet();
    const res = await patch(setId, { instrument: null, dissolvedGasPPM: null }).expect(200);
    expect(res.body.instrument).toBeNull();
    expect(res.body.values.dissolvedGasPPM).toBeUndefined();
    expect(res.body.values.capacitancePF).toEqual(routine.capacitancePF);
    expect((await rowsOf(setId)).some((r) => r.quantity === 'gas')).toBe(false);
  });

  it('answers 409 for a set a decided screening used as its baseline, and changes nothing', async () => {
    const { eventId, factoryId } = await unitWithSet({}, { session: true });
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const before = await rowsOf(factoryId);
    const res = await patch(factoryId, { capacitancePF: { CH: 1, CL: 2, CHL: 3 } });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Record a new set instead/);
    expect(await rowsOf(factoryId)).toEqual(before);
    expect(await updates(factoryId)).toHaveLength(0);
  });

  it('corrects a set taken after the decided fault (no screening used it)', async () => {
    const { eventId, unitId } = await unitWithSet({}, { session: true });
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const later = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ ...routine, takenAt: '2026-12-01' }).expect(201);
    expect((await patch(later.body.id, { notes: 'After re-energising' })).status).toBe(200);
    // Moved before the decided fault it would become one of that screening's inputs: refused.
    expect((await patch(later.body.id, { takenAt: '2026-01-05' })).status).toBe(409);
    expect((await stored(later.body.id)).takenAt.toISOString()).toBe('2026-12-01T00:00:00.000Z');
  });

  it('moves a screened event whose case changed back to testing and says so', async () => {
    const { eventId, factoryId } = await unitWithSet({}, { session: true });
    await f.screen(eventId);
    const res = await patch(factoryId, { capacitancePF: { CH: 3000, CL: 9870, CHL: 5210 } }).expect(200);
    expect(res.body.staleEventIds).toEqual([eventId]);
    expect(res.body.note).toMatch(/new screening/);
    expect((await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).status).toBe('testing');
  });

  it('answers 400 naming the bad field and writes nothing', async () => {
    const { setId } = await unitWithSet();
    const before = await rowsOf(setId);
    const res = await patch(setId, { humidityPercent: 140, capacitancePF: { CH: -5 }, notes: 'never stored' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['capacitancePF.CH', 'humidityPercent']);
    const unknown = await patch(setId, { isReference: true });
    expect(unknown.status).toBe(400);
    expect(JSON.stringify(unknown.body.error.fields)).toMatch(/isReference/);
    expect(await stored(setId)).toMatchObject({ humidityPercent: 35, notes: null, isReference: false });
    expect(await rowsOf(setId)).toEqual(before);
    expect(await updates(setId)).toHaveLength(0);
  });

  it('answers 404 for an unknown set and 409 for a post-fault session', async () => {
    const { sessionId } = await f.event();
    expect((await patch(987654321, { notes: 'x' })).status).toBe(404);
    const res = await patch(sessionId, { notes: 'x' });
    expect(res.status).toBe(409);
    expect((await stored(sessionId)).notes).toBeNull();
  });

  it('lets a tester and an admin correct; refuses protection, manager and engineer with 403', async () => {
    const { setId } = await unitWithSet();
    expect((await patch(setId, { notes: 'by the admin' }, f.as.admin)).status).toBe(200);
    for (const who of [f.as.protection, f.as.manager, f.as.engineer]) expect((await patch(setId, { notes: 'refused' }, who)).status).toBe(403);
    expect((await f.api().patch(`/api/reading-sets/${setId}`).send({ notes: 'x' })).status).toBe(401);
    expect((await stored(setId)).notes).toBe('by the admin');
  });
});

describe('POST /api/reading-sets/:readingSetId/reference', () => {
  it('marks the set and unmarks the unit\'s previous reference of that kind in the same request, both audited', async () => {
    const { unitId, setId } = await unitWithSet();
    const second = (await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ ...routine, takenAt: '2025-04-10' }).expect(201)).body.id as number;
    const first = await mark(setId);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ id: setId, isReference: true, unmarkedIds: [] });
    const moved = await mark(second);
    expect(moved.status).toBe(200);
    expect(moved.body).toMatchObject({ id: second, isReference: true, unmarkedIds: [setId] });
    expect((await stored(setId)).isReference).toBe(false);
    expect((await stored(second)).isReference).toBe(true);
    const refs = await f.env.db.getRepository(ReadingSet).findBy({ unitId, kind: 'routine', isReference: true });
    expect(refs.map((s) => s.id)).toEqual([second]);
    const firstAudits = await updates(setId);
    expect(firstAudits.map((a) => [a.before, a.after])).toEqual([
      [{ isReference: false }, { isReference: true }],
      [{ isReference: true }, { isReference: false }],
    ]);
    expect(firstAudits[1].note).toBe(`Reference moved to reading set ${second}`);
    expect((await updates(second)).map((a) => a.after)).toEqual([{ isReference: true }]);
  });

  it('keeps one reference per kind: the unit\'s factory reference stays when a routine set is marked', async () => {
    const { unitId, setId, factoryId } = await unitWithSet();
    await mark(factoryId).expect(200);
    await mark(setId).expect(200);
    const refs = await f.env.db.getRepository(ReadingSet).find({ where: { unitId, isReference: true }, order: { id: 'ASC' } });
    expect(refs.map((s) => [s.id, s.kind])).toEqual([
      [factoryId, 'factory'],
      [setId, 'routine'],
    ]);
  });

  it('unmarks the previous reference when a new set of that kind is stored already marked', async () => {
    const { unitId, setId } = await unitWithSet();
    await mark(setId).expect(200);
    const added = await f.api().post(`/api/units/${unitId}/reading-sets`).set(f.as.tester).send({ ...routine, takenAt: '2025-09-01', isReference: true }).expect(201);
    expect((await stored(setId)).isReference).toBe(false);
    expect((await stored(added.body.id)).isReference).toBe(true);
  });

  it('marking the reference again changes and audits nothing', async () => {
    const { setId } = await unitWithSet();
    await mark(setId).expect(200);
    const again = await mark(setId);
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ isReference: true, unmarkedIds: [] });
    expect(await updates(setId)).toHaveLength(1);
  });

  it('answers 409 for a post-fault session, 404 for an unknown set, 400 naming a bad id', async () => {
    const { sessionId } = await f.event();
    expect((await mark(sessionId)).status).toBe(409);
    expect((await stored(sessionId)).isReference).toBe(false);
    expect((await mark(987654321)).status).toBe(404);
    const bad = await f.api().post('/api/reading-sets/abc/reference').set(f.as.tester).send({});
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['params.readingSetId']);
  });

  it('lets a tester and an admin mark; refuses protection, manager and engineer with 403 and marks nothing', async () => {
    const { setId } = await unitWithSet();
    for (const who of [f.as.protection, f.as.manager, f.as.engineer]) expect((await mark(setId, who)).status).toBe(403);
    expect((await stored(setId)).isReference).toBe(false);
    expect((await mark(setId, f.as.admin)).status).toBe(200);
    expect((await stored(setId)).isReference).toBe(true);
  });
});

describe('DELETE /api/sweeps/:sweepId', () => {
  const upload = (unitId: number, setId: number) =>
    f.api().post(`/api/units/${unitId}/sweeps`).set(f.as.tester).field('label', 'HV-A-open').field('testType', 'open-circuit').field('readingSetId', String(setId)).attach('file', Buffer.from(sweepCsv()), 'base.csv');
  const remove = (id: number, who = f.as.tester) => f.api().delete(`/api/sweeps/${id}`).set(who);
  const traces = (setId: number) => f.env.db.getRepository(SweepTrace).findBy({ readingSetId: setId });

  it('removes a trace uploaded to a unit set, audited with its description and checksum', async () => {
    const { unitId, setId } = await unitWithSet();
    const up = await upload(unitId, setId).expect(201);
    const res = await remove(up.body.id);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: up.body.id, readingSetId: setId, removed: true, staleEventIds: [] });
    expect(await traces(setId)).toEqual([]);
    const rows = await f.env.db.getRepository(AuditEntry).findBy({ entity: 'sweep_trace', entityId: String(up.body.id), action: 'delete' });
    expect(rows).toHaveLength(1);
    expect(rows[0].before).toMatchObject({ label: 'HV-A-open', testType: 'open-circuit', sha256: up.body.sha256 });
    expect(rows[0].note).toBe('Sweep trace removed');
  });

  it('answers 409 for a trace of a set a decided screening used, and keeps it', async () => {
    const { unitId, eventId, factoryId } = await unitWithSet({}, { session: true });
    const up = await upload(unitId, factoryId).expect(201);
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const res = await remove(up.body.id);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Upload the trace to a new set instead/);
    expect((await traces(factoryId)).map((t) => t.id)).toContain(up.body.id);
  });

  it('answers 404 for an unknown trace and refuses protection, manager and engineer with 403', async () => {
    expect((await remove(987654321)).status).toBe(404);
    const { unitId, setId } = await unitWithSet();
    const up = await upload(unitId, setId).expect(201);
    for (const who of [f.as.protection, f.as.manager, f.as.engineer]) expect((await remove(up.body.id, who)).status).toBe(403);
    expect(await traces(setId)).toHaveLength(1);
  });
});
