// Sessions are named by when they were taken (on the site's clock) and by whom, never by their database id.
import { describe, expect, it } from 'vitest';
import { dayAndTime, sessionInSentence, sessionName } from '../../shared/session-name.js';

const names: Record<number, string> = { 3: 'Theo Tester' };
const person = (id: number | null | undefined) => (id == null ? null : names[id] ?? null);

describe('session names', () => {
  it('names a session by its time on the site clock and its tester', () => {
    // 12:12 UTC on 29 Nov is 12:12 in London (GMT, +00:00) and 07:12 in New York (EST, −05:00).
    expect(sessionName({ takenAt: '2026-11-29T12:12:00.000Z', createdById: 3 }, 'Europe/London', person)).toBe('Tests of 29 Nov 2026 12:12 by Theo Tester');
    expect(sessionName({ takenAt: '2026-11-29T12:12:00.000Z', createdById: 3 }, 'America/New_York', person)).toBe('Tests of 29 Nov 2026 07:12 by Theo Tester');
  });

  it('follows summer time and the date line', () => {
    // 23:30 UTC on 30 Jun is 00:30 on 1 Jul in London (BST, +01:00).
    expect(dayAndTime('2026-06-30T23:30:00.000Z', 'Europe/London')).toBe('1 Jul 2026 00:30');
    expect(dayAndTime('2026-06-30T23:30:00.000Z', 'UTC')).toBe('30 Jun 2026 23:30');
  });

  it('leaves the tester out when unknown, and keeps a day-only date as a day', () => {
    expect(sessionName({ takenAt: '2026-11-29T12:12:00.000Z', createdById: 9 }, 'UTC', person)).toBe('Tests of 29 Nov 2026 12:12');
    expect(sessionName({ takenAt: '2026-11-29T12:12:00.000Z' }, 'UTC')).toBe('Tests of 29 Nov 2026 12:12');
    expect(dayAndTime('2026-01-05', 'Europe/London')).toBe('5 Jan 2026');
    // A date entered without a time is stored as midnight UTC: still the day alone, not "01:00" in summer.
    expect(dayAndTime('2004-05-12T00:00:00.000Z', 'Europe/London')).toBe('12 May 2004');
    expect(sessionName({ takenAt: '2026-07-02T00:00:00Z', createdById: 3 }, 'Europe/London', person)).toBe('Tests of 2 Jul 2026 by Theo Tester');
    expect(dayAndTime(null, 'UTC')).toBe('—');
  });

  it('has a form for inside a sentence', () => {
    expect(sessionInSentence({ takenAt: '2026-11-29T12:12:00.000Z', createdById: 3 }, 'UTC', person)).toBe('the tests of 29 Nov 2026 12:12 by Theo Tester');
  });
});
