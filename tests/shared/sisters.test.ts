// Sister-unit statistics: modified z-score, Grubbs and Dixon against published values; key presence rules.
import { describe, expect, it } from 'vitest';
import { criteriaV1, dixonCritical, dixonQ, grubbsCritical, grubbsMaxStatistic, modifiedZScore, sisterIndicators } from '../../shared/screening/index.js';
import { cleanCase, edit } from './case-builder.js';

// A computed sample of references.md (its values were worked out from the published formulas; it is not a sample the
// NIST/SEMATECH e-Handbook prints).
const SAMPLE = [8.02, 8.05, 7.98, 8.01, 8.04, 8.6];
// The published Grubbs example: NIST/SEMATECH e-Handbook 1.3.5.17.1 (Tietjen–Moore data), as quoted in references.md.
const NIST_GRUBBS = [199.31, 199.53, 200.19, 200.82, 201.92, 201.95, 202.18, 245.57];

describe('modified z-score (Iglewicz & Hoaglin 1993)', () => {
  it('gives median 8.03, MAD 0.02 and M(8.60) = 19.22 for the computed sample of references.md', () => {
    const m = modifiedZScore(8.6, SAMPLE, 0.6745, 0.001);
    expect(m.median).toBeCloseTo(8.03, 12); // computed with the formula of Iglewicz & Hoaglin 1993 (references.md)
    expect(m.mad).toBeCloseTo(0.02, 12); // computed (references.md)
    expect(m.value).toBeCloseTo(19.22, 2); // computed from M = 0.6745·(x − median)/MAD (references.md)
    expect(m.madFloored).toBe(false);
  });

  it('raises a MAD below 0.1 % of |median| to that floor and says so', () => {
    const m = modifiedZScore(101, [100, 100, 100, 100, 100, 101], 0.6745, 0.001);
    expect(m.mad).toBeCloseTo(0.1, 12); // 0.1 % of median 100 (case-format.md)
    expect(m.madFloored).toBe(true);
    expect(m.value).toBeCloseTo(6.745, 9);
  });

  it('gives null with a note when the median is zero', () => {
    const m = modifiedZScore(0, [0, 0, 0, 1, -1, 0], 0.6745, 0.001);
    expect(m.value).toBeNull();
    expect(m.note).toMatch(/median is zero/);
  });
});

describe('Grubbs two-sided test, α 0.05', () => {
  it('reproduces the published critical values for n = 3…20', () => {
    // Grubbs critical values, α 0.05 two-sided (references.md list; n = 7 is 2.0200, not the misprinted 2.202)
    const table: Array<[number, number]> = [[3, 1.1543], [4, 1.4813], [5, 1.715], [6, 1.8871], [7, 2.02], [8, 2.1266], [9, 2.215], [10, 2.29], [12, 2.4116], [15, 2.5483], [20, 2.7082]];
    for (const [n, g] of table) expect(grubbsCritical(n, 0.05)).toBeCloseTo(g, 3);
  });

  it('gives G = 2.0304 > 1.8871 for the computed sample', () => {
    const g = grubbsMaxStatistic(SAMPLE);
    expect(g).toBeCloseTo(2.0304, 4); // computed (references.md)
    expect(g).toBeGreaterThan(1.8871); // the n = 6 critical value, α 0.05 (references.md)
  });

  it('reproduces the published NIST/SEMATECH example: G = 2.4688 against the critical value 2.1266 (n 8, α 0.05)', () => {
    // NIST/SEMATECH e-Handbook 1.3.5.17.1 (Tietjen–Moore data): G = 2.4688, two-sided critical value 2.1266 (references.md)
    expect(grubbsMaxStatistic(NIST_GRUBBS)).toBeCloseTo(2.4688, 4);
    expect(grubbsCritical(NIST_GRUBBS.length, 0.05)).toBeCloseTo(2.1266, 4);
  });
});

describe("Dixon's Q (Rorabacher 1991)", () => {
  it('holds the Q95 table for n 3…10', () => {
    // Rorabacher 1991, Anal. Chem. 63:139 (references.md)
    const q95 = [0.97, 0.829, 0.71, 0.625, 0.568, 0.526, 0.493, 0.466];
    q95.forEach((q, k) => expect(dixonCritical(k + 3, criteriaV1)).toBe(q));
    expect(dixonCritical(11, criteriaV1)).toBeUndefined();
  });

  it('gives Q = 0.8871 > 0.625 for the sample, and no Q for a value that is not an extreme', () => {
    const q = dixonQ(8.6, SAMPLE)!;
    expect(q).toBeCloseTo(0.8871, 4); // computed from Q = gap/range: (8.60 − 8.05)/(8.60 − 7.98) (references.md)
    expect(q).toBeGreaterThan(0.625); // Q95 for n = 6 (Rorabacher 1991, references.md)
    expect(dixonQ(8.02, SAMPLE)).toBeNull();
  });
});

describe('sister indicators', () => {
  const withSisters = (n: number, chl = 5000) =>
    edit(cleanCase(), (d) => {
      d.postFault!.capacitancePF!.CHL = chl;
      d.sisters = Array.from({ length: n }, (_, k) => ({ serial: `S${k}`, capacitancePF: { CHL: 5000 + 10 * k } }));
    });

  it('has no sister keys with fewer than 3 sisters', () => {
    expect(sisterIndicators(withSisters(2), criteriaV1).filter((i) => i.key.includes('CHL'))).toEqual([]);
  });

  it('gives the deviation from the median with 3 or 4 sisters but no modified z below 5', () => {
    for (const n of [3, 4]) {
      const keys = sisterIndicators(withSisters(n), criteriaV1).map((i) => i.key);
      expect(keys, `${n} sisters`).toContain('sisters.capacitance.CHL.deviationFromMedianPercent');
      expect(keys, `${n} sisters`).not.toContain('sisters.capacitance.CHL.modifiedZ');
    }
  });

  it('flags |M| ≥ 3.5 at watch at most (a state, rules revision 2) with 5 sisters and adds Grubbs and Dixon at ok', () => {
    const inds = sisterIndicators(withSisters(5, 5400), criteriaV1);
    const m = inds.find((i) => i.key === 'sisters.capacitance.CHL.modifiedZ')!;
    // Revision 1 gave investigate; revision 2 (case format, "basis": sister statistics are a state) caps it at watch.
    expect(m.level).toBe('watch');
    expect(m.basis).toBe('state');
    expect(inds.find((i) => i.key === 'sisters.capacitance.CHL.grubbsG')!.level).toBe('ok');
    const dixon = inds.find((i) => i.key === 'sisters.capacitance.CHL.dixonQ')!;
    expect(dixon.level).toBe('ok');
    expect(dixon.note).toBe('Dixon: outlier');
    const dev = inds.find((i) => i.key === 'sisters.capacitance.CHL.deviationFromMedianPercent')!;
    expect(dev.value).toBeCloseTo((100 * (5400 - 5020)) / 5020, 9); // computed: median of 5000…5040 is 5020
  });

  it('uses the unit Z base for a sister reactance given in volts and amps', () => {
    const c = edit(cleanCase(), (d) => {
      d.sisters = Array.from({ length: 3 }, (_, k) => ({ serial: `S${k}`, reactance: { A: { volts: 202.1, amps: 4 } } }));
    });
    const dev = sisterIndicators(c, criteriaV1).find((i) => i.key === 'sisters.reactance.A.deviationFromMedianPercent')!;
    const sisterX = (100 * (202.1 / 4)) / ((132 * 132 * 1000) / 40000); // computed from IEEE 62 %X with the unit's Z base
    expect(dev.value).toBeCloseTo((100 * (11.6 - sisterX)) / sisterX, 9);
  });
});
