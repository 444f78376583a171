import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import { FixedClock } from '../../../server/common/clock.js';
import type { Role } from '../../../shared/schemas/roles.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeSite, makeUnit } from '../../helpers/factories.js';

// One test environment per file on a fixed clock, a user per role, and the steps of an event's life through the API.

export const START = '2026-12-01T10:00:00.000Z';
const ROLES = ['admin', 'protection', 'tester', 'manager', 'engineer'] as const satisfies readonly Role[];

export interface Flow {
  env: TestEnv;
  clock: FixedClock;
  as: Record<(typeof ROLES)[number], { Authorization: string }>;
  api: () => ReturnType<typeof request>;
  /** A unit with a factory set, a logged event (tripped, 1 kA on the LV side) and, unless `session: false`, one session. */
  event(opts?: { session?: boolean }): Promise<{ unitId: number; eventId: number; sessionId: number }>;
  /** Runs a normal screening; answers its id and recommendation. */
  screen(eventId: number): Promise<{ id: number; recommendation: string; followUps: string[] }>;
  /** Screens and signs a decision. */
  decide(eventId: number, body: Record<string, unknown>): Promise<{ screeningId: number; signedAt: string }>;
}

// Invented readings of a 40 MVA 132/33 kV two-winding unit (as in the screening tests).
const factory = { kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } };
export const session = { takenAt: '2026-11-29T08:00:00Z', temperatureC: 28, tapPosition: '9b', humidityPercent: 40, instrument: 'M4100', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } };
export const fault = { occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }], notes: 'Feeder 4 cable fault' };

export function correctionsFlow(): Flow {
  const f = { as: {} } as Flow;
  f.clock = new FixedClock(START);
  f.api = () => request(f.env.app);
  let siteId = 0;
  beforeAll(async () => {
    f.env = await openTestEnv({ clock: f.clock });
    for (const role of ROLES) f.as[role] = bearer(f.env.config, (await createTestUser(f.env.db, [role])).id);
    siteId = (await makeSite(f.env.db)).id;
  });
  afterAll(async () => {
    await f.env.db.destroy();
  });
  // Each step a minute after the one before, as in real life (a screening uses the sessions stored before it).
  const step = () => f.clock.advance(60_000);
  f.event = async (opts = {}) => {
    step();
    const unit = await makeUnit(f.env.db, { siteId });
    await f.api().post(`/api/units/${unit.id}/reading-sets`).set(f.as.tester).send(factory).expect(201);
    const ev = await f.api().post('/api/events').set(f.as.protection).send({ unitId: unit.id, ...fault }).expect(201);
    let sessionId = 0;
    step();
    if (opts.session !== false) sessionId = (await f.api().post(`/api/events/${ev.body.id}/sessions`).set(f.as.tester).send(session).expect(201)).body.id;
    return { unitId: unit.id, eventId: ev.body.id as number, sessionId };
  };
  f.screen = async (eventId) => {
    step();
    const s = (await f.api().post(`/api/events/${eventId}/screenings`).set(f.as.tester).send({}).expect(201)).body;
    return { id: s.id, recommendation: s.result.recommendation, followUps: s.result.followUps };
  };
  f.decide = async (eventId, body) => {
    const s = await f.screen(eventId);
    step();
    const d = await f.api().post(`/api/screenings/${s.id}/decision`).set(f.as.manager).send(body).expect(201);
    step();
    return { screeningId: s.id, signedAt: d.body.signedAt };
  };
  return f;
}
