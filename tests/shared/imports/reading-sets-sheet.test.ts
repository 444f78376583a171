// Reading-sets spreadsheet → one set per (serial, kind, takenAt): header by alias, grouping, row errors as the readings
// CSV names them (decimal comma named), unknown serials, repeated readings and differing set conditions.
import { describe, expect, it } from 'vitest';
import { DECIMAL_COMMA_MESSAGE } from '../../../shared/numbers.js';
import { locateReadingSetSheet, readingSheetSerials, readReadingSetRows } from '../../../shared/imports/reading-sets-sheet.js';
import { csvSheetRows, type SheetRow } from '../../../shared/imports/units-sheet.js';

const units = new Map([
  ['t-1', 11],
  ['t-2', 12],
]);
const sheet = (...rows: string[][]): SheetRow[] => rows.map((cells, i) => ({ row: i + 1, cells }));
const HEADER = ['Serial', 'Kind', 'Taken at', 'Quantity', 'Configuration', 'Phase', 'Value', 'Unit', 'Top oil', 'Reference'];

describe('readReadingSetRows', () => {
  it('groups rows into one set per serial, kind and takenAt, with the readings and set conditions', () => {
    const located = locateReadingSetSheet(
      sheet(
        ['Factory baselines'],
        HEADER,
        ['T-1', 'factory', '2011-03-14', 'capacitance', 'CH', '', '4520', 'pF', '25', 'yes'],
        ['T-1', 'Factory', '2011-03-14', 'capacitance', 'CHL', '', '5.21', 'nF', '', ''],
        ['T-1', 'routine', '2020-06-01', 'winding-resistance', '', 'A', '0.41', 'ohm', '', ''],
        ['t-2', 'commissioning', '2012-01-10', 'dissipation', 'CH', '', '0.3', '%', '', 'no'],
      ),
    );
    expect(located.headerRow).toBe(2);
    expect(readingSheetSerials(located)).toEqual(['T-1', 't-2']);
    const r = readReadingSetRows(located, units);
    expect(r.fields).toEqual({});
    expect(r.total).toBe(4);
    expect(r.sets.map((s) => [s.unitId, s.kind, s.takenAt, s.rows])).toEqual([
      [11, 'factory', '2011-03-14', [3, 4]],
      [11, 'routine', '2020-06-01', [5]],
      [12, 'commissioning', '2012-01-10', [6]],
    ]);
    expect(r.sets[0].body).toMatchObject({ kind: 'factory', capacitancePF: { CH: 4520, CHL: 5210 }, topOilC: 25, isReference: true });
    expect(r.sets[1].body).toMatchObject({ windingResistanceOhm: { A: 0.41 } });
    expect(r.sets[1].body?.isReference).toBeUndefined();
  });

  it('lists every bad row by field: decimal comma, unknown serial and kind, bad date, unit and yes/no', () => {
    const r = readReadingSetRows(
      locateReadingSetSheet(
        sheet(
          HEADER,
          ['T-1', 'factory', '2011-03-14', 'capacitance', 'CH', '', '4520,5', 'pF', '', ''],
          ['NOPE', 'factory', '2011-03-14', 'capacitance', 'CH', '', '4520', 'pF', '', ''],
          ['T-2', 'weekly', 'last week', 'capacitance', 'CH', '', '4520', 'kg', '', 'maybe'],
        ),
      ),
      units,
    );
    expect(r.fields).toEqual({
      'row 2.value': DECIMAL_COMMA_MESSAGE,
      'row 3.serial': "no unit with serial 'NOPE'",
      'row 4.kind': "one of factory, commissioning, routine (found 'weekly')",
      'row 4.takenAt': 'not an ISO 8601 date or date-time (e.g. 2024-05-01)',
      'row 4.unit': "capacitance is given in pF or nF (found 'kg')",
      'row 4.reference': 'yes or no',
    });
    expect(r.sets.every((s) => s.body === null)).toBe(true);
  });

  it('refuses a reading given twice in a set and a set condition that differs between its rows', () => {
    const r = readReadingSetRows(
      locateReadingSetSheet(
        sheet(
          HEADER,
          ['T-1', 'factory', '2011-03-14', 'capacitance', 'CH', '', '4520', 'pF', '25', ''],
          ['T-1', 'factory', '2011-03-14', 'capacitance', 'ch', '', '4521', 'pF', '30', ''],
        ),
      ),
      units,
    );
    expect(r.fields).toEqual({
      'row 3.configuration': 'capacitance CH is already given in row 2 for this set',
      'row 3.topOilC': 'differs from row 2 of the same set (25)',
    });
  });

  it('names a missing required column and reads nothing', () => {
    const r = readReadingSetRows(locateReadingSetSheet(sheet(['Serial', 'Quantity', 'Value'], ['T-1', 'capacitance', '1'])), units);
    expect(Object.keys(r.fields).sort()).toEqual(['columns.kind', 'columns.takenAt', 'columns.unit']);
    expect(r.sets).toEqual([]);
  });

  it('reads a semicolon CSV whose decimal comma is named, and a mapping for an unusual header', () => {
    const { rows } = csvSheetRows('Unit no;kind;date;quantity;configuration;phase;value;unit\nT-1;routine;2020-06-01;capacitance;CH;;4520,5;pF\n');
    const r = readReadingSetRows(locateReadingSetSheet(rows, { serial: 'Unit no' }), units);
    expect(r.fields).toEqual({ 'row 2.value': DECIMAL_COMMA_MESSAGE });
  });

  it('names a comma CSV row split by an unquoted decimal comma', () => {
    const { rows } = csvSheetRows('serial,kind,takenAt,quantity,configuration,phase,value,unit\nT-1,routine,2020-06-01,capacitance,CH,,4520,5,pF\n');
    const r = readReadingSetRows(locateReadingSetSheet(rows), units);
    expect(r.fields['row 2']).toBe('expected 8 columns, found 9 (a decimal comma? write 3.14, or quote the value)');
  });
});
