import { z } from 'zod';
import type { RouteDef } from '../../route-def.js';
import { validate } from '../../common/validate.js';
import { currentUser } from '../../common/auth.js';
import { userCreateSchema, userPatchSchema, type UserCreate, type UserPatch } from '../../../shared/schemas/auth.js';
import { ctx } from '../../context.js';
import { createUser, listUsers, updateUser } from './users.service.js';

const idParams = z.object({ id: z.coerce.number().int().positive('not a valid id') });

export const userRoutes: RouteDef[] = [
  {
    // GET /api/users — everyone who can sign in (administration)
    method: 'get',
    path: '/users',
    access: ['admin'],
    handlers: [async (req, res) => void res.json(await listUsers(ctx(req).db))],
  },
  {
    // POST /api/users — create a person with roles and sites
    method: 'post',
    path: '/users',
    access: ['admin'],
    handlers: [
      validate({ body: userCreateSchema }),
      async (req, res) => void res.status(201).json(await createUser(ctx(req).db, currentUser(res).id, res.locals.body as UserCreate)),
    ],
  },
  {
    // PATCH /api/users/:id — change roles, sites, name; deactivate; reset the password
    method: 'patch',
    path: '/users/:id',
    access: ['admin'],
    handlers: [
      validate({ params: idParams, body: userPatchSchema }),
      async (req, res) => {
        const { id } = res.locals.params as { id: number };
        res.json(await updateUser(ctx(req).db, currentUser(res).id, id, res.locals.body as UserPatch));
      },
    ],
  },
];
