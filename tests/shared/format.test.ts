// One time format for the app, the mail and the PDF: ISO date and time on the site's wall clock, offset, zone name.
import { describe, expect, it } from 'vitest';
import { formatCoarse, formatDay, formatFigure, formatInstant, ordinal, SITE_LOCALES, validLocale, wholeYears } from '../../shared/format.js';

describe('formatInstant', () => {
  it('writes the wall clock of the zone with its offset and name, winter and summer', () => {
    expect(formatInstant('2026-11-28T03:12:00Z', 'Europe/London')).toBe('2026-11-28 03:12 +00:00 Europe/London');
    expect(formatInstant('2026-08-17T05:02:00Z', 'Europe/London')).toBe('2026-08-17 06:02 +01:00 Europe/London');
    expect(formatInstant('2026-11-28T03:12:00Z', 'Australia/Sydney')).toBe('2026-11-28 14:12 +11:00 Australia/Sydney');
    expect(formatInstant('2026-11-28T03:12:00Z', 'America/New_York')).toBe('2026-11-27 22:12 −05:00 America/New_York');
  });

  it('leaves the zone off on request, keeps a date-only text, shows a dash for nothing and UTC for an unknown zone', () => {
    expect(formatInstant('2026-11-28T03:12:00Z', 'Australia/Sydney', false)).toBe('2026-11-28 14:12');
    expect(formatInstant('2009-03-18', 'Europe/London')).toBe('2009-03-18');
    expect(formatInstant(null, 'Europe/London')).toBe('—');
    expect(formatInstant('2026-11-28T03:12:00Z', 'Not/AZone')).toBe('2026-11-28 03:12 +00:00 UTC');
    expect(formatInstant('yesterday', 'Europe/London')).toBe('yesterday');
  });
});

describe('formatDay and wholeYears', () => {
  it('gives the date on the site wall clock (the next day in Sydney)', () => {
    expect(formatDay('2026-11-28T20:00:00Z', 'Australia/Sydney')).toBe('2026-11-29');
    expect(formatDay('2026-11-28T20:00:00Z', 'Europe/London')).toBe('2026-11-28');
  });

  it('counts completed years only', () => {
    expect(wholeYears('2009-03-18', '2026-03-17T00:00:00Z')).toBe(16);
    expect(wholeYears('2009-03-18', '2026-03-18T00:00:00Z')).toBe(17);
    expect(wholeYears('not a date', '2026-03-18')).toBeNull();
  });
});

describe('figures in words', () => {
  it('rounds for reading', () => {
    expect(formatFigure(3.4217, true)).toBe('+3.42');
    expect(formatFigure(123.4)).toBe('123');
    expect(formatCoarse(89.4)).toBe('89');
    expect(formatCoarse(8.66)).toBe('8.7');
    expect(formatCoarse(0.987)).toBe('0.99');
    expect([1, 2, 3, 4, 11, 12, 22].map((n) => ordinal(n))).toEqual(['1st', '2nd', '3rd', '4th', '11th', '12th', '22nd']);
  });
});

// The site's date format. Reference: the runtime's ICU data through Intl.DateTimeFormat (ECMA-402), the same library
// the browser uses; the expected strings are what ICU's CLDR patterns give for these locales.
describe("dates in the site's locale format", () => {
  const at = '2026-11-28T15:12:00Z';
  it('keeps the ISO form when the site names no locale', () => {
    expect(formatInstant(at, 'Europe/London', true, null)).toBe('2026-11-28 15:12 +00:00 Europe/London');
    expect(formatDay(at, 'Europe/London', null)).toBe('2026-11-28');
  });
  it('writes day-month-year for en-GB and month-day-year for en-US, on the site wall clock, zone still named', () => {
    expect(formatInstant(at, 'Europe/London', true, 'en-GB')).toBe('28/11/2026, 15:12 +00:00 Europe/London');
    expect(formatInstant(at, 'America/Chicago', false, 'en-US')).toBe('11/28/2026, 09:12 AM');
    expect(formatInstant(at, 'Europe/Berlin', false, 'de-DE')).toBe('28.11.2026, 16:12');
    expect(formatDay(at, 'Europe/Berlin', 'de-DE')).toBe('28.11.2026');
  });
  it('shows a calendar date as written, whatever the zone', () => {
    expect(formatDay('2026-11-28', 'Pacific/Auckland', 'en-GB')).toBe('28/11/2026');
    expect(formatInstant('2026-11-28', 'America/Los_Angeles', true, 'en-US')).toBe('11/28/2026');
  });
  it('falls back to the ISO form for a locale the runtime does not know', () => {
    expect(validLocale('xx-NOPE')).toBeNull();
    expect(validLocale('not a locale')).toBeNull();
    expect(formatInstant(at, 'UTC', false, 'not a locale')).toBe('2026-11-28 15:12');
  });
  it("every offered format is known to the runtime and its label's example is what it prints", () => {
    for (const { locale, label } of SITE_LOCALES) {
      const example = label.slice(label.lastIndexOf('(') + 1, -1);
      expect(formatInstant(at, 'UTC', false, locale)).toBe(example);
    }
  });
});
