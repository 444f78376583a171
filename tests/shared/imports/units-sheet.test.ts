// Fleet spreadsheet → unit bodies: header location and column mapping (aliases, a mapping given), row errors (decimal
// comma named, unknown site or design, repeated and taken serials), CSV rows, and the export's CSV (formula-safe).
import { describe, expect, it } from 'vitest';
import { DECIMAL_COMMA_MESSAGE } from '../../../shared/numbers.js';
import { detectSpreadsheet, zipEntries } from '../../../shared/imports/sniff.js';
import {
  columnHeaders,
  csvSheetRows,
  formulaSafe,
  fromFormulaSafe,
  headerKey,
  locateUnitSheet,
  matchUnitColumns,
  readUnitRows,
  sheetSerials,
  sheetToCsv,
  type SheetRow,
  type UnitSheetRefs,
} from '../../../shared/imports/units-sheet.js';

const refs: UnitSheetRefs = {
  sites: new Map([['harrow cross', 11]]),
  designs: new Map([['gt-40', 21]]),
  takenSerials: new Set(['old-1']),
};

const sheet = (...rows: string[][]): SheetRow[] => rows.map((cells, i) => ({ row: i + 1, cells }));

describe('matchUnitColumns', () => {
  it('matches headers by field name or alias, ignoring case, spaces and brackets', () => {
    const { index, fields } = matchUnitColumns(['Serial No', 'Substation', 'Design Ref', 'HV (kV)', 'lv_kv', 'Rating kVA', 'Z %', 'Notes']);
    expect(fields).toEqual({});
    expect(index).toMatchObject({ serial: 0, site: 1, design: 2, hvKV: 3, lvKV: 4, ratedKVA: 5, impedancePercent: 6, position: -1, year: -1 });
  });

  it('names each required field that has no column', () => {
    const { fields } = matchUnitColumns(['Serial', 'Notes']);
    expect(Object.keys(fields).sort()).toEqual(['columns.design', 'columns.site']);
  });

  it('takes a mapping before aliases, and names a mapped header that is not in the file', () => {
    const { index, fields } = matchUnitColumns(['Unit', 'Where', 'Family', 'HV'], { serial: 'unit', site: 'Where', design: 'Family', lvKV: 'LV kV' });
    expect(index).toMatchObject({ serial: 0, site: 1, design: 2, hvKV: 3, lvKV: -1 });
    expect(fields).toEqual({ 'mapping.lvKV': "no column 'LV kV' in the file" });
  });

  it("leaves a field mapped to '' empty even when an alias would match", () => {
    const { index } = matchUnitColumns(['Serial', 'Site', 'Design', 'HV'], { hvKV: '' });
    expect(index.hvKV).toBe(-1);
  });

  it('refuses one column for two fields', () => {
    const { fields } = matchUnitColumns(['Serial', 'Site', 'Design'], { serial: 'Serial', position: 'serial' });
    expect(fields['mapping.position']).toBe("column 'Serial' is already used for serial");
  });

  it('compares header names loosely', () => {
    expect(headerKey(' Impedance (%) ')).toBe('impedance%');
  });
});

describe('locateUnitSheet', () => {
  it('skips a title row and takes the lower of two header rows (vertically merged headings repeat there)', () => {
    const located = locateUnitSheet(
      sheet(
        ['Fleet register 2026', 'Fleet register 2026', 'Fleet register 2026', 'Fleet register 2026', 'Fleet register 2026'],
        ['Serial', 'Site', 'Design', 'Voltage (kV)', 'Voltage (kV)'],
        ['Serial', 'Site', 'Design', 'HV', 'LV'],
        ['A-1', 'Harrow Cross', 'GT-40', '132', '33'],
      ),
    );
    expect(located.headerRow).toBe(3);
    expect(columnHeaders(located)).toMatchObject({ serial: 'Serial', hvKV: 'HV', lvKV: 'LV', year: null });
    expect(located.dataRows.map((r) => r.row)).toEqual([4]);
    expect(sheetSerials(located)).toEqual(['A-1']);
  });

  it('says the sheet is empty', () => {
    expect(locateUnitSheet(sheet(['', ''])).columns.fields).toEqual({ file: 'the sheet is empty' });
  });
});

describe('readUnitRows', () => {
  const header = ['serial', 'position', 'site', 'design', 'year', 'hvKV', 'lvKV', 'conductor'];

  it('turns good rows into unit bodies (site and design by name, case aside; empty cells left to the design)', () => {
    const r = readUnitRows(locateUnitSheet(sheet(header, ['A-1', 'T1', 'HARROW CROSS', 'gt-40', '2012', '132', '', 'copper'])), refs);
    expect(r.fields).toEqual({});
    expect(r.rows[0].body).toEqual({ serial: 'A-1', position: 'T1', siteId: 11, designId: 21, year: 2012, hvKV: 132, conductor: 'Cu', systemImpedancePercent: 0 });
  });

  it('lists every bad row by row number and field, naming a decimal comma', () => {
    const r = readUnitRows(
      locateUnitSheet(
        sheet(
          header,
          ['A-1', 'T1', 'Harrow Cross', 'GT-40', '2012', '132,5', '33', 'Cu'],
          ['A-2', 'T2', 'Nowhere', 'GT-99', 'soon', '132', '-4', 'tin'],
          ['A-1', 'T3', 'Harrow Cross', 'GT-40', '', '', '', ''],
          ['OLD-1', 'T4', 'Harrow Cross', 'GT-40', '', '', '', ''],
          ['', 'T5', '', '', '', '', '', ''],
          ['A-6', 'T6', 'Harrow Cross', 'GT-40', '', '', '', ''],
        ),
      ),
      refs,
    );
    expect(r.fields).toEqual({
      'row 2.hvKV': DECIMAL_COMMA_MESSAGE,
      'row 3.site': "no site named 'Nowhere'",
      'row 3.design': "no design with reference 'GT-99'",
      'row 3.year': 'not a number',
      'row 3.lvKV': expect.stringMatching(/>0|positive|greater/i),
      'row 3.conductor': 'Cu or Al',
      'row 4.serial': 'repeats the serial of row 2',
      'row 5.serial': 'a unit with this serial exists',
      'row 6.serial': 'required',
      'row 6.site': 'required',
      'row 6.design': 'required',
    });
    expect(DECIMAL_COMMA_MESSAGE).toMatch(/decimal comma/);
    expect(r.rows.map((x) => x.body !== null)).toEqual([false, false, false, false, false, true]);
  });

  it('says phases must be 1 or 3 and a year whole', () => {
    const r = readUnitRows(locateUnitSheet(sheet(['serial', 'site', 'design', 'phases', 'year'], ['A-1', 'Harrow Cross', 'GT-40', '2', '2012.5'])), refs);
    expect(r.fields).toEqual({ 'row 2.phases': '1 or 3', 'row 2.year': 'a whole year, e.g. 2012' });
  });

  it('reads a date in the year column as its year', () => {
    const r = readUnitRows(locateUnitSheet(sheet(['serial', 'site', 'design', 'year'], ['A-1', 'Harrow Cross', 'GT-40', '2009-05-01'])), refs);
    expect(r.rows[0].body?.year).toBe(2009);
  });

  it('reports header problems without reading the rows', () => {
    const r = readUnitRows(locateUnitSheet(sheet(['serial', 'notes'], ['A-1', 'x'])), refs);
    expect(Object.keys(r.fields).sort()).toEqual(['columns.design', 'columns.site']);
    expect(r.rows[0].body).toBeNull();
  });

  it('says so when no unit follows the header', () => {
    expect(readUnitRows(locateUnitSheet(sheet(['serial', 'site', 'design'])), refs).fields).toEqual({ file: 'no units below the header row' });
  });
});

describe('csvSheetRows', () => {
  it('numbers rows by file line and reads semicolon files', () => {
    const { rows, fields } = csvSheetRows('\uFEFFserial;site;design;hvKV\r\n\r\nA-1;Harrow Cross;GT-40;132,5\r\n');
    expect(fields).toEqual({});
    expect(rows).toEqual([
      { row: 1, cells: ['serial', 'site', 'design', 'hvKV'] },
      { row: 3, cells: ['A-1', 'Harrow Cross', 'GT-40', '132,5'] },
    ]);
    expect(readUnitRows(locateUnitSheet(rows), refs).fields).toEqual({ 'row 3.hvKV': DECIMAL_COMMA_MESSAGE });
  });
});

describe('export CSV', () => {
  it('prefixes text cells that a spreadsheet would read as a formula', () => {
    expect(['=1+1', '+44', '-x', '@SUM(A1)', 'T1', '\tx'].map(formulaSafe)).toEqual(["'=1+1", "'+44", "'-x", "'@SUM(A1)", 'T1', "'\tx"]);
  });

  it('reads an escaped cell back as it was written, and leaves any other apostrophe alone', () => {
    for (const t of ['=1+1', '+44', '-x', '@SUM(A1)', 'T1', "'quoted'", "'T1"]) expect(fromFormulaSafe(formulaSafe(t))).toBe(t);
    expect(fromFormulaSafe("'T1")).toBe("'T1");
  });

  it('writes a BOM, quotes where needed, keeps numbers as numbers', () => {
    expect(sheetToCsv(['a', 'b', 'c'], [['=HYPERLINK("x")', -5, null], ['x,y', 1.5, 'ok']])).toBe(
      '\uFEFFa,b,c\r\n"\'=HYPERLINK(""x"")",-5,\r\n"x,y",1.5,ok\r\n',
    );
  });
});

describe('detectSpreadsheet', () => {
  // A minimal ZIP holding one empty stored entry, named as given (local header, central directory, end record).
  function zipWith(name: string, size = 0): Uint8Array {
    const n = new TextEncoder().encode(name);
    const local = new Uint8Array(30 + n.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    local.set(n, 30);
    lv.setUint16(26, n.length, true);
    const central = new Uint8Array(46 + n.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint32(24, size, true);
    cv.setUint16(28, n.length, true);
    central.set(n, 46);
    const end = new Uint8Array(22);
    const ev = new DataView(end.buffer);
    ev.setUint32(0, 0x06054b50, true);
    ev.setUint16(8, 1, true);
    ev.setUint16(10, 1, true);
    ev.setUint32(12, central.length, true);
    ev.setUint32(16, local.length, true);
    const out = new Uint8Array(local.length + central.length + end.length);
    out.set(local, 0);
    out.set(central, local.length);
    out.set(end, local.length + central.length);
    return out;
  }

  it('tells an .xlsx (a ZIP with xl/workbook.xml) from another ZIP, CSV text and an old .xls', () => {
    expect(zipEntries(zipWith('xl/workbook.xml'))?.names).toEqual(['xl/workbook.xml']);
    expect(detectSpreadsheet(zipWith('xl/workbook.xml'), 1000)).toEqual({ kind: 'xlsx' });
    expect(detectSpreadsheet(zipWith('word/document.xml'), 1000)).toEqual({ error: 'the file is a ZIP archive but not an Excel workbook (.xlsx)' });
    expect(detectSpreadsheet(new TextEncoder().encode('serial,site\nA,B\n'), 1000)).toEqual({ kind: 'csv' });
    expect(detectSpreadsheet(new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0]), 1000)).toMatchObject({ error: expect.stringContaining('.xls') });
  });

  it('refuses a workbook that unpacks beyond the limit', () => {
    expect(detectSpreadsheet(zipWith('xl/workbook.xml', 5000), 1000)).toMatchObject({ tooLarge: true });
  });
});
