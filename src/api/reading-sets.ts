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

/** DELETE /api/sweeps/:id — the answer: the trace removed and any screened events sent back to testing. */
export interface RemovedSweep {
  id: number;
  readingSetId: number;
  removed: true;
  staleEventIds: number[];
  note: string | null;
}

// DELETE /api/sweeps/:id — remove a trace of a unit's set (e.g. uploaded to the wrong set); 409 once a decided screening used it.
export function removeUnitSweep(sweepId: number): Promise<RemovedSweep> {
  return api.delete(`/sweeps/${sweepId}`);
}
