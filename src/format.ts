// How the client writes numbers and times: numbers with a sensible precision (tabular figures come from CSS),
// dates in the site's time zone and date format (ISO form unless the site names a locale), with the zone named.
import { formatDay, formatInstant, formatSignificant, offsetText, pad2 as pad, validZone, wallClock, zoneOffsetMinutes } from '../shared/format';

export { formatSignificant, zoneOffsetMinutes };

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

/**
 * Where and how a site's times are shown: its IANA zone alone (ISO form), or the zone with the site's date format
 * (a BCP 47 locale; null: ISO form).
 */
export type SiteZone = string | { timeZone: string; locale?: string | null };

/** A site's zone and date format from its record ({ timeZone, locale }). */
export function siteZone(site: { timeZone: string; locale?: string | null } | null | undefined): SiteZone {
  return site ? { timeZone: site.timeZone, locale: site.locale ?? null } : 'UTC';
}

/** The IANA zone of a SiteZone. */
export function zoneName(zone: SiteZone | null | undefined): string {
  if (!zone) return 'UTC';
  return typeof zone === 'string' ? zone : zone.timeZone;
}

function zoneLocale(zone: SiteZone | null | undefined): string | null {
  return zone && typeof zone !== 'string' ? (zone.locale ?? null) : null;
}

/**
 * An instant on the site's wall clock in the site's date format, with offset and zone:
 * "2026-11-28 03:12 +00:00 Europe/London" (ISO form) or "28/11/2026, 03:12 +00:00 Europe/London" (en-GB).
 */
export function formatInZone(iso: string | null | undefined, zone: SiteZone | null | undefined, withZone = true): string {
  return formatInstant(iso, zoneName(zone), withZone, zoneLocale(zone));
}

/** The date part only, on the site's wall clock, in the site's date format ("2026-11-28", "28/11/2026"). */
export function formatDateInZone(iso: string | null | undefined, zone: SiteZone | null | undefined): string {
  return formatDay(iso, zoneName(zone), zoneLocale(zone));
}

/** The value of a datetime-local input ("2026-11-28T03:12") for an instant, on the site's wall clock. */
export function toLocalInput(iso: string | Date, zone: SiteZone): string {
  const date = typeof iso === 'string' ? new Date(iso) : iso;
  const w = wallClock(date, validZone(zoneName(zone)));
  return `${w.year}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

/**
 * A datetime-local value read as the site's wall clock → the UTC instant in ISO 8601, or null when it is not a time.
 * Two passes settle the offset across a daylight-saving change.
 */
export function fromLocalInput(value: string, siteZoneOrName: SiteZone): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value.trim());
  if (!m) return null;
  const zone = validZone(zoneName(siteZoneOrName));
  const asUtc = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]), Number(m[6] ?? 0));
  let instant = asUtc - zoneOffsetMinutes(new Date(asUtc), zone) * 60000;
  instant = asUtc - zoneOffsetMinutes(new Date(instant), zone) * 60000;
  const date = new Date(instant);
  return Number.isNaN(date.getTime()) ? null : date.toISOString();
}

/** The zone's current offset and name, for a field's suffix ("+01:00 Europe/London"). */
export function zoneLabel(siteZoneOrName: SiteZone, at: Date = new Date()): string {
  const zone = validZone(zoneName(siteZoneOrName));
  return `${offsetText(zoneOffsetMinutes(at, zone))} ${zone}`;
}
