// The event file's "what to do next" and the section shown first, for each status and role (src/event-next-step.ts).
import { describe, expect, it } from 'vitest';
import { nextStep, type EventCard } from '../../src/event-next-step';
import type { EventStatus, Role } from '../../shared/schemas/enums';

type Row = [EventStatus, Role, string, EventCard | null, boolean];

// status, role, words the step contains, the card, whether it is the person's own step.
const table: Row[] = [
  ['logged', 'tester', 'Open a post-fault session', 'sessions', true],
  ['logged', 'admin', 'Open a post-fault session', 'sessions', true],
  ['logged', 'protection', 'attach the relay records', 'fault', true],
  ['logged', 'manager', 'A test engineer is expected to open a post-fault session', null, false],
  ['logged', 'engineer', 'A test engineer is expected to open a post-fault session', null, false],

  ['testing', 'tester', 'Enter the post-fault readings and sweeps, then run the screening', 'sessions', true],
  ['testing', 'admin', 'Enter the post-fault readings and sweeps, then run the screening', 'sessions', true],
  ['testing', 'protection', 'attach any relay records still missing', 'fault', true],
  ['testing', 'manager', 'The test engineer is expected to finish the post-fault readings', null, false],
  ['testing', 'engineer', 'The test engineer is expected to finish the post-fault readings', null, false],

  ['screened', 'manager', 'Sign the decision below', 'decision', true],
  ['screened', 'tester', 'The operations manager is expected to sign the decision', 'decision', false],
  ['screened', 'engineer', 'The operations manager is expected to sign the decision', 'decision', false],
  ['screened', 'admin', 'The operations manager is expected to sign the decision', 'decision', false],
  ['screened', 'protection', 'The operations manager is expected to sign the decision', 'fault', false],

  ['held', 'engineer', 'Record the inspection findings', 'findings', true],
  ['held', 'tester', 'open a new post-fault session (re-test)', 'sessions', true],
  ['held', 'admin', 'open a new post-fault session (re-test)', 'sessions', true],
  ['held', 'manager', 'the asset engineer is expected to record the inspection findings', 'findings', false],
  ['held', 'protection', 'the asset engineer is expected to record the inspection findings', 'fault', false],

  ['released', 'engineer', 'Record the inspection findings, if any', 'findings', true],
  ['released', 'manager', 'Record the re-energising and close the follow-ups', 'decision', true],
  ['released', 'admin', 'Record the re-energising and close the follow-ups', 'decision', true],
  ['released', 'tester', 'Close the follow-ups as their results come in', 'follow-ups', true],
  ['released', 'protection', 'Nothing is waiting: the unit was released', 'fault', false],
];

const screenedStatuses: EventStatus[] = ['screened', 'held', 'released'];

describe('nextStep', () => {
  it.each(table)('%s, %s: "%s…", card %s', (status, role, words, card, yours) => {
    const step = nextStep({ status, hasScreening: screenedStatuses.includes(status), recommendation: screenedStatuses.includes(status) ? 'conditional' : null, roles: [role] });
    expect(step.text).toContain(words);
    expect(step.card).toBe(card);
    expect(step.yours).toBe(yours);
  });

  it('covers every status for every role', () => {
    const statuses = new Set(table.map((r) => `${r[0]}/${r[1]}`));
    for (const s of ['logged', 'testing', 'screened', 'held', 'released'])
      for (const r of ['admin', 'protection', 'tester', 'manager', 'engineer']) expect(statuses.has(`${s}/${r}`), `${s}/${r}`).toBe(true);
  });

  it('names the recommendation to the manager and says "again" to a tester after a re-test was opened', () => {
    expect(nextStep({ status: 'screened', hasScreening: true, recommendation: 'no-go', roles: ['manager'] }).text).toContain('(the screening says no-go)');
    expect(nextStep({ status: 'testing', hasScreening: true, recommendation: 'go', roles: ['tester'] }).text).toContain('run the screening again');
  });

  it('gives a person with several roles the step of the role the status waits for', () => {
    expect(nextStep({ status: 'screened', hasScreening: true, recommendation: 'go', roles: ['tester', 'manager'] }).card).toBe('decision');
    expect(nextStep({ status: 'testing', hasScreening: false, recommendation: null, roles: ['protection', 'tester'] }).card).toBe('sessions');
    expect(nextStep({ status: 'held', hasScreening: true, recommendation: 'no-go', roles: ['tester', 'engineer'] }).card).toBe('findings');
  });
});
