import { z } from 'zod';
import { ROLES, roleSchema } from './roles.js';

// Sign-in and user payloads shared by the server's validation and the client's forms. Strict: an unknown field is a 400
// naming it; every list is bounded.

/** Sites one person may cover by name (more: give them all sites). */
export const USER_SITES_MAX = 200;
const rolesSchema = z.array(roleSchema).min(1, 'at least one role').max(ROLES.length, `at most ${ROLES.length} roles`);
const siteIdsSchema = z.array(z.number().int().positive()).max(USER_SITES_MAX, `at most ${USER_SITES_MAX} sites (or all sites)`);

export const loginBodySchema = z.strictObject({
  email: z.string().trim().min(1, 'required').email('not an e-mail address'),
  password: z.string().min(1, 'required').max(200, 'too long'),
});
export type LoginBody = z.infer<typeof loginBodySchema>;

/** bcrypt reads at most 72 bytes of a password (shared/auth/password-policy.ts uses these limits too). */
export const PASSWORD_MAX_BYTES = 72;
export const NEW_PASSWORD_MIN = 12;
/** Bytes of a text in UTF-8 (what bcrypt sees). */
export function utf8Bytes(text: string): number {
  return new TextEncoder().encode(text).length;
}
const withinBytes = (v: string) => utf8Bytes(v) <= PASSWORD_MAX_BYTES;
const BYTES_MESSAGE = `at most ${PASSWORD_MAX_BYTES} bytes (fewer characters with accents or symbols)`;

/** A new password's length: 12 characters or more, 72 bytes of UTF-8 at most. Whether it is guessable: the policy. */
export const passwordSchema = z
  .string()
  .refine((v) => [...v].length >= NEW_PASSWORD_MIN, `at least ${NEW_PASSWORD_MIN} characters`)
  .refine(withinBytes, BYTES_MESSAGE);

/** POST /api/auth/password: the current password and a new one (12 characters or more, 72 bytes of UTF-8 at most). */
export const passwordChangeSchema = z
  .strictObject({
    // A stored password has 72 bytes at most: a longer one cannot be it (bcrypt would compare only its first 72).
    currentPassword: z.string().min(1, 'required').max(200, 'too long').refine(withinBytes, BYTES_MESSAGE),
    newPassword: passwordSchema,
  })
  .refine((v) => v.newPassword !== v.currentPassword, { path: ['newPassword'], message: 'must differ from the current password' });
export type PasswordChange = z.infer<typeof passwordChangeSchema>;

export const userCreateSchema = z.strictObject({
  email: z.string().trim().email('not an e-mail address').max(254),
  name: z.string().trim().min(1, 'required').max(120),
  password: passwordSchema,
  roles: rolesSchema,
  siteIds: siteIdsSchema.default([]),
  allSites: z.boolean().default(false),
});
export type UserCreate = z.infer<typeof userCreateSchema>;

/** POST /api/users: the person without a password; the server makes a one-time password and answers it once. */
export const userCreateBodySchema = userCreateSchema.omit({ password: true });
export type UserCreateBody = z.infer<typeof userCreateBodySchema>;

/** PATCH /api/users/:id: name, roles, sites, active. A new password only through reset-password. */
export const userPatchSchema = z
  .strictObject({
    name: z.string().trim().min(1, 'required').max(120),
    roles: rolesSchema,
    siteIds: siteIdsSchema,
    allSites: z.boolean(),
    active: z.boolean(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'nothing to change' });
export type UserPatch = z.infer<typeof userPatchSchema>;

/** GET /api/users: search by name or e-mail, one role, active or not; one page, by name. */
export const userListQuerySchema = z.object({
  q: z.string().trim().max(120).optional(),
  role: roleSchema.optional(),
  active: z.enum(['true', 'false'], { message: 'true or false' }).transform((v) => v === 'true').optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(25),
});
export type UserListQuery = z.infer<typeof userListQuerySchema>;

/** The user as the API shows it (its schema: responses/auth.ts). */
export type { UserView as UserDto } from './responses/auth.js';

/** GET /api/security-events: one page of the security log, newest first. */
export const securityEventQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type SecurityEventQuery = z.infer<typeof securityEventQuerySchema>;
