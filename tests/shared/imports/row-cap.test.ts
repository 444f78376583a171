// Row caps checked before parsing (a cheap line count, an upper bound on records), files of separators only, and the
// one-pass building of a reading set from many rows. Counts are hand-computed from the texts shown.
import { describe, expect, it } from 'vitest';
import { countNonBlankLines, csvRecords, rowCapProblem } from '../../../shared/imports/csv.js';
import { parseReadingsCsv, readingRowsToSet, READINGS_MAX_ROWS } from '../../../shared/imports/readings-csv.js';
import { parseSweepCsv, SWEEP_MAX_POINTS } from '../../../shared/imports/sweep-csv.js';

const HEADER = 'quantity,configuration,phase,value,unit';
/** C, then letters: row i's configuration (CA, CB, …, CZ, CBA, …), so every reading is a distinct one. */
const label = (i: number) => {
  let s = '';
  let n = i;
  do {
    s = String.fromCharCode(65 + (n % 26)) + s;
    n = Math.floor(n / 26);
  } while (n > 0);
  return `C${s}`;
};
const readings = (n: number) => `${HEADER}\n${Array.from({ length: n }, (_, i) => `capacitance,${label(i)},,${1000 + i},pF`).join('\n')}\n`;

describe('countNonBlankLines', () => {
  it('counts lines holding anything but spaces and tabs; a line of separators counts (an upper bound on records)', () => {
    // Lines: "a,b" · "" · "  " · ",," · "\t" · "1,2" → 3 count ("a,b", ",,", "1,2").
    expect(countNonBlankLines('a,b\n\n  \n,,\n\t\n1,2')).toBe(3);
    expect(countNonBlankLines('')).toBe(0);
  });

  it('is never below the records papaparse finds, even with a quoted line break', () => {
    const text = 'a,b\n"x\ny",2\n3,4\n';
    expect(csvRecords(text, ',').records).toHaveLength(3);
    expect(countNonBlankLines(text)).toBe(4);
  });
});

describe('rowCapProblem', () => {
  it('null within the cap; over it, the cap and the count with thousands spaced', () => {
    expect(rowCapProblem(5000, 5000)).toBeNull();
    expect(rowCapProblem(70_001, 5000)).toBe('at most 5 000 rows a file; this file has 70 001: split it into smaller files');
  });
});

describe('row caps of the parsers', () => {
  it(`readings: ${READINGS_MAX_ROWS} rows are read, one more is refused naming file, the cap and the count`, () => {
    const atCap = parseReadingsCsv(readings(READINGS_MAX_ROWS));
    expect(atCap.ok && atCap.rows.length).toBe(READINGS_MAX_ROWS);
    expect(parseReadingsCsv(readings(READINGS_MAX_ROWS + 1))).toEqual({
      ok: false,
      fields: { file: 'at most 2 000 rows a file; this file has 2 001: split it into smaller files' },
    });
  });

  it(`sweeps: more than ${SWEEP_MAX_POINTS} points refused naming file`, () => {
    const lines = Array.from({ length: SWEEP_MAX_POINTS + 5 }, (_, i) => `${10 + i},-40`);
    const r = parseSweepCsv(`frequencyHz,magnitudeDb\n${lines.join('\n')}\n`);
    expect(r).toEqual({ ok: false, fields: { file: 'at most 20 000 points a file; this file has 20 005: split it into smaller files' } });
  });
});

describe('files of separators only', () => {
  it('readings and sweeps answer a file-level problem instead of failing', () => {
    expect(parseReadingsCsv(',,,,\n,,,\n')).toEqual({ ok: false, fields: { file: expect.stringMatching(/no values \(only separators\)/) } });
    expect(parseSweepCsv(',,\n,,\n')).toEqual({ ok: false, fields: { file: expect.stringMatching(/no values \(only separators\)/) } });
  });
});

describe('readingRowsToSet on many rows', () => {
  it('keeps every reading of a file at the cap, each under its own configuration, in file order', () => {
    const parsed = parseReadingsCsv(readings(READINGS_MAX_ROWS));
    if (!parsed.ok) throw new Error('expected a good file');
    const set = readingRowsToSet(parsed.rows);
    const keys = Object.keys(set.capacitancePF ?? {});
    expect(keys).toHaveLength(READINGS_MAX_ROWS);
    expect([keys[0], keys[25], keys[26]]).toEqual(['CA', 'CZ', 'CBA']);
    expect(set.capacitancePF!.CBA).toBe(1026);
  });

  it('builds bushings and reactance by key (the readings of a terminal together)', () => {
    const csv = `${HEADER}\nbushing-c1,H1,,400,pF\nreactance,,A,11.6,%\nbushing-c1-dissipation,H1,,0.3,%\nbushing-c1,H2,,410,pF\n`;
    const parsed = parseReadingsCsv(csv);
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.fields));
    expect(readingRowsToSet(parsed.rows)).toEqual({
      bushings: { H1: { c1PF: 400, c1DissipationPercent: 0.3 }, H2: { c1PF: 410 } },
      reactance: { A: { percent: 11.6 } },
    });
  });
});
