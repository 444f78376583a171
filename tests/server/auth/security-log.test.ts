import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { SecurityEvent } from '../../../server/features/security/security-event.entity.js';
import { securityEventPageSchema } from '../../../shared/schemas/responses/index.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';

// The security log: who, from where, when, what and which route, for sign-in failures, locks, unlocks and refusals;
// GET /api/security-events for administrators.

let env: TestEnv;
let adminId: number;
let adminAuth: { Authorization: string };
beforeAll(async () => {
  env = await openTestEnv();
  adminId = (await createTestUser(env.db, ['admin'], { name: 'Ada Admin' })).id;
  adminAuth = bearer(env.config, adminId);
});
afterAll(async () => {
  await env.db.destroy();
});

const repo = () => env.db.getRepository(SecurityEvent);
const login = (email: string, password: string) => request(env.app).post('/api/auth/login').send({ email, password });

describe('what the security log records', () => {
  it('a failed sign-in for a known account: the person, the e-mail as typed, the address, the route and the time', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const before = Date.now();
    await login(`  ${u.email.toUpperCase()}`, 'not the password');
    const [e] = await repo().findBy({ userId: u.id, kind: 'sign_in_failed' });
    // As typed (upper case kept), after the schema's trim.
    expect(e).toMatchObject({ email: u.email.toUpperCase(), route: 'POST /api/auth/login', detail: 'wrong password' });
    expect(e!.address).toMatch(/127\.0\.0\.1$/);
    expect(e!.at.getTime()).toBeGreaterThanOrEqual(before - 1000);
  });

  it('a failed sign-in for an unknown e-mail, without a person', async () => {
    const typed = `Nobody.${Date.now()}@Nowhere.example`;
    await login(typed, 'whatever');
    const e = await repo().findOne({ where: { kind: 'sign_in_failed', email: typed } });
    expect(e).toMatchObject({ userId: null, detail: 'no account with this e-mail' });
  });

  it('an authorization refusal (403 from the route table) with the person and the route, although the request is refused', async () => {
    const t = await createTestUser(env.db, ['tester']);
    expect((await request(env.app).get('/api/users?page=2').set(bearer(env.config, t.id))).status).toBe(403);
    const e = await repo().findOneBy({ userId: t.id, kind: 'access_refused' });
    expect(e).toMatchObject({ route: 'GET /api/users' });
    expect(e!.address).toMatch(/127\.0\.0\.1$/);
    expect(e!.detail).toMatch(/roles/);
  });

  it('not a one-time password’s "choose a new password first"', async () => {
    const u = await createTestUser(env.db, ['tester'], { mustChangePassword: true });
    expect((await request(env.app).get('/api/sites').set(bearer(env.config, u.id))).status).toBe(403);
    expect(await repo().countBy({ userId: u.id })).toBe(0);
  });

  it('an unlock by an administrator and a reset that ends a lock', async () => {
    for (const how of ['unlock', 'reset-password'] as const) {
      const u = await createTestUser(env.db, ['tester'], { lockedUntil: new Date(Date.now() + 10 * 60_000) });
      expect((await request(env.app).post(`/api/users/${u.id}/${how}`).set(adminAuth)).status).toBe(200);
      // Written once the request's transaction has committed, just after the answer.
      const e = await vi.waitFor(async () => (await repo().findOneByOrFail({ userId: u.id, kind: 'account_unlocked' })), { timeout: 3000 });
      expect(e.detail, how).toMatch(/Ada Admin/);
    }
    // No lock, nothing to end: nothing recorded.
    const free = await createTestUser(env.db, ['tester']);
    await request(env.app).post(`/api/users/${free.id}/unlock`).set(adminAuth);
    await new Promise((r) => setTimeout(r, 300));
    expect(await repo().countBy({ userId: free.id })).toBe(0);
  });

  it('nothing for a successful sign-in', async () => {
    const u = await createTestUser(env.db, ['tester']);
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(200);
    expect(await repo().countBy({ userId: u.id })).toBe(0);
  });
});

describe('GET /api/security-events', () => {
  it('answers administrators one page, newest first, with names', async () => {
    const u = await createTestUser(env.db, ['tester'], { name: 'Paged Person' });
    await login(u.email, 'first wrong');
    await login(u.email, 'second wrong');
    const res = await request(env.app).get('/api/security-events').query({ page: 1, pageSize: 2 }).set(adminAuth);
    expect(res.status).toBe(200);
    const page = securityEventPageSchema.parse(res.body);
    expect(page.items).toHaveLength(2);
    expect(page.total).toBeGreaterThanOrEqual(2);
    expect(page.items[0]!.at >= page.items[1]!.at).toBe(true);
    expect(page.items[0]).toMatchObject({ userId: u.id, userName: 'Paged Person', kind: 'sign_in_failed' });
  });

  it('refuses everyone else (403) and checks the page size (400 naming query.pageSize)', async () => {
    const m = await createTestUser(env.db, ['manager']);
    expect((await request(env.app).get('/api/security-events').set(bearer(env.config, m.id))).status).toBe(403);
    const bad = await request(env.app).get('/api/security-events').query({ pageSize: 1000 }).set(adminAuth);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['query.pageSize']);
  });
});
