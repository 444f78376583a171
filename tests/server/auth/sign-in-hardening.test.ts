import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app.js';
import { systemClock } from '../../../server/common/clock.js';
import { loadConfig, ConfigError } from '../../../server/config.js';
import { trustProxySetting } from '../../../server/features/auth/sign-in-protection.js';
import { SecurityEvent } from '../../../server/features/security/security-event.entity.js';
import { User } from '../../../server/features/users/user.entity.js';
import { loginAnswerSchema, personWithPasswordSchema } from '../../../shared/schemas/responses/index.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';

// Sign-in hardening: the 72-byte limit, the password policy, token versions and sign-out, the same answer for a locked
// account as for an unknown e-mail, the per-address throttle, the right address getting in during a lock, no-store.

let env: TestEnv;
let adminAuth: { Authorization: string };
beforeAll(async () => {
  env = await openTestEnv();
  adminAuth = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
});
afterAll(async () => {
  await env.db.destroy();
});

/** An app on the same database with other settings (X-Forwarded-For believed from loopback, a lower throttle). */
const appWith = (over: Record<string, string | number>) => createApp({ db: env.db, clock: systemClock, config: { ...env.config, ...over }, mailSinkRunning: false });
const login = (email: string, password: string, app = env.app, from?: string) => {
  const r = request(app).post('/api/auth/login');
  if (from) r.set('X-Forwarded-For', from);
  return r.send({ email, password });
};
const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
const me = (token: string) => request(env.app).get('/api/auth/me').set(auth(token));
const events = (userId: number) => env.db.getRepository(SecurityEvent).find({ where: { userId }, order: { id: 'ASC' } });

// 65 characters, five of them (ä ü ä ü ü) two bytes each in UTF-8: exactly 72 bytes.
const PW72 = 'Lange Sätze über Bäume, Flüsse und Brücken sind schwer zu erraten12';

describe('passwords over 72 bytes', () => {
  it('cannot sign in with a different tail after the first 72 bytes (bcrypt would cut there)', async () => {
    expect(new TextEncoder().encode(PW72).length).toBe(72);
    const u = await createTestUser(env.db, ['tester'], { passwordHash: await bcrypt.hash(PW72, 4) });
    expect((await login(u.email, PW72)).status).toBe(200);
    const longer = await login(u.email, `${PW72}anything after the cut`);
    expect(longer.status).toBe(401);
    expect(longer.body.error.code).toBe('invalid_credentials');
  });

  it('refuses a current password over 72 bytes with 400 naming currentPassword', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const res = await request(env.app).post('/api/auth/password').set(bearer(env.config, u.id)).send({ currentPassword: 'x'.repeat(73), newPassword: 'a brand new passphrase' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('currentPassword');
  });
});

describe('the password policy on POST /api/auth/password', () => {
  it.each([
    ['1234567890ab', 'at least 12 characters, a sequence'],
    ['password1234', 'a common password with digits'],
    ['qwertyuiop12', 'a keyboard row'],
    ['aaaaaaaaaaaaaaaa', 'one repeated character'],
  ])('refuses %s (%s) with 400 naming newPassword, in words; nothing written', async (newPassword) => {
    const u = await createTestUser(env.db, ['tester']);
    const res = await request(env.app).post('/api/auth/password').set(bearer(env.config, u.id)).send({ currentPassword: TEST_PASSWORD, newPassword });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.newPassword).toMatch(/[a-z]{4,} .*choose a longer phrase/);
    expect((await env.db.getRepository(User).findOneByOrFail({ id: u.id })).passwordHash).toBe(u.passwordHash);
  });

  it('refuses the person’s own e-mail address as a password', async () => {
    const u = await createTestUser(env.db, ['tester'], { email: `marguerite.oakenfold-${Date.now()}@test.example` });
    const res = await request(env.app).post('/api/auth/password').set(bearer(env.config, u.id)).send({ currentPassword: TEST_PASSWORD, newPassword: u.email });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('newPassword');
  });

  it('gives one-time passwords that pass the policy (created and reset)', async () => {
    const created = personWithPasswordSchema.parse(
      (await request(env.app).post('/api/users').set(adminAuth).send({ email: `otp-${Date.now()}@test.example`, name: 'One Time', roles: ['tester'] })).body,
    );
    const { passwordPolicyProblem } = await import('../../../shared/auth/password-policy.js');
    expect(passwordPolicyProblem(created.oneTimePassword)).toBeNull();
    const reset = personWithPasswordSchema.parse((await request(env.app).post(`/api/users/${created.id}/reset-password`).set(adminAuth)).body);
    expect(passwordPolicyProblem(reset.oneTimePassword)).toBeNull();
  });
});

describe('token versions and sign-out', () => {
  it('POST /api/auth/logout answers 204 and ends every token of that person, not only the one sent', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const a = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    const b = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    expect((await me(a)).status).toBe(200);
    const out = await request(env.app).post('/api/auth/logout').set(auth(a));
    expect(out.status).toBe(204);
    expect(out.headers['cache-control']).toBe('no-store');
    for (const t of [a, b]) {
      const res = await me(t);
      expect(res.status).toBe(401);
      expect(res.body.error.message).toMatch(/session has ended/);
    }
    expect((await request(env.app).post('/api/auth/logout').set(auth(a))).status).toBe(401);
    const again = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    expect((await me(again)).status).toBe(200);
  });

  it('lets a person who must replace a one-time password sign out', async () => {
    const u = await createTestUser(env.db, ['tester'], { mustChangePassword: true });
    const t = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    expect((await request(env.app).post('/api/auth/logout').set(auth(t))).status).toBe(204);
  });

  it('ends older tokens on an own password change (the answer carries a new one)', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const t = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    const res = await request(env.app).post('/api/auth/password').set(auth(t)).send({ currentPassword: TEST_PASSWORD, newPassword: 'seven lanterns over the quiet harbour' });
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-store');
    expect((await me(t)).status).toBe(401);
    expect((await me(loginAnswerSchema.parse(res.body).token)).status).toBe(200);
  });

  it('ends older tokens on an administrator’s password reset', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const t = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    expect((await request(env.app).post(`/api/users/${u.id}/reset-password`).set(adminAuth)).status).toBe(200);
    expect((await me(t)).status).toBe(401);
  });

  it('does not bring a token back to life when a deactivation is undone', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const t = loginAnswerSchema.parse((await login(u.email, TEST_PASSWORD)).body).token;
    expect((await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ active: false })).status).toBe(200);
    expect((await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ active: true })).status).toBe(200);
    expect((await me(t)).status).toBe(401);
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(200);
  });

  it('refuses a validly signed token without a version (issued before versions existed)', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const jwt = (await import('jsonwebtoken')).default;
    const old = jwt.sign({ sub: String(u.id) }, env.config.jwtSecret, { algorithm: 'HS256', expiresIn: '1h' });
    expect((await me(old)).status).toBe(401);
  });
});

describe('Cache-Control: no-store', () => {
  it('is on the sign-in answer (refusals too) and on GET /api/auth/me', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const ok = await login(u.email, TEST_PASSWORD);
    expect(ok.headers['cache-control']).toBe('no-store');
    expect((await login(u.email, 'a wrong password')).headers['cache-control']).toBe('no-store');
    expect((await me(ok.body.token)).headers['cache-control']).toBe('no-store');
  });
});

describe('a locked account', () => {
  it('answers exactly as an unknown e-mail does, and the lock is in the security log', async () => {
    const u = await createTestUser(env.db, ['manager']);
    for (let i = 0; i < 5; i++) await login(u.email, `wrong-${i}`);
    const locked = await login(u.email, 'wrong-again');
    const unknown = await login(`nobody-${Date.now()}@test.example`, 'wrong-again');
    expect([locked.status, unknown.status]).toEqual([401, 401]);
    expect(locked.body).toEqual(unknown.body);
    expect(locked.headers['retry-after']).toBeUndefined();
    const kinds = (await events(u.id)).map((e) => e.kind);
    expect(kinds.filter((k) => k === 'sign_in_failed')).toHaveLength(5);
    expect(kinds).toContain('account_locked');
    expect(kinds.at(-1)).toBe('sign_in_locked');
  });

  it('still lets its owner in with the right password from an address that has not failed; the failing addresses stay out', async () => {
    const app = appWith({ TRUST_PROXY: 'loopback' });
    const u = await createTestUser(env.db, ['manager']);
    for (let i = 0; i < 5; i++) expect((await login(u.email, `wrong-${i}`, app, '203.0.113.7')).status).toBe(401);
    // The attacker's address: even the right password is refused while the lock runs.
    expect((await login(u.email, TEST_PASSWORD, app, '203.0.113.7')).status).toBe(401);
    // The owner's office: never failed, gets in.
    const owner = await login(u.email, TEST_PASSWORD, app, '198.51.100.20');
    expect(owner.status).toBe(200);
    // The lock stays for everyone else: an address that fails once during the lock is then refused the right password too.
    expect((await env.db.getRepository(User).findOneByOrFail({ id: u.id })).lockedUntil).not.toBeNull();
    expect((await login(u.email, 'a guess', app, '192.0.2.99')).status).toBe(401);
    expect((await login(u.email, TEST_PASSWORD, app, '192.0.2.99')).status).toBe(401);
    const addresses = (await events(u.id)).map((e) => e.address);
    expect(addresses).toContain('203.0.113.7');
    expect(addresses).toContain('192.0.2.99');
    expect(addresses).not.toContain('198.51.100.20');
  });

  it('does not believe X-Forwarded-For when TRUST_PROXY is off (the default)', async () => {
    expect(env.config.TRUST_PROXY).toBe('off');
    const u = await createTestUser(env.db, ['manager']);
    for (let i = 0; i < 5; i++) await login(u.email, `wrong-${i}`, env.app, '203.0.113.8');
    // The address is the connection's (127.0.0.1), which failed: a forged header does not make it clean.
    expect((await login(u.email, TEST_PASSWORD, env.app, '198.51.100.21')).status).toBe(401);
    expect((await events(u.id)).every((e) => e.address !== '203.0.113.8' && e.address !== '198.51.100.21')).toBe(true);
  });
});

describe('throttling per client address', () => {
  it('answers 429 too_many_attempts with Retry-After and the JSON error shape after LOGIN_RATE_LIMIT_MAX failures from one address, other addresses unaffected', async () => {
    const app = appWith({ TRUST_PROXY: 'loopback', LOGIN_RATE_LIMIT_MAX: 3, LOGIN_RATE_LIMIT_WINDOW_MINUTES: 15 });
    const u = await createTestUser(env.db, ['tester']);
    const from = '203.0.113.50';
    for (let i = 0; i < 3; i++) expect((await login(`unknown-${i}@test.example`, 'whatever', app, from)).status).toBe(401);
    const throttled = await login(u.email, TEST_PASSWORD, app, from);
    expect(throttled.status).toBe(429);
    expect(throttled.body).toEqual({ error: { code: 'too_many_attempts', message: expect.stringMatching(/from this address/) } });
    const retryAfter = Number(throttled.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(14 * 60);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    expect(throttled.headers['cache-control']).toBe('no-store');
    expect((await login(u.email, TEST_PASSWORD, app, '203.0.113.51')).status).toBe(200);
    const logged = await env.db.getRepository(SecurityEvent).findOneBy({ kind: 'sign_in_throttled', address: from });
    expect(logged?.email).toBe(u.email);
  });

  it('does not count successful sign-ins or malformed requests', async () => {
    const app = appWith({ LOGIN_RATE_LIMIT_MAX: 2 });
    const u = await createTestUser(env.db, ['tester']);
    for (let i = 0; i < 4; i++) expect((await login(u.email, TEST_PASSWORD, app)).status).toBe(200);
    for (let i = 0; i < 4; i++) expect((await login('not an e-mail', 'x', app)).status).toBe(400);
    expect((await login(u.email, 'wrong one', app)).status).toBe(401);
    expect((await login(u.email, TEST_PASSWORD, app)).status).toBe(200);
    expect((await login(u.email, 'wrong two', app)).status).toBe(401);
    expect((await login(u.email, TEST_PASSWORD, app)).status).toBe(429);
  });
});

describe('configuration', () => {
  it('reads TRUST_PROXY as off, a hop count or a list', () => {
    expect(trustProxySetting('off')).toBe(false);
    expect(trustProxySetting('1')).toBe(1);
    expect(trustProxySetting('loopback, 10.0.0.0/8')).toEqual(['loopback', '10.0.0.0/8']);
    expect(loadConfig({}).TRUST_PROXY).toBe('off');
    expect(() => loadConfig({ TRUST_PROXY: 'loopback; rm' })).toThrow(ConfigError);
    expect(() => loadConfig({ LOGIN_RATE_LIMIT_MAX: '0' })).toThrow(/LOGIN_RATE_LIMIT_MAX/);
  });
});
