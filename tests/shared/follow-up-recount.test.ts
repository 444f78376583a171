import { describe, expect, it } from 'vitest';
import { FOLLOW_UPS } from '../../shared/screening/verdict.js';
import { proposedFollowUpDueAt, recountedFollowUpDueAt } from '../../shared/schemas/screening.js';

// Follow-ups counted from the decision are counted again from the re-energising; others keep their due dates.
const event = new Date('2026-11-28T03:12:00.000Z');
const decision = new Date('2026-12-01T10:00:00.000Z');
const energised = new Date('2026-12-01T15:00:00.000Z');

describe('recountedFollowUpDueAt', () => {
  it('counts a proposed after-re-energising sample again from the re-energising (24 h and 1 week, common practice)', () => {
    const due = proposedFollowUpDueAt(FOLLOW_UPS.gas24h, decision, event);
    expect(recountedFollowUpDueAt(FOLLOW_UPS.gas24h, due, decision, energised, event)).toBe('2026-12-02T15:00:00.000Z');
    const week = proposedFollowUpDueAt(FOLLOW_UPS.gas1w, decision, event);
    expect(recountedFollowUpDueAt(FOLLOW_UPS.gas1w, week, decision, energised, event)).toBe('2026-12-08T15:00:00.000Z');
  });

  it('keeps a date the manager set, a task counted from the event, and a task without a date (null: unchanged)', () => {
    expect(recountedFollowUpDueAt(FOLLOW_UPS.gas24h, '2026-12-20T09:00:00.000Z', decision, energised, event)).toBeNull();
    const fromEvent = proposedFollowUpDueAt(FOLLOW_UPS.gas24hEvent, decision, event);
    expect(recountedFollowUpDueAt(FOLLOW_UPS.gas24hEvent, fromEvent, decision, energised, event)).toBeNull();
    expect(recountedFollowUpDueAt(FOLLOW_UPS.sweepNextOutage, null, decision, energised, event)).toBeNull();
  });
});
