// Readings CSV, quantities added with rules revision 2 (api.md "Readings CSV quantities added with rules revision 2"):
// gas, bushing-c1/-c2 and their dissipation, excitation-voltage, winding-temperature.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DISSOLVED_GASES, parseReadingsCsv, READING_QUANTITIES, readingRowsToSet, type ReadingRow } from '../../../shared/imports/readings-csv.js';
import { readingSetToRows, rowsToReadingSet } from '../../../shared/readings/rows.js';
import { readingSetSchema } from '../../../shared/schemas/case.js';

const HEADER = 'quantity,configuration,phase,value,unit';
const csv = (...lines: string[]) => [HEADER, ...lines].join('\n');
const examples = join(import.meta.dirname, '../../../examples/imports');

function rowsOf(text: string, knownBushingTerminals?: string[]): ReadingRow[] {
  const r = parseReadingsCsv(text, { knownBushingTerminals });
  if (!r.ok) throw new Error(`expected ok, got ${JSON.stringify(r.fields)}`);
  return r.rows;
}
function fieldsOf(text: string, knownBushingTerminals?: string[]): Record<string, string> {
  const r = parseReadingsCsv(text, { knownBushingTerminals });
  if (r.ok) throw new Error('expected the file to be rejected');
  return r.fields;
}

describe('the quantity list', () => {
  it('has the api.md names, old and new', () => {
    expect(READING_QUANTITIES).toEqual([
      'capacitance',
      'dissipation',
      'reactance',
      'excitation-current',
      'winding-resistance',
      'turns-ratio',
      'gas',
      'bushing-c1',
      'bushing-c1-dissipation',
      'bushing-c2',
      'bushing-c2-dissipation',
      'excitation-voltage',
      'winding-temperature',
    ]);
  });
});

describe('gas', () => {
  it('reads one gas a row in ppm, the gas in configuration (any letter case), into dissolvedGasPPM', () => {
    const rows = rowsOf(csv('gas,H2,,41.3,ppm', 'gas,c2h2,,0,ppm', 'gas,Co2,,2985,PPM', 'gas,CO,,391,µL/L'));
    expect(rows.map((r) => [r.configuration, r.value, r.unit])).toEqual([
      ['H2', 41.3, 'ppm'],
      ['C2H2', 0, 'ppm'],
      ['CO2', 2985, 'ppm'],
      ['CO', 391, 'ppm'],
    ]);
    expect(readingRowsToSet(rows)).toEqual({ dissolvedGasPPM: { H2: 41.3, C2H2: 0, CO2: 2985, CO: 391 } });
  });

  it('accepts every gas of the case format', () => {
    // api.md, "Readings CSV quantities added with rules revision 2": H2, CH4, C2H6, C2H4, C2H2, CO, CO2
    const gases = ['H2', 'CH4', 'C2H6', 'C2H4', 'C2H2', 'CO', 'CO2'];
    expect(rowsOf(csv(...gases.map((g) => `gas,${g},,1,ppm`))).map((r) => r.configuration)).toEqual(gases);
    expect([...DISSOLVED_GASES].sort()).toEqual([...gases].sort());
  });

  it('names an unknown or missing gas, a phase given, a wrong unit and a negative value', () => {
    expect(fieldsOf(csv('gas,N2,,1000,ppm'))).toEqual({ 'row 2.configuration': "unknown gas 'N2': use one of H2, CH4, C2H6, C2H4, C2H2, CO, CO2" });
    expect(fieldsOf(csv('gas,,,1,ppm'))).toEqual({ 'row 2.configuration': 'required for gas: one of H2, CH4, C2H6, C2H4, C2H2, CO, CO2' });
    expect(fieldsOf(csv('gas,H2,A,1,ppm'))).toEqual({ 'row 2.phase': 'leave empty for gas: the gas goes in configuration' });
    expect(fieldsOf(csv('gas,H2,,1,%'))).toEqual({ 'row 2.unit': "gas is given in ppm (found '%')" });
    expect(fieldsOf(csv('gas,H2,,-1,ppm'))).toEqual({ 'row 2.value': 'must be 0 or more' });
  });

  it('rejects the same gas twice, naming the earlier row', () => {
    expect(fieldsOf(csv('gas,H2,,41,ppm', 'gas,h2,,42,ppm'))).toEqual({ 'row 3.configuration': 'gas H2 is already given in row 2' });
  });
});

describe('bushings', () => {
  it('reads C1 and C2 (pF or nF) and their dissipation (%) per terminal into bushings', () => {
    const rows = rowsOf(csv('bushing-c1,H1,,412.5,pF', 'bushing-c1-dissipation,H1,,0.31,%', 'bushing-c2,H1,,3.88,nF', 'bushing-c2-dissipation,H1,,0.42,%', 'bushing-c1,1u,,398,pF'));
    expect(readingRowsToSet(rows)).toEqual({
      bushings: { H1: { c1PF: 412.5, c1DissipationPercent: 0.31, c2PF: 3880, c2DissipationPercent: 0.42 }, '1U': { c1PF: 398 } },
    });
  });

  it('names a missing or bad terminal, a phase given, a wrong unit and bad values', () => {
    expect(fieldsOf(csv('bushing-c1,,,412,pF'))).toEqual({ 'row 2.configuration': 'required for bushing-c1: the bushing terminal (e.g. H1, X1, 1U)' });
    expect(fieldsOf(csv('bushing-c1,H 1,,412,pF'))['row 2.configuration']).toMatch(/^a bushing terminal is a label of letters and digits/);
    expect(fieldsOf(csv('bushing-c1,H123456789012345678901,,412,pF'))['row 2.configuration']).toMatch(/at most 20 characters/);
    expect(fieldsOf(csv('bushing-c1,H1,A,412,pF'))).toEqual({ 'row 2.phase': 'leave empty for bushing-c1: the bushing terminal goes in configuration' });
    expect(fieldsOf(csv('bushing-c1,H1,,412,uF'))).toEqual({ 'row 2.unit': "bushing-c1 is given in pF or nF (found 'uF')" });
    expect(fieldsOf(csv('bushing-c1,H1,,0,pF'))).toEqual({ 'row 2.value': 'must be greater than 0' });
    expect(fieldsOf(csv('bushing-c1,H1,,412,pF', 'bushing-c1-dissipation,H1,,-0.1,%'))).toEqual({ 'row 3.value': 'must be 0 or more' });
    expect(fieldsOf(csv('bushing-c1,H1,,412,pF', 'bushing-c2-dissipation,H1,,0.4,pF'))).toEqual({ 'row 3.unit': "bushing-c2-dissipation is given in % (found 'pF')" });
  });

  it('rejects the same reading of a terminal twice', () => {
    expect(fieldsOf(csv('bushing-c1,H1,,412,pF', 'bushing-c1,h1,,413,pF'))).toEqual({ 'row 3.configuration': 'bushing-c1 H1 is already given in row 2' });
  });

  it("asks for a terminal's C1 with its other readings, unless the session already has it", () => {
    const text = csv('bushing-c1-dissipation,H2,,0.3,%', 'bushing-c2,H2,,3700,pF', 'bushing-c1,H3,,411,pF', 'bushing-c2,H3,,3650,pF');
    expect(fieldsOf(text)).toEqual({ 'row 2.configuration': 'bushing H2 has no bushing-c1 row: give its C1 capacitance too' });
    expect(rowsOf(text, ['h2'])).toHaveLength(4);
  });
});

describe('excitation-voltage and winding-temperature', () => {
  it('read one value for the set: excitationKV (kV, or V → kV) and windingTemperatureC (degC)', () => {
    expect(readingRowsToSet(rowsOf(csv('excitation-voltage,,,10,kV', 'winding-temperature,,,18.5,degC')))).toEqual({ excitationKV: 10, windingTemperatureC: 18.5 });
    expect(readingRowsToSet(rowsOf(csv('excitation-voltage,,,10000,V')))).toEqual({ excitationKV: 10 });
    expect(readingRowsToSet(rowsOf(csv('winding-temperature,,,-5,°C')))).toEqual({ windingTemperatureC: -5 });
  });

  it('want configuration and phase empty, their own unit, and a plausible value', () => {
    expect(fieldsOf(csv('excitation-voltage,,A,10,kV'))).toEqual({ 'row 2.phase': 'leave empty for excitation-voltage: it is one value for the whole set' });
    expect(fieldsOf(csv('winding-temperature,CH,,20,degC'))).toEqual({ 'row 2.configuration': 'leave empty for winding-temperature: it is one value for the whole set' });
    expect(fieldsOf(csv('excitation-voltage,,,10,mA'))).toEqual({ 'row 2.unit': "excitation-voltage is given in kV or V (found 'mA')" });
    expect(fieldsOf(csv('winding-temperature,,,20,K'))).toEqual({ 'row 2.unit': "winding-temperature is given in degC (found 'K')" });
    expect(fieldsOf(csv('excitation-voltage,,,0,kV'))).toEqual({ 'row 2.value': 'must be greater than 0' });
    // 293 written for 20 °C (kelvin): caught.
    expect(fieldsOf(csv('winding-temperature,,,293,degC'))).toEqual({ 'row 2.value': 'must be 250 or less (degC: check the unit)' });
    expect(fieldsOf(csv('winding-temperature,,,-61,degC'))).toEqual({ 'row 2.value': 'must be -60 or more' });
  });

  it('rejects a second value for the set, naming the earlier row', () => {
    expect(fieldsOf(csv('winding-temperature,,,18,degC', 'winding-temperature,,,19,degC'))).toEqual({ 'row 3.quantity': 'winding-temperature is already given in row 2' });
  });
});

describe('examples/imports/post-fault-readings-revision-2.csv', () => {
  it('parses to a valid case-format reading set that survives storage as rows', () => {
    const rows = rowsOf(readFileSync(join(examples, 'post-fault-readings-revision-2.csv'), 'utf8'));
    expect(rows).toHaveLength(26);
    const { windingTemperatureC, ...values } = readingRowsToSet(rows);
    expect(windingTemperatureC).toBe(18.5);
    expect(values.excitationKV).toBe(10);
    expect(values.dissolvedGasPPM).toEqual({ H2: 41.3, CH4: 17.2, C2H6: 10.9, C2H4: 6.8, C2H2: 0.4, CO: 391, CO2: 2985 });
    expect(values.bushings?.H1).toEqual({ c1PF: 412.5, c1DissipationPercent: 0.31, c2PF: 3880, c2DissipationPercent: 0.42 });
    expect(Object.keys(values.bushings ?? {})).toEqual(['H1', 'H2', 'H3']);
    expect(readingSetSchema.safeParse({ ...values, windingTemperatureC }).success).toBe(true);
    // Stored as reading rows (the winding temperature is a set column) and read back unchanged.
    expect(rowsToReadingSet(readingSetToRows(values as never))).toEqual(values);
  });
});
