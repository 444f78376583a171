// Readings CSV import: the contract of api.md ("Readings CSV") — header, one reading a row, every bad row listed.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  csvHeaders,
  mapColumns,
  parseReadingsCsv,
  readingRowsToSet,
  type ReadingRow,
} from '../../../shared/imports/readings-csv.js';

const HEADER = 'quantity,configuration,phase,value,unit';
// api.md: a decimal comma gets its own message (its wording, as the app gives it).
const DECIMAL_COMMA_MESSAGE = 'decimal comma: use a point (3.14)';
const csv = (...lines: string[]) => [HEADER, ...lines].join('\n');
const examples = join(import.meta.dirname, '../../../examples/imports');

function rowsOf(text: string): ReadingRow[] {
  const r = parseReadingsCsv(text);
  if (!r.ok) throw new Error(`expected ok, got ${JSON.stringify(r.fields)}`);
  return r.rows;
}
function fieldsOf(text: string): Record<string, string> {
  const r = parseReadingsCsv(text);
  if (r.ok) throw new Error('expected the file to be rejected');
  return r.fields;
}

describe('parseReadingsCsv — good files', () => {
  it('reads one reading a row with configuration or phase, value and unit', () => {
    const rows = rowsOf(csv('capacitance,CH,,3131,pF', 'reactance,,A,11.64,%'));
    expect(rows).toEqual([
      { quantity: 'capacitance', configuration: 'CH', phase: null, value: 3131, unit: 'pF' },
      { quantity: 'reactance', configuration: null, phase: 'A', value: 11.64, unit: '%' },
    ]);
  });

  it('converts nF to pF (×1000) without floating-point noise', () => {
    // 1 nF = 1000 pF (SI prefixes)
    expect(rowsOf(csv('capacitance,CL,,3.131,nF'))[0]).toMatchObject({ value: 3131, unit: 'pF' });
    expect(rowsOf(csv('capacitance,CL,,9.99,nF'))[0].value).toBe(9990);
  });

  it('accepts header names in any case, with spaces, in any column order', () => {
    const rows = rowsOf([' Value ,UNIT,Quantity,Phase,configuration', '11.6,%,reactance,b,'].join('\n'));
    expect(rows).toEqual([{ quantity: 'reactance', configuration: null, phase: 'B', value: 11.6, unit: '%' }]);
  });

  it('strips a byte-order mark, accepts CRLF line ends and skips blank lines', () => {
    const text = `\uFEFF${HEADER}\r\ncapacitance,CH,,3131,pF\r\n\r\n   \r\n,,,,\r\ndissipation,CH,,0.3,%\r\n`;
    expect(rowsOf(text).map((r) => r.quantity)).toEqual(['capacitance', 'dissipation']);
  });

  it('upper-cases phases and configurations', () => {
    const rows = rowsOf(csv('capacitance,chl,,5405,pF', 'turns-ratio,,c,4.002,ratio'));
    expect(rows.map((r) => r.configuration ?? r.phase)).toEqual(['CHL', 'C']);
  });

  it('accepts ohm, Ω (Greek omega) and Ω (ohm sign) for winding resistance, all stored as ohm', () => {
    const rows = rowsOf(csv('winding-resistance,,A,0.84,ohm', 'winding-resistance,,B,0.84,\u03a9', 'winding-resistance,,C,0.84,\u2126'));
    expect(rows.map((r) => r.unit)).toEqual(['ohm', 'ohm', 'ohm']);
  });

  it('allows a dissipation factor of exactly 0 and exponent notation', () => {
    expect(rowsOf(csv('dissipation,CH,,0,%'))[0].value).toBe(0);
    expect(rowsOf(csv('capacitance,CH,,3.131e3,pF'))[0].value).toBe(3131);
  });

  it('accepts free configuration labels of letters (CT, CHT, CLT for three-winding units)', () => {
    expect(rowsOf(csv('capacitance,CT,,2100,pF', 'capacitance,CHT,,1200,pF', 'capacitance,CLT,,3400,pF'))).toHaveLength(3);
  });
});

describe('parseReadingsCsv — whole-file problems', () => {
  it('rejects an empty file under "file"', () => {
    expect(Object.keys(fieldsOf(''))).toEqual(['file']);
    expect(fieldsOf('\uFEFF \r\n\r\n').file).toMatch(/empty/);
  });

  it('rejects a header-only file under "file"', () => {
    expect(fieldsOf(`${HEADER}\n\n`)).toEqual({ file: 'the file has a header but no readings' });
  });

  it('names extra columns in the header', () => {
    expect(fieldsOf([`${HEADER},tester,remark`, 'capacitance,CH,,3131,pF,JM,ok'].join('\n')).header).toMatch(
      /^unknown columns 'tester', 'remark': the header must be quantity,configuration,phase,value,unit$/,
    );
  });

  it('names missing and repeated columns in the header', () => {
    expect(fieldsOf('quantity,configuration,phase,value\ncapacitance,CH,,3131').header).toMatch(/missing column 'unit'/);
    expect(fieldsOf('quantity,configuration,phase,value,value,unit\nx').header).toMatch(/repeated column 'value'/);
  });

  it("says when the file uses ';' between columns, and lists its decimal commas row by row", () => {
    const text = ['quantity;configuration;phase;value;unit', 'capacitance;CH;;3131;pF', 'dissipation;CH;;0,30;%', 'reactance;;A;11,64;%'].join('\n');
    expect(fieldsOf(text)).toEqual({
      file: "the file uses ';' between columns: save it as CSV with ',' between columns and a point as the decimal mark",
      'row 3.value': DECIMAL_COMMA_MESSAGE,
      'row 4.value': DECIMAL_COMMA_MESSAGE,
    });
  });

  it('says when the file is tab-separated', () => {
    expect(fieldsOf(['quantity\tconfiguration\tphase\tvalue\tunit', 'capacitance\tCH\t\t3131\tpF'].join('\n')).file).toMatch(/tabs/);
  });
});

describe('parseReadingsCsv — bad rows', () => {
  it('numbers rows by file line with the header as row 1 (first data row is row 2; blank lines count)', () => {
    expect(fieldsOf(csv('reactance,,A,abc,%'))).toEqual({ 'row 2.value': 'not a number' });
    expect(fieldsOf(csv('capacitance,CH,,3131,pF', '', 'reactance,,A,abc,%'))).toEqual({ 'row 4.value': 'not a number' });
  });

  it('lists every bad row at once (three bad rows → three rows named)', () => {
    const fields = fieldsOf(csv('capacitance,CH,,x,pF', 'capacitance,CL,,9990,pF', 'capacitance,CHL,,-5,pF', 'reactance,,D,11.6,%'));
    expect(fields).toEqual({
      'row 2.value': 'not a number',
      'row 4.value': 'must be greater than 0',
      'row 5.phase': "must be A, B or C (found 'D')",
    });
  });

  it('gives a quoted decimal comma its own message', () => {
    expect(fieldsOf(csv('capacitance,CH,,"3,14",pF'))).toEqual({ 'row 2.value': 'decimal comma: use a point (3.14)' });
    expect(fieldsOf(csv('capacitance,CH,,"3.131,5",pF'))['row 2.value']).toBe(DECIMAL_COMMA_MESSAGE);
  });

  it('gives an unquoted decimal comma (one column too many) the decimal-comma message', () => {
    expect(fieldsOf(csv('capacitance,CH,,3131,5,pF'))).toEqual({ 'row 2.value': DECIMAL_COMMA_MESSAGE });
  });

  it('reports a row with the wrong number of columns under "row N"', () => {
    expect(fieldsOf(csv('capacitance,CH,3131,pF'))).toEqual({ 'row 2': 'expected 5 columns, found 4' });
  });

  it('reports an unclosed quote under "row N"', () => {
    expect(fieldsOf(csv('capacitance,CH,,3131,pF', 'capacitance,"CL,,9990,pF'))).toEqual({ 'row 3': 'a quoted value is not closed' });
  });

  it('rejects an unknown or missing quantity', () => {
    expect(fieldsOf(csv('inductance,,A,1,mH'))['row 2.quantity']).toBe(
      "unknown quantity 'inductance': use one of capacitance, dissipation, reactance, excitation-current, winding-resistance, turns-ratio, gas, bushing-c1, bushing-c1-dissipation, bushing-c2, bushing-c2-dissipation, excitation-voltage, winding-temperature",
    );
    expect(fieldsOf(csv(',CH,,3131,pF'))['row 2.quantity']).toMatch(/^required/);
  });

  it('requires a configuration for capacitance and dissipation, and a phase empty', () => {
    expect(fieldsOf(csv('capacitance,,,3131,pF'))).toEqual({ 'row 2.configuration': 'required for capacitance (e.g. CH, CL, CHL)' });
    expect(fieldsOf(csv('dissipation,CH,A,0.3,%'))).toEqual({ 'row 2.phase': 'leave empty for dissipation: it is given per configuration' });
    expect(fieldsOf(csv('capacitance,C-H,,3131,pF'))['row 2.configuration']).toBe('a configuration is a label of letters (e.g. CH, CHL)');
  });

  it('requires a phase A/B/C for the per-phase quantities, and a configuration empty', () => {
    expect(fieldsOf(csv('excitation-current,,,28.4,mA'))).toEqual({ 'row 2.phase': 'required for excitation-current: A, B or C' });
    expect(fieldsOf(csv('turns-ratio,CH,A,4.0,ratio'))).toEqual({ 'row 2.configuration': 'leave empty for turns-ratio: it is given per phase' });
  });

  it('requires the unit of each quantity', () => {
    expect(fieldsOf(csv('capacitance,CH,,3131,uF'))).toEqual({ 'row 2.unit': "capacitance is given in pF or nF (found 'uF')" });
    expect(fieldsOf(csv('excitation-current,,A,28.4,A'))['row 2.unit']).toBe("excitation-current is given in mA (found 'A')");
    expect(fieldsOf(csv('turns-ratio,,A,4.0,'))['row 2.unit']).toBe('required: ratio');
    expect(fieldsOf(csv('winding-resistance,,A,0.84,mohm'))['row 2.unit']).toMatch(/given in ohm/);
  });

  it('checks value ranges: dissipation ≥ 0, every other quantity > 0', () => {
    expect(fieldsOf(csv('dissipation,CH,,-0.1,%'))).toEqual({ 'row 2.value': 'must be 0 or more' });
    for (const line of ['capacitance,CH,,0,pF', 'reactance,,A,0,%', 'excitation-current,,A,0,mA', 'winding-resistance,,A,0,ohm', 'turns-ratio,,A,0,ratio']) {
      expect(fieldsOf(csv(line))).toEqual({ 'row 2.value': 'must be greater than 0' });
    }
  });

  it('rejects an empty value, words, hexadecimal and infinite numbers', () => {
    expect(fieldsOf(csv('reactance,,A,,%'))).toEqual({ 'row 2.value': 'required' });
    expect(fieldsOf(csv('reactance,,A,0x10,%'))['row 2.value']).toBe('not a number');
    expect(fieldsOf(csv('reactance,,A,Infinity,%'))['row 2.value']).toBe('not a number');
    expect(fieldsOf(csv('reactance,,A,1e999,%'))['row 2.value']).toBe('not a finite number');
  });

  it('rejects a repeated (quantity, configuration) on the later row, naming the earlier one', () => {
    expect(fieldsOf(csv('capacitance,CH,,3131,pF', 'dissipation,CH,,0.3,%', 'capacitance,ch,,3.2,nF'))).toEqual({
      'row 4.configuration': 'capacitance CH is already given in row 2',
    });
  });

  it('rejects a repeated (quantity, phase) on the later row, naming the earlier one', () => {
    expect(fieldsOf(csv('reactance,,A,11.6,%', 'reactance,,B,11.6,%', 'reactance,,a,11.7,%'))).toEqual({
      'row 4.phase': 'reactance A is already given in row 2',
    });
  });
});

describe('readingRowsToSet', () => {
  it('builds the case-format reading set fields, reactance as { percent }', () => {
    const rows = rowsOf(
      csv(
        'capacitance,CH,,3131,pF',
        'dissipation,CH,,0.3,%',
        'reactance,,A,11.64,%',
        'excitation-current,,A,28.4,mA',
        'winding-resistance,,A,0.8412,ohm',
        'turns-ratio,,A,4.002,ratio',
      ),
    );
    expect(readingRowsToSet(rows)).toEqual({
      capacitancePF: { CH: 3131 },
      dissipationPercent: { CH: 0.3 },
      reactance: { A: { percent: 11.64 } },
      excitationCurrentMA: { A: 28.4 },
      windingResistanceOhm: { A: 0.8412 },
      turnsRatio: { A: 4.002 },
    });
  });

  it('leaves out the quantities that have no rows', () => {
    expect(readingRowsToSet([])).toEqual({});
  });
});

describe('csvHeaders and mapColumns (client column-mapping step)', () => {
  const testSetExport = ['Test;Item;Ph;Reading;Units;Operator', 'capacitance;CH;;3131;pF;JM', '', 'reactance;;a;11,6;%;JM'].join('\n');

  it('lists the header names of any CSV, trimmed, separator detected', () => {
    expect(csvHeaders(' Test , Item,Ph\n1,2,3')).toEqual(['Test', 'Item', 'Ph']);
    expect(csvHeaders(testSetExport)).toEqual(['Test', 'Item', 'Ph', 'Reading', 'Units', 'Operator']);
    expect(csvHeaders('')).toEqual([]);
  });

  it('rewrites a file with other column names onto the canonical header, dropping unmapped columns', () => {
    const out = mapColumns('Value,Kind,Cfg,U,Note\n3131,capacitance,CH,pF,ok\n', {
      quantity: 'kind',
      configuration: 'Cfg',
      phase: '',
      value: 'Value',
      unit: 'U',
    });
    expect(out).toBe(`${HEADER}\ncapacitance,CH,,3131,pF\n`);
    expect(rowsOf(out)).toHaveLength(1);
  });

  it('keeps row numbers and decimal commas, so the parser reports them against the source file', () => {
    const out = mapColumns(testSetExport, { quantity: 'Test', configuration: 'Item', phase: 'Ph', value: 'Reading', unit: 'Units' });
    expect(out).toBe(`${HEADER}\ncapacitance,CH,,3131,pF\n\nreactance,,a,"11,6",%\n`);
    expect(fieldsOf(out)).toEqual({ 'row 4.value': DECIMAL_COMMA_MESSAGE });
  });

  it('throws when a mapped source column is not in the file', () => {
    expect(() => mapColumns('a,b\n1,2', { quantity: 'a', configuration: 'b', phase: '', value: 'nope', unit: '' })).toThrow(/'nope'/);
  });
});

describe('example files (examples/imports)', () => {
  it('post-fault-readings.csv parses to the KVP-HX-T2 post-fault set', () => {
    const rows = rowsOf(readFileSync(join(examples, 'post-fault-readings.csv'), 'utf8'));
    expect(rows).toHaveLength(18);
    const set = readingRowsToSet(rows);
    expect(set.capacitancePF).toEqual({ CH: 3131, CL: 9990, CHL: 5405 });
    expect(set.reactance?.A).toEqual({ percent: 11.64 });
    expect(Object.keys(set).sort()).toEqual(
      ['capacitancePF', 'dissipationPercent', 'excitationCurrentMA', 'reactance', 'turnsRatio', 'windingResistanceOhm'],
    );
  });

  it('readings-bad-rows.csv is rejected with exactly its three bad rows', () => {
    expect(fieldsOf(readFileSync(join(examples, 'readings-bad-rows.csv'), 'utf8'))).toEqual({
      'row 3.value': DECIMAL_COMMA_MESSAGE,
      'row 7.value': 'not a number',
      'row 8.configuration': 'leave empty for reactance: it is given per phase',
    });
  });
});
