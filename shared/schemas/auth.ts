import { z } from 'zod';
import { roleSchema } from './roles.js';

// Sign-in and user payloads shared by the server's validation and the client's forms.

export const loginBodySchema = z.object({
  email: z.string().trim().min(1, 'required').email('not an e-mail address'),
  password: z.string().min(1, 'required').max(200, 'too long'),
});
export type LoginBody = z.infer<typeof loginBodySchema>;

export const passwordSchema = z.string().min(10, 'at least 10 characters').max(200, 'at most 200 characters');

export const userCreateSchema = z.object({
  email: z.string().trim().email('not an e-mail address').max(254),
  name: z.string().trim().min(1, 'required').max(120),
  password: passwordSchema,
  roles: z.array(roleSchema).min(1, 'at least one role'),
  siteIds: z.array(z.number().int().positive()).default([]),
  allSites: z.boolean().default(false),
});
export type UserCreate = z.infer<typeof userCreateSchema>;

/** POST /api/users: the person without a password; the server makes a one-time password and answers it once. */
export const userCreateBodySchema = userCreateSchema.omit({ password: true });
export type UserCreateBody = z.infer<typeof userCreateBodySchema>;

/** PATCH /api/users/:id: name, roles, sites, active. A new password only through reset-password. */
export const userPatchSchema = z
  .object({
    name: z.string().trim().min(1, 'required').max(120),
    roles: z.array(roleSchema).min(1, 'at least one role'),
    siteIds: z.array(z.number().int().positive()),
    allSites: z.boolean(),
    active: z.boolean(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'nothing to change' });
export type UserPatch = z.infer<typeof userPatchSchema>;

/** The user as the API shows it (its schema: responses/auth.ts). */
export type { UserView as UserDto } from './responses/auth.js';
