import { route, type RouteDef } from '../../route-def.js';
import { userParams } from '../../common/params.js';
import { userCreateBodySchema, userListQuerySchema, userPatchSchema } from '../../../shared/schemas/auth.js';
import { createPerson, listUsers, resetPassword, unlockUser, updateUser } from './users.service.js';

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
    handler: ({ m, clock, user, params }) => resetPassword(m, clock, user.id, params.userId),
  }),
  // POST /api/users/:userId/unlock — end a sign-in lock after too many failures
  route({
    method: 'post',
    path: '/users/:userId/unlock',
    access: ['admin'],
    params: userParams,
    handler: ({ m, clock, user, params }) => unlockUser(m, clock, user.id, params.userId),
  }),
];
