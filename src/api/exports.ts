// Spreadsheet exports (.xlsx or CSV), fetched with the token: a unit's readings, a screening's indicators, an event's
// audit trail.
import { api } from './client';

export type ExportFormat = 'xlsx' | 'csv';

// GET /api/units/:id/readings/export — one row per reading of the unit.
export function exportUnitReadings(unitId: number, format: ExportFormat): Promise<Blob> {
  return api.download(`/units/${unitId}/readings/export`, { query: { format } });
}

// GET /api/screenings/:id/indicators/export — one row per indicator of the screening.
export function exportScreeningIndicators(screeningId: number, format: ExportFormat): Promise<Blob> {
  return api.download(`/screenings/${screeningId}/indicators/export`, { query: { format } });
}

// GET /api/events/:id/audit/export — the event's audit trail.
export function exportEventAudit(eventId: number, format: ExportFormat): Promise<Blob> {
  return api.download(`/events/${eventId}/audit/export`, { query: { format } });
}
