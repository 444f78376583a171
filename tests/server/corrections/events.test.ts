import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { correctionsFlow, fault } from './flow.js';

const f = correctionsFlow();
const patch = (eventId: number, body: unknown, who = f.as.protection) => f.api().patch(`/api/events/${eventId}`).set(who).send(body as object);
const audits = (eventId: number) => f.env.db.getRepository(AuditEntry).find({ where: { entity: 'fault_event', entityId: String(eventId), action: 'update' }, order: { id: 'ASC' } });

describe('PATCH /api/events/:eventId', () => {
  it('changes only the fields named and answers the recomputed duty', async () => {
    const { eventId } = await f.event({ session: false });
    const before = (await f.api().get(`/api/events/${eventId}`).set(f.as.protection)).body;
    const res = await patch(eventId, { shots: [{ currentKA: 2, durationS: 0.1 }] });
    expect(res.status).toBe(200);
    expect(res.body.shots).toEqual([{ currentKA: 2, durationS: 0.1 }]);
    // Unnamed fields keep their values: defaults of the create schema (tripped, protections) are not applied again.
    const stored = await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId });
    expect(stored).toMatchObject({ type: 'three-phase', side: 'lv', notes: fault.notes, transformerTripped: true, status: 'logged' });
    expect(stored.occurredAt.toISOString()).toBe('2026-11-28T03:12:00.000Z');
    // Twice the current is four times the I²t (same duration).
    expect(res.body.throughFault.i2t / before.throughFault.i2t).toBeCloseTo(4, 6);
    expect(res.body.screeningStale).toBe(false);
  });

  it('keeps a transformerTripped: false and protections when another field is corrected', async () => {
    const { eventId } = await f.event({ session: false });
    await patch(eventId, { transformerTripped: false, protectionOperated: ['buchholz-alarm'] }).expect(200);
    await patch(eventId, { notes: 'Cable fault at 1.2 km' }).expect(200);
    const stored = await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId });
    expect(stored).toMatchObject({ transformerTripped: false, protectionOperated: ['buchholz-alarm'], notes: 'Cable fault at 1.2 km' });
  });

  it('audits the changed fields only, before and after', async () => {
    const { eventId } = await f.event({ session: false });
    await patch(eventId, { side: 'hv', type: 'three-phase', faultedPhases: 'ABC' }).expect(200);
    const rows = await audits(eventId);
    expect(rows).toHaveLength(1);
    expect(rows[0].before).toEqual({ side: 'lv', faultedPhases: null });
    expect(rows[0].after).toEqual({ side: 'hv', faultedPhases: 'ABC' });
    expect(rows[0].userId).not.toBeNull();
  });

  it('answers 400 naming the bad field and writes nothing', async () => {
    const { eventId } = await f.event({ session: false });
    for (const [body, field, message] of [
      [{ shots: [{ currentKA: 900, durationS: 0.1 }] }, 'shots.0.currentKA', 'above 500 kA: check the unit'],
      [{ faultedPhases: 'XYZ' }, 'faultedPhases', 'phases like A, BC or ABC'],
      [{ occurredAt: 'yesterday' }, 'occurredAt', 'not an ISO 8601 date or date-time'],
      [{ shots: [] }, 'shots', 'at least one shot'],
    ] as const) {
      const res = await patch(eventId, body);
      expect(res.status).toBe(400);
      expect(res.body.error.fields[field]).toBe(message);
    }
    const unknown = await patch(eventId, { unitId: 1 });
    expect(unknown.status).toBe(400);
    expect(Object.keys(unknown.body.error.fields).join(' ')).toMatch(/unitId|\(body\)/);
    expect(await audits(eventId)).toHaveLength(0);
    expect((await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).shots).toEqual(fault.shots);
  });

  it('moves a screened event back to testing when the correction changes its case, and says so', async () => {
    const { eventId } = await f.event();
    await f.screen(eventId);
    const notes = await patch(eventId, { notes: 'Only the notes' }).expect(200);
    expect(notes.body).toMatchObject({ status: 'screened', screeningStale: false, note: null });
    const res = await patch(eventId, { shots: [{ currentKA: 1.5, durationS: 0.1 }] }).expect(200);
    expect(res.body).toMatchObject({ status: 'testing', screeningStale: true });
    expect(res.body.note).toMatch(/new screening/);
  });

  it('answers 409 after a decision and changes nothing', async () => {
    const { eventId } = await f.event();
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const res = await patch(eventId, { notes: 'late' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('invalid_status');
    expect((await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).notes).toBe(fault.notes);
  });

  it('answers 409 for a held event that went back to testing (its screening was decided)', async () => {
    const { eventId } = await f.event();
    await f.decide(eventId, { outcome: 'hold', reason: 'Smell of burnt paper at the conservator breather.' });
    await f.api().post(`/api/events/${eventId}/sessions`).set(f.as.tester).send({ takenAt: '2026-12-01T08:00:00Z', capacitancePF: { CHL: 5210 } }).expect(201);
    expect((await patch(eventId, { notes: 'late' })).status).toBe(409);
  });

  it('answers 404 for an unknown event', async () => {
    expect((await patch(987654321, { notes: 'x' })).status).toBe(404);
  });

  it('lets protection and admin correct; refuses tester and manager with 403', async () => {
    const { eventId } = await f.event({ session: false });
    expect((await patch(eventId, { notes: 'by admin' }, f.as.admin)).status).toBe(200);
    for (const who of [f.as.tester, f.as.manager, f.as.engineer]) expect((await patch(eventId, { notes: 'no' }, who)).status).toBe(403);
  });
});
