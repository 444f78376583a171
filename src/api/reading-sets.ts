// A unit's factory, commissioning and routine reading sets outside events: corrections, the reference mark and baseline
// sweep traces.
import type { CorrectedReadingSet, MarkedReference, SweepMeta } from '../../shared/schemas/responses';
import { api } from './client';
import type { SessionPatch, SweepUploadFields } from './events';

export type { CorrectedReadingSet, MarkedReference };

// PATCH /api/reading-sets/:id — correct a unit's set: only the fields named change (tester, admin).
export function correctReadingSet(readingSetId: number, body: SessionPatch): Promise<CorrectedReadingSet> {
  return api.patch(`/reading-sets/${readingSetId}`, body);
}

// POST /api/reading-sets/:id/reference — the unit's reference set of its kind; the previous one is unmarked.
export function markReferenceSet(readingSetId: number): Promise<MarkedReference> {
  return api.post(`/reading-sets/${readingSetId}/reference`, {});
}

// POST /api/units/:id/sweeps — a baseline sweep trace (CSV) on one of the unit's reading sets (tester, admin).
export function uploadUnitSweep(unitId: number, readingSetId: number, fields: SweepUploadFields, file: File): Promise<SweepMeta> {
  const { baselineTapPosition: _postFaultOnly, ...rest } = fields;
  return api.upload<SweepMeta>(`/units/${unitId}/sweeps`, { file, name: file.name }, { ...rest, readingSetId: String(readingSetId) });
}
