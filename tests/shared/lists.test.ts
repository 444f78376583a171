import { describe, expect, it } from 'vitest';
import { daysBefore, daysOverdue, followUpDueRange, parseDateOrInstant, zoneDayBound } from '../../shared/lists.js';

// Time windows of the work lists. Expected instants worked out by hand from the zones' published offsets.

describe('followUpDueRange', () => {
  const now = new Date('2026-06-10T12:00:00Z');
  it('ends overdue at now, and this week seven days after now', () => {
    expect(followUpDueRange('overdue', now)).toEqual({ from: null, before: now });
    expect(followUpDueRange('week', now)).toEqual({ from: now, before: new Date('2026-06-17T12:00:00Z') });
    expect(followUpDueRange('open', now)).toEqual({ from: null, before: null });
  });
});

describe('daysOverdue', () => {
  const now = new Date('2026-06-10T12:00:00Z');
  it('counts calendar days of the site’s zone since the due day', () => {
    // 9 June 23:30 UTC is 10 June 00:30 in London: due today there, 1 day overdue on UTC's calendar.
    expect(daysOverdue('2026-06-09T23:30:00Z', now, 'Europe/London')).toBe(0);
    expect(daysOverdue('2026-06-09T23:30:00Z', now, 'UTC')).toBe(1);
    expect(daysOverdue(new Date('2026-05-31T12:00:00Z'), now, 'Asia/Tokyo')).toBe(10);
  });
  it('is null before the due time and without a due date', () => {
    expect(daysOverdue('2026-06-10T12:00:00Z', now, 'UTC')).toBeNull();
    expect(daysOverdue(null, now, 'UTC')).toBeNull();
  });
});

describe('date filters', () => {
  it('reads a date as its UTC day (to its last millisecond with endOfDay) and an instant as it is', () => {
    expect(parseDateOrInstant('2026-03-31')?.toISOString()).toBe('2026-03-31T00:00:00.000Z');
    expect(parseDateOrInstant('2026-03-31', true)?.toISOString()).toBe('2026-03-31T23:59:59.999Z');
    expect(parseDateOrInstant('2026-03-31T05:00:00+02:00')?.toISOString()).toBe('2026-03-31T03:00:00.000Z');
  });
  it('refuses days that do not exist and text that is no date', () => {
    expect(parseDateOrInstant('2026-02-30')).toBeNull();
    expect(parseDateOrInstant('31/03/2026')).toBeNull();
    expect(parseDateOrInstant('1712345678')).toBeNull();
  });
  it('bounds a day on a zone’s calendar, across a clock change', () => {
    // London in summer is UTC+1: 1 July starts at 30 June 23:00 UTC.
    expect(zoneDayBound('2026-07-01', 'Europe/London')?.toISOString()).toBe('2026-06-30T23:00:00.000Z');
    expect(zoneDayBound('2026-07-01', 'Europe/London', true)?.toISOString()).toBe('2026-07-01T22:59:59.999Z');
    // 29 March 2026: London goes from UTC+0 to UTC+1 at 01:00 UTC; the day starts at midnight UTC and ends at 22:59:59.999 UTC.
    expect(zoneDayBound('2026-03-29', 'Europe/London')?.toISOString()).toBe('2026-03-29T00:00:00.000Z');
    expect(zoneDayBound('2026-03-29', 'Europe/London', true)?.toISOString()).toBe('2026-03-29T22:59:59.999Z');
    expect(zoneDayBound('2026-02-30', 'UTC')).toBeNull();
  });
  it('daysBefore goes back whole 24-hour days', () => {
    expect(daysBefore(new Date('2026-06-10T12:00:00Z'), 30).toISOString()).toBe('2026-05-11T12:00:00.000Z');
  });
});
