// Status and kind lists shared by the server's entities and the client's screens. Plain constants (no zod), so a page
// that needs one list or label does not pull a schema library into its chunk.

/** The five roles of the brief; a user may hold several. */
export const ROLES = ['admin', 'protection', 'tester', 'manager', 'engineer'] as const;
export type Role = (typeof ROLES)[number];

/** A fault event's status (workflow: logged → testing → screened → held | released). */
export const EVENT_STATUSES = ['logged', 'testing', 'screened', 'held', 'released'] as const;
export type EventStatus = (typeof EVENT_STATUSES)[number];

/** The screening's recommendation. */
export const RECOMMENDATIONS = ['go', 'conditional', 'no-go'] as const;
export type Recommendation = (typeof RECOMMENDATIONS)[number];

/** Kinds of reading set: a post-fault set belongs to an event (a session); the others are the unit's own tests. */
export const READING_SET_KINDS = ['factory', 'commissioning', 'routine', 'post-fault'] as const;
export type ReadingSetKind = (typeof READING_SET_KINDS)[number];

/** The kinds a reading set added to a unit (not to an event) may have. */
export const UNIT_READING_SET_KINDS = ['factory', 'commissioning', 'routine'] as const;
export type UnitReadingSetKind = (typeof UNIT_READING_SET_KINDS)[number];

/** The manager's decision on a screening. */
export const DECISION_OUTCOMES = ['release', 'release-with-restrictions', 'hold'] as const;
export type DecisionOutcome = (typeof DECISION_OUTCOMES)[number];

/** What an inspection found. */
export const FINDING_CLASSIFICATIONS = ['no-damage', 'deformation-confirmed', 'other'] as const;
export type FindingClassification = (typeof FINDING_CLASSIFICATIONS)[number];

/** A queued e-mail's state. */
export const NOTIFICATION_STATUSES = ['queued', 'sent', 'failed'] as const;
export type NotificationStatus = (typeof NOTIFICATION_STATUSES)[number];
/** What a mail reports: a screening (to the site's managers) or a signed decision (control room and testers). */
export const NOTIFICATION_KINDS = ['screening', 'decision'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

/** A unit design's windings (case format `unit.windings`). */
export const WINDINGS = ['two-winding', 'three-winding', 'auto', 'auto-tertiary'] as const;
export type Windings = (typeof WINDINGS)[number];

/** Winding conductor material (case format `unit.conductor`). */
export const CONDUCTORS = ['Cu', 'Al'] as const;
export type Conductor = (typeof CONDUCTORS)[number];

/** Sort keys of the fleet list (`GET /api/units?sort=`); a leading `-` sorts descending. */
export const UNIT_SORTS = ['serial', '-serial', 'site', '-site', 'design', '-design', 'lastEventAt', '-lastEventAt', 'lastRecommendation', '-lastRecommendation'] as const;

/** Sort keys of the event list (`GET /api/events?sort=`); a leading `-` sorts descending. */
export const EVENT_SORTS = ['-occurredAt', 'occurredAt', 'serial', '-serial', 'status', '-status'] as const;
export type EventSort = (typeof EVENT_SORTS)[number];

/** Follow-up buckets of `GET /api/follow-ups?due=`: past due, due within the next 7 days, every open one. */
export const FOLLOW_UP_DUE = ['overdue', 'week', 'open'] as const;
export type FollowUpDue = (typeof FOLLOW_UP_DUE)[number];
