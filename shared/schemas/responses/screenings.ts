import { z } from 'zod';
import { caseSchema } from '../case.js';
import { resultSchema } from '../result.js';
import { isoDateTime, rowId } from './common.js';
import { decisionViewSchema, findingViewSchema, followUpViewSchema } from './events.js';

// Answers of the screening, decision, follow-up and finding routes.

/** POST /api/events/:id/screenings — the stored run and how many managers' e-mails were queued. */
export const runScreeningAnswerSchema = z.strictObject({
  id: rowId,
  result: resultSchema,
  criteriaVersion: z.number().int().positive(),
  comparison: z.boolean(),
  computedAt: isoDateTime,
  mailsQueued: z.number().int().nonnegative(),
});
export type RunScreeningAnswer = z.infer<typeof runScreeningAnswerSchema>;

/** GET /api/screenings/:id/case — the gapsight-case/1 a stored screening judged, as it was then. */
export const screenedCaseAnswerSchema = z.strictObject({
  screeningId: rowId,
  eventId: rowId,
  criteriaVersion: z.number().int().positive(),
  computedAt: isoDateTime,
  case: caseSchema,
});
export type ScreenedCaseAnswer = z.infer<typeof screenedCaseAnswerSchema>;

/** POST /api/screenings/:id/decision — the decision, the event's new status and the follow-ups it set. */
export const decisionAnswerSchema = decisionViewSchema.extend({
  eventStatus: z.enum(['held', 'released']),
  followUps: z.array(followUpViewSchema),
});
export type DecisionAnswer = z.infer<typeof decisionAnswerSchema>;

/** POST /api/follow-ups/:id/close — the closed follow-up. */
export const closedFollowUpSchema = followUpViewSchema.extend({ eventId: rowId });
export type ClosedFollowUp = z.infer<typeof closedFollowUpSchema>;

/** POST /api/events/:id/findings — the recorded finding. */
export const recordedFindingSchema = findingViewSchema.extend({ eventId: rowId });
export type RecordedFinding = z.infer<typeof recordedFindingSchema>;

/** POST /api/events/:id/energised — when the unit was re-energised and the follow-ups as now due. */
export const energisedAnswerSchema = z.strictObject({
  eventId: rowId,
  energisedAt: isoDateTime,
  followUps: z.array(followUpViewSchema),
});
export type EnergisedAnswer = z.infer<typeof energisedAnswerSchema>;

/** POST /api/events/:id/restrictions/lift — the decision whose restrictions were lifted. */
export const liftedRestrictionsSchema = z.strictObject({
  eventId: rowId,
  decisionId: rowId,
  restrictions: z.string(),
  liftedAt: isoDateTime,
  liftedById: rowId,
  reason: z.string(),
});
export type LiftedRestrictions = z.infer<typeof liftedRestrictionsSchema>;
