import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { Config } from '../../config.js';
import { AppError } from '../../common/app-error.js';
import { signToken } from '../../common/auth.js';
import { User } from '../users/user.entity.js';
import { toUserDto } from '../users/user.mapper.js';
import type { UserDto } from '../../../shared/schemas/auth.js';

// A hash to compare against when the e-mail is unknown, so both paths take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10);

const wrongCredentials = () => new AppError('invalid_credentials', 'E-mail or password is wrong.', 401);

/** Checks the password with the database-held lock: N failures lock the account for M minutes (429 + Retry-After). */
export async function login(db: DataSource, config: Config, email: string, password: string): Promise<{ token: string; user: UserDto }> {
  const repo = db.getRepository(User);
  const normalised = email.trim().toLowerCase();
  // The lock is judged on the database clock so that every app server agrees.
  const rows: { id: number; remaining: number | null }[] = await db.query(
    'SELECT id, TIMESTAMPDIFF(MICROSECOND, NOW(3), lockedUntil) / 1000000 AS remaining FROM `user` WHERE email = ?',
    [normalised],
  );
  const row = rows[0];
  if (!row) {
    await bcrypt.compare(password, DUMMY_HASH);
    throw wrongCredentials();
  }
  const remaining = row.remaining === null ? 0 : Number(row.remaining);
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
    await db.query(
      'UPDATE `user` SET lockedUntil = IF(failedSignIns + 1 >= ?, NOW(3) + INTERVAL ? SECOND, lockedUntil), ' +
        'failedSignIns = IF(failedSignIns + 1 >= ?, 0, failedSignIns + 1) WHERE id = ?',
      [config.LOGIN_MAX_FAILURES, Math.round(config.LOGIN_LOCK_MINUTES * 60), config.LOGIN_MAX_FAILURES, user.id],
    );
    throw wrongCredentials();
  }
  if (!user.active) throw new AppError('account_inactive', 'This account has been deactivated; ask an administrator.', 401);
  await db.query('UPDATE `user` SET failedSignIns = 0, lockedUntil = NULL, lastSignInAt = NOW(3) WHERE id = ?', [user.id]);
  const fresh = await repo.findOneOrFail({ where: { id: user.id }, relations: { sites: true } });
  return { token: signToken(user.id, config.jwtSecret, config.JWT_EXPIRES_IN), user: toUserDto(fresh) };
}
