// How the client writes numbers and times: numbers with a sensible precision (tabular figures come from CSS),
// dates in ISO form in the site's time zone, with the zone named.

/** A number with at most `digits` significant digits, no exponent, trailing zeros kept off ("3131", "0.28", "15.8"). */
export function formatSignificant(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.max(0, digits - 1 - magnitude);
  return Number(value.toFixed(Math.min(decimals, 12))).toString();
}

/** A number with a fixed number of decimals ("9.0"). */
export function formatFixed(value: number | null | undefined, decimals = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return value.toFixed(decimals);
}

/** A byte count in kB or MB. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${formatSignificant(bytes / 1024, 3)} kB`;
  return `${formatSignificant(bytes / (1024 * 1024), 3)} MB`;
}

interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

function wallClock(date: Date, timeZone: string): WallClock {
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
  }).formatToParts(date);
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value ?? 0);
  return { year: get('year'), month: get('month'), day: get('day'), hour: get('hour') % 24, minute: get('minute'), second: get('second') };
}

/** Minutes the zone is ahead of UTC at that instant (Europe/London in summer: 60). */
export function zoneOffsetMinutes(date: Date, timeZone: string): number {
  const w = wallClock(date, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return Math.round((asUtc - Math.floor(date.getTime() / 1000) * 1000) / 60000);
}

function offsetText(minutes: number): string {
  const sign = minutes < 0 ? '−' : '+';
  const abs = Math.abs(minutes);
  return `${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
}

const pad = (n: number) => String(n).padStart(2, '0');

function validZone(timeZone: string | null | undefined): string {
  if (!timeZone) return 'UTC';
  try {
    new Intl.DateTimeFormat('en', { timeZone });
    return timeZone;
  } catch {
    return 'UTC';
  }
}

/** An instant in ISO form on the site's wall clock, with offset and zone: "2026-11-28 03:12 +00:00 Europe/London". */
export function formatInZone(iso: string | null | undefined, timeZone: string | null | undefined, withZone = true): string {
  if (!iso) return '—';
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const zone = validZone(timeZone);
  const w = wallClock(date, zone);
  const text = `${w.year}-${pad(w.month)}-${pad(w.day)} ${pad(w.hour)}:${pad(w.minute)}`;
  return withZone ? `${text} ${offsetText(zoneOffsetMinutes(date, zone))} ${zone}` : text;
}

/** The date part only, on the site's wall clock ("2026-11-28"). */
export function formatDateInZone(iso: string | null | undefined, timeZone: string | null | undefined): string {
  if (!iso) return '—';
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const w = wallClock(date, validZone(timeZone));
  return `${w.year}-${pad(w.month)}-${pad(w.day)}`;
}

/** The value of a datetime-local input ("2026-11-28T03:12") for an instant, on the site's wall clock. */
export function toLocalInput(iso: string | Date, timeZone: string): string {
  const date = typeof iso === 'string' ? new Date(iso) : iso;
  const w = wallClock(date, validZone(timeZone));
  return `${w.year}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

/**
 * A datetime-local value read as the site's wall clock → the UTC instant in ISO 8601, or null when it is not a time.
 * Two passes settle the offset across a daylight-saving change.
 */
export function fromLocalInput(value: string, timeZone: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value.trim());
  if (!m) return null;
  const zone = validZone(timeZone);
  const asUtc = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]), Number(m[6] ?? 0));
  let instant = asUtc - zoneOffsetMinutes(new Date(asUtc), zone) * 60000;
  instant = asUtc - zoneOffsetMinutes(new Date(instant), zone) * 60000;
  const date = new Date(instant);
  return Number.isNaN(date.getTime()) ? null : date.toISOString();
}

/** The zone's current offset and name, for a field's suffix ("+01:00 Europe/London"). */
export function zoneLabel(timeZone: string, at: Date = new Date()): string {
  const zone = validZone(timeZone);
  return `${offsetText(zoneOffsetMinutes(at, zone))} ${zone}`;
}
