import { describe, expect, it } from 'vitest';
import { formatInZone, formatSignificant, fromLocalInput, toLocalInput } from '../../src/format';

describe('site-time formatting', () => {
  it('writes an instant in ISO form on the site’s wall clock with offset and zone', () => {
    expect(formatInZone('2026-07-01T03:12:00Z', 'Europe/London')).toBe('2026-07-01 04:12 +01:00 Europe/London');
    expect(formatInZone('2026-11-28T03:12:00Z', 'Europe/London')).toBe('2026-11-28 03:12 +00:00 Europe/London');
    expect(formatInZone('2026-11-28T03:12:00Z', 'America/Chicago')).toBe('2026-11-27 21:12 −06:00 America/Chicago');
  });

  it('reads a datetime-local value as the site’s wall clock, in summer and winter time', () => {
    expect(fromLocalInput('2026-07-01T04:12', 'Europe/London')).toBe('2026-07-01T03:12:00.000Z');
    expect(fromLocalInput('2026-01-15T04:12', 'Europe/London')).toBe('2026-01-15T04:12:00.000Z');
    expect(fromLocalInput('2026-01-15T04:12', 'Australia/Sydney')).toBe('2026-01-14T17:12:00.000Z');
    expect(fromLocalInput('not a time', 'Europe/London')).toBeNull();
  });

  it('turns an instant back into the same datetime-local value', () => {
    expect(toLocalInput('2026-07-01T03:12:00.000Z', 'Europe/London')).toBe('2026-07-01T04:12');
  });

  it('keeps a sensible number of significant digits without trailing noise', () => {
    expect(formatSignificant(3131.0000000000005, 5)).toBe('3131');
    expect(formatSignificant(0.28, 3)).toBe('0.28');
    expect(formatSignificant(15.8034, 3)).toBe('15.8');
    expect(formatSignificant(null)).toBe('—');
  });
});
