import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { systemClock } from '../../../server/common/clock.js';
import { createApp } from '../../../server/app.js';
import { createTransport } from '../../../server/mail/mailer.js';
import { startMailSink, type MailSink } from '../../../server/mail/sink.js';
import { SinkMessage } from '../../../server/mail/sink-message.entity.js';
import { Notification } from '../../../server/features/notifications/notification.entity.js';
import { deliverDueNotifications } from '../../../server/features/notifications/notifications.service.js';
import { Decision } from '../../../server/features/screenings/decision.entity.js';
import { decide } from '../../../server/features/screenings/screenings.service.js';
import { Site } from '../../../server/features/sites/site.entity.js';
import { CAUTIONS } from '../../../shared/screening/cautions.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeSite, makeUnit } from '../../helpers/factories.js';

// The decision's mail (control room and testers), resending a mail, and a mail's PDF from the outbox.

let env: TestEnv;
let sink: MailSink;
let tester: { Authorization: string };
let testerEmail: string;
let protection: { Authorization: string };
let manager: { Authorization: string };
let managerId: number;
let managerName: string;
let admin: { Authorization: string };
let engineer: { Authorization: string };
let siteId: number;
const controlRoom = `control-${Date.now()}@grid.example`;

beforeAll(async () => {
  env = await openTestEnv({ mailSinkRunning: true });
  const t = await createTestUser(env.db, ['tester']);
  tester = bearer(env.config, t.id);
  testerEmail = t.email;
  protection = bearer(env.config, (await createTestUser(env.db, ['protection'])).id);
  const mgr = await createTestUser(env.db, ['manager'], { name: 'Mira Manager' });
  manager = bearer(env.config, mgr.id);
  managerName = mgr.name;
  managerId = mgr.id;
  admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
  engineer = bearer(env.config, (await createTestUser(env.db, ['engineer'])).id);
  siteId = (await makeSite(env.db, { controlRoomEmail: controlRoom })).id;
  sink = await startMailSink(env.db, 0);
});
afterAll(async () => {
  await sink.close();
  await env.db.destroy();
});

const api = () => request(env.app);
const mailer = () => ({ transport: createTransport({ ...env.config, SMTP_HOST: undefined }, sink.port), from: 'gapsight@localhost' });

// Invented readings of a 40 MVA 132/33 kV unit; CHL +3.5 % against 5210 pF gives a conditional (brief, indicator 1).
async function screenedEvent() {
  const unit = await makeUnit(env.db, { siteId });
  await api()
    .post(`/api/units/${unit.id}/reading-sets`)
    .set(tester)
    .send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } })
    .expect(201);
  const ev = (await api().post('/api/events').set(protection).send({ unitId: unit.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }] })).body;
  await api()
    .post(`/api/events/${ev.id}/sessions`)
    .set(tester)
    .send({ takenAt: '2026-11-29T08:00:00Z', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5392.35 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } })
    .expect(201);
  const s = await api().post(`/api/events/${ev.id}/screenings`).set(tester).send({}).expect(201);
  expect(s.body.result.recommendation).toBe('conditional');
  return { eventId: ev.id as number, screeningId: s.body.id as number, serial: unit.serial };
}

const decisionMail = (eventId: number) => env.db.getRepository(Notification).find({ where: { eventId, kind: 'decision' }, order: { id: 'ASC' } });

/** Sends this event's due mail through the local sink (mail queued by other tests is parked first). */
async function deliver(eventId: number) {
  await env.db.query("UPDATE notification SET nextAttemptAt = NULL WHERE status IN ('queued', 'failed') AND (eventId IS NULL OR eventId <> ?)", [eventId]);
  return deliverDueNotifications(env.db, systemClock, mailer(), 'http://127.0.0.1:8640');
}

const reason = 'CHL shift within the investigate band; DGA clean, load kept under 80 % until the FRA is done.';

describe('sites: controlRoomEmail', () => {
  it('is stored on create, cleared with null on patch, and a bad address is a 400 naming it with nothing written', async () => {
    const name = `Control ${Date.now()}`;
    const made = await api().post('/api/sites').set(admin).send({ name, timeZone: 'Europe/London', controlRoomEmail: 'desk@grid.example' }).expect(201);
    expect(made.body.controlRoomEmail).toBe('desk@grid.example');
    const cleared = await api().patch(`/api/sites/${made.body.id}`).set(admin).send({ controlRoomEmail: null }).expect(200);
    expect(cleared.body.controlRoomEmail).toBeNull();
    const bad = await api().post('/api/sites').set(admin).send({ name: `${name} B`, timeZone: 'Europe/London', controlRoomEmail: 'not an address' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('controlRoomEmail');
    expect(await env.db.getRepository(Site).existsBy({ name: `${name} B` })).toBe(false);
  });
});

describe('the decision mail', () => {
  it('is queued with the decision for the control room and the tester who entered the sessions', async () => {
    const { eventId, screeningId } = await screenedEvent();
    await api().post(`/api/screenings/${screeningId}/decision`).set(manager).send({ outcome: 'release-with-restrictions', restrictions: 'Load below 80 %', reason }).expect(201);
    const rows = await decisionMail(eventId);
    expect(rows.map((r) => r.to).sort()).toEqual([controlRoom, testerEmail].sort());
    expect(rows.every((r) => r.status === 'queued' && r.screeningId === screeningId)).toBe(true);
  });

  it("is written by the decision's transaction: rolled back with it, nothing queued", async () => {
    const { eventId, screeningId } = await screenedEvent();
    const rollback = new Error('roll back');
    await expect(
      env.db.transaction(async (m) => {
        await decide(m, systemClock, managerId, screeningId, { outcome: 'release-with-restrictions', restrictions: 'Load below 80 %', reason });
        expect(await m.getRepository(Notification).countBy({ eventId, kind: 'decision' })).toBe(2);
        throw rollback;
      }),
    ).rejects.toBe(rollback);
    expect(await decisionMail(eventId)).toEqual([]);
    expect(await env.db.getRepository(Decision).countBy({ screeningId })).toBe(0);
  });

  it('is not queued when the decision is refused', async () => {
    const { eventId, screeningId } = await screenedEvent();
    // A plain release of a conditional needs a 20-character reason: refused, nothing written.
    await api().post(`/api/screenings/${screeningId}/decision`).set(manager).send({ outcome: 'release', reason: 'ok' }).expect(400);
    expect(await decisionMail(eventId)).toEqual([]);
  });

  it('is delivered through the sink with outcome, restrictions, reason, signer, the recommendation followed, the cautions and the PDF', async () => {
    const { eventId, screeningId, serial } = await screenedEvent();
    await api().post(`/api/screenings/${screeningId}/decision`).set(manager).send({ outcome: 'release-with-restrictions', restrictions: 'Load below 80 %', reason }).expect(201);
    await deliver(eventId);
    const sent = await decisionMail(eventId);
    expect(sent.map((n) => n.status)).toEqual(['sent', 'sent']);
    const msg = await env.db.getRepository(SinkMessage).findOneOrFail({ where: { to: controlRoom, subject: `[Gapsight] Decision: RELEASE WITH RESTRICTIONS — ${serial} (${(await env.db.getRepository(Site).findOneByOrFail({ id: siteId })).name})` }, order: { id: 'DESC' } });
    expect(msg.text).toContain('Release with restrictions');
    expect(msg.text).toContain('Load below 80 %');
    expect(msg.text).toContain(reason);
    expect(msg.text).toContain(`By ${managerName}`);
    expect(msg.text).toContain("follows the screening's CONDITIONAL recommendation");
    for (const c of CAUTIONS) expect(msg.text.replace(/\s+/g, ' ')).toContain(c);
    expect(msg.attachments[0].contentType).toBe('application/pdf');
  });
});

describe('POST /api/notifications/:notificationId/resend', () => {
  it('queues a fresh copy (a new row, audited) for a manager and an admin; a tester is refused; an unknown mail is a 404', async () => {
    const { eventId } = await screenedEvent();
    const original = await env.db.getRepository(Notification).findOneByOrFail({ eventId, kind: 'screening' });
    const res = await api().post(`/api/notifications/${original.id}/resend`).set(manager).expect(201);
    expect(res.body).toMatchObject({ resentFrom: original.id, kind: 'screening', to: original.to, status: 'queued', eventId });
    expect(res.body.id).not.toBe(original.id);
    const copy = await env.db.getRepository(Notification).findOneByOrFail({ id: res.body.id });
    expect(copy).toMatchObject({ status: 'queued', attempts: 0, to: original.to, screeningId: original.screeningId });
    const entry = await env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'notification', entityId: String(copy.id) });
    expect(entry.action).toBe('create');
    expect(entry.after).toMatchObject({ resentFrom: original.id });
    await api().post(`/api/notifications/${original.id}/resend`).set(admin).expect(201);
    const before = await env.db.getRepository(Notification).countBy({ eventId });
    await api().post(`/api/notifications/${original.id}/resend`).set(tester).expect(403);
    await api().post('/api/notifications/999999999/resend').set(manager).expect(404);
    expect(await env.db.getRepository(Notification).countBy({ eventId })).toBe(before);
  });
});

describe('GET /api/dev/outbox/:messageId/attachments/:index', () => {
  it("answers a delivered mail's PDF with a safe attachment disposition; an unknown index is a 404; engineers are refused", async () => {
    const { eventId } = await screenedEvent();
    await deliver(eventId);
    const list = await api().get('/api/dev/outbox').set(manager).expect(200);
    const msg = (list.body as { id: number; text: string; attachments: { filename: string }[] }[]).find((x) => x.text.includes(`/events/${eventId}`) && x.attachments.length);
    expect(msg).toBeDefined();
    const res = await api()
      .get(`/api/dev/outbox/${msg!.id}/attachments/0`)
      .set(admin)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    expect(res.headers['content-type']).toMatch(/^application\/pdf/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="[^"\r\n]+\.pdf"/);
    expect((res.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    await api().get(`/api/dev/outbox/${msg!.id}/attachments/7`).set(manager).expect(404);
    await api().get(`/api/dev/outbox/${msg!.id}/attachments/0`).set(engineer).expect(403);
  });

  it('answers 404 while the local mail sink is not running', async () => {
    const off = createApp({ db: env.db, clock: systemClock, config: env.config, mailSinkRunning: false });
    await request(off).get('/api/dev/outbox/1/attachments/0').set(manager).expect(404);
  });
});
