// Criteria sets compared leaf by leaf. Inputs are small hand-built sets; every expected row is hand computed.
import { describe, expect, it } from 'vitest';
import { criteriaLeaves, criteriaPath, criteriaPathLabel, diffCriteria } from '../../shared/screening/criteria-diff.js';
import { criteriaV1, criteriaV2 } from '../../shared/screening/criteria-sets.js';

const base = {
  version: 1,
  name: 'A',
  capacitance: {
    shiftBands: [
      { from: 2, level: 'watch' },
      { from: 3, level: 'investigate' },
    ],
    consistencyLimitPercent: 1,
    shiftSource: 'utility practice',
  },
  powerFactor: { temperatureFactors: [[20, 1], [30, 0.8]] },
};

describe('diffCriteria', () => {
  it('finds nothing between a set and itself', () => {
    expect(diffCriteria(base, structuredClone(base))).toEqual([]);
    expect(diffCriteria(criteriaV2, structuredClone(criteriaV2))).toEqual([]);
  });

  it('names each changed leaf by its path and in words (hand computed)', () => {
    const b = structuredClone(base);
    b.version = 2;
    b.capacitance.shiftBands[1].from = 4;
    b.powerFactor.temperatureFactors[1][1] = 0.79;
    expect(diffCriteria(base, b)).toEqual([
      { path: 'version', label: 'Version', from: 1, to: 2, kind: 'changed' },
      { path: 'capacitance.shiftBands[1].from', label: 'Winding capacitance › shift bands › band 2 › starts at', from: 3, to: 4, kind: 'changed' },
      { path: 'powerFactor.temperatureFactors[1][1]', label: 'Power factor › temperature factors › row 2 › factor', from: 0.8, to: 0.79, kind: 'changed' },
    ]);
  });

  it('says a band was added or removed (arrays element by element)', () => {
    const b = structuredClone(base);
    b.capacitance.shiftBands.push({ from: 5, level: 'critical' });
    expect(diffCriteria(base, b)).toEqual([
      { path: 'capacitance.shiftBands[2]', label: 'Winding capacitance › shift bands › band 3 (added)', from: null, to: { from: 5, level: 'critical' }, kind: 'added' },
    ]);
    expect(diffCriteria(b, base)).toEqual([
      { path: 'capacitance.shiftBands[2]', label: 'Winding capacitance › shift bands › band 3 (removed)', from: { from: 5, level: 'critical' }, to: null, kind: 'removed' },
    ]);
  });

  it('reports a block only one set has (version 2 adds the bushing block to version 1)', () => {
    const rows = diffCriteria(criteriaV1, criteriaV2);
    expect(rows.find((r) => r.path === 'bushing')?.kind).toBe('added');
    expect(rows.find((r) => r.path === 'version')).toMatchObject({ from: 1, to: 2 });
  });

  it('changes a text leaf (a source) as any other', () => {
    const b = structuredClone(base);
    b.capacitance.shiftSource = 'site practice';
    expect(diffCriteria(base, b)).toEqual([{ path: 'capacitance.shiftSource', label: 'Winding capacitance › shift source', from: 'utility practice', to: 'site practice', kind: 'changed' }]);
  });
});

describe('leaves and their words', () => {
  it('lists every leaf in order with its section (hand counted: 2 + 4 + 2 + 4 leaves)', () => {
    const leaves = criteriaLeaves(base);
    expect(leaves.map((l) => l.path)).toEqual([
      'version',
      'name',
      'capacitance.shiftBands[0].from',
      'capacitance.shiftBands[0].level',
      'capacitance.shiftBands[1].from',
      'capacitance.shiftBands[1].level',
      'capacitance.consistencyLimitPercent',
      'capacitance.shiftSource',
      'powerFactor.temperatureFactors[0][0]',
      'powerFactor.temperatureFactors[0][1]',
      'powerFactor.temperatureFactors[1][0]',
      'powerFactor.temperatureFactors[1][1]',
    ]);
    expect(leaves[6]).toMatchObject({ section: 'capacitance', label: 'Winding capacitance › consistency limit (%)', value: 1 });
  });

  it('writes paths and units in words', () => {
    expect(criteriaPath(['thresholds', 'capacitance', 'shiftBands', 1, 'from'])).toBe('thresholds.capacitance.shiftBands[1].from');
    expect(criteriaPathLabel(['gas', 'acetylenePresentPPM'])).toBe('Dissolved gas › acetylene present (ppm)');
    expect(criteriaPathLabel(['excitation', 'outerSplitMA'])).toBe('Excitation current › outer split (mA)');
    expect(criteriaPathLabel(['resistance', 'referenceTemperatureC'])).toBe('Winding resistance › reference temperature (°C)');
    expect(criteriaPathLabel(['sweep', 'bandsHz', 'low', 0])).toBe('Frequency response (SFRA) › frequency bands (Hz) › low › from');
  });

  it('leaves no camelCase key unspelt in the labels of the built-in sets', () => {
    for (const l of criteriaLeaves(criteriaV2)) expect(l.label, l.path).not.toMatch(/\b[a-z]+[A-Z][a-z]+/);
  });
});
