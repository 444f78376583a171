import { Worker } from 'node:worker_threads';
import { In, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { countNonBlankLines, normaliseCsvText, quoteCell, rowCapProblem } from '../../../shared/imports/csv.js';
import { parseReadingsCsv, readingRowsToSet, READINGS_MAX_ROWS } from '../../../shared/imports/readings-csv.js';
import { UNIT_IMPORT_ROW_LIMIT } from '../../../shared/imports/units-sheet-fields.js';
import { detectSpreadsheet, looksLikeCsvText } from '../../../shared/imports/sniff.js';
import {
  columnHeaders,
  csvSheetRows,
  locateUnitSheet,
  readUnitRows,
  refKey,
  sheetSerials,
  type SheetRow,
  type UnitSheetMapping,
} from '../../../shared/imports/units-sheet.js';
import { readingSetBodySchema } from '../../../shared/schemas/fleet.js';
import type { UnitImportAnswer, UnitImportPreview } from '../../../shared/schemas/responses/units-io.js';
import type { unitReadingSetImportFieldsSchema } from '../../../shared/schemas/units-io.js';
import { AppError, badRequest } from '../../common/app-error.js';
import type { Clock } from '../../common/clock.js';
import { refuseOtherTypes, UPLOAD_LIMITS, unsupportedType, utf8Name } from '../../common/upload.js';
import { fileExtension, UPLOAD_TYPES, type UploadType } from '../../../shared/uploads/file-types.js';
import { parseOr400 } from '../../common/validate.js';
import { Design } from '../designs/design.entity.js';
import { Site } from '../sites/site.entity.js';
import { yieldToEventLoop } from '../imports/insert-readings.js';
import { Unit } from './unit.entity.js';
import { addUnitReadingSet, createUnit } from './units.service.js';

// Fleet onboarding: one unit a row of an .xlsx or CSV file, every row checked before anything is saved, then each unit
// created by the same service as POST /api/units (so each gets its own audited create), all in the request's transaction.

/** Columns read from a worksheet (a sheet formatted far to the right is cut here). */
const MAX_COLUMNS = 200;
/** Rows shown in a dry run's preview. */
const PREVIEW_ROWS = 50;

/** The worker that reads a workbook's rows off the main thread (plain JavaScript: it needs only exceljs). */
const SHEET_ROWS_WORKER = new URL('../../workers/sheet-rows.worker.mjs', import.meta.url);

type WorkerAnswer =
  | { sheet: string; rows: SheetRow[] }
  | { error: 'unreadable'; message: string }
  | { error: 'no-sheet' }
  | { error: 'too-many'; count: number };

/**
 * The worksheet of an .xlsx as rows of cell texts (a merged cell reads as its master cell's value), read in a worker
 * thread: unpacking and parsing a large workbook would otherwise hold every other request. Over `maxRows` data rows
 * (a header and a few title rows allowed for) → 400 naming `file`.
 */
async function workbookRows(bytes: Buffer, sheetName: string, maxRows: number, what: string): Promise<{ sheet: string; rows: SheetRow[] }> {
  const answer = await new Promise<WorkerAnswer>((resolve, reject) => {
    const worker = new Worker(SHEET_ROWS_WORKER, {
      workerData: { bytes: new Uint8Array(bytes), sheetName, maxRows: maxRows + HEADER_ALLOWANCE, maxColumns: MAX_COLUMNS },
      resourceLimits: { maxOldGenerationSizeMb: 512 },
    });
    worker.once('message', (m: WorkerAnswer) => {
      resolve(m);
      void worker.terminate();
    });
    worker.once('error', reject);
    worker.once('exit', (code) => {
      if (code !== 0) reject(new Error(`the workbook reader stopped (exit code ${code})`));
    });
  }).catch((err: Error) => ({ error: 'unreadable' as const, message: err.message }));
  if (!('error' in answer)) return answer;
  if (answer.error === 'unreadable') throw new AppError('invalid_file', 'The workbook cannot be read.', 400, { file: `the workbook cannot be read (${answer.message})` });
  if (answer.error === 'no-sheet') throw new AppError('invalid_file', 'The workbook has no worksheet.', 400, { file: 'the workbook has no worksheet' });
  throw rowCapError(rowCapProblem(answer.count, maxRows, what)!);
}

/**
 * An upload read as sheet rows: a name of the types `type` takes (415 otherwise, naming them), then .xlsx or CSV judged
 * by the bytes (415 otherwise; 413 for a workbook that unpacks too large). `what` names the import in the 415 message; of a workbook the sheet named `sheetName` is read, else the first.
 */
export async function readSheetFile(
  file: { buffer: Buffer; originalname?: string; mimetype?: string },
  what = 'A units import',
  sheetName = 'units',
  type: UploadType = UPLOAD_TYPES.spreadsheet,
  maxRows: number = UNIT_IMPORT_ROW_LIMIT,
  rowWord = 'rows',
): Promise<{ sheet: string | null; rows: SheetRow[]; fields: Record<string, string>; kind: 'xlsx' | 'csv' }> {
  // The name first (415 naming the file and the types this uploader takes, from the list the picker reads), then the bytes.
  if (typeof file.originalname === 'string') refuseOtherTypes(type, { originalname: file.originalname, mimetype: file.mimetype });
  const check = detectSpreadsheet(new Uint8Array(file.buffer), UPLOAD_LIMITS.unitSheetUnpackedBytes);
  if ('error' in check) {
    if (check.tooLarge) throw new AppError('file_too_large', 'The workbook is too large.', 413, { file: check.error });
    throw unsupportedType(`${what} is an .xlsx workbook or a CSV file: ${check.error}.`);
  }
  if (check.kind === 'xlsx') return { ...(await workbookRows(file.buffer, sheetName, maxRows, rowWord)), fields: {}, kind: 'xlsx' };
  const text = file.buffer.toString('utf8');
  // The row cap by a cheap count of lines, before the text is parsed.
  const lines = countNonBlankLines(normaliseCsvText(text)) - 1;
  if (lines > maxRows + HEADER_ALLOWANCE) throw rowCapError(rowCapProblem(lines, maxRows, rowWord)!);
  // Parsed after a turn of the event loop, so requests waiting since the upload arrived answer first.
  await yieldToEventLoop();
  return { sheet: null, ...csvSheetRows(text), kind: 'csv' };
}

/** Title rows a sheet may have above its header, on top of the data rows of a row cap. */
const HEADER_ALLOWANCE = 10;

/** 400 naming `file` for an upload over its row cap ("at most N rows a file; this file has M"). */
export function rowCapError(problem: string): AppError {
  return new AppError('invalid_file', `The file is too long; nothing was imported: ${problem}.`, 400, { file: problem });
}


/** Sheet rows as CSV text, each row on the line of its number (so errors name the sheet's rows). */
function sheetRowsAsCsv(rows: readonly SheetRow[]): string {
  const lines: string[] = [];
  for (const r of rows) {
    while (lines.length < r.row - 1) lines.push('');
    // Trailing empty cells are the sheet's width, not columns of the readings.
    const cells = [...r.cells];
    while (cells.length > 0 && cells[cells.length - 1].trim() === '') cells.pop();
    lines.push(cells.map(quoteCell).join(','));
  }
  return `${lines.join('\n')}\n`;
}

/** The ids of the units with these serials, keyed by refKey(serial); looked up 1 000 serials a query. */
export async function unitIdsBySerial(m: EntityManager, serials: string[]): Promise<Map<string, number>> {
  const found = new Map<string, number>();
  for (let i = 0; i < serials.length; i += 1000) {
    const units = await m.getRepository(Unit).find({ select: { id: true, serial: true }, where: { serial: In(serials.slice(i, i + 1000)) } });
    for (const u of units) found.set(refKey(u.serial), u.id);
  }
  return found;
}

async function serialsTaken(m: EntityManager, serials: string[]): Promise<Set<string>> {
  return new Set((await unitIdsBySerial(m, serials)).keys());
}

/**
 * POST /api/units/import: every row checked (sites by name, designs by reference, serials new) and every problem
 * listed (400, nothing saved); with `dryRun` the mapping and rows are answered instead and nothing is saved.
 */
export async function importUnits(
  m: EntityManager,
  clock: Clock,
  userId: number,
  file: { buffer: Buffer; originalname: string; mimetype?: string },
  opts: { mapping?: UnitSheetMapping; dryRun?: boolean },
): Promise<UnitImportAnswer | UnitImportPreview> {
  const read = await readSheetFile(file, 'A units import', 'units', UPLOAD_TYPES.spreadsheet, UNIT_IMPORT_ROW_LIMIT, 'units');
  const located = locateUnitSheet(read.rows, opts.mapping);
  const sites = await m.getRepository(Site).find({ select: { id: true, name: true } });
  const designs = await m.getRepository(Design).find({ select: { id: true, reference: true } });
  const result = readUnitRows(located, {
    sites: new Map(sites.map((s) => [refKey(s.name), s.id])),
    designs: new Map(designs.map((d) => [refKey(d.reference), d.id])),
    takenSerials: await serialsTaken(m, sheetSerials(located)),
  });
  const fields = { ...read.fields, ...result.fields };
  if (opts.dryRun) {
    return {
      dryRun: true,
      imported: 0,
      sheet: read.sheet,
      headerRow: located.headerRow,
      headers: located.headers,
      columns: columnHeaders(located),
      total: result.rows.length,
      good: result.rows.filter((r) => r.body !== null).length,
      rows: result.rows.slice(0, PREVIEW_ROWS).map((r) => ({ row: r.row, ok: r.body !== null && !fields[`row ${r.row}`], cells: r.cells })),
      fields,
    } satisfies UnitImportPreview;
  }
  if (Object.keys(fields).length > 0) throw new AppError('invalid_file', 'The file has errors; nothing was imported.', 400, fields);
  const rows: UnitImportAnswer['rows'] = [];
  for (const r of result.rows) {
    if (r.body === null) throw badRequest('A row has no unit.', { [`row ${r.row}`]: 'not read' });
    rows.push({ row: r.row, ...(await createUnit(m, clock, userId, r.body)) });
  }
  return { imported: rows.length, rows } satisfies UnitImportAnswer;
}

/**
 * POST /api/units/:unitId/reading-sets/import: a factory, commissioning or routine reading set from a readings CSV (the
 * session import's format), every bad row listed before anything is saved; stored by the same service as
 * POST /api/units/:unitId/reading-sets (audited create).
 */
export async function importUnitReadingSet(
  m: EntityManager,
  clock: Clock,
  userId: number,
  unitId: number,
  fields: z.output<typeof unitReadingSetImportFieldsSchema>,
  file: { originalname: string; mimetype?: string; buffer: Buffer },
) {
  refuseOtherTypes(UPLOAD_TYPES.unitReadingSet, file);
  let text: string;
  if (fileExtension(utf8Name(file.originalname)) === '.xlsx') {
    // A workbook: its first sheet's rows, each on its own line, read as the readings CSV.
    const read = await readSheetFile(file, 'A readings import', 'readings', UPLOAD_TYPES.unitReadingSet, READINGS_MAX_ROWS, 'readings');
    text = sheetRowsAsCsv(read.rows);
  } else {
    if (!looksLikeCsvText(new Uint8Array(file.buffer))) {
      throw unsupportedType(`${utf8Name(file.originalname)} is not comma-separated text: a readings file has a header quantity,configuration,phase,value,unit and one reading a line.`);
    }
    text = file.buffer.toString('utf8');
  }
  const parsed = parseReadingsCsv(text);
  if (!parsed.ok) throw new AppError('invalid_file', 'The file has errors; nothing was imported.', 400, parsed.fields);
  const body = parseOr400(readingSetBodySchema, { ...readingRowsToSet(parsed.rows), ...fields });
  return addUnitReadingSet(m, clock, userId, unitId, body);
}
