import bcrypt from 'bcryptjs';
import type { DataSource, EntityManager } from 'typeorm';
import type { Config } from '../../config.js';
import { AppError } from '../../common/app-error.js';
import { signToken } from '../../common/auth.js';
import type { Clock } from '../../common/clock.js';
import { User } from '../users/user.entity.js';
import { toUserDto } from '../users/user.mapper.js';
import { addressFailedSince, recordSecurityEvent, type RequestFacts } from '../security/security.service.js';
import { PASSWORD_MAX_BYTES, utf8Bytes } from '../../../shared/auth/password-policy.js';
import type { LoginAnswer } from '../../../shared/schemas/responses/index.js';

// A hash to compare against when the e-mail is unknown, so both paths take the same time.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10);

/** The one refusal for a wrong password, an unknown e-mail and a locked account alike (it reveals no account). */
const wrongCredentials = () => new AppError('invalid_credentials', 'E-mail or password is wrong.', 401);

/** Where a sign-in is recorded: the data source (security log, outside any transaction) and the request's facts. */
export interface SignInContext {
  db: DataSource;
  facts: RequestFacts;
  log?: Parameters<typeof recordSecurityEvent>[4];
}

/**
 * Checks e-mail and password. The rules (DEVELOPERS.md, "Sign-in protection"):
 * - a wrong password, an unknown e-mail and a locked account all answer 401 invalid_credentials;
 * - LOGIN_MAX_FAILURES wrong passwords in a row lock the account for LOGIN_LOCK_MINUTES (held in the database);
 * - while locked, the right password still signs in from an address that has not failed a sign-in to this account
 *   since the lock's last LOGIN_LOCK_MINUTES before it began (anything else from such an address is refused), so
 *   whoever locked the account out cannot keep its owner out; such a sign-in leaves the lock in place for everyone else;
 * - a password over 72 bytes never matches (bcrypt would compare only its first 72).
 * Each statement commits on its own (the caller gives a manager outside a transaction), so a failure counts even though
 * the request answers an error. Failures, locks and refused attempts go into the security log.
 */
export async function login(m: EntityManager, clock: Clock, config: Config, email: string, password: string, sc: SignInContext): Promise<LoginAnswer> {
  const repo = m.getRepository(User);
  const normalised = email.trim().toLowerCase();
  const now = clock.now();
  const record = (kind: 'sign_in_failed' | 'sign_in_locked' | 'account_locked', userId: number | null, detail: string) =>
    recordSecurityEvent(sc.db, clock, sc.facts, { kind, userId, email, detail }, sc.log);
  const tooLong = utf8Bytes(password) > PASSWORD_MAX_BYTES;
  const rows: { id: number; lockedUntil: Date | null }[] = await m.query('SELECT id, lockedUntil FROM `user` WHERE email = ?', [normalised]);
  const row = rows[0];
  if (!row) {
    await bcrypt.compare(password, DUMMY_HASH);
    await record('sign_in_failed', null, 'no account with this e-mail');
    throw wrongCredentials();
  }
  const user = await repo.findOneOrFail({ where: { id: row.id }, relations: { sites: true } });
  const ok = (await bcrypt.compare(password, user.passwordHash)) && !tooLong;
  const lockedUntil = row.lockedUntil === null ? null : new Date(row.lockedUntil);
  const locked = lockedUntil !== null && lockedUntil.getTime() > now.getTime();
  if (locked) {
    const lockMs = Math.round(config.LOGIN_LOCK_MINUTES * 60) * 1000;
    const since = new Date(lockedUntil.getTime() - 2 * lockMs);
    if (!ok || (await addressFailedSince(m, user.id, sc.facts.address, since))) {
      await record('sign_in_locked', user.id, 'attempt while the account is locked');
      throw wrongCredentials();
    }
  } else if (!ok) {
    // One atomic statement: concurrent failures on several servers all count. lockedUntil is set before the counter changes.
    const until = new Date(now.getTime() + Math.round(config.LOGIN_LOCK_MINUTES * 60) * 1000);
    await m.query(
      'UPDATE `user` SET lockedUntil = IF(failedSignIns + 1 >= ?, ?, lockedUntil), ' +
        'failedSignIns = IF(failedSignIns + 1 >= ?, 0, failedSignIns + 1), updatedAt = ? WHERE id = ?',
      [config.LOGIN_MAX_FAILURES, until, config.LOGIN_MAX_FAILURES, now, user.id],
    );
    await record('sign_in_failed', user.id, tooLong ? `wrong password (longer than ${PASSWORD_MAX_BYTES} bytes)` : 'wrong password');
    const after: { lockedUntil: Date | null }[] = await m.query('SELECT lockedUntil FROM `user` WHERE id = ?', [user.id]);
    const nowLocked = after[0]?.lockedUntil ? new Date(after[0].lockedUntil).getTime() > now.getTime() : false;
    if (nowLocked) await record('account_locked', user.id, `locked for ${config.LOGIN_LOCK_MINUTES} minute(s) after ${config.LOGIN_MAX_FAILURES} failed sign-ins`);
    throw wrongCredentials();
  }
  if (!user.active) throw new AppError('account_inactive', 'This account has been deactivated; ask an administrator.', 401);
  if (locked) {
    // Signed in from a clean address during a lock: the lock stays for everyone else.
    await m.query('UPDATE `user` SET lastSignInAt = ?, updatedAt = ? WHERE id = ?', [now, now, user.id]);
  } else {
    await m.query('UPDATE `user` SET failedSignIns = 0, lockedUntil = NULL, lastSignInAt = ?, updatedAt = ? WHERE id = ?', [now, now, user.id]);
  }
  const fresh = await repo.findOneOrFail({ where: { id: user.id }, relations: { sites: true } });
  return { token: signToken(user.id, config.jwtSecret, config.JWT_EXPIRES_IN, fresh.tokenVersion), user: toUserDto(fresh) };
}

/** POST /api/auth/logout: raises the person's token version, which ends every session token they hold. */
export async function logout(m: EntityManager, userId: number): Promise<void> {
  await m.query('UPDATE `user` SET tokenVersion = tokenVersion + 1 WHERE id = ?', [userId]);
}
