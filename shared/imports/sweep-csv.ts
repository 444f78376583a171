// Sweep files (POST /api/units/:id/sweeps, POST /api/sessions/:id/sweeps): frequency Hz, magnitude dB, optional phase deg.
//
// Row numbers in error keys are line numbers in the file: with a header the first point is "row 2", without one "row 1".
import { RANGES } from '../schemas/bounds.js';
import {
  DECIMAL_COMMA_MESSAGE,
  collectRowErrors,
  countNonBlankLines,
  csvRecords,
  detectDelimiter,
  normaliseCsvText,
  groupThousands,
  parseDecimalCell,
  rowCapProblem,
  separatorProblem,
} from './csv.js';

/** Fewer points than this cannot carry the three DL/T 911 bands (each needs several common points). */
export const SWEEP_MIN_POINTS = 10;
/** A guard on upload size: commercial FRA sets export a few hundred to a few thousand points. */
export const SWEEP_MAX_POINTS = 20_000;
/** Above this many bad rows the rest are counted, not listed: a wrong file of thousands of rows is one problem. */
const MAX_LISTED_BAD_ROWS = 100;

export type SweepColumn = 'frequencyHz' | 'magnitudeDb' | 'phaseDeg';
export type SweepCsvResult =
  | { ok: true; points: number[][]; minHz: number; maxHz: number }
  | { ok: false; fields: Record<string, string> };

const EXPECTED_HEADER = 'expected frequency (Hz), magnitude (dB) and optionally phase (deg), e.g. frequencyHz,magnitudeDb,phaseDeg';

/** A header name → the column it stands for, or why it cannot be used. */
function columnOf(name: string): SweepColumn | { error: string } {
  const n = name.trim().toLowerCase().replace(/[^a-z0-9]/g, '');
  if (/^(f|freq|frequency)?(khz|mhz)$/.test(n) || /^(freq|frequency)(in)?(khz|mhz)$/.test(n)) {
    return { error: `column '${name.trim()}' is not in Hz: give the frequency in Hz` };
  }
  if (/^(f|freq|frequency|hz|freqhz|frequencyhz|fhz|frequencyinhz)$/.test(n)) return 'frequencyHz';
  if (/^(phase|phasedeg|phasedegrees|deg|degrees|angle|angledeg|phaseindeg)$/.test(n)) return 'phaseDeg';
  if (/^(mag|magnitude|magdb|magnitudedb|db|gain|gaindb|amplitude|amplitudedb|response|responsedb|magnitudeindb)$/.test(n)) {
    return 'magnitudeDb';
  }
  return { error: `unknown column '${name.trim()}': ${EXPECTED_HEADER}` };
}

/** A record is a header when none of its cells is a number and one holds text ("100,abc" is a bad data row). */
function isHeaderRecord(cells: string[]): boolean {
  const readings = cells.map((c) => parseDecimalCell(c));
  const numeric = readings.some((r) => 'value' in r || r.error === DECIMAL_COMMA_MESSAGE || r.error === 'not a finite number');
  return !numeric && readings.some((r) => 'error' in r && r.error === 'not a number');
}

function readHeader(cells: string[]): { columns: SweepColumn[] } | { error: string } {
  const columns: SweepColumn[] = [];
  const problems: string[] = [];
  for (const cell of cells) {
    const c = columnOf(cell);
    if (typeof c === 'object') problems.push(c.error);
    else if (columns.includes(c)) problems.push(`two columns stand for ${c} ('${cell.trim()}')`);
    else columns.push(c);
  }
  if (problems.length === 0) {
    const missing = (['frequencyHz', 'magnitudeDb'] as const).filter((c) => !columns.includes(c));
    if (missing.length > 0) problems.push(`missing ${missing.join(' and ')}: ${EXPECTED_HEADER}`);
  }
  return problems.length > 0 ? { error: problems.join('; ') } : { columns };
}

/** Parse a sweep CSV into `[frequencyHz, magnitudeDb(, phaseDeg)]` points, strictly increasing in frequency. */
export function parseSweepCsv(text: string): SweepCsvResult {
  const normalised = normaliseCsvText(text);
  if (normalised.trim() === '') return { ok: false, fields: { file: 'the file is empty: expected frequencyHz,magnitudeDb[,phaseDeg] rows' } };
  const separator = separatorProblem(detectDelimiter(normalised));
  if (separator !== null) return { ok: false, fields: { file: separator } };

  // Far over the cap by a cheap count of lines (header or not): refused before it is parsed.
  const tooMany = rowCapProblem(countNonBlankLines(normalised) - 1, SWEEP_MAX_POINTS, 'points');
  if (tooMany !== null) return { ok: false, fields: { file: tooMany } };

  const { records, quoteErrorLines } = csvRecords(normalised, ',');
  if (records.length === 0) return { ok: false, fields: { file: 'the file has no values (only separators): expected frequencyHz,magnitudeDb[,phaseDeg] rows' } };
  let columns: SweepColumn[];
  let data = records;
  if (isHeaderRecord(records[0].cells)) {
    const header = readHeader(records[0].cells);
    if ('error' in header) return { ok: false, fields: { header: header.error } };
    columns = header.columns;
    data = records.slice(1);
  } else {
    // No header: frequency, magnitude[, phase] in that order, as many columns as the first row has (at most 3).
    columns = (['frequencyHz', 'magnitudeDb', 'phaseDeg'] as const).slice(0, Math.max(2, Math.min(3, records[0].cells.length)));
  }
  if (data.length === 0) return { ok: false, fields: { file: 'the file has a header but no points' } };
  if (data.length > SWEEP_MAX_POINTS) {
    return {
      ok: false,
      fields: { file: `at most ${groupThousands(SWEEP_MAX_POINTS)} points, found ${groupThousands(data.length)}` },
    };
  }

  const rowErrors = collectRowErrors(MAX_LISTED_BAD_ROWS);
  const addRowErrors = (line: number, errors: Record<string, string>) => rowErrors.add(line, errors);
  const points: number[][] = [];
  let previous: { frequencyHz: number; line: number } | null = null;

  for (const { line, cells } of data) {
    const quoteError = quoteErrorLines.get(line);
    if (quoteError !== undefined) {
      addRowErrors(line, { '': quoteError });
      continue;
    }
    if (cells.length !== columns.length) {
      // "1000,-42,1" where the file meant -42.1: one cell too many, each a whole number.
      const splitDecimal = cells.length > columns.length && cells.every((c) => /^\s*[+-]?\d+\s*$/.test(c));
      addRowErrors(line, { '': splitDecimal ? DECIMAL_COMMA_MESSAGE : `expected ${columns.length} columns, found ${cells.length}` });
      continue;
    }
    const errors: Record<string, string> = {};
    const point: Partial<Record<SweepColumn, number>> = {};
    columns.forEach((column, i) => {
      const r = parseDecimalCell(cells[i]);
      if ('error' in r) errors[column] = r.error;
      else point[column] = r.value;
    });
    // Each value within the range the case format takes (shared/schemas/bounds.ts): a sweep in kHz or a linear ratio
    // read as dB is refused here, not stored and refused later by the case.
    for (const column of columns) {
      const v = point[column];
      const range = RANGES[column];
      if (v === undefined || errors[column] !== undefined) continue;
      if (v > range.max || (column !== 'frequencyHz' && v < range.min)) {
        errors[column] = `${v} ${range.unit} is outside ${range.min} … ${range.max} ${range.unit}`;
      }
    }
    const f = point.frequencyHz;
    if (f !== undefined && errors.frequencyHz === undefined) {
      if (f <= 0) errors.frequencyHz = 'must be greater than 0';
      else if (previous !== null && f <= previous.frequencyHz) {
        errors.frequencyHz = `${f} Hz is not above ${previous.frequencyHz} Hz in row ${previous.line}: frequencies must increase from row to row (sort the file)`;
      }
    }
    if (Object.keys(errors).length > 0) {
      addRowErrors(line, errors);
      continue;
    }
    previous = { frequencyHz: f as number, line };
    points.push(columns.includes('phaseDeg') ? [f as number, point.magnitudeDb as number, point.phaseDeg as number] : [f as number, point.magnitudeDb as number]);
  }
  const fields = rowErrors.finish();
  if (Object.keys(fields).length > 0) return { ok: false, fields };
  if (points.length < SWEEP_MIN_POINTS) {
    return { ok: false, fields: { file: `at least ${SWEEP_MIN_POINTS} points are needed, found ${points.length}` } };
  }
  return { ok: true, points, minHz: points[0][0], maxHz: points[points.length - 1][0] };
}
