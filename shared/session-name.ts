// A post-fault test session (or any reading set) named the way people speak of it: by when it was taken and by whom
// ("Tests of 29 Nov 2026 12:12 by Theo Tester"), never by its database id. Pure; times on the site's wall clock.
import { pad2, validZone, wallClock } from './format.js';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/**
 * "29 Nov 2026 12:12" on the zone's wall clock. A date without a time gives the day alone ("29 Nov 2026"): a date-only
 * string, or midnight UTC exactly, which is how a date entered without a time is stored (the case format's rule).
 * Empty → "—".
 */
export function dayAndTime(iso: string | null | undefined, timeZone: string | null | undefined): string {
  if (!iso) return '—';
  const dateOnly = /^(\d{4})-(\d{2})-(\d{2})(?:T00:00(?::00(?:\.000)?)?Z)?$/.exec(iso);
  if (dateOnly) return `${Number(dateOnly[3])} ${MONTHS[Number(dateOnly[2]) - 1]} ${dateOnly[1]}`;
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const w = wallClock(date, validZone(timeZone));
  return `${w.day} ${MONTHS[w.month - 1]} ${w.year} ${pad2(w.hour)}:${pad2(w.minute)}`;
}

export interface NamedSession {
  takenAt: string;
  createdById?: number | null;
}

/**
 * "Tests of 29 Nov 2026 12:12 by Theo Tester" (without a known tester: "Tests of 29 Nov 2026 12:12"). `personName`
 * answers a person's name, or an empty text when it does not know them.
 */
export function sessionName(s: NamedSession, timeZone: string | null | undefined, personName?: (id: number | null | undefined) => string | null | undefined): string {
  const who = s.createdById != null && personName ? personName(s.createdById) : null;
  return `Tests of ${dayAndTime(s.takenAt, timeZone)}${who ? ` by ${who}` : ''}`;
}

/** The session's name inside a sentence ("the tests of 29 Nov 2026 12:12 by Theo Tester"). */
export function sessionInSentence(s: NamedSession, timeZone: string | null | undefined, personName?: (id: number | null | undefined) => string | null | undefined): string {
  return `the t${sessionName(s, timeZone, personName).slice(1)}`;
}
