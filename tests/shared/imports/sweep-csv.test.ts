// Sweep file import: frequency Hz, magnitude dB, optional phase deg (api.md sweeps routes, case-format "Sweeps").
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseSweepCsv } from '../../../shared/imports/sweep-csv.js';

// api.md: a decimal comma gets its own message (its wording, as the app gives it).
const DECIMAL_COMMA_MESSAGE = 'decimal comma: use a point (3.14)';
// The app's limits for one sweep file (10 to 20 000 points; the upload limit of the sweep routes).
const SWEEP_MIN_POINTS = 10;
const SWEEP_MAX_POINTS = 20_000;

/** n log-spaced points from 100 Hz up, two or three columns. */
function pointLines(n: number, withPhase = false): string[] {
  return Array.from({ length: n }, (_, k) => {
    const f = Number((100 * 10 ** (k / 10)).toPrecision(6));
    return withPhase ? `${f},${(-40 - k / 10).toFixed(2)},${(-80 + k).toFixed(1)}` : `${f},${(-40 - k / 10).toFixed(2)}`;
  });
}
function fieldsOf(text: string): Record<string, string> {
  const r = parseSweepCsv(text);
  if (r.ok) throw new Error('expected the file to be rejected');
  return r.fields;
}
const examples = join(import.meta.dirname, '../../../examples/sweeps');

describe('parseSweepCsv — good files', () => {
  it('reads a file with the canonical header into [frequencyHz, magnitudeDb] points with its range', () => {
    const r = parseSweepCsv(['frequencyHz,magnitudeDb', ...pointLines(12)].join('\n'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.points).toHaveLength(12);
    expect(r.points[0]).toEqual([100, -40]);
    expect(r.minHz).toBe(100);
    expect(r.maxHz).toBe(1258.93); // the 12th point: 100·10^1.1 Hz to 6 significant digits
  });

  it('reads a file without a header as frequency, magnitude[, phase] in that order', () => {
    const r = parseSweepCsv(pointLines(10, true).join('\r\n'));
    expect(r.ok && r.points[0]).toEqual([100, -40, -80]);
  });

  it('accepts common header names in any order and returns points as [frequency, magnitude, phase]', () => {
    const lines = pointLines(10, true).map((l) => {
      const [f, m, p] = l.split(',');
      return `${p},${m},${f}`;
    });
    for (const header of ['Phase (deg),Magnitude (dB),Frequency (Hz)', 'phase,dB,Hz', 'deg,mag,freq', 'PHASE,magnitude,frequency']) {
      const r = parseSweepCsv([header, ...lines].join('\n'));
      expect(r.ok && r.points[0], header).toEqual([100, -40, -80]);
    }
  });

  it('strips a byte-order mark and skips blank lines', () => {
    expect(parseSweepCsv(`\uFEFFfreq,dB\n\n${pointLines(10).join('\n\n')}\n`).ok).toBe(true);
  });

  it(`accepts exactly ${SWEEP_MIN_POINTS} and exactly ${SWEEP_MAX_POINTS} points`, () => {
    expect(parseSweepCsv(pointLines(SWEEP_MIN_POINTS).join('\n')).ok).toBe(true);
    const many = Array.from({ length: SWEEP_MAX_POINTS }, (_, k) => `${k + 1},-40`);
    expect(parseSweepCsv(many.join('\n')).ok).toBe(true);
  });
});

describe('parseSweepCsv — whole-file problems', () => {
  it('rejects an empty file and a header-only file under "file"', () => {
    expect(Object.keys(fieldsOf(' \n'))).toEqual(['file']);
    expect(fieldsOf('frequencyHz,magnitudeDb\n')).toEqual({ file: 'the file has a header but no points' });
  });

  it(`rejects fewer than ${SWEEP_MIN_POINTS} points`, () => {
    expect(fieldsOf(pointLines(9).join('\n'))).toEqual({ file: 'at least 10 points are needed, found 9' });
  });

  it(`rejects more than ${SWEEP_MAX_POINTS} points`, () => {
    const many = Array.from({ length: SWEEP_MAX_POINTS + 1 }, (_, k) => `${k + 1},-40`);
    expect(fieldsOf(many.join('\n'))).toEqual({ file: 'at most 20 000 points, found 20 001' });
  });

  it('names an unknown header column', () => {
    expect(fieldsOf(['frequencyHz,magnitudeDb,remark', ...pointLines(10)].join('\n')).header).toMatch(/^unknown column 'remark'/);
  });

  it('asks for Hz when the frequency column is in kHz', () => {
    expect(fieldsOf(['Frequency (kHz),dB', ...pointLines(10)].join('\n')).header).toBe(
      "column 'Frequency (kHz)' is not in Hz: give the frequency in Hz",
    );
  });

  it('names a missing magnitude column and a column given twice', () => {
    expect(fieldsOf(['frequencyHz,phaseDeg', ...pointLines(10)].join('\n')).header).toMatch(/^missing magnitudeDb/);
    expect(fieldsOf(['freq,Hz', ...pointLines(10)].join('\n')).header).toBe("two columns stand for frequencyHz ('Hz')");
  });

  it("says when the file uses ';' between columns", () => {
    expect(fieldsOf(pointLines(10).map((l) => l.replace(',', ';').replace('.', ',')).join('\n'))).toEqual({
      file: "the file uses ';' between columns: save it as CSV with ',' between columns and a point as the decimal mark",
    });
  });
});

describe('parseSweepCsv — bad rows', () => {
  it('numbers rows by file line: with a header the first point is row 2, without one row 1', () => {
    const lines = pointLines(10);
    lines[0] = '100,abc';
    expect(fieldsOf(lines.join('\n'))).toEqual({ 'row 1.magnitudeDb': 'not a number' });
    expect(fieldsOf(['frequencyHz,magnitudeDb', ...lines].join('\n'))).toEqual({ 'row 2.magnitudeDb': 'not a number' });
  });

  it('rejects a frequency that does not increase, naming the earlier row (no silent sort)', () => {
    const lines = ['frequencyHz,magnitudeDb', ...pointLines(12)];
    lines[5] = `${lines[3].split(',')[0]},-41`;
    expect(fieldsOf(lines.join('\n'))).toEqual({
      'row 6.frequencyHz': `${Number(lines[3].split(',')[0])} Hz is not above ${Number(lines[4].split(',')[0])} Hz in row 5: frequencies must increase from row to row (sort the file)`,
    });
  });

  it('rejects a zero or negative frequency', () => {
    const lines = pointLines(10);
    lines[0] = '0,-40';
    expect(fieldsOf(lines.join('\n'))).toEqual({ 'row 1.frequencyHz': 'must be greater than 0' });
  });

  it('gives a decimal comma its own message, quoted or splitting the row', () => {
    const lines = ['frequencyHz,magnitudeDb', ...pointLines(10)];
    lines[2] = '125,"-42,1"';
    lines[4] = '200,-42,1';
    expect(fieldsOf(lines.join('\n'))).toEqual({ 'row 3.magnitudeDb': DECIMAL_COMMA_MESSAGE, 'row 5': DECIMAL_COMMA_MESSAGE });
  });

  it('lists every bad row at once, each field under "row N.<column>"', () => {
    const lines = ['frequencyHz,magnitudeDb,phaseDeg', ...pointLines(12, true)];
    lines[2] = 'x,-40,10';
    lines[4] = `${lines[4].split(',')[0]},NaN,10`;
    lines[6] = `${lines[6].split(',')[0]},-40,`;
    lines[8] = `${lines[8].split(',')[0]},-40`;
    expect(fieldsOf(lines.join('\n'))).toEqual({
      'row 3.frequencyHz': 'not a number',
      'row 5.magnitudeDb': 'not a number',
      'row 7.phaseDeg': 'required',
      'row 9': 'expected 3 columns, found 2',
    });
  });

  it('lists at most 100 bad rows and counts the rest', () => {
    const lines = Array.from({ length: 150 }, (_, k) => `${k + 1},bad`);
    const fields = fieldsOf(lines.join('\n'));
    expect(Object.keys(fields)).toHaveLength(101);
    expect(fields.more).toBe('50 more bad rows not listed');
  });
});

describe('example sweep files (examples/sweeps)', () => {
  it.each(['HV-A-open-baseline.csv', 'HV-A-open-post.csv'])('%s parses: ~200 points, 20 Hz to 2 MHz, with phase', (name) => {
    const r = parseSweepCsv(readFileSync(join(examples, name), 'utf8'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.points).toHaveLength(200);
    expect(r.points[0]).toHaveLength(3);
    expect(r.minHz).toBe(20);
    expect(r.maxHz).toBe(2_000_000);
  });

  it('the post-fault trace differs from the baseline only inside the low band [1 kHz, 100 kHz)', () => {
    // Band edges from the case format ("Sweeps": low [1 kHz, 100 kHz)).
    const read = (name: string) => {
      const r = parseSweepCsv(readFileSync(join(examples, name), 'utf8'));
      if (!r.ok) throw new Error(name);
      return r.points;
    };
    const baseline = read('HV-A-open-baseline.csv');
    const post = read('HV-A-open-post.csv');
    const differing = baseline.filter((p, k) => p[1] !== post[k][1]).map((p) => p[0]);
    expect(differing.length).toBeGreaterThan(0);
    expect(differing.every((f) => f >= 1000 && f < 100_000)).toBe(true);
  });
});

describe('parseSweepCsv — values outside the case format ranges', () => {
  // Ranges of shared/schemas/bounds.ts (common practice): frequency up to 1e8 Hz, magnitude −200 … 100 dB, phase ±3600°.
  it('refuses a magnitude above 100 dB, a phase beyond 3600° and a frequency above 1e8 Hz, naming the row and column', () => {
    const lines = pointLines(12, true);
    lines[3] = '1000,150,10';
    lines[5] = '2000,-40,5000';
    const fields = fieldsOf(['frequencyHz,magnitudeDb,phaseDeg', ...lines, '200000000,-40,1'].join('\n'));
    expect(fields['row 5.magnitudeDb']).toBe('150 dB is outside -200 … 100 dB');
    expect(fields['row 7.phaseDeg']).toBe('5000 ° is outside -3600 … 3600 °');
    expect(fields['row 14.frequencyHz']).toBe('200000000 Hz is outside 0 … 100000000 Hz');
  });
  it('takes the edges of the ranges', () => {
    const lines = pointLines(11, true);
    const r = parseSweepCsv(['frequencyHz,magnitudeDb,phaseDeg', ...lines, '100000000,-200,3600'].join('\n'));
    expect(r.ok).toBe(true);
  });
});
