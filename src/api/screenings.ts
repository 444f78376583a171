// Screenings and what follows them: run a screening, the PDF report, the manager's decision, closing follow-ups,
// inspection findings.
import type { z } from 'zod';
import type { decisionBodySchema, findingBodySchema, followUpInputSchema, screeningRunBodySchema } from '../../shared/schemas/screening';
import type { ClosedFollowUp, DecisionAnswer, RecordedFinding, RunScreeningAnswer, ScreenedCaseAnswer } from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses; the bodies are the server's zod schemas' input.
export type { ClosedFollowUp, DecisionAnswer, RecordedFinding, RunScreeningAnswer, ScreenedCaseAnswer };
/** A criteria-set version other than the newest published one (engineers' comparison runs); a comparison run changes no status and sends no mail. */
export type RunScreeningBody = z.input<typeof screeningRunBodySchema>;
/** A follow-up the manager sets (dueAt ISO 8601 UTC, or null for a task without a date). */
export type DecisionFollowUp = z.input<typeof followUpInputSchema>;
export type DecisionBody = z.input<typeof decisionBodySchema>;
export type FindingBody = z.input<typeof findingBodySchema>;

// POST /api/events/:id/screenings — compute and store a screening (409 when the event's status does not allow it).
export function runScreening(eventId: number, body: RunScreeningBody = {}): Promise<RunScreeningAnswer> {
  return api.post<RunScreeningAnswer>(`/events/${eventId}/screenings`, body);
}

// GET /api/screenings/:id/report.pdf — the screening report, fetched with the token (a plain link could not send it).
export function downloadScreeningReport(screeningId: number): Promise<Blob> {
  return api.download(`/screenings/${screeningId}/report.pdf`);
}

// GET /api/screenings/:id/case — the case a stored screening judged (the evidence charts are drawn from it).
export function getScreenedCase(screeningId: number): Promise<ScreenedCaseAnswer> {
  return api.get<ScreenedCaseAnswer>(`/screenings/${screeningId}/case`);
}

// POST /api/screenings/:id/decision — the manager signs release / release with restrictions / hold.
export function signDecision(screeningId: number, body: DecisionBody): Promise<DecisionAnswer> {
  return api.post<DecisionAnswer>(`/screenings/${screeningId}/decision`, body);
}

// POST /api/follow-ups/:id/close — record a follow-up's result and close it.
export function closeFollowUp(followUpId: number, result: string): Promise<ClosedFollowUp> {
  return api.post<ClosedFollowUp>(`/follow-ups/${followUpId}/close`, { result });
}

// POST /api/events/:id/findings — what an inspection found.
export function recordFinding(eventId: number, body: FindingBody): Promise<RecordedFinding> {
  return api.post<RecordedFinding>(`/events/${eventId}/findings`, body);
}
