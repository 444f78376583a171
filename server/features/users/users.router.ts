import { route, type RouteDef } from '../../route-def.js';
import { userParams } from '../../common/params.js';
import { userCreateSchema, userPatchSchema } from '../../../shared/schemas/auth.js';
import { createUser, listUsers, updateUser } from './users.service.js';

export const userRoutes: RouteDef[] = [
  // GET /api/users — everyone who can sign in (administration)
  route({ method: 'get', path: '/users', access: ['admin'], handler: ({ m }) => listUsers(m) }),
  // POST /api/users — create a person with roles and sites
  route({ method: 'post', path: '/users', access: ['admin'], body: userCreateSchema, status: 201, handler: ({ m, clock, user, body }) => createUser(m, clock, user.id, body) }),
  // PATCH /api/users/:userId — change roles, sites, name; deactivate; reset the password
  route({
    method: 'patch',
    path: '/users/:userId',
    access: ['admin'],
    params: userParams,
    body: userPatchSchema,
    handler: ({ m, clock, user, params, body }) => updateUser(m, clock, user.id, params.userId, body),
  }),
];
