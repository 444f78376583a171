import { createSecretKey, type KeyObject } from 'node:crypto';
import type { RequestHandler } from 'express';
import jwt from 'jsonwebtoken';
import type { Role } from '../../shared/schemas/roles.js';
import type { UserDto } from '../../shared/schemas/auth.js';
import { ctx } from '../context.js';
import { SESSION_USER_COLUMNS, sessionUserFromRow, type SessionUserRow } from '../features/users/user.mapper.js';
import { AppError } from './app-error.js';

const unauthorized = (message: string) => new AppError('unauthorized', message, 401, undefined, { 'WWW-Authenticate': 'Bearer' });

/**
 * Signs a session token for a user id (HS256, expiring) carrying the user's token version (`ver`): raising the version
 * (password change or reset, deactivation, reactivation, sign-out) ends every token signed before.
 */
export function signToken(userId: number, secret: string, expiresIn: string, version = 0): string {
  return jwt.sign({ sub: String(userId), ver: version }, secret, { algorithm: 'HS256', expiresIn: expiresIn as jwt.SignOptions['expiresIn'] });
}

// The secret as a key object, made once: given the text, jsonwebtoken first tries it as a public key on every verify
// (and fails, at the cost of a thrown error) before it makes the secret key.
let verifyKey: { secret: string; key: KeyObject } | null = null;
function secretKey(secret: string): KeyObject {
  if (verifyKey?.secret !== secret) verifyKey = { secret, key: createSecretKey(Buffer.from(secret, 'utf8')) };
  return verifyKey.key;
}

/** The session's user by id: one query on the primary key, only the columns the answer needs (sites included). */
async function loadSessionUser(db: { query(sql: string, params: unknown[]): Promise<SessionUserRow[]> }, id: number) {
  const rows = await db.query(`SELECT ${SESSION_USER_COLUMNS} FROM \`user\` u WHERE u.id = ?`, [id]);
  return rows.length ? sessionUserFromRow(rows[0]) : null;
}

// Verifies the bearer token and reloads the user on every request, so a deactivation takes effect at once.
export const authenticate: RequestHandler = async (req, res, next) => {
  const header = req.headers.authorization ?? '';
  const m = /^Bearer\s+(\S+)$/i.exec(header);
  if (!m) return next(unauthorized('Sign in first (no bearer token).'));
  const { db, config } = ctx(req);
  let sub: string;
  let ver: number;
  try {
    const payload = jwt.verify(m[1], secretKey(config.jwtSecret), { algorithms: ['HS256'] });
    if (typeof payload === 'string' || typeof payload.sub !== 'string') throw new Error('no subject');
    if (!Number.isInteger(payload.ver)) throw new Error('no token version');
    sub = payload.sub;
    ver = payload.ver as number;
  } catch (err) {
    const expired = err instanceof jwt.TokenExpiredError;
    return next(unauthorized(expired ? 'Your session has expired; sign in again.' : 'The session token is not valid; sign in again.'));
  }
  const id = Number(sub);
  const found = Number.isSafeInteger(id) && id > 0 ? await loadSessionUser(db, id) : null;
  const user = found?.dto;
  if (!user || !user.active) return next(unauthorized('This account is not active; sign in again or ask an administrator.'));
  if (found.tokenVersion !== ver) return next(unauthorized('This session has ended (signed out, or the password changed); sign in again.'));
  // A one-time password still in use: only reading oneself and choosing a new password are allowed.
  if (user.mustChangePassword && !PASSWORD_CHANGE_ROUTES.has(`${req.method} ${req.route?.path ?? req.path}`)) {
    return next(new AppError('password_change_required', 'Choose a new password first: the one-time password allows nothing else.', 403));
  }
  res.locals.user = user;
  next();
};

// The routes a person who must replace a one-time password may still call.
const PASSWORD_CHANGE_ROUTES = new Set(['GET /auth/me', 'POST /auth/password', 'POST /auth/logout']);

/** The signed-in user of a request (after authenticate). */
export function currentUser(res: { locals: Record<string, unknown> }): UserDto {
  return res.locals.user as UserDto;
}

// Lets the request through only when the user holds one of the roles.
export function requireRoles(roles: readonly Role[]): RequestHandler {
  return (_req, res, next) => {
    const user = currentUser(res);
    if (!user.roles.some((r) => roles.includes(r))) {
      return next(new AppError('forbidden', `This needs one of the roles: ${roles.join(', ')}.`, 403));
    }
    next();
  };
}
