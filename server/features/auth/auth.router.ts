import type { RequestHandler } from 'express';
import { route, Reply, type RouteDef } from '../../route-def.js';
import { loginBodySchema, passwordChangeSchema } from '../../../shared/schemas/auth.js';
import { changeOwnPassword } from '../users/users.service.js';
import { requestFacts } from '../security/security.service.js';
import { login, logout } from './auth.service.js';

// Answers that carry a token or the person must not be kept by a browser or a proxy (errors included).
const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};
const uncached = (r: RouteDef): RouteDef => ({ ...r, handlers: [noStore, ...r.handlers] });

export const authRoutes: RouteDef[] = [
  // POST /api/auth/login — exchange e-mail and password for a session token. Not one transaction: a failed attempt
  // must be counted although the answer is an error. Throttled per client address as well (app.ts).
  route({
    method: 'post',
    path: '/auth/login',
    access: 'public',
    body: loginBodySchema,
    write: false,
    handler: ({ m, clock, ctx, body, req }) => login(m, clock, ctx.config, body.email, body.password, { db: ctx.db, facts: requestFacts(req), log: req.log }),
  }),
  // GET /api/auth/me — the signed-in user
  route({ method: 'get', path: '/auth/me', access: 'signed-in', handler: ({ user }) => user }),
  // POST /api/auth/password — the signed-in person replaces their own password (also a one-time one); every older
  // token ends, so the answer is a new token and the user, as a sign-in answers
  route({
    method: 'post',
    path: '/auth/password',
    access: 'signed-in',
    body: passwordChangeSchema,
    handler: ({ m, clock, ctx, user, body }) => changeOwnPassword(m, clock, ctx.config, user.id, body),
  }),
  // POST /api/auth/logout — sign out everywhere: every token of the person ends (204)
  route({
    method: 'post',
    path: '/auth/logout',
    access: 'signed-in',
    handler: async ({ m, user }) => {
      await logout(m, user.id);
      return new Reply({ status: 204 });
    },
  }),
].map(uncached);
