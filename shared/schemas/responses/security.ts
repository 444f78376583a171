import { z } from 'zod';
import { isoDateTime, pageOf, rowId } from './common.js';

// Answer of GET /api/security-events (administrators): the security log, newest first.

/** What happened (words for each: shared/security-words.ts). */
export const SECURITY_EVENT_KINDS = [
  'sign_in_failed',
  'sign_in_locked',
  'account_locked',
  'account_unlocked',
  'sign_in_throttled',
  'access_refused',
] as const;
export type SecurityEventKind = (typeof SECURITY_EVENT_KINDS)[number];

export const securityEventViewSchema = z.strictObject({
  id: rowId,
  at: isoDateTime,
  kind: z.enum(SECURITY_EVENT_KINDS),
  /** The person (signed in, or the account a sign-in named); null for an unknown e-mail. */
  userId: rowId.nullable(),
  /** Their name when the account exists. */
  userName: z.string().nullable(),
  /** The e-mail as typed on a sign-in. */
  email: z.string().nullable(),
  address: z.string().nullable(),
  route: z.string(),
  detail: z.string().nullable(),
});
export type SecurityEventView = z.infer<typeof securityEventViewSchema>;

export const securityEventPageSchema = pageOf(securityEventViewSchema);
export type SecurityEventPage = z.infer<typeof securityEventPageSchema>;
