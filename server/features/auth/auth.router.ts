import type { RouteDef } from '../../route-def.js';
import { validate } from '../../common/validate.js';
import { loginBodySchema } from '../../../shared/schemas/auth.js';
import { ctx } from '../../context.js';
import { currentUser } from '../../common/auth.js';
import { login } from './auth.service.js';

export const authRoutes: RouteDef[] = [
  {
    // POST /api/auth/login — exchange e-mail and password for a session token
    method: 'post',
    path: '/auth/login',
    access: 'public',
    handlers: [
      validate({ body: loginBodySchema }),
      async (req, res) => {
        const { db, config } = ctx(req);
        const body = res.locals.body as { email: string; password: string };
        res.json(await login(db, config, body.email, body.password));
      },
    ],
  },
  {
    // GET /api/auth/me — the signed-in user
    method: 'get',
    path: '/auth/me',
    access: 'signed-in',
    handlers: [(_req, res) => void res.json(currentUser(res))],
  },
];
