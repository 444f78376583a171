import { route, type RouteDef } from '../../route-def.js';
import { userParams } from '../../common/params.js';
import { userCreateBodySchema, userListQuerySchema, userPatchSchema } from '../../../shared/schemas/auth.js';
import { createPerson, listUsers, resetPassword, unlockUser, updateUser } from './users.service.js';
import { recordSecurityEvent, requestFacts } from '../security/security.service.js';
import type { RouteInput } from '../../route-def.js';

/** Records an ended sign-in lock in the security log once the request's transaction has committed. */
const unlockRecorder =
  (i: Pick<RouteInput<readonly ['admin'], unknown, unknown, unknown, undefined>, 'afterCommit' | 'ctx' | 'clock' | 'req'>, userId: number, how: string) => () =>
    i.afterCommit(() => void recordSecurityEvent(i.ctx.db, i.clock, requestFacts(i.req), { kind: 'account_unlocked', userId, detail: how }, i.req.log));

export const userRoutes: RouteDef[] = [
  // GET /api/users — one page of people (search by name or e-mail, role, active), by name
  route({ method: 'get', path: '/users', access: ['admin'], query: userListQuerySchema, handler: ({ m, clock, query }) => listUsers(m, clock, query) }),
  // POST /api/users — create a person with roles and sites; answers their one-time password once
  route({ method: 'post', path: '/users', access: ['admin'], body: userCreateBodySchema, status: 201, handler: ({ m, clock, user, body }) => createPerson(m, clock, user.id, body) }),
  // PATCH /api/users/:userId — change name, roles, sites; deactivate or reactivate
  route({
    method: 'patch',
    path: '/users/:userId',
    access: ['admin'],
    params: userParams,
    body: userPatchSchema,
    handler: ({ m, clock, user, params, body }) => updateUser(m, clock, user.id, params.userId, body),
  }),
  // POST /api/users/:userId/reset-password — a new one-time password, answered once; ends a sign-in lock
  route({
    method: 'post',
    path: '/users/:userId/reset-password',
    access: ['admin'],
    params: userParams,
    handler: (i) => resetPassword(i.m, i.clock, i.user.id, i.params.userId, unlockRecorder(i, i.params.userId, `password reset by ${i.user.name}`)),
  }),
  // POST /api/users/:userId/unlock — end a sign-in lock after too many failures
  route({
    method: 'post',
    path: '/users/:userId/unlock',
    access: ['admin'],
    params: userParams,
    handler: (i) => unlockUser(i.m, i.clock, i.user.id, i.params.userId, unlockRecorder(i, i.params.userId, `unlocked by ${i.user.name}`)),
  }),
];
