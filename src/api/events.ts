// Fault events and what hangs on them: log a fault, the event file, relay records, sessions, readings CSV imports,
// sweeps and the case document.
import type { z } from 'zod';
import type { FaultType, GapsightCase } from '../../shared/schemas/case';
import type { EventSort, EventStatus } from '../../shared/schemas/enums';
import type { eventBodySchema, eventPatchSchema, preFaultGasSchema, sessionBodySchema, sessionPatchSchema, sweepUploadFieldsSchema } from '../../shared/schemas/fleet';
import type {
  AttachmentView,
  AuditRow,
  CorrectedEvent,
  CorrectedSession,
  CreatedEvent,
  CreatedSession,
  DecisionView,
  EnergisedAnswer,
  EventDetail,
  EventListItem,
  EventListPage,
  EventView,
  FindingView,
  FollowUpView,
  ImportAnswer,
  LiftedRestrictions,
  NotificationView,
  Person,
  StoredScreening,
  SweepMeta,
} from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses (the server's views are checked against the same schemas).
export type { DecisionOutcome, FindingClassification } from '../../shared/schemas/enums';
export type {
  AuditRow,
  CreatedEvent,
  CreatedSession,
  DecisionView,
  EventDetail,
  EventListItem,
  EventListPage,
  FindingView,
  FollowUpView,
  ImportAnswer,
  NotificationView,
  Person,
  StoredScreening,
};
/** A fault event's own record. */
export type FaultEvent = EventView;
/** A stored relay or fault-recorder record. */
export type Attachment = AttachmentView;

/** The body of POST /api/events as the form sends it. */
export type EventBody = z.input<typeof eventBodySchema>;
/** The pre-fault oil sample sent with a session: its sampling time and gases. */
export type PreFaultGasBody = z.input<typeof preFaultGasSchema>;
/** The body of POST /api/events/:id/sessions (with the pre-fault oil sample when there is one). */
export type SessionBody = z.input<typeof sessionBodySchema>;
/** Multipart fields of a sweep upload (sent as text). */
export type SweepUploadFields = z.input<typeof sweepUploadFieldsSchema>;
/** GET /api/events's query as the client sends it: several statuses or fault types go comma-separated. */
export interface EventListQuery {
  /** Part of a unit serial. */
  q?: string;
  status?: EventStatus | EventStatus[];
  type?: FaultType | FaultType[];
  unitId?: number;
  siteId?: number;
  /** ISO date or instant; `to` keeps the whole of a date's day. */
  from?: string;
  to?: string;
  withoutAttachments?: boolean;
  sort?: EventSort;
  page?: number;
  pageSize?: number;
}

// POST /api/events — log a fault; the answer carries its through-fault duty.
export function createEvent(body: EventBody): Promise<CreatedEvent> {
  return api.post<CreatedEvent>('/events', body);
}

// GET /api/events — one page of events: by unit serial, site, unit, statuses, fault types, dates, relay records; sorted.
export function listEvents(query: EventListQuery = {}, signal?: AbortSignal): Promise<EventListPage> {
  const { status, type, ...rest } = query;
  const list = (v: string | string[] | undefined) => (Array.isArray(v) ? v.join(',') : v);
  return api.get('/events', { query: { ...rest, status: list(status), type: list(type) }, signal });
}

// GET /api/events/:id — the event file.
export function getEvent(id: number, signal?: AbortSignal): Promise<EventDetail> {
  return api.get<EventDetail>(`/events/${id}`, { signal });
}

// GET /api/events/:id/case — the event as a gapsight-case/1 document.
export function getEventCase(id: number, signal?: AbortSignal): Promise<GapsightCase> {
  return api.get<GapsightCase>(`/events/${id}/case`, { signal });
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

// ---- corrections and after the decision ------------------------------------------------------------------------------

/** PATCH /api/events/:id and PATCH /api/sessions/:id bodies: only the fields named change. */
export type EventPatch = z.input<typeof eventPatchSchema>;
export type SessionPatch = z.input<typeof sessionPatchSchema>;
export type { CorrectedEvent, CorrectedSession, EnergisedAnswer, LiftedRestrictions } from '../../shared/schemas/responses';

// PATCH /api/events/:id — correct a logged fault before a decision; answers the recomputed duty.
export function correctEvent(eventId: number, body: EventPatch): Promise<CorrectedEvent> {
  return api.patch(`/events/${eventId}`, body);
}

// PATCH /api/sessions/:id — correct a session's conditions and readings before the screening that used it is decided.
export function correctSession(sessionId: number, body: SessionPatch): Promise<CorrectedSession> {
  return api.patch(`/sessions/${sessionId}`, body);
}

// POST /api/events/:id/energised — when the released unit was re-energised; follow-ups count from it.
export function recordEnergised(eventId: number, at: string): Promise<EnergisedAnswer> {
  return api.post(`/events/${eventId}/energised`, { at });
}

// POST /api/events/:id/restrictions/lift — the restrictions of a release with restrictions no longer apply.
export function liftRestrictions(eventId: number, reason: string): Promise<LiftedRestrictions> {
  return api.post(`/events/${eventId}/restrictions/lift`, { reason });
}
