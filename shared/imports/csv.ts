// Generic CSV reading used by the readings and sweep importers: text normalised, separator judged, records with their
// file line numbers, decimal cells, a fixed header, and bad rows collected as "row N.field" errors.
import Papa from 'papaparse';
import { DECIMAL_COMMA_MESSAGE, isDecimalCommaNumber, parseDecimal } from '../numbers.js';

export { DECIMAL_COMMA_MESSAGE, isDecimalCommaNumber };

export type CsvRecord = { line: number; cells: string[] };

/** BOM removed and every line ending turned into \n, so line numbers and papaparse agree. */
export function normaliseCsvText(text: string): string {
  const noBom = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  return noBom.replace(/\r\n?/g, '\n');
}

/**
 * The column separator of a file judged by its first non-blank line: ';' when the line has one and its commas (if any)
 * all sit between digits (decimal commas, as spreadsheets in many locales write them), else ',' when it has one, else a
 * tab when it has one, else ','.
 */
export function detectDelimiter(normalisedText: string): ',' | ';' | '\t' {
  const first = normalisedText.split('\n').find((l) => l.trim() !== '') ?? '';
  const commas = first.match(/,/g)?.length ?? 0;
  const decimalCommas = first.match(/\d,\d/g)?.length ?? 0;
  if (first.includes(';') && commas === decimalCommas) return ';';
  if (first.includes(',')) return ',';
  if (first.includes('\t')) return '\t';
  return ',';
}

/** A sentence for a file whose columns are not separated by commas (null when they are). */
export function separatorProblem(delimiter: ',' | ';' | '\t'): string | null {
  if (delimiter === ';') {
    return "the file uses ';' between columns: save it as CSV with ',' between columns and a point as the decimal mark";
  }
  if (delimiter === '\t') return "the file uses tabs between columns: save it as CSV with ',' between columns";
  return null;
}

/**
 * The non-blank lines of a normalised CSV text, counted in one cheap scan (no parsing). A record never spans fewer lines
 * than one, so this is an upper bound on the records: a file within a row cap by this count is within it by records too.
 */
export function countNonBlankLines(normalisedText: string): number {
  let count = 0;
  let start = 0;
  while (start <= normalisedText.length) {
    let end = normalisedText.indexOf('\n', start);
    if (end < 0) end = normalisedText.length;
    for (let i = start; i < end; i += 1) {
      const c = normalisedText.charCodeAt(i);
      // Anything but a space or a tab makes the line count (a line of separators counts too: still an upper bound).
      if (c !== 32 && c !== 9) {
        count += 1;
        break;
      }
    }
    start = end + 1;
  }
  return count;
}

/** "file: at most N rows; this file has M" — the message of a file over its row cap (null within it). */
export function rowCapProblem(dataLines: number, maxRows: number, what = 'rows'): string | null {
  if (dataLines <= maxRows) return null;
  return `at most ${groupThousands(maxRows)} ${what} a file; this file has ${groupThousands(dataLines)}: split it into smaller files`;
}

/** 12 345 → "12 345" (a thin grouping as the other messages write it). */
export function groupThousands(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/** Every non-blank record of a normalised CSV text with the file line it starts on (1-based), plus quoting errors by line. */
export function csvRecords(
  normalisedText: string,
  delimiter: string,
): { records: CsvRecord[]; quoteErrorLines: Map<number, string> } {
  const parsed = Papa.parse<string[]>(normalisedText, { delimiter, newline: '\n', header: false, skipEmptyLines: false });
  const records: CsvRecord[] = [];
  const startLines: number[] = [];
  let line = 1;
  for (const cells of parsed.data) {
    startLines.push(line);
    if (cells.some((c) => c.trim() !== '')) records.push({ line, cells });
    // A quoted cell may hold line breaks: the next record starts that many lines further down.
    line += 1 + cells.reduce((n, c) => n + (c.match(/\n/g)?.length ?? 0), 0);
  }
  const quoteErrorLines = new Map<number, string>();
  for (const e of parsed.errors) {
    if (e.type !== 'Quotes' || e.row === undefined) continue;
    const at = startLines[e.row] ?? line;
    quoteErrorLines.set(
      at,
      e.code === 'MissingQuotes' ? 'a quoted value is not closed' : 'a quote mark sits inside a value (write it as "")',
    );
  }
  return { records, quoteErrorLines };
}

/** A cell read as a plain decimal number: the number, or why not (the shared decimal parser's messages). */
export function parseDecimalCell(cell: string): { value: number } | { error: string } {
  const r = parseDecimal(cell);
  return r.ok ? { value: r.value } : { error: r.message };
}

/** A cell written back to CSV, quoted when it holds a comma, a quote or a line break. */
export function quoteCell(cell: string): string {
  return /[",\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}

/** "'a', 'b'". */
export function listNames(names: readonly string[]): string {
  return names.map((n) => `'${n}'`).join(', ');
}

/**
 * Header cells (any letter case, any order) → column index per expected name, or a message naming unknown, missing
 * and repeated columns.
 */
export function readFixedHeader<C extends string>(
  cells: string[],
  columns: readonly C[],
): { index: Record<C, number> } | { error: string } {
  const names = cells.map((c) => c.trim().toLowerCase());
  const unknown = names.filter((n) => !(columns as readonly string[]).includes(n));
  const missing = columns.filter((c) => !names.includes(c));
  const repeated = columns.filter((c) => names.filter((n) => n === c).length > 1);
  const problems: string[] = [];
  if (unknown.length > 0) problems.push(`unknown column${unknown.length > 1 ? 's' : ''} ${listNames(unknown.map((u) => u || '(empty)'))}`);
  if (missing.length > 0) problems.push(`missing column${missing.length > 1 ? 's' : ''} ${listNames(missing)}`);
  if (repeated.length > 0) problems.push(`repeated column${repeated.length > 1 ? 's' : ''} ${listNames(repeated)}`);
  if (problems.length > 0) return { error: `${problems.join('; ')}: the header must be ${columns.join(',')}` };
  const index = Object.fromEntries(columns.map((c) => [c, names.indexOf(c)])) as Record<C, number>;
  return { index };
}

export interface RowErrors {
  /** The error fields so far ("row 7.value", "row 9" for a whole row, plus any file-level fields written into it). */
  readonly fields: Record<string, string>;
  /** Record one bad row's errors; field '' stands for the whole row. */
  add(line: number, errors: Record<string, string>): void;
  /** Adds the "more" count when rows were left unlisted; returns `fields`. */
  finish(): Record<string, string>;
}

/** Collects bad rows as "row N.field" errors, listing at most `maxListed` rows and counting the rest. */
export function collectRowErrors(maxListed: number, fields: Record<string, string> = {}): RowErrors {
  let badRows = 0;
  return {
    fields,
    add(line, errors) {
      badRows += 1;
      if (badRows > maxListed) return;
      for (const [field, message] of Object.entries(errors)) fields[field === '' ? `row ${line}` : `row ${line}.${field}`] = message;
    },
    finish() {
      if (badRows > maxListed) fields.more = `${badRows - maxListed} more bad rows not listed`;
      return fields;
    },
  };
}
