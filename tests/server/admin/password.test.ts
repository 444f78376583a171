import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { User } from '../../../server/features/users/user.entity.js';
import { loginAnswerSchema, personWithPasswordSchema, userViewSchema } from '../../../shared/schemas/responses/index.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';

// A one-time password must be replaced at first sign-in: until then only GET /api/auth/me and POST /api/auth/password
// answer. Anyone may change their own password the same way later.

let env: TestEnv;
let adminAuth: { Authorization: string };
beforeAll(async () => {
  env = await openTestEnv();
  const admin = await createTestUser(env.db, ['admin']);
  adminAuth = bearer(env.config, admin.id);
});
afterAll(async () => {
  await env.db.destroy();
});

const uniqueEmail = (what: string) => `${what}-${Math.random().toString(36).slice(2, 10)}@test.example`;
const rowOf = (id: number) => env.db.getRepository(User).findOneByOrFail({ id });
const change = (auth: { Authorization: string }, body: Record<string, unknown>) => request(env.app).post('/api/auth/password').set(auth).send(body);
const passwordAudits = (id: number) =>
  env.db.getRepository(AuditEntry).find({ where: { entity: 'user', entityId: String(id), note: 'password changed by its owner' } });

async function newPerson(): Promise<{ id: number; email: string; oneTimePassword: string; auth: { Authorization: string } }> {
  const email = uniqueEmail('first');
  const res = await request(env.app).post('/api/users').set(adminAuth).send({ email, name: 'First Timer', roles: ['tester'] });
  const p = personWithPasswordSchema.parse(res.body);
  const login = await request(env.app).post('/api/auth/login').send({ email, password: p.oneTimePassword });
  const answer = loginAnswerSchema.parse(login.body);
  return { id: p.id, email, oneTimePassword: p.oneTimePassword, auth: { Authorization: `Bearer ${answer.token}` } };
}

describe('the duty to replace a one-time password', () => {
  it('is set on a person an administrator creates and shown in the sign-in answer and GET /api/auth/me', async () => {
    const email = uniqueEmail('flag');
    const created = personWithPasswordSchema.parse((await request(env.app).post('/api/users').set(adminAuth).send({ email, name: 'Flagged', roles: ['manager'] })).body);
    expect(created.mustChangePassword).toBe(true);
    expect((await rowOf(created.id)).mustChangePassword).toBe(true);
    const login = loginAnswerSchema.parse((await request(env.app).post('/api/auth/login').send({ email, password: created.oneTimePassword })).body);
    expect(login.user.mustChangePassword).toBe(true);
    const me = await request(env.app).get('/api/auth/me').set({ Authorization: `Bearer ${login.token}` });
    expect(me.status).toBe(200);
    expect(userViewSchema.parse(me.body).mustChangePassword).toBe(true);
  });

  it('is set again by a password reset', async () => {
    const u = await createTestUser(env.db, ['tester']);
    expect(u.mustChangePassword).toBe(false);
    const res = await request(env.app).post(`/api/users/${u.id}/reset-password`).set(adminAuth);
    expect(res.status).toBe(200);
    expect(personWithPasswordSchema.parse(res.body).mustChangePassword).toBe(true);
    expect((await rowOf(u.id)).mustChangePassword).toBe(true);
  });

  it('answers 403 password_change_required on every other route, role-guarded or not', async () => {
    const p = await newPerson();
    for (const [method, path] of [
      ['get', '/api/sites'],
      ['get', '/api/units'],
      ['get', '/api/events'],
    ] as const) {
      const res = await request(env.app)[method](path).set(p.auth);
      expect(res.status, path).toBe(403);
      expect(res.body.error.code, path).toBe('password_change_required');
    }
    const reset = await request(env.app).post(`/api/users/${p.id}/reset-password`).set(p.auth);
    expect(reset.status).toBe(403);
    expect(reset.body.error.code).toBe('password_change_required');
  });
});

describe('POST /api/auth/password', () => {
  it('refuses a new password under 12 characters, equal to the current one or over 72 bytes, naming newPassword; nothing written', async () => {
    const p = await newPerson();
    const hash = (await rowOf(p.id)).passwordHash;
    for (const newPassword of ['short pass1', p.oneTimePassword, 'é'.repeat(37)]) {
      const res = await change(p.auth, { currentPassword: p.oneTimePassword, newPassword });
      expect(res.status, newPassword).toBe(400);
      expect(res.body.error.fields, newPassword).toHaveProperty('newPassword');
    }
    const row = await rowOf(p.id);
    expect(row.passwordHash).toBe(hash);
    expect(row.mustChangePassword).toBe(true);
    expect(await passwordAudits(p.id)).toHaveLength(0);
  });

  it('accepts exactly 72 bytes of UTF-8', async () => {
    const p = await newPerson();
    // 66 bytes of UTF-8 (each of ö ä ü Ä counts 2) + 6 = 72 bytes, 66 characters.
    const newPassword = 'Zwölf Äpfel, drei Birnen; später Kaffee für Jürgen & Börte!!123456';
    expect(new TextEncoder().encode(newPassword).length).toBe(72);
    const res = await change(p.auth, { currentPassword: p.oneTimePassword, newPassword });
    expect(res.status).toBe(200);
  });

  it('refuses a wrong current password with 400 naming currentPassword; nothing written', async () => {
    const p = await newPerson();
    const res = await change(p.auth, { currentPassword: 'not the password', newPassword: 'a brand new passphrase' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('currentPassword');
    expect((await rowOf(p.id)).mustChangePassword).toBe(true);
    expect(await passwordAudits(p.id)).toHaveLength(0);
  });

  it('stores the new password, clears the duty, audits without hashes, and then every route answers as usual', async () => {
    const p = await newPerson();
    const newPassword = 'a brand new passphrase';
    const res = await change(p.auth, { currentPassword: p.oneTimePassword, newPassword });
    expect(res.status).toBe(200);
    // Every older token ends with the change: the answer carries a new one, as a sign-in does.
    const answer = loginAnswerSchema.parse(res.body);
    expect(answer.user.mustChangePassword).toBe(false);
    expect((await request(env.app).get('/api/auth/me').set(p.auth)).status).toBe(401);
    const fresh = { Authorization: `Bearer ${answer.token}` };
    const row = await rowOf(p.id);
    expect(row.mustChangePassword).toBe(false);
    expect(await bcrypt.compare(newPassword, row.passwordHash)).toBe(true);

    const [entry] = await passwordAudits(p.id);
    expect(entry).toMatchObject({ action: 'update', userId: p.id });
    expect((entry.before as { mustChangePassword: boolean }).mustChangePassword).toBe(true);
    expect((entry.after as { mustChangePassword: boolean }).mustChangePassword).toBe(false);
    const written = JSON.stringify([entry.before, entry.after]);
    expect(written).not.toContain(row.passwordHash);
    expect(written).not.toContain('$2');
    expect(written).not.toContain(newPassword);

    expect((await request(env.app).get('/api/sites').set(fresh)).status).toBe(200);
    expect((await request(env.app).post('/api/auth/login').send({ email: p.email, password: p.oneTimePassword })).status).toBe(401);
    expect((await request(env.app).post('/api/auth/login').send({ email: p.email, password: newPassword })).status).toBe(200);
  });

  it('lets anyone change their own password later, and needs a sign-in', async () => {
    const u = await createTestUser(env.db, ['engineer']);
    const res = await change(bearer(env.config, u.id), { currentPassword: TEST_PASSWORD, newPassword: 'another good passphrase' });
    expect(res.status).toBe(200);
    expect(await bcrypt.compare('another good passphrase', (await rowOf(u.id)).passwordHash)).toBe(true);
    expect((await request(env.app).post('/api/auth/password').send({ currentPassword: 'x', newPassword: 'another good passphrase' })).status).toBe(401);
  });
});
