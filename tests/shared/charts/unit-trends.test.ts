// Unit trends: values and changes against the engine's baseline, PF20 and resistance corrections, bands of criteria
// set 2, fault markers. Check values are hand computations (shown beside them) or published worked values.
import { describe, expect, it } from 'vitest';
import {
  bandRanges,
  CHANGE_Y_TITLE,
  clipBands,
  eventMarkers,
  trendGroup,
  trendTable,
  trendXRange,
  trendYRange,
  unitTrends,
  type TrendReadingSet,
} from '../../../shared/charts/unit-trends.js';
import { niceRange } from '../../../shared/charts/svg-plot.js';
import { criteriaV2 } from '../../../shared/screening/criteria-sets.js';
import { pf20Percent } from '../../../shared/screening/power-factor.js';

// Invented demo unit: 20 MVA, 115 kV, copper (IEC 60076-5 category II under criteria set 2: L = 2 %).
const UNIT = { hvKV: 115, ratedKVA: 20000, conductor: 'Cu' };

const SETS: TrendReadingSet[] = [
  {
    id: 1,
    kind: 'factory',
    isReference: false,
    takenAt: '2015-05-01T00:00:00.000Z',
    temperatureC: 20,
    windingTemperatureC: 30,
    values: {
      capacitancePF: { CHL: 4000, CH: 3000 },
      dissipationPercent: { CHL: 0.3 },
      reactance: { A: { percent: 8 } },
      windingResistanceOhm: { A: 0.3215 },
      dissolvedGasPPM: { H2: 10, C2H2: 0 },
    },
  },
  {
    id: 2,
    kind: 'commissioning',
    isReference: false,
    takenAt: '2016-01-10T00:00:00.000Z',
    temperatureC: 30,
    values: { capacitancePF: { CHL: 4010 }, dissipationPercent: { CHL: 0.5 } },
  },
  {
    id: 3,
    kind: 'routine',
    isReference: false,
    takenAt: '2020-06-01T00:00:00.000Z',
    temperatureC: 25,
    values: { capacitancePF: { CHL: 4050, CH: 3030 }, dissipationPercent: { CHL: 0.4 }, reactance: { A: { percent: 8.1 } } },
  },
  {
    id: 4,
    kind: 'post-fault',
    isReference: false,
    takenAt: '2024-03-05T00:00:00.000Z',
    windingTemperatureC: 30,
    values: {
      capacitancePF: { CHL: 4130.3, CH: 2940 },
      dissipationPercent: { CHL: 0.45 },
      reactance: { A: { percent: 8.24 } },
      windingResistanceOhm: { A: 0.33 },
      dissolvedGasPPM: { H2: 150, C2H2: 3 },
    },
  },
];

const ys = (g: ReturnType<typeof trendGroup>, key: string) => g.series.find((s) => s.key === key)!.points.map((p) => p.y);

describe('capacitance trend', () => {
  it('gives the values in pF with the newest baseline set holding each configuration as its baseline', () => {
    const g = trendGroup('capacitance', SETS, UNIT, criteriaV2, 'values');
    expect(g.yTitle).toBe('Capacitance (pF)');
    expect(ys(g, 'capacitance.CHL')).toEqual([4000, 4010, 4050, 4130.3]);
    // CHL: the commissioning set (2016) is the newest baseline set with CHL; CH: only the factory set has it.
    expect(g.series.find((s) => s.key === 'capacitance.CHL')!.baseline).toEqual({ x: Date.parse('2016-01-10T00:00:00.000Z'), y: 4010, setId: 2 });
    expect(g.series.find((s) => s.key === 'capacitance.CH')!.baseline?.setId).toBe(1);
  });

  it('gives the change against that baseline in %', () => {
    const g = trendGroup('capacitance', SETS, UNIT, criteriaV2, 'change');
    expect(g.yTitle).toBe(CHANGE_Y_TITLE);
    const chl = ys(g, 'capacitance.CHL');
    expect(chl[0]).toBeCloseTo(-0.249376559, 8); // 100·(4000 − 4010)/4010 (hand computed)
    expect(chl[1]).toBe(0); // the baseline itself
    expect(chl[2]).toBeCloseTo(0.997506234, 8); // 100·40/4010
    expect(chl[3]).toBeCloseTo(3, 10); // 100·120.3/4010 = 3.0
    expect(ys(g, 'capacitance.CH')).toEqual([0, expect.closeTo(1, 10), expect.closeTo(-2, 10)]); // 100·30/3000, 100·(−60)/3000
  });

  it('takes a routine set marked as reference as the newer baseline (shared/readings/baseline.ts)', () => {
    const marked = SETS.map((s) => (s.id === 3 ? { ...s, isReference: true } : s));
    const g = trendGroup('capacitance', marked, UNIT, criteriaV2, 'change');
    expect(g.series.find((s) => s.key === 'capacitance.CHL')!.baseline?.setId).toBe(3);
    expect(ys(g, 'capacitance.CHL')[3]).toBeCloseTo(1.982716049, 8); // 100·(4130.3 − 4050)/4050
  });

  it('carries the shift bands of criteria set 2 (2 / 3 / 5 %, judged on |shift|) as y ranges above and below zero', () => {
    const g = trendGroup('capacitance', SETS, UNIT, criteriaV2, 'change');
    expect(g.bands).toEqual([
      { level: 'watch', from: 2, to: 3 },
      { level: 'watch', from: -3, to: -2 },
      { level: 'investigate', from: 3, to: 5 },
      { level: 'investigate', from: -5, to: -3 },
      { level: 'critical', from: 5, to: null },
      { level: 'critical', from: null, to: -5 },
    ]);
    expect(g.bandsSource).toMatch(/^criteria set 2: /);
    expect(trendGroup('capacitance', SETS, UNIT, criteriaV2, 'values').bands).toEqual([]);
  });
});

describe('power factor at 20 °C', () => {
  it('matches the engine correction (criteria temperature table, IEEE C57.12.90-style, from memory) and a hand computation', () => {
    const g = trendGroup('powerFactor', SETS, UNIT, criteriaV2, 'values');
    expect(g.yTitle).toBe('PF at 20 °C (%)');
    const v = ys(g, 'powerFactor.CHL');
    // Set 1: DF 0.3 % at 20 °C: PF = 0.003/√(1 + 0.003²) = 0.00299998650, factor 1.00 → 0.299998650 %.
    expect(v[0]).toBeCloseTo(0.29999865, 8);
    // Set 2: DF 0.5 % at 30 °C: PF = 0.005/√(1.000025) = 0.00499993750, factor 0.80 → 0.399995000 %.
    expect(v[1]).toBeCloseTo(0.399995, 8);
    // Set 3: DF 0.4 % at 25 °C: PF = 0.004/√(1.000016) = 0.00399996800, factor 0.89 → 0.355997152 %.
    expect(v[2]).toBeCloseTo(0.355997152, 8);
    expect(v.slice(0, 3)).toEqual([pf20Percent(0.3, 20, criteriaV2), pf20Percent(0.5, 30, criteriaV2), pf20Percent(0.4, 25, criteriaV2)]);
    // Set 4 has no insulation temperature: left out and said so.
    expect(v).toHaveLength(3);
    expect(g.notes.join(' ')).toMatch(/1 dissipation reading\(s\) without an insulation temperature/);
  });

  it('gives the PF20 rise against the baseline with the rise bands of criteria set 2 (50 / 100 %, rises only)', () => {
    const g = trendGroup('powerFactor', SETS, UNIT, criteriaV2, 'change');
    // 100·(0.355997152 − 0.399995)/0.399995 = −10.99960 (hand computed from the values above)
    expect(ys(g, 'powerFactor.CHL')[2]).toBeCloseTo(-10.9996, 3);
    expect(g.bands).toEqual([
      { level: 'watch', from: 50, to: 100 },
      { level: 'investigate', from: 100, to: null },
    ]);
  });

  it('leaves out a reading taken outside the correction table (10–70 °C)', () => {
    const hot = [{ ...SETS[0], temperatureC: 80 }];
    const g = trendGroup('powerFactor', hot, UNIT, criteriaV2, 'values');
    expect(g.series).toEqual([]);
    expect(g.notes.join(' ')).toMatch(/outside the correction table \(10–70 °C\)/);
  });
});

describe('reactance, resistance and gases', () => {
  it('gives %X and its change with bands of 0.5 / 1 / 1.5 × L, L = 2 % for 20 MVA (criteria set 2)', () => {
    const g = trendGroup('reactance', SETS, UNIT, criteriaV2, 'change');
    expect(ys(g, 'reactance.A')).toEqual([0, expect.closeTo(1.25, 10), expect.closeTo(3, 10)]); // 100·0.1/8, 100·0.24/8
    expect(g.bands.filter((b) => b.from !== null && b.from >= 0)).toEqual([
      { level: 'watch', from: 1, to: 2 },
      { level: 'investigate', from: 2, to: 3 },
      { level: 'critical', from: 3, to: null },
    ]);
  });

  it('corrects winding resistance to 75 °C as the engine does (references.md: 0.3215 Ω at 30 °C → 0.3762 Ω)', () => {
    const g = trendGroup('resistance', SETS, UNIT, criteriaV2, 'values');
    expect(g.yTitle).toBe('Winding resistance at 75 °C (Ω)');
    const v = ys(g, 'resistance.A');
    expect(v[0]).toBeCloseTo(0.3762, 4); // 0.3215·(75 + 234.5)/(30 + 234.5), IEEE C57.12.90 (references.md)
    const c = trendGroup('resistance', SETS, UNIT, criteriaV2, 'change');
    expect(ys(c, 'resistance.A')[1]).toBeCloseTo(2.643856921, 8); // same temperature: 100·(0.33 − 0.3215)/0.3215
    expect(c.bands).toEqual([
      { level: 'investigate', from: 2, to: null },
      { level: 'investigate', from: null, to: -2 },
    ]);
  });

  it('shows gases in ppm; in the change view no bands, and a gas with a zero baseline is named, not divided by', () => {
    const v = trendGroup('gas', SETS, UNIT, criteriaV2, 'values');
    expect(v.yTitle).toBe('Dissolved gas (ppm)');
    expect(v.series.map((s) => s.name)).toEqual(['Hydrogen (H2)', 'Acetylene (C2H2)']);
    expect(ys(v, 'gas.H2')).toEqual([10, 150]);
    const c = trendGroup('gas', SETS, UNIT, criteriaV2, 'change');
    expect(ys(c, 'gas.H2')).toEqual([0, 1400]); // 100·(150 − 10)/10
    expect(c.bands).toEqual([]);
    expect(c.bandsSource).toBeNull();
    expect(c.notes).toContain('No baseline to compare with: Acetylene (C2H2)');
  });
});

describe('markers, groups and the table', () => {
  it('puts each fault on the time axis in ms with its type in words', () => {
    expect(eventMarkers([{ id: 9, occurredAt: '2024-03-01T10:00:00.000Z', type: 'phase-to-ground' }])).toEqual([
      { x: 1709287200000, eventId: 9, occurredAt: '2024-03-01T10:00:00.000Z', label: 'Fault: phase-to-ground' }, // 2024-03-01T10:00Z in ms
    ]);
  });

  it('lists only the groups the unit has readings of, with the markers', () => {
    const t = unitTrends({ unit: UNIT, readingSets: SETS, events: [{ id: 9, occurredAt: '2024-03-01T10:00:00.000Z', type: 'three-phase' }] }, criteriaV2, 'values');
    expect(t.groups.map((g) => g.id)).toEqual(['capacitance', 'powerFactor', 'reactance', 'resistance', 'gas']);
    expect(t.markers).toHaveLength(1);
    expect(t.criteriaVersion).toBe(2);
  });

  it('gives one table row per reading set, oldest first, naming the baseline', () => {
    const table = trendTable(trendGroup('capacitance', SETS, UNIT, criteriaV2, 'values'));
    expect(table.columns).toEqual(['CH', 'CHL']);
    expect(table.rows.map((r) => [r.setId, r.cells, r.baselineOf])).toEqual([
      [1, [3000, 4000], ['CH']],
      [2, [null, 4010], ['CHL']],
      [3, [3030, 4050], []],
      [4, [2940, 4130.3], []],
    ]);
  });

  it('bandRanges keeps a rise-only rule above zero', () => {
    expect(bandRanges([{ from: 1, level: 'investigate' }, { from: 5, level: 'critical' }], false)).toEqual([
      { level: 'investigate', from: 1, to: 5 },
      { level: 'critical', from: 5, to: null },
    ]);
  });
});

describe('axis ranges', () => {
  it('opens the change axis to 1.5 × the first band so the watch band shows, and clips open bands to it', () => {
    const g = trendGroup('capacitance', SETS, UNIT, criteriaV2, 'change');
    // data −2 … 3 %; first band 2 % → ±3 %; range −3 … 3, padded by 5 % of 6 = 0.3
    const r = trendYRange(g);
    expect(r.min).toBeCloseTo(-3.3, 10);
    expect(r.max).toBeCloseTo(3.3, 10);
    expect(clipBands(g.bands, r)).toEqual([
      { level: 'watch', y: 2, y2: 3 },
      { level: 'watch', y: -3, y2: -2 },
      { level: 'investigate', y: 3, y2: expect.closeTo(3.3, 10) },
      { level: 'investigate', y: expect.closeTo(-3.3, 10), y2: -3 },
    ]);
  });

  it('spans the points and the fault markers in time', () => {
    const g = trendGroup('gas', SETS, UNIT, criteriaV2, 'values');
    const m = eventMarkers([{ id: 9, occurredAt: '2025-05-01T00:00:00.000Z', type: 'three-phase' }]);
    const r = trendXRange(g, m)!;
    const lo = Date.parse('2015-05-01T00:00:00.000Z');
    const hi = Date.parse('2025-05-01T00:00:00.000Z');
    expect(r.min).toBe(lo - 0.03 * (hi - lo));
    expect(r.max).toBe(hi + 0.03 * (hi - lo));
  });
});

describe('nice axis ranges', () => {
  it('widens a range outward to whole steps of 1, 2 or 5 × 10^n', () => {
    // −3.3 … 3.3: about 5 intervals of 1.32 → step 2; ticks −2, 0, 2 inside → −4 … 4, 4 intervals
    expect(niceRange({ min: -3.3, max: 3.3 })).toEqual({ min: -4, max: 4, tickAmount: 4 });
    // 2756 … 10272: raw step 1503 → 2000; ticks 4000 … 10000 inside → 2000 … 12000, 5 intervals
    expect(niceRange({ min: 2756, max: 10272 })).toEqual({ min: 2000, max: 12000, tickAmount: 5 });
    // already on steps: kept
    expect(niceRange({ min: 0, max: 10 })).toEqual({ min: 0, max: 10, tickAmount: 5 });
  });
});
