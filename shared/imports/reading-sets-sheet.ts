// A reading-sets spreadsheet (rows of cell texts, from .xlsx or .csv): one reading a row, rows grouped into one reading
// set per (serial, kind, takenAt). Pure: the server reads the file into rows and looks up the serials; every reading is
// checked as a readings CSV row is, and every set as POST /api/units/:unitId/reading-sets checks its body.
import { readingSetBodySchema, type ReadingSetBody } from '../schemas/fleet.js';
import { UNIT_READING_SET_KINDS } from '../schemas/enums.js';
import { collectRowErrors, parseDecimalCell } from './csv.js';
import { checkReading, readingRowsToSet, READINGS_COLUMNS, type ReadingRow } from './readings-csv.js';
import {
  READING_SET_IMPORT_ROW_LIMIT,
  READING_SET_SHEET_FIELD_LABELS,
  READING_SET_SHEET_FIELDS,
  READING_SET_SHEET_REQUIRED,
  type ReadingSetSheetField,
} from './reading-sets-sheet-fields.js';
import { locateSheet, refKey, sheetRowCells, type LocatedSheet, type SheetRow, type SheetSpec } from './units-sheet.js';

export * from './reading-sets-sheet-fields.js';

/** Our field → the file's header that holds it ('' = leave the field empty). */
export type ReadingSetSheetMapping = Partial<Record<ReadingSetSheetField, string>>;
export type LocatedReadingSetSheet = LocatedSheet<ReadingSetSheetField>;

export const READING_SET_SHEET_SPEC: SheetSpec<ReadingSetSheetField> = {
  fields: READING_SET_SHEET_FIELDS,
  aliases: {
    serial: ['serial', 'serial no', 'serial number', 'unit serial', 'transformer serial', 's/n', 'sn'],
    kind: ['kind', 'set kind', 'type', 'test type', 'reading kind'],
    takenAt: ['taken at', 'taken', 'date', 'test date', 'taken on', 'measured at', 'measured on'],
    quantity: ['quantity', 'measurement', 'test'],
    configuration: ['configuration', 'config', 'gas', 'terminal', 'bushing'],
    phase: ['phase', 'ph'],
    value: ['value', 'reading', 'result'],
    unit: ['unit', 'units', 'uom'],
    topOilC: ['top oil c', 'top oil', 'top oil temperature', 'oil temperature'],
    ambientC: ['ambient c', 'ambient', 'ambient temperature'],
    tap: ['tap', 'tap position', 'tapposition'],
    instrument: ['instrument', 'test set', 'test instrument'],
    reference: ['reference', 'is reference', 'reference set'],
  },
  required: READING_SET_SHEET_REQUIRED,
  labels: READING_SET_SHEET_FIELD_LABELS,
  key: 'serial',
};

/** The sheet split at its header row (see locateSheet). */
export function locateReadingSetSheet(rows: readonly SheetRow[], mapping: ReadingSetSheetMapping = {}): LocatedReadingSetSheet {
  return locateSheet(READING_SET_SHEET_SPEC, rows, mapping);
}

/** One reading set found in the file: the unit, the rows it came from and its body (null when a row of it is bad). */
export interface ReadingSetGroup {
  serial: string;
  unitId: number | null;
  kind: string;
  takenAt: string;
  rows: number[];
  body: ReadingSetBody | null;
}

export interface ReadingSetSheetResult {
  sets: ReadingSetGroup[];
  /** Data rows read. */
  total: number;
  /** Every problem: header (`columns.*`, `mapping.*`, `file`) and rows (`row 7.value`); empty when all rows are good. */
  fields: Record<string, string>;
}

const MAX_LISTED_ROWS = 1000;
const YES = new Set(['yes', 'y', 'true', '1', 'x']);
const NO = new Set(['no', 'n', 'false', '0', '']);
const SET_FIELDS = ['topOilC', 'ambientC', 'tap', 'instrument', 'reference'] as const;
type SetField = (typeof SET_FIELDS)[number];

/** The set-level cells of a row, checked: numbers for temperatures, yes/no for reference. */
function setConditions(cells: Record<ReadingSetSheetField, string>): { values: Partial<Record<SetField, unknown>>; errors: Record<string, string> } {
  const values: Partial<Record<SetField, unknown>> = {};
  const errors: Record<string, string> = {};
  for (const field of ['topOilC', 'ambientC'] as const) {
    if (cells[field] === '') continue;
    const n = parseDecimalCell(cells[field]);
    if ('error' in n) errors[field] = n.error;
    else values[field] = n.value;
  }
  if (cells.tap !== '') values.tap = cells.tap;
  if (cells.instrument !== '') values.instrument = cells.instrument;
  const ref = cells.reference.toLowerCase();
  if (YES.has(ref)) values.reference = true;
  else if (!NO.has(ref)) errors.reference = 'yes or no';
  return { values, errors };
}

interface Building {
  group: ReadingSetGroup;
  firstRow: number;
  readings: ReadingRow[];
  seen: Map<string, number>;
  conditions: Partial<Record<SetField, { value: unknown; row: number }>>;
  bad: boolean;
}

/**
 * The data rows of a located sheet → one reading set per (serial, kind, takenAt), with every bad row listed: a reading
 * as the readings CSV checks it (`row 7.value`: decimal comma named), an unknown serial or kind, a reading given twice
 * in a set, a set condition that differs from an earlier row of the same set, and a set the reading-set body refuses.
 */
export function readReadingSetRows(sheet: LocatedReadingSetSheet, units: ReadonlyMap<string, number>): ReadingSetSheetResult {
  const errors = collectRowErrors(MAX_LISTED_ROWS, { ...sheet.columns.fields });
  if (sheet.dataRows.length > READING_SET_IMPORT_ROW_LIMIT) {
    errors.fields.file = `${sheet.dataRows.length} readings: one import takes at most ${READING_SET_IMPORT_ROW_LIMIT}; split the file`;
  }
  const headerBad = Object.keys(sheet.columns.fields).length > 0;
  const groups = new Map<string, Building>();
  if (!headerBad) {
    for (const r of sheet.dataRows) {
      const cells = sheetRowCells(READING_SET_SHEET_FIELDS, r, sheet.columns);
      const rowErrors: Record<string, string> = {};
      // A CSV row with cells beyond the header: most often a value written with a decimal comma and no quotes.
      if (r.cells.length > sheet.headers.length && r.cells.slice(sheet.headers.length).some((c) => c.trim() !== '')) {
        rowErrors[''] = `expected ${sheet.headers.length} columns, found ${r.cells.length} (a decimal comma? write 3.14, or quote the value)`;
      }
      const unitId = cells.serial === '' ? undefined : units.get(refKey(cells.serial));
      if (cells.serial === '') rowErrors.serial = 'required';
      else if (unitId === undefined) rowErrors.serial = `no unit with serial '${cells.serial}'`;
      const kind = cells.kind.toLowerCase();
      if (kind === '') rowErrors.kind = `required: ${UNIT_READING_SET_KINDS.join(', ')}`;
      else if (!(UNIT_READING_SET_KINDS as readonly string[]).includes(kind)) rowErrors.kind = `one of ${UNIT_READING_SET_KINDS.join(', ')} (found '${cells.kind}')`;
      if (cells.takenAt === '') rowErrors.takenAt = 'required';
      else if (Number.isNaN(Date.parse(cells.takenAt))) rowErrors.takenAt = 'not an ISO 8601 date or date-time (e.g. 2024-05-01)';
      const reading = checkReading(
        READINGS_COLUMNS.map((c) => cells[c]),
        Object.fromEntries(READINGS_COLUMNS.map((c, i) => [c, i])) as Record<(typeof READINGS_COLUMNS)[number], number>,
      );
      Object.assign(rowErrors, reading.errors);
      const conditions = setConditions(cells);
      Object.assign(rowErrors, conditions.errors);

      const key = `${refKey(cells.serial)}|${kind}|${cells.takenAt}`;
      let b = groups.get(key);
      if (b === undefined) {
        b = {
          group: { serial: cells.serial, unitId: unitId ?? null, kind, takenAt: cells.takenAt, rows: [], body: null },
          firstRow: r.row,
          readings: [],
          seen: new Map(),
          conditions: {},
          bad: false,
        };
        groups.set(key, b);
      }
      b.group.rows.push(r.row);
      if (reading.row) {
        const label = reading.row.configuration ?? reading.row.phase ?? '';
        const dupKey = `${reading.row.quantity}|${label}`;
        const earlier = b.seen.get(dupKey);
        if (earlier !== undefined) {
          const field = reading.row.configuration !== null ? 'configuration' : reading.row.phase !== null ? 'phase' : 'quantity';
          rowErrors[field] ??= `${reading.row.quantity}${label ? ` ${label}` : ''} is already given in row ${earlier} for this set`;
        } else b.seen.set(dupKey, r.row);
      }
      for (const [field, value] of Object.entries(conditions.values) as [SetField, unknown][]) {
        const given = b.conditions[field];
        if (given === undefined) b.conditions[field] = { value, row: r.row };
        else if (given.value !== value) rowErrors[field] ??= `differs from row ${given.row} of the same set (${String(given.value)})`;
      }
      if (Object.keys(rowErrors).length > 0) {
        b.bad = true;
        errors.add(r.row, rowErrors);
      } else if (reading.row) b.readings.push(reading.row);
    }
  }
  const sets: ReadingSetGroup[] = [];
  for (const b of groups.values()) {
    if (!b.bad) {
      const c = b.conditions;
      const parsed = readingSetBodySchema.safeParse({
        ...readingRowsToSet(b.readings),
        kind: b.group.kind,
        takenAt: b.group.takenAt,
        ...(c.topOilC ? { topOilC: c.topOilC.value } : {}),
        ...(c.ambientC ? { ambientC: c.ambientC.value } : {}),
        ...(c.tap ? { tapPosition: c.tap.value } : {}),
        ...(c.instrument ? { instrument: c.instrument.value } : {}),
        ...(c.reference ? { isReference: c.reference.value } : {}),
      });
      if (parsed.success) b.group.body = parsed.data;
      else {
        const issues: Record<string, string> = {};
        for (const issue of parsed.error.issues) issues[issue.path.join('.') || ''] ??= issue.message;
        errors.add(b.firstRow, issues);
      }
    }
    sets.push(b.group);
  }
  if (!headerBad && sheet.dataRows.length === 0 && sheet.headerRow > 0) errors.fields.file = 'no readings below the header row';
  return { sets, total: sheet.dataRows.length, fields: errors.finish() };
}

/** The serials a located sheet names (for looking up their units). */
export function readingSheetSerials(sheet: LocatedReadingSetSheet): string[] {
  const at = sheet.columns.index.serial;
  if (at < 0) return [];
  return [...new Set(sheet.dataRows.map((r) => (r.cells[at] ?? '').trim()).filter((s) => s !== ''))];
}
