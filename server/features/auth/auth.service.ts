import bcrypt from 'bcryptjs';
import type { EntityManager } from 'typeorm';
import type { Config } from '../../config.js';
import { AppError } from '../../common/app-error.js';
import { signToken } from '../../common/auth.js';
import type { Clock } from '../../common/clock.js';
import { User } from '../users/user.entity.js';
import { toUserDto } from '../users/user.mapper.js';
import type { LoginAnswer } from '../../../shared/schemas/responses/index.js';

// A hash to compare against when the e-mail is unknown, so both paths take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10);

const wrongCredentials = () => new AppError('invalid_credentials', 'E-mail or password is wrong.', 401);

/**
 * Checks the password with the database-held lock: N failures lock the account for M minutes (429 + Retry-After).
 * Each statement commits on its own (the caller gives a manager outside a transaction), so a failure counts even though
 * the request answers an error.
 */
export async function login(m: EntityManager, clock: Clock, config: Config, email: string, password: string): Promise<LoginAnswer> {
  const repo = m.getRepository(User);
  const normalised = email.trim().toLowerCase();
  const now = clock.now();
  const rows: { id: number; lockedUntil: Date | null }[] = await m.query('SELECT id, lockedUntil FROM `user` WHERE email = ?', [normalised]);
  const row = rows[0];
  if (!row) {
    await bcrypt.compare(password, DUMMY_HASH);
    throw wrongCredentials();
  }
  const remaining = row.lockedUntil === null ? 0 : (new Date(row.lockedUntil).getTime() - now.getTime()) / 1000;
  if (remaining > 0) {
    const seconds = Math.ceil(remaining);
    throw new AppError('too_many_attempts', `Too many failed sign-ins: this account is locked for ${Math.ceil(seconds / 60)} more minute(s).`, 429, undefined, {
      'Retry-After': String(seconds),
    });
  }
  const user = await repo.findOneOrFail({ where: { id: row.id }, relations: { sites: true } });
  const ok = await bcrypt.compare(password, user.passwordHash);
  if (!ok) {
    // One atomic statement: concurrent failures on several servers all count. lockedUntil is set before the counter changes.
    await m.query(
      'UPDATE `user` SET lockedUntil = IF(failedSignIns + 1 >= ?, ?, lockedUntil), ' +
        'failedSignIns = IF(failedSignIns + 1 >= ?, 0, failedSignIns + 1), updatedAt = ? WHERE id = ?',
      [config.LOGIN_MAX_FAILURES, new Date(now.getTime() + Math.round(config.LOGIN_LOCK_MINUTES * 60) * 1000), config.LOGIN_MAX_FAILURES, now, user.id],
    );
    throw wrongCredentials();
  }
  if (!user.active) throw new AppError('account_inactive', 'This account has been deactivated; ask an administrator.', 401);
  await m.query('UPDATE `user` SET failedSignIns = 0, lockedUntil = NULL, lastSignInAt = ?, updatedAt = ? WHERE id = ?', [now, now, user.id]);
  const fresh = await repo.findOneOrFail({ where: { id: user.id }, relations: { sites: true } });
  return { token: signToken(user.id, config.jwtSecret, config.JWT_EXPIRES_IN), user: toUserDto(fresh) };
}
