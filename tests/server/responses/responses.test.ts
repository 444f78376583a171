// The server's answers against the shared answer schemas (shared/schemas/responses), on the real database: the
// schemas are strict objects, so a key a view adds, drops or mistypes fails here as well as in the client's types.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { SinkMessage } from '../../../server/mail/sink-message.entity.js';
import {
  attachmentViewSchema,
  closedFollowUpSchema,
  createdEventSchema,
  createdReadingSetSchema,
  createdSessionSchema,
  decisionAnswerSchema,
  designDetailSchema,
  designListItemSchema,
  eventDetailSchema,
  eventListPageSchema,
  healthAnswerSchema,
  importAnswerSchema,
  loginAnswerSchema,
  outboxMessageSchema,
  recordedFindingSchema,
  runScreeningAnswerSchema,
  screenedCaseAnswerSchema,
  siteViewSchema,
  sweepMetaSchema,
  unitDetailSchema,
  unitListPageSchema,
  userViewSchema,
} from '../../../shared/schemas/responses/index.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';
import { sweepCsv } from '../../helpers/sweep-csv.js';

let env: TestEnv;
let tester: { Authorization: string };
let protection: { Authorization: string };
let manager: { Authorization: string };
let engineer: { Authorization: string };
let admin: { Authorization: string };
let testerEmail: string;
let unitId: number;
let designId: number;
let eventId: number;
/** The answers of the writes that built the event, checked in their own test. */
const written: Record<string, { status: number; body: unknown }> = {};

const api = () => request(env.app);

/** Parses an answer with its schema; on a mismatch the issues (path and message) are the failure. */
function expectAnswer<S extends z.ZodType>(schema: S, body: unknown): z.infer<S> {
  const parsed = schema.safeParse(body);
  expect(parsed.error?.issues ?? []).toEqual([]);
  return parsed.data as z.infer<S>;
}

// Invented demo values: a 40 MVA 132/33 kV unit with a factory set, a fault, one post-fault session, a screening,
// the manager's release with one follow-up (closed), an inspection finding and a relay record.
beforeAll(async () => {
  env = await openTestEnv({ mailSinkRunning: true });
  const testerUser = await createTestUser(env.db, ['tester']);
  tester = bearer(env.config, testerUser.id);
  testerEmail = testerUser.email;
  protection = bearer(env.config, (await createTestUser(env.db, ['protection'])).id);
  manager = bearer(env.config, (await createTestUser(env.db, ['manager'])).id);
  engineer = bearer(env.config, (await createTestUser(env.db, ['engineer'])).id);
  admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
  const site = await makeSite(env.db);
  const design = await makeDesign(env.db);
  designId = design.id;
  const unit = await makeUnit(env.db, { siteId: site.id, designId: design.id });
  unitId = unit.id;

  const keep = (key: string, res: request.Response) => {
    written[key] = { status: res.status, body: res.body };
    return res.body;
  };
  const factory = keep(
    'readingSet',
    await api()
      .post(`/api/units/${unitId}/reading-sets`)
      .set(tester)
      .send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } }),
  );
  keep(
    'baselineSweep',
    await api().post(`/api/units/${unitId}/sweeps`).set(tester).field('label', 'HV-A-open').field('testType', 'open-circuit').field('winding', 'hv').field('phase', 'A').field('readingSetId', String(factory.id)).attach('file', Buffer.from(sweepCsv()), 'base.csv'),
  );
  const event = keep(
    'event',
    await api().post('/api/events').set(protection).send({ unitId, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', faultedPhases: 'ABC', shots: [{ currentKA: 1, durationS: 0.1 }], protectionOperated: ['overcurrent'] }),
  );
  eventId = event.id;
  keep('attachment', await api().post(`/api/events/${eventId}/attachments`).set(protection).attach('file', Buffer.from('KESTREL VALLEY HX,REL670,1999\n3,3A,0D\n1,IA,A,,A,1,0,0,-32767,32767,1,1,P\n'), 'fault.cfg'));
  const session = keep(
    'session',
    await api()
      .post(`/api/events/${eventId}/sessions`)
      .set(tester)
      .send({ takenAt: '2026-11-29T08:00:00Z', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } }),
  );
  keep('import', await api().post(`/api/sessions/${session.id}/imports`).set(tester).attach('file', Buffer.from('quantity,configuration,phase,value,unit\ncapacitance,CL,,9870,pF\ncapacitance,CHL,,5210,pF\n'), 'readings.csv'));
  keep('sessionSweep', await api().post(`/api/sessions/${session.id}/sweeps`).set(tester).field('label', 'HV-A-open').field('testType', 'open-circuit').field('winding', 'hv').field('phase', 'A').attach('file', Buffer.from(sweepCsv(0.1)), 'post.csv'));
  const screening = keep('screening', await api().post(`/api/events/${eventId}/screenings`).set(tester).send({}));
  const decision = keep(
    'decision',
    await api()
      .post(`/api/screenings/${screening.id}/decision`)
      .set(manager)
      .send({ outcome: 'release-with-restrictions', reason: 'Readings within the bands; load limited until the gas sample.', restrictions: 'Load at most 80 % for a week', followUps: [{ task: 'Dissolved-gas sample 24 h after re-energising', dueAt: '2026-12-01T08:00:00Z' }] }),
  );
  keep('followUp', await api().post(`/api/follow-ups/${decision.followUps[0].id}/close`).set(manager).send({ result: 'C2H2 below 1 ppm; no change.' }));
  keep('finding', await api().post(`/api/events/${eventId}/findings`).set(engineer).send({ classification: 'no-damage', text: 'Internal inspection at the next outage: no displacement seen.' }));
  await env.db.getRepository(SinkMessage).save({ to: 'ops@test.example', subject: 'Screening: GO', text: 'Invented message.', attachments: [{ filename: 'report.pdf', contentType: 'application/pdf', size: 1234 }] });
});
afterAll(async () => {
  await env.db.destroy();
});

describe('the screened case', () => {
  it('GET /api/screenings/:id/case: the case the screening judged, with its sweep traces, matches screenedCaseAnswerSchema', async () => {
    const screening = written.screening.body as { id: number; criteriaVersion: number };
    const res = await api().get(`/api/screenings/${screening.id}/case`).set(engineer);
    expect(res.status).toBe(200);
    const answer = expectAnswer(screenedCaseAnswerSchema, res.body);
    expect(answer).toMatchObject({ screeningId: screening.id, eventId, criteriaVersion: screening.criteriaVersion });
    expect(answer.case.sweeps?.map((s) => s.label)).toContain('HV-A-open');
    expect((await api().get('/api/screenings/999999/case').set(engineer)).status).toBe(404);
  });
});

describe('answers of the fleet routes', () => {
  it('GET /api/units: the page with the unit matches unitListPageSchema', async () => {
    const res = await api().get('/api/units').query({ designId }).set(tester);
    expect(res.status).toBe(200);
    const page = expectAnswer(unitListPageSchema, res.body);
    expect(page.items.map((u) => u.id)).toEqual([unitId]);
    const recommendation = (written.screening.body as { result: { recommendation: string } }).result.recommendation;
    expect(page.items[0]).toMatchObject({ lastEventId: eventId, lastEventStatus: 'released', lastRecommendation: recommendation });
  });

  it('GET /api/units/:id: the unit file, with its reading sets, sweep traces and event, matches unitDetailSchema', async () => {
    const res = await api().get(`/api/units/${unitId}`).set(tester);
    expect(res.status).toBe(200);
    const unit = expectAnswer(unitDetailSchema, res.body);
    expect(unit.readingSets.map((s) => s.kind)).toEqual(['post-fault', 'factory']);
    expect(unit.readingSets.flatMap((s) => s.sweeps.map((t) => t.label))).toEqual(['HV-A-open', 'HV-A-open']);
    expect(unit.events.map((e) => e.id)).toEqual([eventId]);
  });

  it('GET /api/sites and GET /api/designs: every item matches its schema; GET /api/designs/:id lists the unit', async () => {
    const sites = await api().get('/api/sites').set(tester);
    expect(sites.status).toBe(200);
    expect(sites.body.length).toBeGreaterThan(0);
    expectAnswer(siteViewSchema.array(), sites.body);
    const designs = await api().get('/api/designs').set(tester);
    expect(designs.status).toBe(200);
    const list = expectAnswer(designListItemSchema.array(), designs.body);
    expect(list.find((d) => d.id === designId)?.unitCount).toBe(1);
    const detail = await api().get(`/api/designs/${designId}`).set(tester);
    expect(expectAnswer(designDetailSchema, detail.body).units.map((u) => u.id)).toEqual([unitId]);
  });
});

describe('answers of the event routes', () => {
  it('GET /api/events: the page with the event matches eventListPageSchema', async () => {
    const res = await api().get('/api/events').query({ unitId }).set(tester);
    expect(res.status).toBe(200);
    const page = expectAnswer(eventListPageSchema, res.body);
    expect(page.items.map((e) => e.id)).toEqual([eventId]);
  });

  it('GET /api/events/:id: the event file, with every part filled, matches eventDetailSchema', async () => {
    const res = await api().get(`/api/events/${eventId}`).set(tester);
    expect(res.status).toBe(200);
    const event = expectAnswer(eventDetailSchema, res.body);
    expect(event.status).toBe('released');
    expect(event.sessions).toHaveLength(1);
    expect(event.sessions[0].sweeps).toHaveLength(1);
    expect(event.screenings).toHaveLength(1);
    expect(event.decision?.outcome).toBe('release-with-restrictions');
    expect(event.followUps.map((f) => f.result)).toEqual(['C2H2 below 1 ppm; no change.']);
    expect(event.findings.map((f) => f.classification)).toEqual(['no-damage']);
    expect(event.notifications.length).toBeGreaterThan(0);
    expect(event.attachments.map((a) => a.name)).toEqual(['fault.cfg']);
    expect(event.audit.map((a) => a.action)).toContain('decide');
    expect(Object.keys(event.people).length).toBeGreaterThan(0);
  });

  it('the writes that built the event answered their schemas', () => {
    const checks: [string, number, z.ZodType][] = [
      ['readingSet', 201, createdReadingSetSchema],
      ['baselineSweep', 201, sweepMetaSchema],
      ['event', 201, createdEventSchema],
      ['attachment', 201, attachmentViewSchema],
      ['session', 201, createdSessionSchema],
      ['import', 200, importAnswerSchema],
      ['sessionSweep', 201, sweepMetaSchema],
      ['screening', 201, runScreeningAnswerSchema],
      ['decision', 201, decisionAnswerSchema],
      ['followUp', 200, closedFollowUpSchema],
      ['finding', 201, recordedFindingSchema],
    ];
    for (const [key, status, schema] of checks) {
      expect({ key, status: written[key].status }).toEqual({ key, status });
      expect({ key, issues: schema.safeParse(written[key].body).error?.issues ?? [] }).toEqual({ key, issues: [] });
    }
  });
});

describe('answers of the sign-in, health and outbox routes', () => {
  it('GET /api/auth/me and POST /api/auth/login answer the user as userViewSchema', async () => {
    const me = await api().get('/api/auth/me').set(tester);
    expect(me.status).toBe(200);
    expect(expectAnswer(userViewSchema, me.body).email).toBe(testerEmail);
    const login = await api().post('/api/auth/login').send({ email: testerEmail, password: TEST_PASSWORD });
    expect(login.status).toBe(200);
    expect(expectAnswer(loginAnswerSchema, login.body).user.email).toBe(testerEmail);
  });

  it('GET /api/health and GET /api/dev/outbox match their schemas', async () => {
    const health = await api().get('/api/health');
    expect(health.status).toBe(200);
    expect(expectAnswer(healthAnswerSchema, health.body).db).toBe('ok');
    const outbox = await api().get('/api/dev/outbox').set(admin);
    expect(outbox.status).toBe(200);
    expect(outbox.body.length).toBeGreaterThan(0);
    expectAnswer(outboxMessageSchema.array(), outbox.body);
  });
});
