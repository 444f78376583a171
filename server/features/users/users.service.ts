import bcrypt from 'bcryptjs';
import { In, type EntityManager } from 'typeorm';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import type { UserCreate, UserDto, UserPatch } from '../../../shared/schemas/auth.js';
import { Site } from '../sites/site.entity.js';
import { User } from './user.entity.js';
import { toUserDto } from './user.mapper.js';

export const BCRYPT_COST = 10;

async function sitesByIds(m: EntityManager, ids: number[]): Promise<Site[]> {
  if (!ids.length) return [];
  const sites = await m.getRepository(Site).findBy({ id: In(ids) });
  const missing = ids.filter((id) => !sites.some((s) => s.id === id));
  if (missing.length) throw new AppError('invalid_input', 'Unknown site.', 400, { siteIds: `no site with id ${missing.join(', ')}` });
  return sites;
}

/** Lists every user, by name. */
export async function listUsers(m: EntityManager): Promise<UserDto[]> {
  const users = await m.getRepository(User).find({ relations: { sites: true }, order: { name: 'ASC' } });
  return users.map(toUserDto);
}

/** Creates a user (audited); the e-mail must be new. */
export async function createUser(m: EntityManager, clock: Clock, actorId: number | null, input: UserCreate, opts: { demo?: boolean; passwordHash?: string } = {}): Promise<UserDto> {
  const email = input.email.trim().toLowerCase();
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
    createdAt: clock.now(),
    updatedAt: clock.now(),
  });
  await m.save(user);
  const dto = toUserDto(user);
  await audit(m, clock, { userId: actorId, action: 'create', entity: 'user', entityId: user.id, after: dto });
  return dto;
}

/** Changes a user (roles, sites, name, password, active), audited with before and after. */
export async function updateUser(m: EntityManager, clock: Clock, actorId: number, id: number, patch: UserPatch): Promise<UserDto> {
  const repo = m.getRepository(User);
  const user = await repo.findOne({ where: { id }, relations: { sites: true } });
  if (!user) throw notFound('User');
  const before = toUserDto(user);
  if (patch.active === false && id === actorId) {
    throw new AppError('invalid_input', 'You cannot deactivate your own account.', 400, { active: 'not for your own account' });
  }
  if (patch.name !== undefined) user.name = patch.name;
  if (patch.roles !== undefined) user.roles = [...new Set(patch.roles)];
  if (patch.allSites !== undefined) user.allSites = patch.allSites;
  if (patch.active !== undefined) user.active = patch.active;
  if (patch.siteIds !== undefined) user.sites = await sitesByIds(m, patch.siteIds);
  if (patch.password !== undefined) {
    user.passwordHash = await bcrypt.hash(patch.password, BCRYPT_COST);
    user.failedSignIns = 0;
    user.lockedUntil = null;
  }
  user.updatedAt = clock.now();
  await repo.save(user);
  const after = toUserDto(user);
  await audit(m, clock, { userId: actorId, action: 'update', entity: 'user', entityId: id, before, after, note: patch.password ? 'password reset' : undefined });
  return after;
}
