import { route, type RouteDef } from '../../route-def.js';
import { loginBodySchema, passwordChangeSchema } from '../../../shared/schemas/auth.js';
import { changeOwnPassword } from '../users/users.service.js';
import { login } from './auth.service.js';

export const authRoutes: RouteDef[] = [
  // POST /api/auth/login — exchange e-mail and password for a session token. Not one transaction: a failed attempt
  // must be counted although the answer is an error.
  route({
    method: 'post',
    path: '/auth/login',
    access: 'public',
    body: loginBodySchema,
    write: false,
    handler: ({ m, clock, ctx, body }) => login(m, clock, ctx.config, body.email, body.password),
  }),
  // GET /api/auth/me — the signed-in user
  route({ method: 'get', path: '/auth/me', access: 'signed-in', handler: ({ user }) => user }),
  // POST /api/auth/password — the signed-in person replaces their own password (also a one-time one)
  route({
    method: 'post',
    path: '/auth/password',
    access: 'signed-in',
    body: passwordChangeSchema,
    handler: ({ m, clock, user, body }) => changeOwnPassword(m, clock, user.id, body),
  }),
];
