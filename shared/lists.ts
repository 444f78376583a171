// Time windows of the work lists (events, follow-ups): due buckets, days overdue, date filters. Pure functions of "now".
import { validZone, wallClock, zoneOffsetMinutes } from './format.js';
import type { FollowUpDue } from './schemas/enums.js';

export const DAY_MS = 86_400_000;
/** "Due this week": due from now to this many days ahead. */
export const DUE_SOON_DAYS = 7;

/** The due-date range of a bucket: `from` inclusive, `before` exclusive; null leaves that side open. */
export function followUpDueRange(due: FollowUpDue, now: Date): { from: Date | null; before: Date | null } {
  if (due === 'overdue') return { from: null, before: now };
  if (due === 'week') return { from: now, before: new Date(now.getTime() + DUE_SOON_DAYS * DAY_MS) };
  return { from: null, before: null };
}

/** Whole days on the site's calendar from the due day to today, for a follow-up past its due time; null otherwise. */
export function daysOverdue(dueAt: Date | string | null, now: Date, timeZone: string): number | null {
  if (dueAt === null) return null;
  const due = new Date(dueAt);
  if (Number.isNaN(due.getTime()) || due.getTime() >= now.getTime()) return null;
  const zone = validZone(timeZone);
  const a = wallClock(due, zone);
  const b = wallClock(now, zone);
  return Math.round((Date.UTC(b.year, b.month - 1, b.day) - Date.UTC(a.year, a.month - 1, a.day)) / DAY_MS);
}

/** The instant `days` days before `now`. */
export function daysBefore(now: Date, days: number): Date {
  return new Date(now.getTime() - days * DAY_MS);
}

const DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** An ISO date (`2026-07-01`, midnight UTC) or instant as a Date; `endOfDay` moves a date to its last millisecond. */
export function parseDateOrInstant(text: string, endOfDay = false): Date | null {
  const d = DATE_ONLY.exec(text);
  if (d) {
    const start = Date.UTC(Number(d[1]), Number(d[2]) - 1, Number(d[3]));
    const date = new Date(start);
    // 2026-02-30 is no date.
    if (date.getUTCMonth() !== Number(d[2]) - 1 || date.getUTCDate() !== Number(d[3])) return null;
    return endOfDay ? new Date(start + DAY_MS - 1) : date;
  }
  if (!/^\d{4}-\d{2}-\d{2}T/.test(text)) return null;
  const t = Date.parse(text);
  return Number.isNaN(t) ? null : new Date(t);
}

/**
 * The first instant of a calendar day in a time zone (`endOfDay`: its last millisecond), for date filters typed as days
 * on a person's own calendar; null when the text is no date.
 */
export function zoneDayBound(date: string, timeZone: string, endOfDay = false): Date | null {
  const d = DATE_ONLY.exec(date);
  if (!d || !parseDateOrInstant(date)) return null;
  const zone = validZone(timeZone);
  const [y, m, day] = [Number(d[1]), Number(d[2]), Number(d[3]) + (endOfDay ? 1 : 0)];
  const wall = Date.UTC(y, m - 1, day);
  // The zone's offset at the guess, then again at the instant found (a day that starts at a clock change).
  let at = wall - zoneOffsetMinutes(new Date(wall), zone) * 60_000;
  at = wall - zoneOffsetMinutes(new Date(at), zone) * 60_000;
  return new Date(endOfDay ? at - 1 : at);
}
