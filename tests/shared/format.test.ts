// One time format for the app, the mail and the PDF: ISO date and time on the site's wall clock, offset, zone name.
import { describe, expect, it } from 'vitest';
import { formatCoarse, formatDay, formatFigure, formatInstant, ordinal, wholeYears } from '../../shared/format.js';

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
