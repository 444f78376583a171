import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../../server/features/users/user.entity.js';
import { seedDemo } from '../../../server/db/seed/demo-seed.js';
import { DEMO_PASSWORD, DEMO_USERS } from '../../../server/db/seed/demo-users.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
  await seedDemo(env.db);
});
afterAll(async () => {
  await env.db.destroy();
});

const login = (email: string, password: string) => request(env.app).post('/api/auth/login').send({ email, password });

describe('POST /api/auth/login', () => {
  it.each(DEMO_USERS.map((u) => [u.roles[0], u.email] as const))('signs in the demo %s account and returns a token with the roles', async (role, email) => {
    const res = await login(email, DEMO_PASSWORD);
    expect(res.status).toBe(200);
    expect(typeof res.body.token).toBe('string');
    expect(res.body.user.email).toBe(email);
    expect(res.body.user.roles).toEqual([role]);
    expect(res.body.user).not.toHaveProperty('passwordHash');
    const me = await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${res.body.token}`);
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(email);
  });

  it('answers 401 with the error shape for a wrong password', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const res = await login(u.email, 'not the password');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_credentials');
    expect(typeof res.body.error.message).toBe('string');
  });

  it('answers 401 for an unknown e-mail, with the same message as a wrong password', async () => {
    const res = await login('nobody@test.example', 'whatever-password');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_credentials');
  });

  it('rejects a missing password and a malformed e-mail with 400 naming both fields', async () => {
    const res = await request(env.app).post('/api/auth/login').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('email');
    expect(res.body.error.fields).toHaveProperty('password');
  });

  it('answers 400 invalid_json for a body that is not JSON', async () => {
    const res = await request(env.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });

  it('locks the account after 5 failures: later attempts answer the same 401 as a wrong password, and the right password from the failing address is refused until the lock ends', async () => {
    const u = await createTestUser(env.db, ['tester']);
    for (let i = 0; i < 5; i++) expect((await login(u.email, `wrong-${i}`)).status).toBe(401);
    const locked = await env.db.getRepository(User).findOneByOrFail({ id: u.id });
    const lockSeconds = (locked.lockedUntil!.getTime() - Date.now()) / 1000;
    expect(lockSeconds).toBeGreaterThan(14 * 60);
    expect(lockSeconds).toBeLessThanOrEqual(15 * 60);
    const sixth = await login(u.email, 'wrong-again');
    const unknown = await login('nobody-at-all@test.example', 'wrong-again');
    expect(sixth.status).toBe(401);
    expect(sixth.body).toEqual(unknown.body);
    expect(sixth.headers['retry-after']).toBeUndefined();
    const correctWhileLocked = await login(u.email, TEST_PASSWORD);
    expect(correctWhileLocked.status).toBe(401);
    expect(correctWhileLocked.body).toEqual(unknown.body);
    // The lock is held in the database: move its end into the past, as 15 minutes passing would.
    await env.db.query('UPDATE `user` SET lockedUntil = NOW(3) - INTERVAL 1 SECOND WHERE id = ?', [u.id]);
    const afterLock = await login(u.email, TEST_PASSWORD);
    expect(afterLock.status).toBe(200);
    const row = await env.db.getRepository(User).findOneByOrFail({ id: u.id });
    expect(row.failedSignIns).toBe(0);
    expect(row.lockedUntil).toBeNull();
    expect(row.lastSignInAt).toBeInstanceOf(Date);
  });

  it('refuses an inactive user with 401 even with the right password', async () => {
    const u = await createTestUser(env.db, ['manager'], { active: false });
    const res = await login(u.email, TEST_PASSWORD);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('account_inactive');
  });
});

describe('bearer tokens', () => {
  it('stop working at once when an administrator deactivates the user', async () => {
    const admin = await createTestUser(env.db, ['admin']);
    const u = await createTestUser(env.db, ['protection']);
    const token = (await login(u.email, TEST_PASSWORD)).body.token as string;
    expect((await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(200);
    const patch = await request(env.app).patch(`/api/users/${u.id}`).set(bearer(env.config, admin.id)).send({ active: false });
    expect(patch.status).toBe(200);
    expect(patch.body.active).toBe(false);
    const after = await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(after.status).toBe(401);
  });

  it('rejects an expired token with 401', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const expired = jwt.sign({ sub: String(u.id), exp: Math.floor(Date.now() / 1000) - 60 }, env.config.jwtSecret, { algorithm: 'HS256' });
    const res = await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${expired}`);
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/expired/);
  });

  it('rejects a token whose payload was tampered with', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const admin = await createTestUser(env.db, ['admin']);
    const [h, , s] = bearer(env.config, u.id).Authorization.slice(7).split('.');
    const forged = Buffer.from(JSON.stringify({ sub: String(admin.id), exp: Math.floor(Date.now() / 1000) + 600 })).toString('base64url');
    const res = await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${h}.${forged}.${s}`);
    expect(res.status).toBe(401);
  });

  it('rejects an unsigned alg:none token', async () => {
    const u = await createTestUser(env.db, ['admin']);
    const header = Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url');
    const payload = Buffer.from(JSON.stringify({ sub: String(u.id), exp: Math.floor(Date.now() / 1000) + 600 })).toString('base64url');
    const res = await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${header}.${payload}.`);
    expect(res.status).toBe(401);
  });

  it('rejects a token signed with another secret', async () => {
    const u = await createTestUser(env.db, ['admin']);
    const other = jwt.sign({ sub: String(u.id) }, 'another-secret-of-at-least-32-characters!!', { algorithm: 'HS256', expiresIn: '1h' });
    expect((await request(env.app).get('/api/auth/me').set('Authorization', `Bearer ${other}`)).status).toBe(401);
  });

  it('answers 401 without a token', async () => {
    const res = await request(env.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthorized');
  });
});

describe('role guard', () => {
  it('answers 403 to protection on an admin-only route, and 200 to admin', async () => {
    const p = await createTestUser(env.db, ['protection']);
    const a = await createTestUser(env.db, ['admin']);
    const denied = await request(env.app).get('/api/users').set(bearer(env.config, p.id));
    expect(denied.status).toBe(403);
    expect(denied.body.error.code).toBe('forbidden');
    expect((await request(env.app).get('/api/users').set(bearer(env.config, a.id))).status).toBe(200);
  });

  it('lets a user holding several roles use a route of any of them', async () => {
    const u = await createTestUser(env.db, ['tester', 'admin']);
    expect((await request(env.app).get('/api/users').set(bearer(env.config, u.id))).status).toBe(200);
  });
});

describe('GET /api/health and unknown routes', () => {
  it('answers status ok and db ok', async () => {
    const res = await request(env.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', db: 'ok' });
  });

  it('answers an unknown API route with a JSON 404', async () => {
    const res = await request(env.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.body.error.code).toBe('not_found');
  });

  it('sends security headers with a CSP that allows no inline script', async () => {
    const res = await request(env.app).get('/api/health');
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});
