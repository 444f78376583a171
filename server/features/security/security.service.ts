import type { ErrorRequestHandler, Request } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import { AppError } from '../../common/app-error.js';
import type { Clock } from '../../common/clock.js';
import { ctx } from '../../context.js';
import type { SecurityEventKind, SecurityEventPage, SecurityEventView } from '../../../shared/schemas/responses/security.js';
import type { SecurityEventQuery } from '../../../shared/schemas/auth.js';
import { SecurityEvent } from './security-event.entity.js';

/** Where a request came from and what it asked for, as the security log records it. */
export interface RequestFacts {
  address: string | null;
  route: string;
}

/** The client's address (Express's req.ip: X-Forwarded-For counts only as TRUST_PROXY allows) and the method and path. */
export function requestFacts(req: Request): RequestFacts {
  const path = (req.originalUrl ?? req.url).split('?')[0]!;
  return { address: (req.ip ?? req.socket.remoteAddress ?? null)?.slice(0, 64) ?? null, route: `${req.method} ${path}`.slice(0, 200) };
}

export interface SecurityEventInput {
  kind: SecurityEventKind;
  userId?: number | null;
  email?: string | null;
  detail?: string | null;
}

/**
 * Writes one event of the security log through the data source's own manager: never inside the request's transaction,
 * so a refusal that rolls the request back is still recorded. A failure to write is logged, not answered.
 */
export async function recordSecurityEvent(db: DataSource, clock: Clock, facts: RequestFacts, input: SecurityEventInput, log?: Request['log']): Promise<void> {
  try {
    await db.manager.insert(SecurityEvent, {
      at: clock.now(),
      kind: input.kind,
      userId: input.userId ?? null,
      email: input.email === undefined || input.email === null ? null : [...input.email].slice(0, 254).join(''),
      address: facts.address,
      route: facts.route,
      detail: input.detail ? input.detail.slice(0, 300) : null,
    });
  } catch (err) {
    log?.error({ err }, 'security event not recorded');
  }
}

/**
 * Has this address failed a sign-in to this account since `since` (a wrong password, or any attempt while locked)?
 * Read outside any transaction (sign-in runs without one).
 */
export async function addressFailedSince(m: EntityManager, userId: number, address: string | null, since: Date): Promise<boolean> {
  if (address === null) return true;
  const rows: unknown[] = await m.query(
    "SELECT 1 FROM `security_event` WHERE userId = ? AND kind IN ('sign_in_failed', 'sign_in_locked') AND address = ? AND at >= ? LIMIT 1",
    [userId, address, since],
  );
  return rows.length > 0;
}

// Authorization refusals (403 forbidden: the route table's roles, an engineer's normal screening run) go into the security
// log on their way to the error handler. A one-time password's "choose a new password first" is not a refusal.
export const recordRefusals: ErrorRequestHandler = (err, req, res, next) => {
  if (err instanceof AppError && err.status === 403 && err.code === 'forbidden') {
    const c = ctx(req);
    const user = res.locals.user as { id: number } | undefined;
    void recordSecurityEvent(c.db, c.clock, requestFacts(req), { kind: 'access_refused', userId: user?.id ?? null, detail: err.message }, req.log).finally(() =>
      next(err),
    );
    return;
  }
  next(err);
};

/** GET /api/security-events: one page of the security log, newest first, with the person's name where known. */
export async function listSecurityEvents(m: EntityManager, q: SecurityEventQuery): Promise<SecurityEventPage> {
  const [rows, [{ n }]]: [Array<SecurityEvent & { userName: string | null }>, [{ n: number | string }]] = await Promise.all([
    m.query(
      'SELECT e.*, u.name AS userName FROM `security_event` e LEFT JOIN `user` u ON u.id = e.userId ORDER BY e.at DESC, e.id DESC LIMIT ? OFFSET ?',
      [q.pageSize, (q.page - 1) * q.pageSize],
    ),
    m.query('SELECT COUNT(*) AS n FROM `security_event`'),
  ]);
  const items = rows.map(
    (r) =>
      ({
        id: Number(r.id),
        at: new Date(r.at).toISOString(),
        kind: r.kind,
        userId: r.userId === null ? null : Number(r.userId),
        userName: r.userName ?? null,
        email: r.email,
        address: r.address,
        route: r.route,
        detail: r.detail,
      }) satisfies SecurityEventView,
  );
  return { items, total: Number(n), page: q.page, pageSize: q.pageSize } satisfies SecurityEventPage;
}
