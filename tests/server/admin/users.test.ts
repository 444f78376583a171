import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { User } from '../../../server/features/users/user.entity.js';
import { personPageSchema, personViewSchema, personWithPasswordSchema } from '../../../shared/schemas/responses/admin.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';
import { makeSite } from '../../helpers/factories.js';

// People administration: create with a one-time password, reset it, unlock, the rules that keep an administrator, and
// what deactivation does to sign-in and tokens.

let env: TestEnv;
let admin: User;
let adminAuth: { Authorization: string };
beforeAll(async () => {
  env = await openTestEnv();
  admin = await createTestUser(env.db, ['admin']);
  adminAuth = bearer(env.config, admin.id);
});
afterAll(async () => {
  await env.db.destroy();
});

const login = (email: string, password: string) => request(env.app).post('/api/auth/login').send({ email, password });
const auditRows = (userId: number) => env.db.getRepository(AuditEntry).find({ where: { entity: 'user', entityId: String(userId) }, order: { id: 'ASC' } });
const rowOf = (id: number) => env.db.getRepository(User).findOneByOrFail({ id });
const uniqueEmail = (what: string) => `${what}-${Math.random().toString(36).slice(2, 10)}@test.example`;

describe('POST /api/users', () => {
  it('creates the person and answers a one-time password once; only its hash is stored and it signs in', async () => {
    const site = await makeSite(env.db);
    const email = uniqueEmail('new');
    const res = await request(env.app)
      .post('/api/users')
      .set(adminAuth)
      .send({ email: email.toUpperCase(), name: 'Nia Tester', roles: ['tester', 'manager'], siteIds: [site.id] });
    expect(res.status).toBe(201);
    const answer = personWithPasswordSchema.parse(res.body);
    expect(answer.email).toBe(email);
    expect(answer.roles).toEqual(['tester', 'manager']);
    expect(answer.siteIds).toEqual([site.id]);
    expect(answer.oneTimePassword).toMatch(/^[A-Za-z0-9_-]{16}$/);

    const row = await rowOf(answer.id);
    expect(row.passwordHash).not.toContain(answer.oneTimePassword);
    expect(await bcrypt.compare(answer.oneTimePassword, row.passwordHash)).toBe(true);

    const list = await request(env.app).get('/api/users').query({ q: email }).set(adminAuth);
    const listed = (list.body.items as Record<string, unknown>[]).find((p) => p.id === answer.id);
    expect(personViewSchema.strict().parse(listed)).not.toHaveProperty('oneTimePassword');

    expect((await login(email, answer.oneTimePassword)).status).toBe(200);

    const [entry] = await auditRows(answer.id);
    expect(entry.action).toBe('create');
    expect(entry.userId).toBe(admin.id);
    expect(JSON.stringify(entry.after)).not.toContain(row.passwordHash);
    expect(JSON.stringify(entry.after)).not.toContain(answer.oneTimePassword);
  });

  it('does not take a password from the body (400 naming it): the one-time password is the server’s', async () => {
    const email = uniqueEmail('chosen');
    const res = await request(env.app).post('/api/users').set(adminAuth).send({ email, name: 'Chosen', roles: ['tester'], password: 'my own password here' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['password']);
    expect((await login(email, 'my own password here')).status).toBe(401);
  });

  it('answers 400 naming the e-mail, the name and the roles, and writes nothing', async () => {
    const email = uniqueEmail('bad');
    const res = await request(env.app).post('/api/users').set(adminAuth).send({ email: 'not-an-email', name: ' ', roles: [] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'name', 'roles']);
    const again = await request(env.app).post('/api/users').set(adminAuth).send({ email, name: 'X', roles: ['tester'], siteIds: [987654321] });
    expect(again.status).toBe(400);
    expect(again.body.error.fields).toHaveProperty('siteIds');
    expect(await env.db.getRepository(User).existsBy({ email })).toBe(false);
  });

  it('answers 409 naming the e-mail when it is already in use', async () => {
    const other = await createTestUser(env.db, ['tester']);
    const res = await request(env.app).post('/api/users').set(adminAuth).send({ email: other.email, name: 'Twin', roles: ['tester'] });
    expect(res.status).toBe(409);
    expect(res.body.error.fields).toHaveProperty('email');
  });
});

describe('POST /api/users/:id/reset-password', () => {
  it('answers a new one-time password once: the old password stops working, the new one works, a lock is cleared', async () => {
    const u = await createTestUser(env.db, ['tester'], { failedSignIns: 3, lockedUntil: new Date(Date.now() + 10 * 60_000) });
    const res = await request(env.app).post(`/api/users/${u.id}/reset-password`).set(adminAuth);
    expect(res.status).toBe(200);
    const answer = personWithPasswordSchema.parse(res.body);
    expect(answer.id).toBe(u.id);
    expect(answer.lockedUntil).toBeNull();
    expect(answer.oneTimePassword).not.toBe(TEST_PASSWORD);

    const row = await rowOf(u.id);
    expect(row.failedSignIns).toBe(0);
    expect(row.lockedUntil).toBeNull();
    expect(await bcrypt.compare(answer.oneTimePassword, row.passwordHash)).toBe(true);

    expect((await login(u.email, TEST_PASSWORD)).status).toBe(401);
    expect((await login(u.email, answer.oneTimePassword)).status).toBe(200);
  });

  it('audits the reset with before and after, without the password or its hash', async () => {
    const u = await createTestUser(env.db, ['manager']);
    const res = await request(env.app).post(`/api/users/${u.id}/reset-password`).set(adminAuth);
    expect(res.status).toBe(200);
    const rows = await auditRows(u.id);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ action: 'update', userId: admin.id, note: 'password reset: one-time password issued' });
    expect(rows[0].before).toMatchObject({ id: u.id, email: u.email });
    expect(rows[0].after).toMatchObject({ id: u.id, email: u.email });
    const stored = JSON.stringify([rows[0].before, rows[0].after]);
    expect(stored).not.toContain(res.body.oneTimePassword);
    expect(stored).not.toContain((await rowOf(u.id)).passwordHash);
    expect(stored).not.toContain('passwordHash');
  });

  it('answers 404 for an unknown person and 403 for a manager, changing nothing', async () => {
    expect((await request(env.app).post('/api/users/987654321/reset-password').set(adminAuth)).status).toBe(404);
    const u = await createTestUser(env.db, ['tester']);
    const manager = await createTestUser(env.db, ['manager']);
    const denied = await request(env.app).post(`/api/users/${u.id}/reset-password`).set(bearer(env.config, manager.id));
    expect(denied.status).toBe(403);
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(200);
    expect(await auditRows(u.id)).toHaveLength(0);
  });
});

describe('POST /api/users/:id/unlock', () => {
  it('ends a sign-in lock after too many failures: the right password works again at once', async () => {
    const u = await createTestUser(env.db, ['tester']);
    for (let i = 0; i < 5; i++) expect((await login(u.email, `wrong-${i}`)).status).toBe(401);
    // Locked: the right password from the address that failed is refused like a wrong one (no 429 that reveals the account).
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(401);
    const listed = (await request(env.app).get('/api/users').query({ q: u.email }).set(adminAuth)).body.items.find((p: { id: number }) => p.id === u.id);
    expect(listed.lockedUntil).not.toBeNull();

    const res = await request(env.app).post(`/api/users/${u.id}/unlock`).set(adminAuth);
    expect(res.status).toBe(200);
    expect(personViewSchema.parse(res.body).lockedUntil).toBeNull();
    const row = await rowOf(u.id);
    expect(row.lockedUntil).toBeNull();
    expect(row.failedSignIns).toBe(0);
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(200);

    const entry = (await auditRows(u.id)).find((a) => a.note === 'sign-in unlocked');
    expect(entry?.userId).toBe(admin.id);
    expect((entry?.before as { lockedUntil: string | null }).lockedUntil).not.toBeNull();
    expect((entry?.after as { lockedUntil: string | null }).lockedUntil).toBeNull();
  });

  it('answers 404 for an unknown person and 403 for a tester', async () => {
    expect((await request(env.app).post('/api/users/987654321/unlock').set(adminAuth)).status).toBe(404);
    const u = await createTestUser(env.db, ['tester'], { lockedUntil: new Date(Date.now() + 10 * 60_000) });
    const tester = await createTestUser(env.db, ['tester']);
    expect((await request(env.app).post(`/api/users/${u.id}/unlock`).set(bearer(env.config, tester.id))).status).toBe(403);
    expect((await rowOf(u.id)).lockedUntil).not.toBeNull();
  });
});

describe('PATCH /api/users/:id — keeping an administrator', () => {
  it('refuses with 409 an administrator removing the administrator role from themself, and writes nothing', async () => {
    const me = await createTestUser(env.db, ['admin', 'manager']);
    const res = await request(env.app).patch(`/api/users/${me.id}`).set(bearer(env.config, me.id)).send({ roles: ['manager'] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('own_admin_role');
    expect(res.body.error.message).toMatch(/another administrator/);
    expect(res.body.error.fields).toHaveProperty('roles');
    expect((await rowOf(me.id)).roles).toEqual(['admin', 'manager']);
    expect(await auditRows(me.id)).toHaveLength(0);
  });

  it('refuses with 409 an administrator deactivating themself', async () => {
    const me = await createTestUser(env.db, ['admin']);
    const res = await request(env.app).patch(`/api/users/${me.id}`).set(bearer(env.config, me.id)).send({ active: false });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('own_account');
    expect(res.body.error.fields).toHaveProperty('active');
    expect((await rowOf(me.id)).active).toBe(true);
  });

  it('lets an administrator change their own other roles and name, keeping admin', async () => {
    const me = await createTestUser(env.db, ['admin']);
    const res = await request(env.app).patch(`/api/users/${me.id}`).set(bearer(env.config, me.id)).send({ roles: ['admin', 'engineer'], name: 'Renamed Admin' });
    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['admin', 'engineer']);
    expect(res.body.name).toBe('Renamed Admin');
  });

  it('lets another administrator remove the administrator role, audited with before and after', async () => {
    const other = await createTestUser(env.db, ['admin']);
    const res = await request(env.app).patch(`/api/users/${other.id}`).set(adminAuth).send({ roles: ['engineer'] });
    expect(res.status).toBe(200);
    expect(res.body.roles).toEqual(['engineer']);
    const [entry] = await auditRows(other.id);
    expect(entry).toMatchObject({ action: 'update', userId: admin.id });
    expect((entry.before as { roles: string[] }).roles).toEqual(['admin']);
    expect((entry.after as { roles: string[] }).roles).toEqual(['engineer']);
    expect(JSON.stringify(entry)).not.toContain('passwordHash');
  });

  it('answers 400 naming the field for no roles, an unknown site or an empty change, and writes nothing', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const noRoles = await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ roles: [] });
    expect(noRoles.status).toBe(400);
    expect(noRoles.body.error.fields).toHaveProperty('roles');
    const badSite = await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ siteIds: [987654321] });
    expect(badSite.status).toBe(400);
    expect(badSite.body.error.fields).toHaveProperty('siteIds');
    // A password is not changed through PATCH (reset-password is the one way): alone it is an empty change.
    const password = await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ password: 'a new password 123' });
    expect(password.status).toBe(400);
    expect(await auditRows(u.id)).toHaveLength(0);
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(200);
  });
});

describe('deactivation', () => {
  it('ends the person’s token at once and refuses their sign-in; reactivation lets them sign in again', async () => {
    const u = await createTestUser(env.db, ['tester']);
    const token = (await login(u.email, TEST_PASSWORD)).body.token as string;
    const me = () => request(env.app).get('/api/units').set('Authorization', `Bearer ${token}`);
    expect((await me()).status).toBe(200);

    const off = await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ active: false });
    expect(off.status).toBe(200);
    expect(off.body.active).toBe(false);
    const refused = await me();
    expect(refused.status).toBe(401);
    expect(refused.body.error.code).toBe('unauthorized');
    const signIn = await login(u.email, TEST_PASSWORD);
    expect(signIn.status).toBe(401);
    expect(signIn.body.error.code).toBe('account_inactive');

    const on = await request(env.app).patch(`/api/users/${u.id}`).set(adminAuth).send({ active: true });
    expect(on.status).toBe(200);
    expect((await login(u.email, TEST_PASSWORD)).status).toBe(200);
    const actions = (await auditRows(u.id)).map((a) => [(a.before as { active: boolean }).active, (a.after as { active: boolean }).active]);
    expect(actions).toEqual([
      [true, false],
      [false, true],
    ]);
  });
});

describe('GET /api/users — one page of people', () => {
  it('searches by name or e-mail, filters by role and active, pages by name with the total', async () => {
    const tag = Math.random().toString(36).slice(2, 8);
    const made = [];
    for (const [i, name] of ['Cara', 'Abel', 'Bea'].entries()) {
      made.push(await createTestUser(env.db, i === 2 ? ['manager'] : ['tester'], { name: `${name} ${tag}`, email: `${name.toLowerCase()}-${tag}@test.example`, active: i !== 1 }));
    }
    const get = (query: Record<string, string | number>) => request(env.app).get('/api/users').query(query).set(adminAuth);

    const byName = await get({ q: tag, pageSize: 2 });
    expect(byName.status).toBe(200);
    const page1 = personPageSchema.parse(byName.body);
    expect(page1.total).toBe(3);
    expect(page1.pageSize).toBe(2);
    expect(page1.items.map((p) => p.name)).toEqual([`Abel ${tag}`, `Bea ${tag}`]);
    const page2 = personPageSchema.parse((await get({ q: tag, pageSize: 2, page: 2 })).body);
    expect(page2.items.map((p) => p.name)).toEqual([`Cara ${tag}`]);

    const byEmail = personPageSchema.parse((await get({ q: `bea-${tag}@` })).body);
    expect(byEmail.items.map((p) => p.id)).toEqual([made[2].id]);
    const managers = personPageSchema.parse((await get({ q: tag, role: 'manager' })).body);
    expect(managers.items.map((p) => p.id)).toEqual([made[2].id]);
    const inactive = personPageSchema.parse((await get({ q: tag, active: 'false' })).body);
    expect(inactive.items.map((p) => p.id)).toEqual([made[1].id]);
    const active = personPageSchema.parse((await get({ q: tag, active: 'true' })).body);
    expect(active.items.map((p) => p.id).sort((x, y) => x - y)).toEqual([made[0].id, made[2].id].sort((x, y) => x - y));
  });

  it('pages 25 by default and refuses a page size over 500 or an unknown role, naming the field', async () => {
    const plain = personPageSchema.parse((await request(env.app).get('/api/users').set(adminAuth)).body);
    expect(plain.pageSize).toBe(25);
    expect(plain.page).toBe(1);
    const big = await request(env.app).get('/api/users').query({ pageSize: 501 }).set(adminAuth);
    expect(big.status).toBe(400);
    expect(big.body.error.fields).toHaveProperty(['query.pageSize']);
    const role = await request(env.app).get('/api/users').query({ role: 'auditor' }).set(adminAuth);
    expect(role.status).toBe(400);
    expect(role.body.error.fields).toHaveProperty(['query.role']);
  });
});
