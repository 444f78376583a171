import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Screening } from '../../../server/features/screenings/screening.entity.js';
import { SecurityEvent } from '../../../server/features/security/security-event.entity.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeSite, makeUnit } from '../../helpers/factories.js';

// api.md: POST /events/:id/screenings — "tester, manager; engineer for comparison runs only (403 otherwise)".

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
});
afterAll(async () => {
  await env.db.destroy();
});

describe('an engineer asking for a normal screening run', () => {
  it('is refused with 403, nothing is written, and the refusal is in the security log', async () => {
    const engineer = await createTestUser(env.db, ['engineer']);
    const protection = bearer(env.config, (await createTestUser(env.db, ['protection'])).id);
    const unit = await makeUnit(env.db, { siteId: (await makeSite(env.db)).id });
    const ev = await request(env.app)
      .post('/api/events')
      .set(protection)
      .send({ unitId: unit.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }] });
    expect(ev.status).toBe(201);
    const statusBefore = (await env.db.getRepository(FaultEvent).findOneByOrFail({ id: ev.body.id })).status;

    const res = await request(env.app).post(`/api/events/${ev.body.id}/screenings`).set(bearer(env.config, engineer.id)).send({ comparison: false });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(res.body.error.message).toMatch(/comparison/);
    expect(await env.db.getRepository(Screening).countBy({ eventId: ev.body.id })).toBe(0);
    expect((await env.db.getRepository(FaultEvent).findOneByOrFail({ id: ev.body.id })).status).toBe(statusBefore);

    const logged = await env.db.getRepository(SecurityEvent).findOneBy({ userId: engineer.id, kind: 'access_refused' });
    expect(logged).toMatchObject({ route: `POST /api/events/${ev.body.id}/screenings` });
    expect(logged!.detail).toMatch(/comparison/);
  });
});
