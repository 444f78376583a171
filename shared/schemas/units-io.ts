import { z } from 'zod';
import { READING_SET_SHEET_FIELDS } from '../imports/reading-sets-sheet-fields.js';
import { UNIT_SHEET_FIELDS, type UnitSheetField } from '../imports/units-sheet-fields.js';
import { dateInRange } from './bounds.js';
import { UNIT_READING_SET_KINDS } from './enums.js';
import { unitListQuerySchema } from './fleet.js';

// Inputs of the fleet spreadsheet routes: GET /api/units/export, POST /api/units/import and POST
// /api/units/:unitId/reading-sets/import.

/** GET /api/units/export — the fleet list's filters and sort (no paging) and the file format. */
export const unitExportQuerySchema = unitListQuerySchema.omit({ page: true, pageSize: true }).extend({
  format: z.enum(['xlsx', 'csv'], { message: 'xlsx or csv' }).default('xlsx'),
});

/**
 * POST /api/units/import — the multipart fields beside `file`: `mapping`, JSON `{ ourField: theirHeader }` ('' leaves a
 * field empty), and `dryRun` (`true`: check and map every row, save nothing).
 */
/** A multipart `mapping` field: JSON `{ ourField: theirHeader }` over the given fields. */
const mappingField = <F extends string>(names: readonly F[], what: string) =>
  z
    .string()
    .max(4000)
    .optional()
    .transform((text, ctx): Partial<Record<F, string>> | undefined => {
      if (text === undefined || text.trim() === '') return undefined;
      let value: unknown;
      try {
        value = JSON.parse(text);
      } catch {
        ctx.addIssue({ code: 'custom', message: 'not JSON: give {"ourField": "their header", …}' });
        return z.NEVER;
      }
      if (typeof value !== 'object' || value === null || Array.isArray(value)) {
        ctx.addIssue({ code: 'custom', message: 'a JSON object {"ourField": "their header", …}' });
        return z.NEVER;
      }
      const out: Partial<Record<F, string>> = {};
      for (const [key, header] of Object.entries(value)) {
        if (!(names as readonly string[]).includes(key)) {
          ctx.addIssue({ code: 'custom', path: [key], message: `not a ${what} field (${names.join(', ')})` });
        } else if (typeof header !== 'string' || header.length > 200) {
          ctx.addIssue({ code: 'custom', path: [key], message: 'a header name of at most 200 characters' });
        } else out[key as F] = header;
      }
      return out;
    });

const dryRunField = z
  .enum(['true', 'false'], { message: 'true or false' })
  .transform((v) => v === 'true')
  .optional();

export const unitImportFieldsSchema = z.strictObject({
  mapping: mappingField<UnitSheetField>(UNIT_SHEET_FIELDS, 'unit'),
  dryRun: dryRunField,
});

/** POST /api/units/reading-sets/import — `mapping` over the reading-sets sheet's fields, and `dryRun`. */
export const readingSetsImportFieldsSchema = z.strictObject({
  mapping: mappingField(READING_SET_SHEET_FIELDS, 'reading-sets sheet'),
  dryRun: dryRunField,
});

/**
 * POST /api/units/:unitId/reading-sets/import — the multipart fields beside `file` (a readings CSV, the format of
 * POST /api/sessions/:id/imports): the set's kind, when it was taken, and a few conditions.
 */
export const unitReadingSetImportFieldsSchema = z.strictObject({
  kind: z.enum(UNIT_READING_SET_KINDS, { message: UNIT_READING_SET_KINDS.join(', ') }),
  takenAt: dateInRange(),
  isReference: z.enum(['true', 'false'], { message: 'true or false' }).transform((v) => v === 'true').optional(),
  tapPosition: z.string().trim().max(20, 'at most 20 characters').optional(),
  instrument: z.string().max(120).optional(),
  notes: z.string().max(5000).optional(),
});
