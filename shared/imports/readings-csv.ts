// Readings CSV (POST /api/sessions/:id/imports): parse, check every row, turn rows into a case-format reading set.
//
// Row numbers in error keys are line numbers in the file, counting the header line as row 1: the first data row
// directly under the header is "row 2", and a blank line still counts, so "row 7" is what a text editor shows as line 7.
import {
  DECIMAL_COMMA_MESSAGE,
  collectRowErrors,
  countNonBlankLines,
  csvRecords,
  detectDelimiter,
  isDecimalCommaNumber,
  normaliseCsvText,
  parseDecimalCell,
  quoteCell,
  readFixedHeader,
  rowCapProblem,
  separatorProblem,
} from './csv.js';

/** Column names of the canonical readings CSV, in the order written by `mapColumns`. */
export const READINGS_COLUMNS = ['quantity', 'configuration', 'phase', 'value', 'unit'] as const;
export type ReadingsColumn = (typeof READINGS_COLUMNS)[number];

export const READING_QUANTITIES = [
  'capacitance',
  'dissipation',
  'reactance',
  'excitation-current',
  'winding-resistance',
  'turns-ratio',
  // Rules revision 2 (api.md "Readings CSV quantities added with rules revision 2").
  'gas',
  'bushing-c1',
  'bushing-c1-dissipation',
  'bushing-c2',
  'bushing-c2-dissipation',
  'excitation-voltage',
  'winding-temperature',
] as const;
export type ReadingQuantity = (typeof READING_QUANTITIES)[number];

/** The dissolved gases of the case format, as `configuration` of a `gas` row (any letter case in the file). */
export const DISSOLVED_GASES = ['H2', 'CH4', 'C2H6', 'C2H4', 'C2H2', 'CO', 'CO2'] as const;

export type ReadingRow = {
  quantity: ReadingQuantity;
  /** Configuration (CH, CHL), gas (H2) or bushing terminal (H1); null for per-phase and whole-set quantities. */
  configuration: string | null;
  phase: string | null;
  value: number;
  unit: string;
};

export type ReadingsCsvResult = { ok: true; rows: ReadingRow[] } | { ok: false; fields: Record<string, string> };

/** One bushing terminal as imported (its C1 may already be in the session). */
export type ImportedBushing = { c1PF?: number; c1DissipationPercent?: number; c2PF?: number; c2DissipationPercent?: number };

/** Part of a `gapsight-case/1` reading set, as built from imported rows. */
export type ReadingSetPart = {
  capacitancePF?: Record<string, number>;
  dissipationPercent?: Record<string, number>;
  reactance?: Record<string, { percent: number }>;
  excitationCurrentMA?: Record<string, number>;
  excitationKV?: number;
  windingResistanceOhm?: Record<string, number>;
  windingTemperatureC?: number;
  turnsRatio?: Record<string, number>;
  dissolvedGasPPM?: Record<string, number>;
  bushings?: Record<string, ImportedBushing>;
};

type QuantitySpec = {
  /** What names the reading: a configuration, a phase, a gas, a bushing terminal, or nothing (one value per set). */
  keyedBy: 'configuration' | 'phase' | 'gas' | 'terminal' | 'set';
  /** Accepted unit spellings (lower case, or Ω as written) → canonical unit and the factor to it. */
  units: Record<string, { unit: string; factor: number }>;
  unitHint: string;
  /** Smallest allowed value and whether it is itself allowed. */
  min: { value: number; inclusive: boolean };
  /** Largest allowed value (inclusive), when the quantity has one (a temperature in °C). */
  max?: number;
  setKey: keyof ReadingSetPart;
  /** The reading of a bushing terminal this quantity is. */
  bushingKey?: keyof ImportedBushing;
};

const PF = { unit: 'pF', factor: 1 };
const NF = { unit: 'pF', factor: 1000 };
const PERCENT = { unit: '%', factor: 1 };
const OHM = { unit: 'ohm', factor: 1 };
const PPM = { unit: 'ppm', factor: 1 };
const KV = { unit: 'kV', factor: 1 };
const DEG_C = { unit: 'degC', factor: 1 };
const POSITIVE = { value: 0, inclusive: false };
const NON_NEGATIVE = { value: 0, inclusive: true };

const QUANTITIES: Record<ReadingQuantity, QuantitySpec> = {
  capacitance: {
    keyedBy: 'configuration',
    units: { pf: PF, nf: NF },
    unitHint: 'pF or nF',
    min: POSITIVE,
    setKey: 'capacitancePF',
  },
  dissipation: {
    keyedBy: 'configuration',
    units: { '%': PERCENT },
    unitHint: '%',
    min: NON_NEGATIVE,
    setKey: 'dissipationPercent',
  },
  reactance: { keyedBy: 'phase', units: { '%': PERCENT }, unitHint: '%', min: POSITIVE, setKey: 'reactance' },
  'excitation-current': {
    keyedBy: 'phase',
    units: { ma: { unit: 'mA', factor: 1 } },
    unitHint: 'mA',
    min: POSITIVE,
    setKey: 'excitationCurrentMA',
  },
  'winding-resistance': {
    keyedBy: 'phase',
    // Ω as GREEK CAPITAL LETTER OMEGA (U+03A9) and as OHM SIGN (U+2126): test sets write either.
    units: { ohm: OHM, ohms: OHM, '\u03a9': OHM, '\u2126': OHM },
    unitHint: 'ohm',
    min: POSITIVE,
    setKey: 'windingResistanceOhm',
  },
  'turns-ratio': {
    keyedBy: 'phase',
    units: { ratio: { unit: 'ratio', factor: 1 } },
    unitHint: 'ratio',
    min: POSITIVE,
    setKey: 'turnsRatio',
  },
  // Dissolved gases in ppm (µL/L, the same thing for gas in oil: IEC 60599 writes µL/L).
  gas: {
    keyedBy: 'gas',
    units: { ppm: PPM, 'µl/l': PPM, 'ul/l': PPM },
    unitHint: 'ppm',
    min: NON_NEGATIVE,
    setKey: 'dissolvedGasPPM',
  },
  'bushing-c1': { keyedBy: 'terminal', units: { pf: PF, nf: NF }, unitHint: 'pF or nF', min: POSITIVE, setKey: 'bushings', bushingKey: 'c1PF' },
  'bushing-c1-dissipation': { keyedBy: 'terminal', units: { '%': PERCENT }, unitHint: '%', min: NON_NEGATIVE, setKey: 'bushings', bushingKey: 'c1DissipationPercent' },
  'bushing-c2': { keyedBy: 'terminal', units: { pf: PF, nf: NF }, unitHint: 'pF or nF', min: POSITIVE, setKey: 'bushings', bushingKey: 'c2PF' },
  'bushing-c2-dissipation': { keyedBy: 'terminal', units: { '%': PERCENT }, unitHint: '%', min: NON_NEGATIVE, setKey: 'bushings', bushingKey: 'c2DissipationPercent' },
  'excitation-voltage': {
    keyedBy: 'set',
    units: { kv: KV, v: { unit: 'kV', factor: 0.001 } },
    unitHint: 'kV or V',
    min: POSITIVE,
    setKey: 'excitationKV',
  },
  // A measured winding temperature in °C; -60 … 250 °C catches a value written in kelvin or °F.
  'winding-temperature': {
    keyedBy: 'set',
    units: { degc: DEG_C, '°c': DEG_C, '\u2103': DEG_C },
    unitHint: 'degC',
    min: { value: -60, inclusive: true },
    max: 250,
    setKey: 'windingTemperatureC',
  },
};

const PHASES = ['A', 'B', 'C'];
const CONFIGURATION = /^[A-Za-z]{1,16}$/;
/** A bushing terminal label: letters and digits (`H1`, `X0`, `1U`), '.', '-' or '_' inside, at most 20 characters. */
const TERMINAL = /^[A-Za-z0-9](?:[A-Za-z0-9._-]{0,18}[A-Za-z0-9])?$/;
/** Above this many bad rows the rest are counted, not listed, so a wrong file cannot produce a huge answer. */
const MAX_LISTED_BAD_ROWS = 1000;
/**
 * Readings a file may hold. A unit's full set is a few hundred rows at most (capacitance and dissipation of each
 * configuration, four quantities a phase, seven gases, four readings a bushing terminal); 2 000 leaves room for any real
 * file and keeps the check of the largest to milliseconds (figures: `npm run bench`, README "Benchmarks").
 */
export const READINGS_MAX_ROWS = 2000;

// ---------------------------------------------------------------------------------------------------------------------
// Readings
// ---------------------------------------------------------------------------------------------------------------------

/** Header cells → column index per canonical name, or a message naming unknown, missing and repeated columns. */
function readHeader(cells: string[]): { index: Record<ReadingsColumn, number> } | { error: string } {
  return readFixedHeader(cells, READINGS_COLUMNS);
}

export type RowCheck = { row?: ReadingRow; errors: Record<string, string> };

/** One data record checked field by field; `cells` already has the header's column count. */
export function checkReading(cells: string[], index: Record<ReadingsColumn, number>): RowCheck {
  const errors: Record<string, string> = {};
  const cell = (c: ReadingsColumn) => cells[index[c]].trim();

  const quantityText = cell('quantity').toLowerCase();
  const quantity = (READING_QUANTITIES as readonly string[]).includes(quantityText)
    ? (quantityText as ReadingQuantity)
    : null;
  if (quantityText === '') errors.quantity = `required: one of ${READING_QUANTITIES.join(', ')}`;
  else if (quantity === null) errors.quantity = `unknown quantity '${cell('quantity')}': use one of ${READING_QUANTITIES.join(', ')}`;

  const number = parseDecimalCell(cell('value'));
  if ('error' in number) errors.value = number.error;

  if (quantity === null) return { errors };
  const spec = QUANTITIES[quantity];

  let configuration: string | null = null;
  let phase: string | null = null;
  const configurationText = cell('configuration');
  const phaseText = cell('phase');
  switch (spec.keyedBy) {
    case 'configuration':
      if (configurationText === '') errors.configuration = `required for ${quantity} (e.g. CH, CL, CHL)`;
      else if (!CONFIGURATION.test(configurationText)) errors.configuration = 'a configuration is a label of letters (e.g. CH, CHL)';
      else configuration = configurationText.toUpperCase();
      if (phaseText !== '') errors.phase = `leave empty for ${quantity}: it is given per configuration`;
      break;
    case 'gas': {
      const gas = DISSOLVED_GASES.find((g) => g === configurationText.toUpperCase());
      if (configurationText === '') errors.configuration = `required for gas: one of ${DISSOLVED_GASES.join(', ')}`;
      else if (gas === undefined) errors.configuration = `unknown gas '${configurationText}': use one of ${DISSOLVED_GASES.join(', ')}`;
      else configuration = gas;
      if (phaseText !== '') errors.phase = 'leave empty for gas: the gas goes in configuration';
      break;
    }
    case 'terminal':
      if (configurationText === '') errors.configuration = `required for ${quantity}: the bushing terminal (e.g. H1, X1, 1U)`;
      else if (!TERMINAL.test(configurationText)) errors.configuration = 'a bushing terminal is a label of letters and digits (e.g. H1, 1U), at most 20 characters';
      else configuration = configurationText.toUpperCase();
      if (phaseText !== '') errors.phase = `leave empty for ${quantity}: the bushing terminal goes in configuration`;
      break;
    case 'phase':
      if (phaseText === '') errors.phase = `required for ${quantity}: A, B or C`;
      else if (!PHASES.includes(phaseText.toUpperCase())) errors.phase = `must be A, B or C (found '${phaseText}')`;
      else phase = phaseText.toUpperCase();
      if (configurationText !== '') errors.configuration = `leave empty for ${quantity}: it is given per phase`;
      break;
    case 'set':
      if (configurationText !== '') errors.configuration = `leave empty for ${quantity}: it is one value for the whole set`;
      if (phaseText !== '') errors.phase = `leave empty for ${quantity}: it is one value for the whole set`;
      break;
  }

  const unitText = cell('unit');
  // Exact spelling first: 'Ω'.toLowerCase() is 'ω', which is no unit.
  const unit = spec.units[unitText] ?? spec.units[unitText.toLowerCase()];
  if (unitText === '') errors.unit = `required: ${spec.unitHint}`;
  else if (unit === undefined) errors.unit = `${quantity} is given in ${spec.unitHint} (found '${unitText}')`;

  if ('value' in number && unit !== undefined) {
    const { value: min, inclusive } = spec.min;
    if (inclusive ? number.value < min : number.value <= min) {
      errors.value = inclusive ? `must be ${min} or more` : `must be greater than ${min}`;
    } else if (spec.max !== undefined && number.value > spec.max) {
      errors.value = `must be ${spec.max} or less (${spec.unitHint}: check the unit)`;
    }
  }
  if (Object.keys(errors).length > 0 || !('value' in number) || unit === undefined) return { errors };
  // nF → pF: ×1000 (V → kV: ×0.001), rounded to 12 significant digits so 3.131 nF gives 3131 pF, not 3131.0000000000005.
  const value = unit.factor === 1 ? number.value : Number((number.value * unit.factor).toPrecision(12));
  return { row: { quantity, configuration, phase, value, unit: unit.unit }, errors };
}

/** When a row has one cell too many because its value was written with an unquoted decimal comma ("3131,5"). */
function splitByDecimalComma(cells: string[], columns: number, valueIndex: number): boolean {
  if (cells.length !== columns + 1) return false;
  return isDecimalCommaNumber(`${cells[valueIndex]},${cells[valueIndex + 1]}`);
}

export interface ReadingsCsvOptions {
  /**
   * Bushing terminals whose C1 capacitance is already known (the session's): a file may then give only their other
   * readings. Any other terminal needs its `bushing-c1` row in the file (the case format requires C1 with a bushing).
   */
  knownBushingTerminals?: Iterable<string>;
}

/** Parse a readings CSV: every reading checked, every bad row listed as "row N.field" (N = file line, header = 1). */
export function parseReadingsCsv(text: string, options: ReadingsCsvOptions = {}): ReadingsCsvResult {
  const normalised = normaliseCsvText(text);
  if (normalised.trim() === '') return { ok: false, fields: { file: 'the file is empty: expected a header quantity,configuration,phase,value,unit and one reading a row' } };

  // The row cap first, by a cheap count of lines: a file over it is refused before it is parsed.
  const tooMany = rowCapProblem(countNonBlankLines(normalised) - 1, READINGS_MAX_ROWS);
  if (tooMany !== null) return { ok: false, fields: { file: tooMany } };

  const delimiter = detectDelimiter(normalised);
  const fields: Record<string, string> = {};
  const separator = separatorProblem(delimiter);
  if (separator !== null) fields.file = separator;

  const { records, quoteErrorLines } = csvRecords(normalised, delimiter);
  const [headerRecord, ...dataRecords] = records;
  if (headerRecord === undefined) return { ok: false, fields: { file: 'the file has no values (only separators): expected a header quantity,configuration,phase,value,unit and one reading a row' } };
  const header = readHeader(headerRecord.cells);
  if ('error' in header) return { ok: false, fields: { ...fields, header: header.error } };
  if (dataRecords.length === 0) {
    return { ok: false, fields: { ...fields, file: fields.file ?? 'the file has a header but no readings' } };
  }

  const columns = headerRecord.cells.length;
  const rows: ReadingRow[] = [];
  const rowLines = new Map<ReadingRow, number>();
  const firstSeen = new Map<string, number>();
  const rowErrors = collectRowErrors(MAX_LISTED_BAD_ROWS, fields);
  const addRowErrors = (line: number, errors: Record<string, string>) => rowErrors.add(line, errors);

  for (const { line, cells } of dataRecords) {
    const quoteError = quoteErrorLines.get(line);
    if (quoteError !== undefined) {
      addRowErrors(line, { '': quoteError });
      continue;
    }
    if (cells.length !== columns) {
      if (splitByDecimalComma(cells, columns, header.index.value)) addRowErrors(line, { value: DECIMAL_COMMA_MESSAGE });
      else addRowErrors(line, { '': `expected ${columns} columns, found ${cells.length}` });
      continue;
    }
    const checked = checkReading(cells, header.index);
    if (checked.row === undefined) {
      addRowErrors(line, checked.errors);
      continue;
    }
    const row = checked.row;
    const label = row.configuration ?? row.phase ?? '';
    const key = `${row.quantity}|${label}`;
    const earlier = firstSeen.get(key);
    if (earlier !== undefined) {
      const field = row.configuration !== null ? 'configuration' : row.phase !== null ? 'phase' : 'quantity';
      addRowErrors(line, { [field]: `${row.quantity}${label ? ` ${label}` : ''} is already given in row ${earlier}` });
      continue;
    }
    firstSeen.set(key, line);
    rows.push(row);
    rowLines.set(row, line);
  }
  // A bushing's other readings need its C1 (in this file or already in the session).
  const known = new Set([...(options.knownBushingTerminals ?? [])].map((t) => t.toUpperCase()));
  const reported = new Set<string>();
  for (const row of rows) {
    const terminal = row.configuration ?? '';
    if (QUANTITIES[row.quantity].keyedBy !== 'terminal' || row.quantity === 'bushing-c1' || known.has(terminal) || reported.has(terminal)) continue;
    if (firstSeen.has(`bushing-c1|${terminal}`)) continue;
    reported.add(terminal);
    addRowErrors(rowLines.get(row)!, { configuration: `bushing ${terminal} has no bushing-c1 row: give its C1 capacitance too` });
  }
  rowErrors.finish();
  if (Object.keys(fields).length > 0) return { ok: false, fields };
  return { ok: true, rows };
}

/**
 * Checked rows → the matching part of a case-format reading set (reactance as `{ percent }`, bushings by terminal).
 * One pass, each section filled in place (no copy per row), so a file of many rows takes time in proportion to its rows.
 */
export function readingRowsToSet(rows: readonly ReadingRow[]): ReadingSetPart {
  const set: ReadingSetPart = {};
  const sections = set as Record<string, Record<string, unknown> | number | undefined>;
  for (const row of rows) {
    const spec = QUANTITIES[row.quantity];
    const label = (spec.keyedBy === 'phase' ? row.phase : row.configuration) ?? '';
    if (spec.setKey === 'excitationKV' || spec.setKey === 'windingTemperatureC') {
      set[spec.setKey] = row.value;
      continue;
    }
    const section = (sections[spec.setKey] ??= {}) as Record<string, unknown>;
    if (spec.setKey === 'reactance') section[label] = { percent: row.value };
    else if (spec.setKey === 'bushings') ((section[label] ??= {}) as ImportedBushing)[spec.bushingKey!] = row.value;
    else section[label] = row.value;
  }
  return set;
}

/** The header names of a CSV text (trimmed, in file order; separator detected), for the client's column-mapping step. */
export function csvHeaders(text: string): string[] {
  const normalised = normaliseCsvText(text);
  const { records } = csvRecords(normalised, detectDelimiter(normalised));
  return records.length === 0 ? [] : records[0].cells.map((c) => c.trim());
}

/**
 * Rewrite a CSV with another column layout into the canonical readings CSV.
 * `mapping` names, for each canonical column, the source column by its header ('' = leave that column empty).
 * Blank lines are kept so that row numbers in later errors still match the source file's lines; values are copied as
 * they are, whatever the source separator (a decimal comma stays one and is reported by `parseReadingsCsv`). Throws when a named source column is not in
 * the file: the mapping step offers only names from `csvHeaders`, so that is a programming error.
 */
export function mapColumns(text: string, mapping: Record<ReadingsColumn, string>): string {
  const normalised = normaliseCsvText(text);
  const { records } = csvRecords(normalised, detectDelimiter(normalised));
  if (records.length === 0) return `${READINGS_COLUMNS.join(',')}\n`;
  const sourceNames = records[0].cells.map((c) => c.trim().toLowerCase());
  const sourceIndex = READINGS_COLUMNS.map((column) => {
    const wanted = mapping[column].trim().toLowerCase();
    if (wanted === '') return -1;
    const at = sourceNames.indexOf(wanted);
    if (at < 0) throw new RangeError(`mapColumns: no column '${mapping[column]}' in the file (for ${column})`);
    return at;
  });

  // Each record goes back on the line it came from (blank lines and leading blank lines kept), so row numbers match.
  const out: string[] = [];
  let nextLine = 1;
  for (const [k, { line, cells }] of records.entries()) {
    while (nextLine < line) {
      out.push('');
      nextLine += 1;
    }
    const content = k === 0 ? READINGS_COLUMNS.join(',') : sourceIndex.map((i) => quoteCell(i < 0 ? '' : (cells[i] ?? ''))).join(',');
    out.push(content);
    nextLine += 1 + (content.match(/\n/g)?.length ?? 0);
  }
  return `${out.join('\n')}\n`;
}
