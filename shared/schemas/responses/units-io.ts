import { z } from 'zod';
import { READING_SET_SHEET_FIELDS } from '../../imports/reading-sets-sheet-fields.js';
import { UNIT_SHEET_FIELDS } from '../../imports/units-sheet-fields.js';
import { unitViewSchema } from './fleet.js';

// Answers of POST /api/units/import (strict objects, like every answer schema).

const perField = <T extends z.ZodType>(value: T) => z.strictObject(Object.fromEntries(UNIT_SHEET_FIELDS.map((f) => [f, value])) as Record<(typeof UNIT_SHEET_FIELDS)[number], T>);

/** POST /api/units/import — the units created, each with the sheet row it came from. */
export const unitImportAnswerSchema = z.strictObject({
  imported: z.number().int().nonnegative(),
  rows: z.array(unitViewSchema.extend({ row: z.number().int().positive() })),
});
export type UnitImportAnswer = z.infer<typeof unitImportAnswerSchema>;

/** POST /api/units/import with dryRun=true — how the sheet was read, the first rows mapped, every problem; nothing saved. */
export const unitImportPreviewSchema = z.strictObject({
  dryRun: z.literal(true),
  imported: z.literal(0),
  /** .xlsx: the worksheet read; CSV: null. */
  sheet: z.string().nullable(),
  /** The row holding the header (0: the sheet is empty). */
  headerRow: z.number().int().nonnegative(),
  headers: z.array(z.string()),
  /** Our field → the file's header used for it (null: none). */
  columns: perField(z.string().nullable()),
  /** Data rows in the file, and how many of them are good. */
  total: z.number().int().nonnegative(),
  good: z.number().int().nonnegative(),
  /** The first rows with their texts per field. */
  rows: z.array(z.strictObject({ row: z.number().int().positive(), ok: z.boolean(), cells: perField(z.string()) })),
  /** Every problem, as a 400 of the real import would name it (empty: the import would go through). */
  fields: z.record(z.string(), z.string()),
});
export type UnitImportPreview = z.infer<typeof unitImportPreviewSchema>;

/** POST /api/units/reading-sets/import — the sets created, each with its unit and how many rows it took. */
export const readingSetsImportAnswerSchema = z.strictObject({
  imported: z.number().int().nonnegative(),
  sets: z.array(
    z.strictObject({
      id: z.number().int().positive(),
      unitId: z.number().int().positive(),
      serial: z.string(),
      kind: z.string(),
      takenAt: z.string(),
      rows: z.number().int().positive(),
    }),
  ),
});
export type ReadingSetsImportAnswer = z.infer<typeof readingSetsImportAnswerSchema>;

/** POST /api/units/reading-sets/import with dryRun=true — the sets found per unit and every problem; nothing saved. */
export const readingSetsImportPreviewSchema = z.strictObject({
  dryRun: z.literal(true),
  imported: z.literal(0),
  sheet: z.string().nullable(),
  headerRow: z.number().int().nonnegative(),
  headers: z.array(z.string()),
  columns: z.strictObject(Object.fromEntries(READING_SET_SHEET_FIELDS.map((f) => [f, z.string().nullable()])) as Record<(typeof READING_SET_SHEET_FIELDS)[number], z.ZodNullable<z.ZodString>>),
  /** Reading rows in the file. */
  total: z.number().int().nonnegative(),
  /** Reading sets the rows make, and the first of them (at most 200). */
  setCount: z.number().int().nonnegative(),
  sets: z.array(
    z.strictObject({
      serial: z.string(),
      kind: z.string(),
      takenAt: z.string(),
      rows: z.number().int().nonnegative(),
      firstRow: z.number().int().nonnegative(),
      ok: z.boolean(),
    }),
  ),
  fields: z.record(z.string(), z.string()),
});
export type ReadingSetsImportPreview = z.infer<typeof readingSetsImportPreviewSchema>;
