// Fault events and what hangs on them: log a fault, the event file, relay records, sessions, readings CSV imports,
// sweeps and the case document.
import type { z } from 'zod';
import type { CurrentIs, DissolvedGas, FaultType, GapsightCase, Protection, ReadingSet as CaseReadingSet, Shot } from '../../shared/schemas/case';
import type { eventBodySchema, eventListQuerySchema, sessionBodySchema, sweepUploadFieldsSchema } from '../../shared/schemas/fleet';
import type { ReadingRow } from '../../shared/imports/readings-csv';
import type { GapsightResult, Recommendation, ThroughFault } from '../../shared/schemas/result';
import { api } from './client';
import type { Design } from './designs';
import type { Site } from './sites';
import type { EventStatus, ReadingSetWithValues, SweepMeta, Unit } from './units';

/** The body of POST /api/events as the form sends it (rules revision 2: where the fault was, line or winding currents). */
export type EventBody = z.input<typeof eventBodySchema> & { location?: 'hv' | 'lv'; currentIs?: CurrentIs };
/** The pre-fault oil sample sent with a session: its sampling time and gases. */
export interface PreFaultGasBody {
  takenAt: string;
  dissolvedGasPPM: DissolvedGas;
}
/** The body of POST /api/events/:id/sessions (rules revision 2 adds the pre-fault oil sample). */
export type SessionBody = z.input<typeof sessionBodySchema> & { preFaultGas?: PreFaultGasBody };
/** Multipart fields of a sweep upload (rules revision 2: winding, phase, baseline tap position — sent as text). */
export type SweepUploadFields = z.input<typeof sweepUploadFieldsSchema> & { winding?: 'hv' | 'lv' | 'tv'; phase?: 'A' | 'B' | 'C'; baselineTapPosition?: string };
export type EventListQuery = Partial<z.output<typeof eventListQuerySchema>>;

export interface FaultEvent {
  id: number;
  unitId: number;
  occurredAt: string;
  type: FaultType;
  faultedPhases: string | null;
  side: 'hv' | 'lv';
  /** Rules revision 2 (absent from events logged before it): side the fault was on, and what the shot currents are. */
  location?: 'hv' | 'lv' | null;
  currentIs?: CurrentIs | null;
  shots: Shot[];
  transformerTripped: boolean;
  protectionOperated: Protection[];
  notes: string | null;
  status: EventStatus;
  createdById: number | null;
  createdAt: string;
}

export interface CreatedEvent extends FaultEvent {
  throughFault: ThroughFault | null;
}

export interface EventListItem extends FaultEvent {
  unitSerial: string;
  siteId: number;
  siteName: string;
  siteTimeZone: string;
  recommendation: Recommendation | null;
}

export interface StoredScreening {
  id: number;
  recommendation: Recommendation;
  criteriaVersion: number;
  comparison: boolean;
  computedById: number | null;
  computedAt: string;
  result: GapsightResult;
}

export interface Attachment {
  id: number;
  name: string;
  contentType: string;
  kind: string;
  size: number;
  sha256: string;
  createdAt: string;
}

export interface AuditRow {
  id: number;
  at: string;
  userId: number | null;
  action: string;
  entity: string;
  entityId: string;
  before: unknown;
  after: unknown;
  highlighted: boolean;
  note: string | null;
}

export interface Person {
  id: number;
  name: string;
  email: string;
}

export interface DecisionView {
  id: number;
  screeningId: number;
  managerId: number;
  outcome: 'release' | 'release-with-restrictions' | 'hold';
  restrictions: string | null;
  reason: string;
  againstRecommendation: boolean;
  signedAt: string;
}

export type DecisionOutcome = DecisionView['outcome'];

export interface FollowUpView {
  id: number;
  task: string;
  dueAt: string | null;
  closedAt: string | null;
  closedById: number | null;
  result: string | null;
}

export type FindingClassification = 'no-damage' | 'deformation-confirmed' | 'other';

export interface FindingView {
  id: number;
  /** One of FindingClassification; typed loosely so that an unknown code from a newer server still renders. */
  classification: string;
  text: string;
  recordedById: number | null;
  recordedAt: string;
}

/** One e-mail about the event (the manager's mail after a screening), as queued and sent by the server. */
export interface NotificationView {
  id: number;
  /** The screening the mail reports on. */
  screeningId?: number;
  to: string;
  subject: string;
  status: 'queued' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  sentAt: string | null;
  createdAt: string;
}

export interface EventDetail extends FaultEvent {
  unit: Unit & { site: Site; design: Design };
  throughFault: ThroughFault | null;
  sessions: ReadingSetWithValues[];
  screenings: StoredScreening[];
  decision: DecisionView | null;
  decisions: DecisionView[];
  followUps: FollowUpView[];
  findings: FindingView[];
  /** The event's e-mails (optional: servers before the e-mail log leave it out). */
  notifications?: NotificationView[];
  attachments: Attachment[];
  audit: AuditRow[];
  people: Record<string, Person>;
}

export interface CreatedSession extends Omit<ReadingSetWithValues, 'sweeps'> {
  values?: CaseReadingSet;
  eventStatus: 'testing';
}

export interface ImportAnswer {
  imported: number;
  rows: ReadingRow[];
}

// POST /api/events — log a fault; the answer carries its through-fault duty.
export function createEvent(body: EventBody): Promise<CreatedEvent> {
  return api.post<CreatedEvent>('/events', body);
}

// GET /api/events — events newest first, by status, unit or site.
export function listEvents(query: EventListQuery = {}): Promise<{ items: EventListItem[]; total: number }> {
  return api.get('/events', { query: { ...query } });
}

// GET /api/events/:id — the event file.
export function getEvent(id: number): Promise<EventDetail> {
  return api.get<EventDetail>(`/events/${id}`);
}

// GET /api/events/:id/case — the event as a gapsight-case/1 document.
export function getEventCase(id: number): Promise<GapsightCase> {
  return api.get<GapsightCase>(`/events/${id}/case`);
}

// POST /api/events/:id/attachments — a relay record (413 too large, 415 wrong type).
export function uploadAttachment(eventId: number, file: File): Promise<Attachment> {
  return api.upload<Attachment>(`/events/${eventId}/attachments`, { file, name: file.name });
}

// GET /api/events/:id/attachments/:attachmentId — a stored relay record's bytes.
export function downloadAttachment(eventId: number, attachmentId: number): Promise<Blob> {
  return api.download(`/events/${eventId}/attachments/${attachmentId}`);
}

// POST /api/events/:id/sessions — a post-fault session with its readings; the event moves to testing.
export function createSession(eventId: number, body: SessionBody): Promise<CreatedSession> {
  return api.post<CreatedSession>(`/events/${eventId}/sessions`, body);
}

// POST /api/sessions/:id/imports — a canonical readings CSV into a session: all rows or none.
export function importReadings(sessionId: number, csvText: string, fileName: string): Promise<ImportAnswer> {
  const name = /\.csv$/i.test(fileName) ? fileName : `${fileName.replace(/\.[^.]*$/, '')}.csv`;
  // A File, not a bare Blob: its name travels with it whatever the FormData implementation does with a third argument.
  const file = new File([csvText], name, { type: 'text/csv' });
  return api.upload<ImportAnswer>(`/sessions/${sessionId}/imports`, { file, name });
}

// POST /api/sessions/:id/sweeps — a post-fault sweep trace (CSV) with its label and test type.
export function uploadSessionSweep(sessionId: number, fields: SweepUploadFields, file: File): Promise<SweepMeta> {
  return api.upload<SweepMeta>(`/sessions/${sessionId}/sweeps`, { file, name: file.name }, { ...fields });
}
