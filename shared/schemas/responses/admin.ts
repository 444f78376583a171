import { z } from 'zod';
import { userViewSchema } from './auth.js';
import { isoDateTime, pageOf } from './common.js';

// Answers of the administration routes for people (GET/POST/PATCH /api/users, reset-password, unlock).

/** A person as the administration shows them: the user and, while sign-in is locked, until when. */
export const personViewSchema = userViewSchema.extend({
  /** End of the sign-in lock after too many failures; null when sign-in is not locked now. */
  lockedUntil: isoDateTime.nullable(),
});
export type PersonView = z.infer<typeof personViewSchema>;

/** GET /api/users: one page of people, by name. */
export const personPageSchema = pageOf(personViewSchema);
export type PersonPage = z.infer<typeof personPageSchema>;

/** POST /api/users and POST /api/users/:id/reset-password: the person and their one-time password, answered this once. */
export const personWithPasswordSchema = personViewSchema.extend({ oneTimePassword: z.string().min(10) });
export type PersonWithPassword = z.infer<typeof personWithPasswordSchema>;
