// What each role is called and does in Gapsight, in the words of the product brief's role table.
import type { Role } from '../shared/schemas/enums';

export const ROLE_LABELS: Record<Role, string> = {
  protection: 'Protection engineer',
  tester: 'Test engineer',
  manager: 'Operations manager',
  engineer: 'Asset engineer',
  admin: 'Administrator',
};

export const ROLE_DUTIES: Record<Role, string> = {
  protection: 'Logs fault events against units and attaches the relay and fault-recorder records.',
  tester:
    'Enters baselines and post-fault readings, uploads test-set CSV exports and sweep files, and runs screenings.',
  manager:
    'Receives the recommendation and signs off the decision: release, release with restrictions, or hold; closes follow-ups.',
  engineer:
    'Analyses the fleet and sister units, drafts criteria, runs comparison screenings and records inspection findings.',
  admin: 'Manages users, sites, designs, units and publishes criteria sets — everything except signing decisions.',
};

/** Roles in the order a desk lists them: the fault's life from logging to decision, then support roles. */
export const ROLE_ORDER: Role[] = ['protection', 'tester', 'manager', 'engineer', 'admin'];
