import bcrypt from 'bcryptjs';
import { randomBytes } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import { pick, present } from '../../common/audited-row.js';
import type { Clock } from '../../common/clock.js';
import { signToken } from '../../common/auth.js';
import type { Config } from '../../config.js';
import { passwordPolicyProblem } from '../../../shared/auth/password-policy.js';
import type { LoginAnswer } from '../../../shared/schemas/responses/auth.js';
import type { PasswordChange, UserCreate, UserCreateBody, UserDto, UserListQuery, UserPatch } from '../../../shared/schemas/auth.js';
import type { PersonPage, PersonView, PersonWithPassword } from '../../../shared/schemas/responses/admin.js';
import { Site } from '../sites/site.entity.js';
import { User } from './user.entity.js';
import { toPersonView, toUserDto } from './user.mapper.js';

export const BCRYPT_COST = 10;

async function sitesByIds(m: EntityManager, ids: number[]): Promise<Site[]> {
  if (!ids.length) return [];
  const sites = await m.getRepository(Site).findBy({ id: In(ids) });
  const missing = ids.filter((id) => !sites.some((s) => s.id === id));
  if (missing.length) throw new AppError('invalid_input', 'Unknown site.', 400, { siteIds: `no site with id ${missing.join(', ')}` });
  return sites;
}

/** One page of people by name: search by name or e-mail, one role, active or not; with any sign-in lock still running. */
export async function listUsers(m: EntityManager, clock: Clock, q: UserListQuery): Promise<PersonPage> {
  const qb = m.getRepository(User).createQueryBuilder('u').leftJoinAndSelect('u.sites', 's');
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    qb.andWhere('(u.name LIKE :like OR u.email LIKE :like)', { like });
  }
  if (q.role) qb.andWhere('JSON_CONTAINS(u.roles, :role)', { role: JSON.stringify(q.role) });
  if (q.active !== undefined) qb.andWhere('u.active = :active', { active: q.active });
  qb.orderBy('u.name', 'ASC').addOrderBy('u.id', 'ASC').skip((q.page - 1) * q.pageSize).take(q.pageSize);
  const [users, total] = await qb.getManyAndCount();
  const now = clock.now();
  return { items: users.map((u) => toPersonView(u, now)), total, page: q.page, pageSize: q.pageSize } satisfies PersonPage;
}

/**
 * A one-time password: 12 random bytes, 16 characters of base64url, drawn again in the rare case the password policy
 * would refuse it (a run of repeats or a dictionary word by chance), so every password the app hands out passes it.
 */
export function newOneTimePassword(): string {
  for (;;) {
    const candidate = randomBytes(12).toString('base64url');
    if (passwordPolicyProblem(candidate) === null) return candidate;
  }
}

/** 400 naming the field when a new password breaks the policy (shared/auth/password-policy.ts). */
export function assertPasswordPolicy(field: string, password: string, personal: readonly string[]): void {
  const problem = passwordPolicyProblem(password, personal);
  if (problem) throw new AppError('invalid_input', `The new password is refused: ${problem}.`, 400, { [field]: problem });
}

/** POST /api/users: creates the person with a one-time password, answered this once (only its hash is stored). */
export async function createPerson(m: EntityManager, clock: Clock, actorId: number, input: UserCreateBody): Promise<PersonWithPassword> {
  const oneTimePassword = newOneTimePassword();
  const dto = await createUser(m, clock, actorId, { ...input, password: oneTimePassword }, { mustChangePassword: true });
  const user = await loadUser(m, dto.id);
  return { ...toPersonView(user, clock.now()), oneTimePassword };
}

async function loadUser(m: EntityManager, id: number): Promise<User> {
  const user = await m.getRepository(User).findOne({ where: { id }, relations: { sites: true } });
  if (!user) throw notFound('User');
  return user;
}

/** Creates a user (audited); the e-mail must be new. */
export async function createUser(m: EntityManager, clock: Clock, actorId: number | null, input: UserCreate, opts: { demo?: boolean; passwordHash?: string; mustChangePassword?: boolean } = {}): Promise<UserDto> {
  const email = input.email.trim().toLowerCase();
  // A typed password must pass the policy; the demo accounts' password is seeded (passwordHash given), not typed.
  if (!opts.passwordHash && !opts.demo) assertPasswordPolicy('password', input.password, [email, input.name]);
  if (await m.getRepository(User).exists({ where: { email } })) {
    throw new AppError('email_taken', 'A user with this e-mail already exists.', 409, { email: 'already in use' });
  }
  const user = m.getRepository(User).create({
    email,
    name: input.name,
    passwordHash: opts.passwordHash ?? (await bcrypt.hash(input.password, BCRYPT_COST)),
    roles: [...new Set(input.roles)],
    allSites: input.allSites,
    sites: await sitesByIds(m, input.siteIds),
    active: true,
    demo: opts.demo ?? false,
    mustChangePassword: opts.mustChangePassword ?? false,
    createdAt: clock.now(),
    updatedAt: clock.now(),
  });
  await m.save(user);
  const dto = toUserDto(user);
  await audit(m, clock, { userId: actorId, action: 'create', entity: 'user', entityId: user.id, after: dto });
  return dto;
}

/**
 * Changes a person (name, roles, sites, active), audited with before and after. Nobody removes their own admin role or
 * deactivates themself (409): the actor is an active administrator, so one always remains. The active administrators
 * are locked and counted too, so two administrators demoting each other at once cannot leave none.
 */
export async function updateUser(m: EntityManager, clock: Clock, actorId: number, id: number, patch: UserPatch): Promise<PersonView> {
  const user = await loadUser(m, id);
  const now = clock.now();
  const before = toPersonView(user, now);
  if (id === actorId && patch.active === false) {
    throw new AppError('own_account', 'You cannot deactivate your own account: another administrator must do it.', 409, { active: 'not for your own account' });
  }
  if (id === actorId && patch.roles !== undefined && user.roles.includes('admin') && !patch.roles.includes('admin')) {
    throw new AppError('own_admin_role', 'You cannot remove the administrator role from yourself: another administrator must do it.', 409, {
      roles: 'you cannot remove your own administrator role',
    });
  }
  const wasAdmin = user.active && user.roles.includes('admin');
  if (patch.name !== undefined) user.name = patch.name;
  if (patch.roles !== undefined) user.roles = [...new Set(patch.roles)];
  if (patch.allSites !== undefined) user.allSites = patch.allSites;
  if (patch.active !== undefined && patch.active !== user.active) {
    user.active = patch.active;
    // Deactivated or reactivated: every token issued before ends (a reactivation must not revive an old session).
    user.tokenVersion += 1;
  }
  if (patch.siteIds !== undefined) user.sites = await sitesByIds(m, patch.siteIds);
  if (wasAdmin && !(user.active && user.roles.includes('admin')) && (await otherActiveAdmins(m, id)) === 0) {
    throw new AppError('last_admin', 'This is the last active administrator: give another person the administrator role first.', 409, {
      [patch.active === false ? 'active' : 'roles']: 'the last active administrator',
    });
  }
  user.updatedAt = now;
  await m.getRepository(User).save(user);
  const after = toPersonView(user, now);
  // The audit shows the fields the change named, nothing else.
  const fields = Object.keys(present(patch));
  await audit(m, clock, { userId: actorId, action: 'update', entity: 'user', entityId: id, before: pick(before, fields), after: pick(after, fields) });
  return after;
}

/** Active administrators other than this person, their rows locked until the request's transaction ends. */
async function otherActiveAdmins(m: EntityManager, id: number): Promise<number> {
  const rows: { id: number }[] = await m.query("SELECT id FROM `user` WHERE active = 1 AND JSON_CONTAINS(roles, '\"admin\"') AND id <> ? FOR UPDATE", [id]);
  return rows.length;
}

/** POST /api/users/:id/reset-password: a new one-time password (answered once, stored hashed); clears a sign-in lock. */
export async function resetPassword(m: EntityManager, clock: Clock, actorId: number, id: number, onUnlocked?: () => void): Promise<PersonWithPassword> {
  const user = await loadUser(m, id);
  const now = clock.now();
  const before = toPersonView(user, now);
  const oneTimePassword = newOneTimePassword();
  user.passwordHash = await bcrypt.hash(oneTimePassword, BCRYPT_COST);
  user.mustChangePassword = true;
  user.tokenVersion += 1;
  if (before.lockedUntil !== null) onUnlocked?.();
  user.failedSignIns = 0;
  user.lockedUntil = null;
  user.updatedAt = now;
  await m.getRepository(User).save(user);
  const after = toPersonView(user, now);
  await audit(m, clock, { userId: actorId, action: 'update', entity: 'user', entityId: id, before, after, note: 'password reset: one-time password issued' });
  return { ...after, oneTimePassword };
}

/** POST /api/users/:id/unlock: ends a sign-in lock and clears the failure count (audited). */
export async function unlockUser(m: EntityManager, clock: Clock, actorId: number, id: number, onUnlocked?: () => void): Promise<PersonView> {
  const user = await loadUser(m, id);
  const now = clock.now();
  const before = { ...toPersonView(user, now), failedSignIns: user.failedSignIns };
  if (before.lockedUntil !== null) onUnlocked?.();
  user.failedSignIns = 0;
  user.lockedUntil = null;
  user.updatedAt = now;
  await m.getRepository(User).save(user);
  const after = toPersonView(user, now);
  await audit(m, clock, { userId: actorId, action: 'update', entity: 'user', entityId: id, before, after: { ...after, failedSignIns: 0 }, note: 'sign-in unlocked' });
  return after;
}

/**
 * POST /api/auth/password: the signed-in person replaces their password (the current one checked, the new one held to
 * the password policy); ends the duty to change a one-time password and every token issued before, so the answer is a
 * new token with the user. Audited without any hash.
 */
export async function changeOwnPassword(m: EntityManager, clock: Clock, config: Config, userId: number, input: PasswordChange): Promise<LoginAnswer> {
  const user = await loadUser(m, userId);
  if (!(await bcrypt.compare(input.currentPassword, user.passwordHash))) {
    throw new AppError('invalid_input', 'The current password is wrong.', 400, { currentPassword: 'wrong password' });
  }
  assertPasswordPolicy('newPassword', input.newPassword, [user.email, user.name]);
  const now = clock.now();
  const before = toUserDto(user);
  user.passwordHash = await bcrypt.hash(input.newPassword, BCRYPT_COST);
  user.mustChangePassword = false;
  user.tokenVersion += 1;
  user.updatedAt = now;
  await m.getRepository(User).save(user);
  const after = toUserDto(user);
  await audit(m, clock, { userId, action: 'update', entity: 'user', entityId: userId, before, after, note: 'password changed by its owner' });
  return { token: signToken(userId, config.jwtSecret, config.JWT_EXPIRES_IN, user.tokenVersion), user: after };
}
