import { z } from 'zod';
import { criteriaSchema } from '../../screening/criteria.js';
import { isoDateTime, rowId } from './common.js';

// Answers of the criteria-set routes.

/** GET /api/criteria/:version (and each item of GET /api/criteria; POST, PATCH and publish answer the same shape). */
export const criteriaSetViewSchema = z.strictObject({
  id: rowId,
  version: z.number().int().positive(),
  status: z.enum(['draft', 'published']),
  /** The set's name (its thresholds' `name`). */
  name: z.string(),
  notes: z.string().nullable(),
  createdById: rowId.nullable(),
  /** Who drafted it, in words; null for the built-in sets. */
  createdByName: z.string().nullable(),
  createdAt: isoDateTime,
  publishedAt: isoDateTime.nullable(),
  /** Every threshold and table the engine uses, with its source (a draft's too: it validates on every save). */
  thresholds: criteriaSchema,
});
export type CriteriaSetView = z.infer<typeof criteriaSetViewSchema>;

/** GET /api/criteria — every version, newest first. */
export const criteriaSetListSchema = z.array(criteriaSetViewSchema);
export type CriteriaSetList = z.infer<typeof criteriaSetListSchema>;
