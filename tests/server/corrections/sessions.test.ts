import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Reading } from '../../../server/features/readings/reading.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { correctionsFlow, session } from './flow.js';

const f = correctionsFlow();
const patch = (sessionId: number, body: unknown, who = f.as.tester) => f.api().patch(`/api/sessions/${sessionId}`).set(who).send(body as object);
const audits = (sessionId: number) => f.env.db.getRepository(AuditEntry).find({ where: { entity: 'reading_set', entityId: String(sessionId), action: 'update' }, order: { id: 'ASC' } });
const status = async (eventId: number) => (await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).status;

describe('PATCH /api/sessions/:sessionId', () => {
  it('changes only the conditions named; the readings and other conditions stay', async () => {
    const { sessionId } = await f.event();
    const res = await patch(sessionId, { humidityPercent: 55, notes: 'Rain during the test' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ humidityPercent: 55, notes: 'Rain during the test', instrument: 'M4100', tapPosition: '9b', temperatureC: 28 });
    expect(res.body.values.capacitancePF).toEqual(session.capacitancePF);
    const stored = await f.env.db.getRepository(ReadingSet).findOneByOrFail({ id: sessionId });
    expect(stored).toMatchObject({ humidityPercent: 55, instrument: 'M4100', tapPosition: '9b' });
  });

  it('replaces a reading section named, keeps the others, and audits before and after of what changed', async () => {
    const { sessionId } = await f.event();
    const res = await patch(sessionId, { capacitancePF: { CH: 3120, CL: 9870, CHL: 5300 } }).expect(200);
    expect(res.body.values.capacitancePF).toEqual({ CH: 3120, CL: 9870, CHL: 5300 });
    expect(res.body.values.reactance).toEqual(session.reactance);
    const chl = await f.env.db.getRepository(Reading).findBy({ readingSetId: sessionId, quantity: 'capacitance', configuration: 'CHL' });
    expect(chl.map((r) => r.value)).toEqual([5300]);
    const rows = await audits(sessionId);
    expect(rows).toHaveLength(1);
    expect(rows[0].before).toEqual({ capacitancePF: session.capacitancePF });
    expect(rows[0].after).toEqual({ capacitancePF: { CH: 3120, CL: 9870, CHL: 5300 } });
  });

  it('clears a condition given null', async () => {
    const { sessionId } = await f.event();
    const res = await patch(sessionId, { instrument: null }).expect(200);
    expect(res.body.instrument).toBeNull();
    expect((await audits(sessionId))[0].before).toEqual({ instrument: 'M4100' });
  });

  it('answers 400 naming the bad field and writes nothing', async () => {
    const { sessionId } = await f.event();
    for (const [body, field] of [
      [{ humidityPercent: 140 }, 'humidityPercent'],
      [{ capacitancePF: { CHL: -5 } }, 'capacitancePF.CHL'],
      [{ takenAt: 'soon' }, 'takenAt'],
      [{ windingTemperatureC: 400 }, 'windingTemperatureC'],
    ] as const) {
      const res = await patch(sessionId, body);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toContain(field);
    }
    expect(await audits(sessionId)).toHaveLength(0);
    expect((await f.env.db.getRepository(ReadingSet).findOneByOrFail({ id: sessionId })).humidityPercent).toBe(40);
  });

  it('moves a screened event back to testing when readings change, and says so; a note alone does not', async () => {
    const { eventId, sessionId } = await f.event();
    await f.screen(eventId);
    const notes = await patch(sessionId, { notes: 'Checked the leads' }).expect(200);
    expect(notes.body).toMatchObject({ eventStatus: 'screened', screeningStale: false, note: null });
    const res = await patch(sessionId, { capacitancePF: { CH: 3120, CL: 9870, CHL: 5392.35 } }).expect(200);
    expect(res.body).toMatchObject({ eventStatus: 'testing', screeningStale: true });
    expect(res.body.note).toMatch(/new screening/);
    expect(await status(eventId)).toBe('testing');
    const rescreen = await f.screen(eventId);
    expect(rescreen.recommendation).toBe('conditional');
  });

  it('answers 409 once the screening that used the session is decided ("record a new session instead")', async () => {
    const { eventId, sessionId } = await f.event();
    await f.decide(eventId, { outcome: 'hold', reason: 'Smell of burnt paper at the conservator breather.' });
    const res = await patch(sessionId, { humidityPercent: 60 });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/new session instead/);
    expect((await f.env.db.getRepository(ReadingSet).findOneByOrFail({ id: sessionId })).humidityPercent).toBe(40);
    // The re-test session after the hold is not an input of the decided screening: it may be corrected.
    const retest = (await f.api().post(`/api/events/${eventId}/sessions`).set(f.as.tester).send({ takenAt: '2026-12-01T08:00:00Z', capacitancePF: { CHL: 5210 } }).expect(201)).body;
    expect((await patch(retest.id, { humidityPercent: 60 })).status).toBe(200);
    expect((await patch(sessionId, { humidityPercent: 60 })).status).toBe(409);
  });

  it('answers 404 for an unknown session or a unit reading set', async () => {
    expect((await patch(987654321, { notes: 'x' })).status).toBe(404);
    const { unitId } = await f.event({ session: false });
    const factorySet = await f.env.db.getRepository(ReadingSet).findOneByOrFail({ unitId, kind: 'factory' });
    expect((await patch(factorySet.id, { notes: 'x' })).status).toBe(404);
  });

  it('lets tester and admin correct; refuses protection and manager with 403', async () => {
    const { sessionId } = await f.event();
    expect((await patch(sessionId, { notes: 'by admin' }, f.as.admin)).status).toBe(200);
    for (const who of [f.as.protection, f.as.manager, f.as.engineer]) expect((await patch(sessionId, { notes: 'no' }, who)).status).toBe(403);
  });
});
