import { z } from 'zod';
import { roleSchema } from '../roles.js';
import { isoDateTime, rowId } from './common.js';

// Answers of the sign-in, user and health routes.

/** A user as the API shows it (never the hash or the counters): GET /api/auth/me, GET /api/users (each). */
export const userViewSchema = z.strictObject({
  id: rowId,
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
  /** The sites whose mail a manager receives (empty: all sites or not a manager). */
  siteIds: z.array(rowId),
  allSites: z.boolean(),
  active: z.boolean(),
  /** A demo account (invented Kestrel Valley data). */
  demo: z.boolean(),
  /** Signed in with a one-time password: a new password must be chosen before anything else. */
  mustChangePassword: z.boolean(),
  lastSignInAt: isoDateTime.nullable(),
});
export type UserView = z.infer<typeof userViewSchema>;
/** The signed-in user, as GET /api/auth/me answers. */
export type SessionUser = UserView;

/** POST /api/auth/login — a token and the user. */
export const loginAnswerSchema = z.strictObject({ token: z.string().min(1), user: userViewSchema });
export type LoginAnswer = z.infer<typeof loginAnswerSchema>;

/** GET /api/health — up, the database reachable, the demo data loaded, the local mail sink running. */
export const healthAnswerSchema = z.strictObject({
  status: z.enum(['ok', 'degraded']),
  db: z.enum(['ok', 'down']),
  /** The invented Kestrel Valley demo data (and its demo accounts) is loaded. */
  demo: z.boolean(),
  /** The local mail sink runs, so the outbox page has something to show. */
  mailSink: z.boolean(),
  /** On a 503 only: the request's id, as in every 5xx answer (X-Request-Id). */
  requestId: z.string().optional(),
});
export type HealthAnswer = z.infer<typeof healthAnswerSchema>;
