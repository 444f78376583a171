import { z } from 'zod';
import { NOTIFICATION_KINDS } from '../enums.js';
import { isoDateTime, rowId } from './common.js';

/** POST /api/notifications/:notificationId/resend — the fresh copy queued (201). */
export const resentNotificationSchema = z.strictObject({
  id: rowId,
  /** The mail it copies. */
  resentFrom: rowId,
  kind: z.enum(NOTIFICATION_KINDS),
  eventId: rowId.nullable(),
  screeningId: rowId.nullable(),
  to: z.string(),
  subject: z.string(),
  status: z.literal('queued'),
  createdAt: isoDateTime,
});
export type ResentNotification = z.infer<typeof resentNotificationSchema>;
