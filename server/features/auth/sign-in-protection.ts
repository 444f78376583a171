import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { AppError } from '../../common/app-error.js';
import type { AppContext } from '../../context.js';
import { recordSecurityEvent, requestFacts } from '../security/security.service.js';

// Sign-in protection per client address (the per-account lock lives in auth.service.ts; DEVELOPERS.md "Sign-in
// protection" states the rules).

/** TRUST_PROXY as Express's 'trust proxy' setting: false, a hop count, or a list of addresses, subnets or names. */
export function trustProxySetting(value: string | undefined): boolean | number | string[] {
  const v = (value ?? 'off').trim();
  if (v === '' || v === 'off') return false;
  if (/^\d+$/.test(v)) return Number(v);
  return v.split(',').map((s) => s.trim()).filter(Boolean);
}

/**
 * POST /api/auth/login, per client address: at most LOGIN_RATE_LIMIT_MAX failed sign-ins (401, any accounts) in
 * LOGIN_RATE_LIMIT_WINDOW_MINUTES, then 429 too_many_attempts with Retry-After until the window ends. Successful sign-ins
 * and malformed requests (400) are not counted. The count is held in this process's memory (one app server; several would each count their own).
 */
export function loginRateLimit(context: AppContext): RequestHandler {
  const { config } = context;
  const windowMs = Math.round((config.LOGIN_RATE_LIMIT_WINDOW_MINUTES ?? 15) * 60_000);
  return rateLimit({
    windowMs,
    limit: config.LOGIN_RATE_LIMIT_MAX ?? 20,
    skip: (req) => req.method !== 'POST',
    // Only refused credentials (401) count: a sign-in, a malformed request (400) or a refusal by this limit does not.
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // A client may send X-Forwarded-For when no proxy is trusted; it is simply not believed (TRUST_PROXY).
    validate: { xForwardedForHeader: false },
    handler: (req, res, next) => {
      const reset = (req as typeof req & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      const seconds = Math.max(1, Math.ceil(((reset?.getTime() ?? Date.now() + windowMs) - Date.now()) / 1000));
      res.setHeader('Cache-Control', 'no-store');
      const email = typeof req.body?.email === 'string' ? req.body.email : null;
      void recordSecurityEvent(context.db, context.clock, requestFacts(req), { kind: 'sign_in_throttled', email, detail: `retry after ${seconds} s` }, req.log).finally(() =>
        next(
          new AppError('too_many_attempts', `Too many failed sign-ins from this address: try again in ${Math.ceil(seconds / 60)} minute(s).`, 429, undefined, {
            'Retry-After': String(seconds),
          }),
        ),
      );
    },
  });
}
