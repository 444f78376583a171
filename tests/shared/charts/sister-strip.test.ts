// The family strip plot: points, groups, median line and the band in value terms, computed by hand below.
import { describe, expect, it } from 'vitest';
import { sisterStrip, type StripInput } from '../../../shared/charts/sister-strip.js';

// The computed sample of references.md "Outliers among sister units": median 8.03, MAD 0.02, constant 0.6745, limit
// 3.5. Band half-width = limit·MAD/constant = 3.5·0.02/0.6745 = 0.103781 (hand computation), so the band is
// 8.03 ± 0.103781 = [7.926219, 8.133781]; 8.60 lies outside it (its M is 19.22).
const input: StripInput = {
  label: 'CHL capacitance',
  unit: 'pF',
  median: 8.03,
  mad: 0.02,
  constant: 0.6745,
  limit: 3.5,
  items: [
    { serial: 'U3', value: 7.98, outlier: false },
    { serial: 'U1', value: 8.02, outlier: false, isThisUnit: true },
    { serial: 'U6', value: 8.6, outlier: true },
    { serial: 'U2', value: 8.05, outlier: false },
    { serial: 'U5', value: 8.04, outlier: false },
    { serial: 'U4', value: 8.01, outlier: false },
  ],
};

describe('sisterStrip', () => {
  it('places one point per unit in serial order, this unit and the outlier in groups of their own', () => {
    const s = sisterStrip(input);
    expect(s.points).toEqual([
      { position: 1, value: 8.02, serial: 'U1', group: 'this-unit' },
      { position: 2, value: 8.05, serial: 'U2', group: 'family' },
      { position: 3, value: 7.98, serial: 'U3', group: 'family' },
      { position: 4, value: 8.01, serial: 'U4', group: 'family' },
      { position: 5, value: 8.04, serial: 'U5', group: 'family' },
      { position: 6, value: 8.6, serial: 'U6', group: 'outlier' },
    ]);
    expect(s.categories).toEqual(['U1', 'U2', 'U3', 'U4', 'U5', 'U6']);
    expect(s.series.map((x) => [x.group, x.shape, x.data.length])).toEqual([
      ['family', 'circle', 4],
      ['outlier', 'triangle', 1],
      ['this-unit', 'square', 1],
    ]);
  });

  it('draws the median and the band median ± limit·MAD/constant', () => {
    const s = sisterStrip(input);
    expect(s.median).toBe(8.03);
    expect(s.band!.low).toBeCloseTo(7.926219, 6); // 8.03 − 3.5·0.02/0.6745 (hand computation above)
    expect(s.band!.high).toBeCloseTo(8.133781, 6); // 8.03 + 3.5·0.02/0.6745
    // value range: lowest 7.926219 (band), highest 8.60; span 0.673781, padded by 5 % = 0.033689 each side
    expect(s.valueMin).toBeCloseTo(7.89253, 5);
    expect(s.valueMax).toBeCloseTo(8.633689, 5);
  });

  it('has axis titles with units', () => {
    const s = sisterStrip(input);
    expect(s.valueTitle).toBe('CHL capacitance (pF)');
    expect(s.unitsTitle).toBe('Unit of the family (by serial)');
    expect(sisterStrip({ ...input, label: 'Phase A leakage reactance', unit: '%' }).valueTitle).toBe('Phase A leakage reactance (%)');
  });

  it('draws no band when the MAD is zero or unknown, and pads a flat family by 1 % of its median', () => {
    const flat = sisterStrip({ ...input, median: 100, mad: 0, items: [{ serial: 'A', value: 100, outlier: false }, { serial: 'B', value: 100, outlier: false }] });
    expect(flat.band).toBeNull();
    expect(flat.valueMin).toBe(99); // 100 − 1 % of 100
    expect(flat.valueMax).toBe(101);
    expect(sisterStrip({ ...input, mad: null }).band).toBeNull();
    expect(sisterStrip({ ...input, items: [], median: null, mad: null }).series).toEqual([]);
  });
});
