// Display formatting shared by the client and the server's mail/PDF: rounding for reading, wall-clock time in a zone.
// Pure; the result JSON keeps full precision.

/** At most `digits` significant digits, no exponent, no trailing zeros ("3131", "0.28", "15.8"). */
export function formatSignificant(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.max(0, digits - 1 - magnitude);
  const text = Number(value.toFixed(Math.min(decimals, 12))).toString();
  return text.includes('e') ? value.toPrecision(digits) : text;
}

/** Two digits ("03"). */
export const pad2 = (n: number) => String(n).padStart(2, '0');

/** The zone when the runtime knows it, else UTC. */
export function validZone(timeZone: string | null | undefined): string {
  if (!timeZone) return 'UTC';
  if (zoneFormats.has(timeZone)) return timeZone;
  try {
    new Intl.DateTimeFormat('en', { timeZone });
    return timeZone;
  } catch {
    return 'UTC';
  }
}

// One wall-clock formatter per zone, made once (making an Intl.DateTimeFormat costs far more than using one).
const zoneFormats = new Map<string, Intl.DateTimeFormat>();
function zoneFormat(timeZone: string): Intl.DateTimeFormat {
  let f = zoneFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    if (zoneFormats.size < 500) zoneFormats.set(timeZone, f);
  }
  return f;
}

export interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

/** What a clock in the zone shows at that instant. */
export function wallClock(date: Date, timeZone: string): WallClock {
  const parts = zoneFormat(timeZone).formatToParts(date);
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value ?? 0);
  return { year: get('year'), month: get('month'), day: get('day'), hour: get('hour') % 24, minute: get('minute'), second: get('second') };
}

/** Minutes the zone is ahead of UTC at that instant (Europe/London in summer: 60). */
export function zoneOffsetMinutes(date: Date, timeZone: string): number {
  const w = wallClock(date, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return Math.round((asUtc - Math.floor(date.getTime() / 1000) * 1000) / 60000);
}

/** "+01:00", "−05:00". */
export function offsetText(minutes: number): string {
  const sign = minutes < 0 ? '−' : '+';
  const abs = Math.abs(minutes);
  return `${sign}${pad2(Math.floor(abs / 60))}:${pad2(abs % 60)}`;
}

// ---------------------------------------------------------------------------------------------------------------------
// Instants: one form for the app, the mail and the PDF — ISO date and time on the site's wall clock, offset, zone name.

const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/;

/**
 * "2026-11-28 03:12 +00:00 Europe/London" (`withZone` false: "2026-11-28 03:12"); a date-only string stays as it is;
 * empty → "—"; text that is no instant is returned as it is.
 */
export function formatInstant(
  iso: string | null | undefined,
  timeZone: string | null | undefined,
  withZone = true,
  locale: string | null = null,
): string {
  if (!iso) return '—';
  if (DATE_ONLY.test(iso)) return locale ? formatDay(iso, timeZone, locale) : iso;
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const zone = validZone(timeZone);
  const lang = validLocale(locale);
  let text: string;
  if (lang) {
    text = new Intl.DateTimeFormat(lang, { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' }).format(date);
  } else {
    const w = wallClock(date, zone);
    text = `${w.year}-${pad2(w.month)}-${pad2(w.day)} ${pad2(w.hour)}:${pad2(w.minute)}`;
  }
  return withZone ? `${text} ${offsetText(zoneOffsetMinutes(date, zone))} ${zone}` : text;
}

/**
 * A site's date format: a BCP 47 locale the runtime knows ("en-GB", "de-DE", "en-US"), or null for the international
 * ISO form (2026-11-28 03:12), which is the default. An unknown locale falls back to the ISO form.
 */
export function validLocale(locale: string | null | undefined): string | null {
  if (!locale) return null;
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([locale]).length ? locale : null;
  } catch {
    return null;
  }
}

/** The date formats a site can choose (null: ISO), with an example of each. */
export const SITE_LOCALES: readonly { locale: string | null; label: string }[] = [
  { locale: null, label: 'International, ISO 8601 (2026-11-28 15:12)' },
  { locale: 'en-GB', label: 'English, UK (28/11/2026, 15:12)' },
  { locale: 'en-US', label: 'English, US (11/28/2026, 03:12 PM)' },
  { locale: 'en-AU', label: 'English, Australia (28/11/2026, 03:12 pm)' },
  { locale: 'en-CA', label: 'English, Canada (2026-11-28, 03:12 p.m.)' },
  { locale: 'de-DE', label: 'Deutsch (28.11.2026, 15:12)' },
  { locale: 'fr-FR', label: 'Français (28/11/2026 15:12)' },
  { locale: 'es-ES', label: 'Español (28/11/2026, 15:12)' },
  { locale: 'it-IT', label: 'Italiano (28/11/2026, 15:12)' },
  { locale: 'nl-NL', label: 'Nederlands (28-11-2026, 15:12)' },
  { locale: 'pt-BR', label: 'Português, Brasil (28/11/2026, 15:12)' },
  { locale: 'sv-SE', label: 'Svenska (2026-11-28 15:12)' },
  { locale: 'pl-PL', label: 'Polski (28.11.2026, 15:12)' },
  { locale: 'zh-CN', label: '中文 (2026/11/28 15:12)' },
  { locale: 'ja-JP', label: '日本語 (2026/11/28 15:12)' },
];

/** The date part on the site's wall clock ("2026-11-28"); a date-only string stays as it is; empty → "—". */
export function formatDay(iso: string | null | undefined, timeZone: string | null | undefined, locale: string | null = null): string {
  if (!iso) return '—';
  const lang = validLocale(locale);
  if (DATE_ONLY.test(iso)) {
    if (!lang) return iso;
    // A calendar date: shown as written, whatever the zone.
    return new Intl.DateTimeFormat(lang, { timeZone: 'UTC', year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(`${iso}T12:00:00Z`));
  }
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const zone = validZone(timeZone);
  if (lang) return new Intl.DateTimeFormat(lang, { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(date);
  const w = wallClock(date, zone);
  return `${w.year}-${pad2(w.month)}-${pad2(w.day)}`;
}

/** Whole years from `from` to `to` (completed years; null when either is not a date). */
export function wholeYears(from: string, to: string): number | null {
  const a = new Date(from);
  const b = new Date(to);
  if (Number.isNaN(a.getTime()) || Number.isNaN(b.getTime())) return null;
  let years = b.getUTCFullYear() - a.getUTCFullYear();
  const beforeAnniversary =
    b.getUTCMonth() < a.getUTCMonth() || (b.getUTCMonth() === a.getUTCMonth() && b.getUTCDate() < a.getUTCDate());
  if (beforeAnniversary) years--;
  return Math.max(0, years);
}

// ---------------------------------------------------------------------------------------------------------------------
// Figures in words

/** A percentage or similar figure for reading: 89 · 8.7 · 0.29 (and a sign when asked: +3.42 is kept at 3 digits). */
export function formatFigure(value: number | null | undefined, signed = false): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const abs = Math.abs(value);
  const text = abs >= 100 ? value.toFixed(0) : formatSignificant(value, 3);
  return signed && value > 0 ? `+${text}` : text;
}

/** A coarse percentage for plain words: 89 · 8.7 · 0.99 (whole numbers from 10, one decimal from 1). */
export function formatCoarse(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const abs = Math.abs(value);
  if (abs >= 10) return value.toFixed(0);
  if (abs >= 1) return value.toFixed(1);
  return formatSignificant(value, 2);
}

/** A multiple of rated current with one decimal ("9.0"). */
export function formatPerUnit(value: number): string {
  return value.toFixed(1);
}

/** "1st", "2nd", "3rd", "4th", "11th", "22nd". */
export function ordinal(n: number): string {
  const mod100 = n % 100;
  if (mod100 >= 11 && mod100 <= 13) return `${n}th`;
  const suffix = ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th';
  return `${n}${suffix}`;
}
