import { z } from 'zod';
import { FOLLOW_UPS } from '../screening/verdict.js';
import { dateInRange, LIST_MAX, plannedDate } from './bounds.js';
import { DECISION_OUTCOMES, FINDING_CLASSIFICATIONS, type DecisionOutcome, type Recommendation } from './enums.js';

// Bodies of the screening, decision, follow-up and finding routes, and the decision rules both sides apply.

export const screeningRunBodySchema = z.strictObject({
  criteriaVersion: z.number().int().positive('not a criteria-set version').optional(),
  comparison: z.boolean().default(false),
});

export { DECISION_OUTCOMES, type DecisionOutcome };

/** Characters a reason needs when the decision goes against the recommendation. */
export const AGAINST_REASON_MIN = 20;

/** Whether a decision goes against the recommendation: go → hold; conditional → plain release; no-go → any release. */
export function decisionGoesAgainst(recommendation: Recommendation, outcome: DecisionOutcome): boolean {
  if (recommendation === 'go') return outcome === 'hold';
  if (recommendation === 'conditional') return outcome === 'release';
  return outcome !== 'hold';
}

export const followUpInputSchema = z.strictObject({
  task: z.string().trim().min(1, 'required').max(300),
  /** A planned date: a real one, at most 100 years ahead (the database's dates end in 9999). */
  dueAt: plannedDate().nullable().optional(),
});

export const decisionBodySchema = z
  .strictObject({
    outcome: z.enum(DECISION_OUTCOMES),
    reason: z.string().trim().min(1, 'required').max(5000),
    restrictions: z.string().trim().max(5000).optional(),
    followUps: z.array(followUpInputSchema).max(LIST_MAX.followUps, `at most ${LIST_MAX.followUps} follow-ups`).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.outcome === 'release-with-restrictions' && !v.restrictions) {
      ctx.addIssue({ code: 'custom', path: ['restrictions'], message: 'required for a release with restrictions' });
    }
  });
export type DecisionBody = z.infer<typeof decisionBodySchema>;

/** POST /api/events/:eventId/energised — when the released unit was re-energised. */
export const energisedBodySchema = z.strictObject({
  at: dateInRange({ formatMessage: 'not an ISO 8601 date-time' }),
});

/** POST /api/events/:eventId/restrictions/lift — why the restrictions no longer apply. */
export const liftRestrictionsBodySchema = z.strictObject({ reason: z.string().trim().min(1, 'required').max(5000) });

export const followUpCloseSchema = z.strictObject({ result: z.string().trim().min(1, 'required').max(5000) });

export const findingBodySchema = z.strictObject({
  classification: z.enum(FINDING_CLASSIFICATIONS),
  text: z.string().trim().min(1, 'required').max(10000),
});

const HOUR = 3600_000;
/** Due offsets of the proposed follow-ups after re-energising (common practice); a sweep waits for the next outage. */
const FOLLOW_UP_DUE_HOURS: Record<string, number | null> = {
  [FOLLOW_UPS.gas24h]: 24,
  [FOLLOW_UPS.gas1w]: 24 * 7,
  [FOLLOW_UPS.gas1m]: 24 * 30,
  [FOLLOW_UPS.sweepNextOutage]: null,
  // A unit that stayed in service: samples now and counted from the event.
  [FOLLOW_UPS.gasNow]: 0,
  [FOLLOW_UPS.gas24hEvent]: 24,
  [FOLLOW_UPS.gas1wEvent]: 24 * 7,
  [FOLLOW_UPS.gas1mEvent]: 24 * 30,
};

/** Follow-ups of a unit that stayed in service count from the event, not from the decision. */
const COUNTED_FROM_EVENT = new Set<string>([FOLLOW_UPS.gas24hEvent, FOLLOW_UPS.gas1wEvent, FOLLOW_UPS.gas1mEvent]);

/** The due date of a proposed follow-up counted from `from` (the event's time for the in-service ones; null when none). */
export function proposedFollowUpDueAt(task: string, from: Date, eventAt?: Date): string | null {
  const hours = FOLLOW_UP_DUE_HOURS[task];
  const start = eventAt && COUNTED_FROM_EVENT.has(task) ? eventAt : from;
  return typeof hours === 'number' ? new Date(start.getTime() + hours * HOUR).toISOString() : null;
}

/**
 * The new due date of a follow-up when the unit is re-energised at `energisedAt`: a task whose due date was counted from
 * `from` (the decision, or an earlier re-energising) by the rule above is counted again from `energisedAt`. Tasks counted
 * from the event, without a due date, or with a date the manager set keep theirs (null: unchanged).
 */
export function recountedFollowUpDueAt(task: string, dueAt: string | null, from: Date, energisedAt: Date, eventAt: Date): string | null {
  if (dueAt === null || COUNTED_FROM_EVENT.has(task)) return null;
  const counted = proposedFollowUpDueAt(task, from, eventAt);
  if (counted === null || new Date(counted).getTime() !== new Date(dueAt).getTime()) return null;
  return proposedFollowUpDueAt(task, energisedAt, eventAt);
}
