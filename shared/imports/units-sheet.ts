// A fleet spreadsheet (rows of cell texts, from .xlsx or .csv) → unit bodies and row errors, and the fleet table → an
// export sheet. Pure: the server reads the file into rows (merged cells already resolved to their master's value) and
// looks up sites, designs and taken serials; everything decided about a row is decided here.
import type { z } from 'zod';
import { unitBodySchema } from '../schemas/fleet.js';
import type { UnitListItem } from '../schemas/responses/fleet.js';
import { formatInstant } from '../format.js';
import { parseDecimal } from '../numbers.js';
import { collectRowErrors, csvRecords, detectDelimiter, normaliseCsvText } from './csv.js';
import {
  UNIT_IMPORT_ROW_LIMIT,
  UNIT_SHEET_FIELD_LABELS,
  UNIT_SHEET_FIELDS,
  UNIT_SHEET_REQUIRED,
  type UnitSheetField,
} from './units-sheet-fields.js';

export * from './units-sheet-fields.js';

/** One row of a sheet: its number as the spreadsheet shows it (1-based; a CSV's line) and its cells as text. */
export type SheetRow = { row: number; cells: string[] };

/** Our field → the file's header that holds it ('' = leave the field empty). */
export type UnitSheetMapping = Partial<Record<UnitSheetField, string>>;

export type UnitBody = z.output<typeof unitBodySchema>;

/** A header name compared loosely: letter case, spaces, brackets and punctuation aside ("HV (kV)" = "hv_kv"). */
export function headerKey(name: string): string {
  return name.normalize('NFKC').toLowerCase().replace(/[^a-z0-9%]/g, '');
}

/** Header names accepted for each field besides the field's own name, best first (compared with headerKey). */
export const UNIT_SHEET_ALIASES: Record<UnitSheetField, readonly string[]> = {
  serial: ['serial', 'serial no', 'serial number', 'serial #', 'unit serial', 'transformer serial', 's/n', 'sn'],
  position: ['position', 'pos', 'local name', 'unit name', 'name', 'bay', 'tag'],
  site: ['site', 'site name', 'substation', 'station', 'location'],
  design: ['design', 'design reference', 'design ref', 'design family', 'family', 'reference', 'ref', 'model'],
  year: ['year', 'year of manufacture', 'manufacture year', 'year made', 'yom', 'built', 'manufactured'],
  phases: ['phases', 'no of phases', 'number of phases', 'phase'],
  hvKV: ['hv kv', 'hv', 'hv voltage', 'hv voltage kv', 'rated hv kv', 'hv rated kv', 'primary kv', 'primary voltage kv', 'primary voltage'],
  lvKV: ['lv kv', 'lv', 'lv voltage', 'lv voltage kv', 'rated lv kv', 'lv rated kv', 'secondary kv', 'secondary voltage kv', 'secondary voltage'],
  ratedKVA: ['rated kva', 'kva', 'rating kva', 'rating', 'rated power kva', 'rated power', 'power kva'],
  impedancePercent: ['impedance percent', 'impedance %', 'impedance', 'percent impedance', 'z %', 'z', 'uk %', 'uk'],
  systemImpedancePercent: ['system impedance percent', 'system impedance %', 'system impedance', 'source impedance %', 'source impedance', 'zs %', 'zs'],
  conductor: ['conductor', 'winding conductor', 'winding material', 'material'],
};

/** What a spreadsheet import looks for: its fields, their header aliases, the required ones and their words on screen. */
export interface SheetSpec<F extends string> {
  fields: readonly F[];
  aliases: Record<F, readonly string[]>;
  required: readonly F[];
  labels: Record<F, string>;
  /** The field without which a row is no header. */
  key: F;
}

/** Column index per field (-1: not in the file) and the header problems found. */
export interface SheetColumns<F extends string> {
  index: Record<F, number>;
  fields: Record<string, string>;
}
export type UnitColumns = SheetColumns<UnitSheetField>;

/**
 * The file's columns for a spec's fields: a field named in `mapping` takes that header (any letter case; '' leaves it
 * empty), the others the best matching header of their aliases. Header problems come back as `mapping.<field>` (a mapped
 * header that is not in the file) and `columns.<field>` (a required field without a column).
 */
export function matchColumns<F extends string>(spec: SheetSpec<F>, headers: readonly string[], mapping: Partial<Record<F, string>> = {}): SheetColumns<F> {
  const keys = headers.map(headerKey);
  const index = Object.fromEntries(spec.fields.map((f) => [f, -1])) as Record<F, number>;
  const fields: Record<string, string> = {};
  const taken = new Map<number, F>();
  for (const field of spec.fields) {
    const wanted = mapping[field];
    if (wanted === undefined) continue;
    if (wanted.trim() === '') continue; // left empty on purpose: no alias either
    const exact = headers.findIndex((h) => h.trim().toLowerCase() === wanted.trim().toLowerCase());
    const at = exact >= 0 ? exact : keys.indexOf(headerKey(wanted));
    if (at < 0) fields[`mapping.${field}`] = `no column '${wanted}' in the file`;
    else if (taken.has(at)) fields[`mapping.${field}`] = `column '${headers[at]}' is already used for ${taken.get(at)}`;
    else {
      index[field] = at;
      taken.set(at, field);
    }
  }
  for (const field of spec.fields) {
    if (mapping[field] !== undefined) continue;
    const aliasKeys = [...new Set([headerKey(field), ...spec.aliases[field].map(headerKey)])];
    for (const alias of aliasKeys) {
      const at = keys.findIndex((k, i) => k === alias && !taken.has(i));
      if (at >= 0) {
        index[field] = at;
        taken.set(at, field);
        break;
      }
    }
  }
  for (const field of spec.required) {
    if (index[field] < 0 && fields[`mapping.${field}`] === undefined) {
      fields[`columns.${field}`] = `no column for ${spec.labels[field].toLowerCase()}: name one in the mapping`;
    }
  }
  return { index, fields };
}

export const UNIT_SHEET_SPEC: SheetSpec<UnitSheetField> = {
  fields: UNIT_SHEET_FIELDS,
  aliases: UNIT_SHEET_ALIASES,
  required: UNIT_SHEET_REQUIRED,
  labels: UNIT_SHEET_FIELD_LABELS,
  key: 'serial',
};

/** The unit fields' columns (see matchColumns). */
export function matchUnitColumns(headers: readonly string[], mapping: UnitSheetMapping = {}): UnitColumns {
  return matchColumns(UNIT_SHEET_SPEC, headers, mapping);
}

const HEADER_SEARCH_ROWS = 10;

/** The sheet split at its header row, with the columns matched. */
export interface LocatedSheet<F extends string> {
  /** Row number of the header (0 when the sheet is empty). */
  headerRow: number;
  headers: string[];
  columns: SheetColumns<F>;
  /** The non-blank rows below the header. */
  dataRows: SheetRow[];
}
export type LocatedUnitSheet = LocatedSheet<UnitSheetField>;

const isBlank = (r: SheetRow) => r.cells.every((c) => c.trim() === '');

/**
 * Finds the header among the first non-blank rows: the row where most fields find a column (a title row or a row of
 * merged group headings above it is skipped; on a tie the lower row wins, as vertically merged headings repeat there).
 */
export function locateSheet<F extends string>(spec: SheetSpec<F>, rows: readonly SheetRow[], mapping: Partial<Record<F, string>> = {}): LocatedSheet<F> {
  const filled = rows.filter((r) => !isBlank(r));
  if (filled.length === 0) {
    return { headerRow: 0, headers: [], columns: { ...matchColumns(spec, [], mapping), fields: { file: 'the sheet is empty' } }, dataRows: [] };
  }
  let best = 0;
  let bestScore = -1;
  for (let i = 0; i < Math.min(HEADER_SEARCH_ROWS, filled.length); i += 1) {
    const { index } = matchColumns(spec, filled[i].cells, mapping);
    const found = spec.fields.filter((f) => index[f] >= 0).length;
    // Without the key column a row is no header, however many other names it matches.
    const score = index[spec.key] >= 0 ? found : 0;
    if (score > 0 && score >= bestScore) {
      best = i;
      bestScore = score;
    }
  }
  const headers = filled[best].cells.map((c) => c.trim());
  return { headerRow: filled[best].row, headers, columns: matchColumns(spec, headers, mapping), dataRows: filled.slice(best + 1) };
}

/** The unit sheet located (see locateSheet). */
export function locateUnitSheet(rows: readonly SheetRow[], mapping: UnitSheetMapping = {}): LocatedUnitSheet {
  return locateSheet(UNIT_SHEET_SPEC, rows, mapping);
}

/** A row's texts per field ('' where the field has no column). */
export function sheetRowCells<F extends string>(fields: readonly F[], row: SheetRow, columns: SheetColumns<F>): Record<F, string> {
  return Object.fromEntries(
    fields.map((f) => [f, columns.index[f] >= 0 ? fromFormulaSafe((row.cells[columns.index[f]] ?? '').trim()) : '']),
  ) as Record<F, string>;
}

export function rowCells(row: SheetRow, columns: UnitColumns): Record<UnitSheetField, string> {
  return sheetRowCells(UNIT_SHEET_FIELDS, row, columns);
}

/** The header names of the columns in use, per field (null: not in the file). */
export function sheetColumnHeaders<F extends string>(fields: readonly F[], sheet: LocatedSheet<F>): Record<F, string | null> {
  return Object.fromEntries(fields.map((f) => [f, sheet.columns.index[f] >= 0 ? (sheet.headers[sheet.columns.index[f]] ?? null) : null])) as Record<F, string | null>;
}

/**
 * A CSV text as sheet rows numbered by file line (separator ',', ';' or tab, judged from the first line), plus the
 * lines whose quoting is broken.
 */
export function csvSheetRows(text: string): { rows: SheetRow[]; fields: Record<string, string> } {
  const normalised = normaliseCsvText(text);
  const { records, quoteErrorLines } = csvRecords(normalised, detectDelimiter(normalised));
  const fields: Record<string, string> = {};
  for (const [line, message] of quoteErrorLines) fields[`row ${line}`] = message;
  return { rows: records.map((r) => ({ row: r.line, cells: r.cells })), fields };
}

/** Sites by name, designs by reference (keys trimmed and lower-case), and serials already in the fleet (lower-case). */
export interface UnitSheetRefs {
  sites: ReadonlyMap<string, number>;
  designs: ReadonlyMap<string, number>;
  takenSerials: ReadonlySet<string>;
}

/** The lookup key of a site name, design reference or serial (the database compares them without letter case). */
export const refKey = (s: string) => s.trim().toLowerCase();

const NUMBER_FIELDS = ['hvKV', 'lvKV', 'ratedKVA', 'impedancePercent', 'systemImpedancePercent'] as const;
const CONDUCTOR_WORDS: Record<string, 'Cu' | 'Al'> = { cu: 'Cu', copper: 'Cu', al: 'Al', aluminium: 'Al', aluminum: 'Al' };
const ISO_DATE = /^(\d{4})-\d{2}-\d{2}/;

/** One data row mapped: its texts per field, and its body when the row is good. */
export interface UnitSheetRow {
  row: number;
  cells: Record<UnitSheetField, string>;
  body: UnitBody | null;
}

export interface UnitSheetResult {
  rows: UnitSheetRow[];
  /** Every problem: header (`columns.*`, `mapping.*`, `file`) and rows (`row 7.hvKV`); empty when all rows are good. */
  fields: Record<string, string>;
}

const MAX_LISTED_ROWS = 200;

/** One row's texts → a unit body, or its errors by field. */
function readRow(cells: Record<UnitSheetField, string>, refs: UnitSheetRefs): { body: UnitBody } | { errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  const body: Record<string, unknown> = { serial: cells.serial, position: cells.position };
  if (cells.serial === '') errors.serial = 'required';
  for (const [field, lookup, what] of [
    ['site', refs.sites, 'no site named'],
    ['design', refs.designs, 'no design with reference'],
  ] as const) {
    if (cells[field] === '') errors[field] = 'required';
    else {
      const id = lookup.get(refKey(cells[field]));
      if (id === undefined) errors[field] = `${what} '${cells[field]}'`;
      else body[field === 'site' ? 'siteId' : 'designId'] = id;
    }
  }
  if (cells.year !== '') {
    const date = ISO_DATE.exec(cells.year);
    const n = date ? { ok: true as const, value: Number(date[1]) } : parseDecimal(cells.year);
    if (!n.ok) errors.year = n.message;
    else if (!Number.isInteger(n.value)) errors.year = 'a whole year, e.g. 2012';
    else body.year = n.value;
  }
  if (cells.phases !== '') {
    const n = parseDecimal(cells.phases);
    if (!n.ok) errors.phases = n.message;
    else if (n.value !== 1 && n.value !== 3) errors.phases = '1 or 3';
    else body.phases = n.value;
  }
  for (const field of NUMBER_FIELDS) {
    if (cells[field] === '') continue;
    const n = parseDecimal(cells[field]);
    if (!n.ok) errors[field] = n.message;
    else body[field] = n.value;
  }
  if (cells.conductor !== '') {
    const c = CONDUCTOR_WORDS[cells.conductor.toLowerCase()];
    if (c === undefined) errors.conductor = 'Cu or Al';
    else body.conductor = c;
  }
  const parsed = unitBodySchema.safeParse(body);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = String(issue.path[0] ?? '');
      const field = key === 'siteId' ? 'site' : key === 'designId' ? 'design' : key;
      errors[field] ??= issue.message;
    }
  }
  if (Object.keys(errors).length > 0 || !parsed.success) return { errors };
  return { body: parsed.data };
}

/**
 * The data rows of a located sheet → unit bodies, with every bad row listed (`row 7.hvKV: decimal comma: use a point
 * (3.14)`, unknown site or design, a serial repeated in the file or already in the fleet).
 */
export function readUnitRows(sheet: LocatedUnitSheet, refs: UnitSheetRefs): UnitSheetResult {
  const errors = collectRowErrors(MAX_LISTED_ROWS, { ...sheet.columns.fields });
  if (sheet.dataRows.length > UNIT_IMPORT_ROW_LIMIT) {
    errors.fields.file = `${sheet.dataRows.length} units: one import takes at most ${UNIT_IMPORT_ROW_LIMIT}; split the file`;
  }
  const headerBad = Object.keys(sheet.columns.fields).length > 0;
  const firstRowOf = new Map<string, number>();
  const rows: UnitSheetRow[] = [];
  for (const r of sheet.dataRows) {
    const cells = rowCells(r, sheet.columns);
    if (headerBad) {
      rows.push({ row: r.row, cells, body: null });
      continue;
    }
    const read = readRow(cells, refs);
    const rowErrors = 'errors' in read ? read.errors : {};
    if (cells.serial !== '') {
      const key = refKey(cells.serial);
      const first = firstRowOf.get(key);
      if (first !== undefined) rowErrors.serial ??= `repeats the serial of row ${first}`;
      else {
        firstRowOf.set(key, r.row);
        if (refs.takenSerials.has(key)) rowErrors.serial ??= 'a unit with this serial exists';
      }
    }
    if (Object.keys(rowErrors).length > 0) {
      errors.add(r.row, rowErrors);
      rows.push({ row: r.row, cells, body: null });
    } else rows.push({ row: r.row, cells, body: 'body' in read ? read.body : null });
  }
  if (!headerBad && sheet.dataRows.length === 0 && sheet.headerRow > 0) errors.fields.file = 'no units below the header row';
  return { rows, fields: errors.finish() };
}

/** The serials a located sheet names (for looking up the ones already taken). */
export function sheetSerials(sheet: LocatedUnitSheet): string[] {
  const at = sheet.columns.index.serial;
  if (at < 0) return [];
  return [...new Set(sheet.dataRows.map((r) => (r.cells[at] ?? '').trim()).filter((s) => s !== ''))];
}

/** The header names of the unit columns in use (null: not in the file). */
export function columnHeaders(sheet: LocatedUnitSheet): Record<UnitSheetField, string | null> {
  return sheetColumnHeaders(UNIT_SHEET_FIELDS, sheet);
}

// ---- Export -------------------------------------------------------------------------------------------------------

/** The fleet export's columns: the import's fields (so an export can be edited and imported), then the last event. */
export const FLEET_EXPORT_COLUMNS = [
  ...UNIT_SHEET_FIELDS,
  'siteTimeZone',
  'lastEventAtUtc',
  'lastEventLocal',
  'lastEventStatus',
  'lastRecommendation',
  'activeRestrictions',
] as const;

export type SheetCell = string | number | null;

/** The fleet table's units as export rows, in FLEET_EXPORT_COLUMNS order (times in UTC and on the site's clock). */
export function fleetExportRows(items: readonly UnitListItem[]): SheetCell[][] {
  return items.map((u) => [
    u.serial,
    u.position,
    u.siteName,
    u.designReference,
    u.year,
    u.phases,
    u.hvKV,
    u.lvKV,
    u.ratedKVA,
    u.impedancePercent,
    u.systemImpedancePercent,
    u.conductor,
    u.siteTimeZone,
    u.lastEventAt,
    u.lastEventAt ? formatInstant(u.lastEventAt, u.siteTimeZone, false) : null,
    u.lastEventStatus,
    u.lastRecommendation,
    u.activeRestrictions,
  ]);
}

/**
 * A text cell made safe for spreadsheets: one starting with = + - @ (or a tab or carriage return) would be read as a
 * formula, so it gets a leading apostrophe.
 */
export function formulaSafe(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/**
 * The text of an exported cell as it was before formulaSafe: an apostrophe followed by = + - @ (or a tab or carriage
 * return) is the export's escape and is dropped, so a re-imported export keeps its names; any other apostrophe stays.
 */
export function fromFormulaSafe(text: string): string {
  return /^'[=+\-@\t\r]/.test(text) ? text.slice(1) : text;
}

function csvCell(cell: SheetCell): string {
  if (cell === null) return '';
  if (typeof cell === 'number') return String(cell);
  const safe = formulaSafe(cell);
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** A sheet as CSV text: a BOM (spreadsheets then read it as UTF-8), comma-separated, CRLF line ends, text cells formula-safe. */
export function sheetToCsv(header: readonly string[], rows: readonly SheetCell[][]): string {
  const lines = [header.map(csvCell).join(','), ...rows.map((r) => r.map(csvCell).join(','))];
  return `\uFEFF${lines.join('\r\n')}\r\n`;
}
