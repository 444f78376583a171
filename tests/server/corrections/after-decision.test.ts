import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Decision } from '../../../server/features/screenings/decision.entity.js';
import { FollowUp } from '../../../server/features/screenings/follow-up.entity.js';
import { correctionsFlow } from './flow.js';

const f = correctionsFlow();
const HOUR = 3600_000;
const energised = (eventId: number, at: string, who = f.as.manager) => f.api().post(`/api/events/${eventId}/energised`).set(who).send({ at });
const lift = (eventId: number, reason: string, who = f.as.manager) => f.api().post(`/api/events/${eventId}/restrictions/lift`).set(who).send({ reason });
const dueOf = async (eventId: number) =>
  Object.fromEntries((await f.env.db.getRepository(FollowUp).find({ where: { eventId } })).map((t) => [t.task, t.dueAt?.toISOString() ?? null]));

describe('POST /api/events/:eventId/energised', () => {
  it('stores the time and counts the follow-ups proposed from the decision again from it', async () => {
    const { eventId } = await f.event();
    const { signedAt } = await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const before = await dueOf(eventId);
    const gas24 = Object.keys(before).find((t) => /24 h after re-energising/.test(t))!;
    expect(new Date(before[gas24]!).getTime() - new Date(signedAt).getTime()).toBe(24 * HOUR);
    // Re-energised five hours after the decision (the clock is already past it).
    f.clock.set(new Date(new Date(signedAt).getTime() + 8 * HOUR));
    const at = new Date(new Date(signedAt).getTime() + 5 * HOUR).toISOString();
    const res = await energised(eventId, at);
    expect(res.status).toBe(200);
    expect(res.body.energisedAt).toBe(at);
    const after = await dueOf(eventId);
    expect(new Date(after[gas24]!).getTime() - new Date(at).getTime()).toBe(24 * HOUR);
    const week = Object.keys(after).find((t) => /1 week after re-energising/.test(t))!;
    expect(new Date(after[week]!).getTime() - new Date(at).getTime()).toBe(7 * 24 * HOUR);
    // A sweep at the next outage has no due date before and after.
    const sweep = Object.keys(after).find((t) => /next outage/.test(t));
    if (sweep) expect(after[sweep]).toBeNull();
    expect((await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).energisedAt?.toISOString()).toBe(at);
    const entry = await f.env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'fault_event', entityId: String(eventId), note: 'Re-energised' });
    expect(entry.before).toEqual({ energisedAt: null });
    expect(entry.after).toEqual({ energisedAt: at });
    const recount = await f.env.db.getRepository(AuditEntry).findBy({ entity: 'follow_up', note: 'Counted from re-energising' });
    expect(recount.some((r) => (r.before as { dueAt: string }).dueAt === before[gas24])).toBe(true);
  });

  it('leaves a due date the manager set as it was', async () => {
    const { eventId } = await f.event();
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.', followUps: [{ task: 'Dissolved-gas sample 24 h after re-energising', dueAt: '2026-12-20T09:00:00.000Z' }] });
    const res = await energised(eventId, f.clock.now().toISOString()).expect(200);
    expect(res.body.followUps.map((t: { dueAt: string | null }) => t.dueAt)).toEqual(['2026-12-20T09:00:00.000Z']);
  });

  it('leaves a closed follow-up as it was', async () => {
    const { eventId } = await f.event();
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const before = await f.env.db.getRepository(FollowUp).find({ where: { eventId }, order: { id: 'ASC' } });
    const closed = before.find((t) => /24 h after re-energising/.test(t.task))!;
    await f.api().post(`/api/follow-ups/${closed.id}/close`).set(f.as.tester).send({ result: 'Sampled.' }).expect(200);
    f.clock.advance(HOUR);
    await energised(eventId, f.clock.now().toISOString()).expect(200);
    const after = await f.env.db.getRepository(FollowUp).findOneByOrFail({ id: closed.id });
    expect(after.dueAt?.toISOString()).toBe(closed.dueAt?.toISOString());
    const week = (await f.env.db.getRepository(FollowUp).find({ where: { eventId } })).find((t) => /1 week after re-energising/.test(t.task))!;
    expect(week.dueAt!.getTime() - f.clock.now().getTime()).toBe(7 * 24 * HOUR);
  });

  it('answers 409 for an event that is not released, a time before the decision or in the future; nothing stored', async () => {
    const { eventId } = await f.event();
    expect((await energised(eventId, f.clock.now().toISOString())).status).toBe(409);
    const { signedAt } = await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const early = await energised(eventId, new Date(new Date(signedAt).getTime() - HOUR).toISOString());
    expect(early.status).toBe(409);
    expect(early.body.error.fields.at).toMatch(/before the decision/);
    const future = await energised(eventId, new Date(f.clock.now().getTime() + HOUR).toISOString());
    expect(future.status).toBe(409);
    expect(future.body.error.fields.at).toMatch(/future/);
    expect((await f.env.db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).energisedAt).toBeNull();
  });

  it('accepts a time typed to the minute of the signature (seconds before it) and names the signing time in site time when earlier', async () => {
    const { eventId } = await f.event();
    // Sign 40 s into a minute: the form sends whole minutes, so the minute of the signature must be accepted.
    f.clock.set(new Date(Math.floor(f.clock.now().getTime() / 60_000) * 60_000 + 40_000));
    const { signedAt } = await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    const minute = Math.floor(new Date(signedAt).getTime() / 60_000) * 60_000;
    const early = await energised(eventId, new Date(minute - 60_000).toISOString());
    expect(early.status).toBe(409);
    expect(early.body.error.fields.at).toMatch(/^before the decision, which was signed \d{4}-\d{2}-\d{2} \d{2}:\d{2} /);
    await energised(eventId, new Date(minute).toISOString()).expect(200);
  });

  it('answers 400 naming `at` for a time that is not a date, 404 for an unknown event, 403 for a tester', async () => {
    const { eventId } = await f.event();
    const bad = await energised(eventId, 'later');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.at).toBe('not an ISO 8601 date-time');
    expect((await energised(987654321, f.clock.now().toISOString())).status).toBe(404);
    expect((await energised(eventId, f.clock.now().toISOString(), f.as.tester)).status).toBe(403);
  });
});

describe('restrictions after a release with restrictions', () => {
  it('are active on the unit (fleet list, unit file, event file) until lifted; the lift is audited', async () => {
    const { unitId, eventId } = await f.event();
    await f.decide(eventId, { outcome: 'release-with-restrictions', reason: 'Readings unchanged; cautious.', restrictions: 'Load below 80 %; reclosing blocked' });
    const listed = async () => (await f.api().get(`/api/units?q=${encodeURIComponent((await f.api().get(`/api/units/${unitId}`).set(f.as.engineer)).body.serial)}`).set(f.as.engineer)).body.items[0];
    expect((await listed()).activeRestrictions).toBe('Load below 80 %; reclosing blocked');
    expect((await f.api().get(`/api/units/${unitId}`).set(f.as.engineer)).body.activeRestrictions).toBe('Load below 80 %; reclosing blocked');
    expect((await f.api().get(`/api/events/${eventId}`).set(f.as.engineer)).body).toMatchObject({ activeRestrictions: 'Load below 80 %; reclosing blocked', restrictionsLifted: null });

    const res = await lift(eventId, 'Cable repaired; load limit no longer needed.');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ eventId, restrictions: 'Load below 80 %; reclosing blocked', reason: 'Cable repaired; load limit no longer needed.', liftedAt: f.clock.now().toISOString() });
    expect((await listed()).activeRestrictions).toBeNull();
    expect((await f.api().get(`/api/units/${unitId}`).set(f.as.engineer)).body.activeRestrictions).toBeNull();
    const file = (await f.api().get(`/api/events/${eventId}`).set(f.as.engineer)).body;
    expect(file.activeRestrictions).toBeNull();
    expect(file.restrictionsLifted).toMatchObject({ reason: 'Cable repaired; load limit no longer needed.' });
    const entry = await f.env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'fault_event', entityId: String(eventId), note: 'Restrictions lifted' });
    expect(entry.before).toMatchObject({ restrictions: 'Load below 80 %; reclosing blocked' });
    expect(entry.after).toMatchObject({ reason: 'Cable repaired; load limit no longer needed.' });

    expect((await lift(eventId, 'again')).status).toBe(409);
  });

  it('answers 409 when there are none to lift, 400 naming reason, 403 for an engineer, 404 for an unknown event', async () => {
    const { eventId } = await f.event();
    await f.decide(eventId, { outcome: 'release', reason: 'Readings unchanged.' });
    expect((await lift(eventId, 'nothing')).status).toBe(409);
    const blank = await lift(eventId, '  ');
    expect(blank.status).toBe(400);
    expect(blank.body.error.fields.reason).toBe('required');
    expect((await lift(eventId, 'x', f.as.engineer)).status).toBe(403);
    expect((await lift(987654321, 'x')).status).toBe(404);
    expect(await f.env.db.getRepository(Decision).countBy({ restrictionsLiftReason: 'nothing' })).toBe(0);
  });
});
