import { z } from 'zod';
import { rowId } from './common.js';
import { createdReadingSetSchema } from './fleet.js';

/**
 * PATCH /api/reading-sets/:id — the corrected unit reading set; screened events of the unit whose case changed are
 * back in testing (`staleEventIds`, `note`).
 */
export const correctedReadingSetSchema = createdReadingSetSchema.extend({
  staleEventIds: z.array(rowId),
  note: z.string().nullable(),
});
export type CorrectedReadingSet = z.infer<typeof correctedReadingSetSchema>;

/** POST /api/reading-sets/:id/reference — the set now the unit's reference of its kind and the sets no longer marked. */
export const markedReferenceSchema = createdReadingSetSchema.extend({
  unmarkedIds: z.array(rowId),
  staleEventIds: z.array(rowId),
  note: z.string().nullable(),
});
export type MarkedReference = z.infer<typeof markedReferenceSchema>;
