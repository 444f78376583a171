import { z } from 'zod';
import { currentIsSchema, faultSideSchema, faultTypeSchema, protectionSchema, readingSetSchema, shotSchema } from '../case.js';
import { DECISION_OUTCOMES, EVENT_STATUSES, FINDING_CLASSIFICATIONS, NOTIFICATION_KINDS, NOTIFICATION_STATUSES, RECOMMENDATIONS } from '../enums.js';
import { faultSchema, priorFaultSchema, unitSchema as caseUnitSchema } from '../case.js';
import { resultSchema, throughFaultSchema } from '../result.js';
import { isoDateTime, pageOf, rowId } from './common.js';
import { designViewSchema, readingSetConditionsSchema, readingSetViewSchema, siteViewSchema, unitViewSchema } from './fleet.js';

// Answers of the event routes (the event file and what hangs on it) and of the screening follow-on routes.

/** A fault event's own record. */
export const eventViewSchema = z.strictObject({
  id: rowId,
  unitId: rowId,
  occurredAt: isoDateTime,
  type: faultTypeSchema,
  faultedPhases: z.string().nullable(),
  /** Where the fault current was measured. */
  side: faultSideSchema,
  /** Side the fault was on (null: the same as `side`), and what the shot currents are (null: line). */
  location: faultSideSchema.nullable(),
  currentIs: currentIsSchema.nullable(),
  shots: z.array(shotSchema),
  transformerTripped: z.boolean(),
  protectionOperated: z.array(protectionSchema),
  notes: z.string().nullable(),
  status: z.enum(EVENT_STATUSES),
  createdById: rowId.nullable(),
  createdAt: isoDateTime,
});
export type EventView = z.infer<typeof eventViewSchema>;

/** POST /api/events — the event with its through-fault duty (earlier faults counted). */
export const createdEventSchema = eventViewSchema.extend({ throughFault: throughFaultSchema.nullable() });
export type CreatedEvent = z.infer<typeof createdEventSchema>;

/** PATCH /api/events/:id — the corrected event with its recomputed duty; a screened event whose case changed is back in testing. */
export const correctedEventSchema = createdEventSchema.extend({
  screeningStale: z.boolean(),
  note: z.string().nullable(),
});
export type CorrectedEvent = z.infer<typeof correctedEventSchema>;

/** GET /api/events (each item): the event with its unit, site and newest recommendation. */
export const eventListItemSchema = eventViewSchema.extend({
  unitSerial: z.string(),
  siteId: rowId,
  siteName: z.string(),
  siteTimeZone: z.string(),
  /** The site's date format (BCP 47); null or absent: ISO form. */
  siteLocale: z.string().nullable().optional(),
  recommendation: z.enum(RECOMMENDATIONS).nullable(),
});
export type EventListItem = z.infer<typeof eventListItemSchema>;

/** GET /api/events — one page of events. */
export const eventListPageSchema = pageOf(eventListItemSchema);
export type EventListPage = z.infer<typeof eventListPageSchema>;

/** A stored screening run with its result document. */
export const storedScreeningSchema = z.strictObject({
  id: rowId,
  recommendation: z.enum(RECOMMENDATIONS),
  criteriaVersion: z.number().int().positive(),
  comparison: z.boolean(),
  computedById: rowId.nullable(),
  computedAt: isoDateTime,
  result: resultSchema,
});
export type StoredScreening = z.infer<typeof storedScreeningSchema>;

/** A stored relay or fault-recorder record (POST /api/events/:id/attachments, and in the event file). */
export const attachmentViewSchema = z.strictObject({
  id: rowId,
  name: z.string(),
  contentType: z.string(),
  kind: z.string(),
  size: z.number().int().nonnegative(),
  sha256: z.string(),
  createdAt: isoDateTime,
});
export type AttachmentView = z.infer<typeof attachmentViewSchema>;

/** One audit-trail row. */
export const auditRowSchema = z.strictObject({
  id: rowId,
  at: isoDateTime,
  userId: rowId.nullable(),
  action: z.string(),
  entity: z.string(),
  entityId: z.string(),
  before: z.unknown(),
  after: z.unknown(),
  highlighted: z.boolean(),
  note: z.string().nullable(),
  /** The entry as one sentence: who, what, the outcome and the reason, in words. */
  summary: z.string(),
});
export type AuditRow = z.infer<typeof auditRowSchema>;

/** A person named in the event file. */
export const personSchema = z.strictObject({ id: rowId, name: z.string(), email: z.string() });
export type Person = z.infer<typeof personSchema>;

/** A manager's signed decision. */
export const decisionViewSchema = z.strictObject({
  id: rowId,
  screeningId: rowId,
  managerId: rowId,
  outcome: z.enum(DECISION_OUTCOMES),
  restrictions: z.string().nullable(),
  reason: z.string(),
  againstRecommendation: z.boolean(),
  signedAt: isoDateTime,
});
export type DecisionView = z.infer<typeof decisionViewSchema>;

/** A follow-up task (open while `closedAt` is null). */
export const followUpViewSchema = z.strictObject({
  id: rowId,
  task: z.string(),
  dueAt: isoDateTime.nullable(),
  closedAt: isoDateTime.nullable(),
  closedById: rowId.nullable(),
  result: z.string().nullable(),
});
export type FollowUpView = z.infer<typeof followUpViewSchema>;

/** What an inspection found. */
export const findingViewSchema = z.strictObject({
  id: rowId,
  classification: z.enum(FINDING_CLASSIFICATIONS),
  text: z.string(),
  recordedById: rowId.nullable(),
  recordedAt: isoDateTime,
});
export type FindingView = z.infer<typeof findingViewSchema>;

/** A finding in the event file, with its photos and documents. */
export const eventFindingSchema = findingViewSchema.extend({ attachments: z.array(attachmentViewSchema) });
export type EventFinding = z.infer<typeof eventFindingSchema>;

/** One e-mail about the event, as queued and sent. */
export const notificationViewSchema = z.strictObject({
  id: rowId,
  /** The screening the mail reports on. */
  screeningId: rowId.nullable(),
  /** What the mail reports: the screening (managers) or the signed decision (control room, testers). */
  kind: z.enum(NOTIFICATION_KINDS),
  to: z.string(),
  subject: z.string(),
  status: z.enum(NOTIFICATION_STATUSES),
  attempts: z.number().int().nonnegative(),
  lastError: z.string().nullable(),
  sentAt: isoDateTime.nullable(),
  createdAt: isoDateTime,
});
export type NotificationView = z.infer<typeof notificationViewSchema>;

/** GET /api/events/:id — the event file. */
export const eventDetailSchema = eventViewSchema.extend({
  unit: unitViewSchema.extend({ site: siteViewSchema, design: designViewSchema }),
  throughFault: throughFaultSchema.nullable(),
  /** The duty curve's inputs in the case format: the unit, this fault and the unit's earlier faults (oldest first). */
  dutyCase: z.strictObject({ unit: caseUnitSchema, fault: faultSchema, priorFaults: z.array(priorFaultSchema) }),
  sessions: z.array(readingSetViewSchema),
  /** Newest first. */
  screenings: z.array(storedScreeningSchema),
  /** The newest decision (null: none yet), then every decision newest first. */
  decision: decisionViewSchema.nullable(),
  decisions: z.array(decisionViewSchema),
  followUps: z.array(followUpViewSchema),
  findings: z.array(eventFindingSchema),
  notifications: z.array(notificationViewSchema),
  attachments: z.array(attachmentViewSchema),
  audit: z.array(auditRowSchema),
  /** Everybody the file names, by id. */
  people: z.record(z.string(), personSchema),
  /** When the released unit was re-energised (null: not recorded). */
  energisedAt: isoDateTime.nullable(),
  /** The decision's restrictions while not lifted (null: none or lifted), and the lifting (null: not lifted). */
  activeRestrictions: z.string().nullable(),
  restrictionsLifted: z.strictObject({ at: isoDateTime, byId: rowId.nullable(), reason: z.string() }).nullable(),
});
export type EventDetail = z.infer<typeof eventDetailSchema>;

/** POST /api/events/:id/sessions — the session's conditions and values; a pre-fault gas sample comes back stored too. */
export const createdSessionSchema = readingSetConditionsSchema.extend({
  values: readingSetSchema.optional(),
  eventStatus: z.literal('testing'),
  preFaultGas: readingSetConditionsSchema.extend({ values: readingSetSchema.optional() }).optional(),
});
export type CreatedSession = z.infer<typeof createdSessionSchema>;

/** PATCH /api/sessions/:id — the corrected session; a screened event whose case changed is back in testing. */
export const correctedSessionSchema = readingSetConditionsSchema.extend({
  values: readingSetSchema.optional(),
  eventStatus: z.enum(EVENT_STATUSES),
  screeningStale: z.boolean(),
  note: z.string().nullable(),
});
export type CorrectedSession = z.infer<typeof correctedSessionSchema>;

/** POST /api/sessions/:id/imports — the rows stored. */
export const importAnswerSchema = z.strictObject({
  imported: z.number().int().nonnegative(),
  rows: z.array(
    z.strictObject({
      quantity: z.string(),
      /** Configuration (CH, CHL), gas (H2) or bushing terminal (H1); null for per-phase and whole-set quantities. */
      configuration: z.string().nullable(),
      phase: z.string().nullable(),
      value: z.number(),
      unit: z.string(),
    }),
  ),
});
export type ImportAnswer = z.infer<typeof importAnswerSchema>;
