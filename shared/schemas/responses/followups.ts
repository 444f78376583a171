import { z } from 'zod';
import { EVENT_STATUSES } from '../enums.js';
import { isoDateTime, pageOf, rowId } from './common.js';
import { followUpViewSchema } from './events.js';

// Answers of the follow-up list route.

/** GET /api/follow-ups (each item): an open follow-up with its event, unit and site. */
export const followUpListItemSchema = followUpViewSchema.extend({
  eventId: rowId,
  eventStatus: z.enum(EVENT_STATUSES),
  eventOccurredAt: isoDateTime,
  unitId: rowId,
  unitSerial: z.string(),
  siteId: rowId,
  siteName: z.string(),
  /** IANA time zone of the site: the due date is shown in it. */
  siteTimeZone: z.string(),
  /** The site's date format (BCP 47); null or absent: ISO form. */
  siteLocale: z.string().nullable().optional(),
  /** Whole days on the site's calendar since the due day, once the due time has passed; null before it or without one. */
  daysOverdue: z.number().int().nonnegative().nullable(),
});
export type FollowUpListItem = z.infer<typeof followUpListItemSchema>;

/** GET /api/follow-ups — one page of follow-ups. */
export const followUpListPageSchema = pageOf(followUpListItemSchema);
export type FollowUpListPage = z.infer<typeof followUpListPageSchema>;
