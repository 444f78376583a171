import type { EntityManager } from 'typeorm';
import {
  locateReadingSetSheet,
  readingSheetSerials,
  readReadingSetRows,
  READING_SET_SHEET_FIELDS,
  type ReadingSetSheetMapping,
} from '../../../shared/imports/reading-sets-sheet.js';
import { sheetColumnHeaders } from '../../../shared/imports/units-sheet.js';
import type { ReadingSetsImportAnswer, ReadingSetsImportPreview } from '../../../shared/schemas/responses/units-io.js';
import { AppError, badRequest } from '../../common/app-error.js';
import type { Clock } from '../../common/clock.js';
import { READING_SET_IMPORT_ROW_LIMIT } from '../../../shared/imports/reading-sets-sheet-fields.js';
import { UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';
import { yieldToEventLoop } from '../imports/insert-readings.js';
import { readSheetFile, unitIdsBySerial } from './units-import.service.js';
import { addUnitReadingSet } from './units.service.js';

// Reading sets of many units from one .xlsx or CSV file (one reading a row): every row checked before anything is
// saved, then each set created by the same service as POST /api/units/:unitId/reading-sets (each audited), all in the
// request's transaction.

/** Sets listed in a dry run's preview. */
const PREVIEW_SETS = 200;

/** Units by serial (lower-case key) for the serials a file names. */

/**
 * POST /api/units/reading-sets/import: rows grouped into one set per (serial, kind, takenAt); every problem listed
 * (400, nothing saved); with `dryRun` the sets found per unit and the problems are answered and nothing is saved.
 */
export async function importReadingSets(
  m: EntityManager,
  clock: Clock,
  userId: number,
  file: { buffer: Buffer },
  opts: { mapping?: ReadingSetSheetMapping; dryRun?: boolean },
): Promise<ReadingSetsImportAnswer | ReadingSetsImportPreview> {
  const read = await readSheetFile(file, 'A reading-sets import', 'readings', UPLOAD_TYPES.spreadsheet, READING_SET_IMPORT_ROW_LIMIT, 'readings');
  await yieldToEventLoop();
  const located = locateReadingSetSheet(read.rows, opts.mapping);
  const result = readReadingSetRows(located, await unitIdsBySerial(m, readingSheetSerials(located)));
  const fields = { ...read.fields, ...result.fields };
  if (opts.dryRun) {
    return {
      dryRun: true,
      imported: 0,
      sheet: read.sheet,
      headerRow: located.headerRow,
      headers: located.headers,
      columns: sheetColumnHeaders(READING_SET_SHEET_FIELDS, located),
      total: result.total,
      setCount: result.sets.length,
      sets: result.sets.slice(0, PREVIEW_SETS).map((s) => ({
        serial: s.serial,
        kind: s.kind,
        takenAt: s.takenAt,
        rows: s.rows.length,
        firstRow: s.rows[0] ?? 0,
        ok: s.body !== null,
      })),
      fields,
    } satisfies ReadingSetsImportPreview;
  }
  if (Object.keys(fields).length > 0) throw new AppError('invalid_file', 'The file has errors; nothing was imported.', 400, fields);
  const sets: ReadingSetsImportAnswer['sets'] = [];
  for (const s of result.sets) {
    if (s.body === null || s.unitId === null) throw badRequest('A set was not read.', { [`row ${s.rows[0]}`]: 'not read' });
    const created = await addUnitReadingSet(m, clock, userId, s.unitId, s.body);
    sets.push({ id: created.id, unitId: s.unitId, serial: s.serial, kind: s.body.kind, takenAt: s.takenAt, rows: s.rows.length });
  }
  return { imported: sets.length, sets } satisfies ReadingSetsImportAnswer;
}
