// Screenings and what follows them: run a screening, the PDF report, the manager's decision, closing follow-ups,
// inspection findings.
import type { GapsightResult } from '../../shared/schemas/result';
import { api } from './client';
import type { DecisionOutcome, DecisionView, FindingClassification, FindingView, FollowUpView } from './events';

export interface RunScreeningBody {
  /** A criteria-set version other than the newest published one (engineers' comparison runs). */
  criteriaVersion?: number;
  /** A comparison run changes no status and sends no mail. */
  comparison?: boolean;
}

export interface RunScreeningAnswer {
  id: number;
  result: GapsightResult;
  criteriaVersion: number;
  comparison: boolean;
}

export interface DecisionFollowUp {
  task: string;
  /** ISO 8601 UTC, or null for a task without a date (the sweep at the next outage). */
  dueAt?: string | null;
}

export interface DecisionBody {
  outcome: DecisionOutcome;
  reason: string;
  restrictions?: string;
  followUps?: DecisionFollowUp[];
}

// POST /api/events/:id/screenings — compute and store a screening (409 when the event's status does not allow it).
export function runScreening(eventId: number, body: RunScreeningBody = {}): Promise<RunScreeningAnswer> {
  return api.post<RunScreeningAnswer>(`/events/${eventId}/screenings`, body);
}

// GET /api/screenings/:id/report.pdf — the screening report, fetched with the token (a plain link could not send it).
export function downloadScreeningReport(screeningId: number): Promise<Blob> {
  return api.download(`/screenings/${screeningId}/report.pdf`);
}

// POST /api/screenings/:id/decision — the manager signs release / release with restrictions / hold.
export function signDecision(screeningId: number, body: DecisionBody): Promise<DecisionView> {
  return api.post<DecisionView>(`/screenings/${screeningId}/decision`, body);
}

// POST /api/follow-ups/:id/close — record a follow-up's result and close it.
export function closeFollowUp(followUpId: number, result: string): Promise<FollowUpView> {
  return api.post<FollowUpView>(`/follow-ups/${followUpId}/close`, { result });
}

// POST /api/events/:id/findings — what an inspection found.
export function recordFinding(eventId: number, body: { classification: FindingClassification; text: string }): Promise<FindingView> {
  return api.post<FindingView>(`/events/${eventId}/findings`, body);
}
