// The dissipation-over-frequency chart's series: the engine's fit drawn as a curve and its A/f, B·f and C parts.
import { describe, expect, it } from 'vitest';
import type { GapsightCase } from '../../../shared/schemas/case.js';
import { criteriaV2 } from '../../../shared/screening/criteria-sets.js';
import { fitDissipationOverFrequency } from '../../../shared/screening/df-frequency.js';
import { DF_AXIS_TITLES, dfFrequencyChart, dfFrequencyCharts, fitInWords, hasDfAtFrequencies, logSpaced } from '../../../shared/charts/df-frequency.js';

// Hand computed from DF(f) = 6/f + 0.002·f + 0.3 (%):
//   f 10 → 0.6 + 0.02 + 0.3 = 0.92; f 50 → 0.12 + 0.1 + 0.3 = 0.52; f 100 → 0.06 + 0.2 + 0.3 = 0.56;
//   f 400 → 0.015 + 0.8 + 0.3 = 1.115. The points lie on the curve, so the least-squares fit is exact (R² = 1).
const EXACT: [number, number][] = [
  [100, 0.56],
  [10, 0.92],
  [400, 1.115],
  [50, 0.52],
];

describe('dissipation over frequency chart', () => {
  const ch = dfFrequencyChart('CHL', EXACT, criteriaV2, [], 5);

  it('carries the engine’s fit (hand computed: A 6, B 0.002, C 0.3, R² 1)', () => {
    expect(ch.fit).toEqual(fitDissipationOverFrequency(EXACT));
    expect(ch.fit!.a).toBeCloseTo(6, 9);
    expect(ch.fit!.b).toBeCloseTo(0.002, 12);
    expect(ch.fit!.c).toBeCloseTo(0.3, 9);
    expect(ch.fit!.rSquared).toBeCloseTo(1, 12);
    expect(ch.fitText).toBe('A = 6 % · Hz, B = 0.002 %/Hz, C = 0.3 %, R² = 1.0000');
  });

  it('sorts the measured points and samples the curve over the measured range, evenly in log10(f)', () => {
    expect(ch.measured.map((p) => p.x)).toEqual([10, 50, 100, 400]);
    // 5 samples from 10 to 400 Hz: 10^(1 + k·log10(40)/4), k = 0…4 (hand computed: 10, 25.15, 63.25, 159.1, 400)
    expect(ch.curve.map((p) => p.x)[0]).toBe(10);
    expect(ch.curve.map((p) => p.x)[4]).toBe(400);
    expect(ch.curve[2].x).toBeCloseTo(Math.sqrt(10 * 400), 9);
    expect(ch.curve[0].y).toBeCloseTo(0.92, 9); // the curve passes through the measured points (hand computed above)
    expect(ch.curve[4].y).toBeCloseTo(1.115, 9);
    expect(ch.rows.map((r) => [r.frequencyHz, r.dfPercent])).toEqual([[10, 0.92], [50, 0.52], [100, 0.56], [400, 1.115]]);
    ch.rows.forEach((r) => expect(r.fittedPercent!).toBeCloseTo(r.dfPercent, 9)); // exact fit (hand computed above)
  });

  it('splits the curve into A/f, B·f and C, which add up to it', () => {
    for (let k = 0; k < ch.curve.length; k++) {
      expect(ch.conductivePart[k].y + ch.seriesPart[k].y + ch.constantPart[k].y).toBeCloseTo(ch.curve[k].y, 12);
    }
    expect(ch.conductivePart[0].y).toBeCloseTo(0.6, 9); // 6/10 (hand computed)
    expect(ch.seriesPart[4].y).toBeCloseTo(0.8, 9); // 0.002 · 400 (hand computed)
    expect(ch.constantPart.every((p) => Math.abs(p.y - 0.3) < 1e-9)).toBe(true);
    expect(ch.axes).toEqual(DF_AXIS_TITLES);
    expect(DF_AXIS_TITLES).toEqual({ frequency: 'Frequency (Hz)', dissipation: 'Dissipation factor (%)' });
  });

  it('draws no fit with fewer points than the criteria set asks for, and says so', () => {
    const few = dfFrequencyChart('CH', EXACT.slice(0, 3), criteriaV2);
    expect(few.fit).toBeNull();
    expect(few.curve).toEqual([]);
    expect(few.note).toBe('fewer than 4 frequencies (3): no fit'); // criteria set 2: dfFrequency.minPoints 4
    expect(few.measured).toHaveLength(3);
    expect(few.rows.every((r) => r.fittedPercent === null)).toBe(true);
    expect(fitInWords(null)).toBe('no fit');
  });

  it('builds one chart per configuration with DF at several frequencies', () => {
    const c = {
      format: 'gapsight-case/1',
      unit: { serial: 'X', phases: 3, ratedKVA: 1000, hvKV: 11, lvKV: 0.4, impedancePercent: 5 },
      baseline: { dissipationByFrequency: { CHL: [[10, 0.5], [100, 0.5]] } },
      postFault: { dissipationByFrequency: { CHL: EXACT, CH: [[60, 0.3]] } },
    } as unknown as GapsightCase;
    expect(hasDfAtFrequencies(c)).toBe(true);
    const charts = dfFrequencyCharts(c, criteriaV2);
    expect(charts.map((x) => x.configuration)).toEqual(['CHL']);
    expect(charts[0].baselineMeasured).toEqual([{ x: 10, y: 0.5 }, { x: 100, y: 0.5 }]);
    expect(hasDfAtFrequencies({ ...c, postFault: {} } as GapsightCase)).toBe(false);
  });

  it('spaces frequencies evenly in log10', () => {
    expect(logSpaced(1, 1000, 4).map((f) => Number(f.toPrecision(12)))).toEqual([1, 10, 100, 1000]);
  });
});
