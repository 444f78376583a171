// Shift chart: which indicators are shifts, the thresholds from criteria set 2 behind each key, grouping by unit.
// The indicators are hand-built (invented values); the thresholds are criteria set 2's numbers (criteria-sets.ts).
import { describe, expect, it } from 'vitest';
import { bandsForKey, isShiftIndicator, shiftAxisRange, shiftChart, thresholdWords } from '../../../shared/charts/shift-chart.js';
import { criteriaV1, criteriaV2 } from '../../../shared/screening/criteria-sets.js';
import type { Indicator } from '../../../shared/schemas/result.js';

/** The engine's method of a key, as its method files set it (dissipation over frequency is a power-factor test). */
const METHOD_OF: Record<string, Indicator['method']> = { capacitance: 'capacitance', powerFactor: 'power-factor', dfFrequency: 'power-factor', reactance: 'reactance', resistance: 'resistance', excitation: 'excitation', gas: 'gas', sweep: 'sweep', duty: 'duty' };

const ind = (key: string, value: Indicator['value'], level: Indicator['level'], basis?: Indicator['basis'], extra: Partial<Indicator> = {}): Indicator => ({
  key,
  value,
  level,
  rule: 'r',
  source: 's',
  method: METHOD_OF[key.split('.')[0]] ?? 'capacitance',
  ...(basis ? { basis } : {}),
  ...(value === null ? { note: 'no value' } : {}),
  ...extra,
});

const RESULT: Indicator[] = [
  ind('capacitance.CHL.shiftPercent', -3.4, 'investigate', 'change', { reference: '2016-01-10 baseline' }),
  ind('capacitance.CH.shiftPercent', 6, 'investigate', 'sisters'),
  ind('capacitance.CHL.consistencyPercent', 0.2, 'ok', 'state'),
  ind('powerFactor.CHL.pf20Percent', 0.5, 'ok', 'state'),
  ind('powerFactor.CHL.riseFromBaselinePercent', 60, 'watch', 'change'),
  ind('reactance.A.shiftPercent', 2.5, 'investigate', 'change'),
  ind('reactance.A.percent', 8.2, 'ok', 'state'),
  ind('reactance.phaseSpreadChangePoints', 1.2, 'watch', 'change'),
  ind('resistance.A.changePercent', -2.6, 'watch', 'change', { lowConfidence: true }),
  ind('excitation.B.changePercent', null, 'ok', 'change'),
  ind('gas.C2H2.risePPM', 3, 'investigate', 'change'),
  ind('gas.H2.risePPM', 140, 'critical', 'change'),
  ind('gas.duvalZone', 'T3', 'ok', 'state'),
  ind('sweep.hv.A.asleDb', 0.8, 'ok', 'change'),
  ind('sweep.hv.A.correlation', 0.99, 'ok', 'change'),
  ind('duty.eventDutyPercent', 40, 'ok', 'duty'),
  ind('dfFrequency.CHL.seriesChangePercent', 12, 'ok', 'change'),
];

describe('which indicators are shifts', () => {
  it('takes numeric %, points and ppm changes; not states, duty, dB, unitless figures or null values', () => {
    expect(RESULT.filter(isShiftIndicator).map((i) => i.key)).toEqual([
      'capacitance.CHL.shiftPercent',
      'capacitance.CH.shiftPercent',
      'powerFactor.CHL.riseFromBaselinePercent',
      'reactance.A.shiftPercent',
      'reactance.phaseSpreadChangePoints',
      'resistance.A.changePercent',
      'gas.C2H2.risePPM',
      'gas.H2.risePPM',
      'dfFrequency.CHL.seriesChangePercent',
    ]);
  });

  it('reads a result stored before rules revision 2 (no basis) by its key', () => {
    expect(isShiftIndicator(ind('capacitance.CL.shiftPercent', 1, 'ok'))).toBe(true);
    expect(isShiftIndicator(ind('powerFactor.CL.pf20Percent', 0.4, 'ok'))).toBe(false);
  });
});

describe('thresholds from criteria set 2', () => {
  const groups = shiftChart(RESULT, criteriaV2, { ratedKVA: 20000 });
  const bar = (key: string) => groups.flatMap((g) => g.bars).find((b) => b.key === key)!;

  it('groups bars by method and unit so no axis mixes units or methods, each with its axis title', () => {
    expect(groups.map((g) => [g.id, g.axisTitle, g.bars.map((b) => b.key)])).toEqual([
      ['capacitance|%', 'Capacitance: shift (%)', ['capacitance.CHL.shiftPercent', 'capacitance.CH.shiftPercent']],
      ['power-factor|%', 'Power factor: shift (%)', ['powerFactor.CHL.riseFromBaselinePercent', 'dfFrequency.CHL.seriesChangePercent']],
      ['reactance|%', 'Leakage reactance: shift (%)', ['reactance.A.shiftPercent']],
      ['reactance|points', 'Leakage reactance: change (percentage points)', ['reactance.phaseSpreadChangePoints']],
      ['resistance|%', 'Winding resistance: shift (%)', ['resistance.A.changePercent']],
      ['gas|ppm', 'Dissolved gases: rise (ppm)', ['gas.C2H2.risePPM', 'gas.H2.risePPM']],
    ]);
  });

  it('capacitance: |shift| bands 2 / 3 / 5 %, drawn on the side of a fall', () => {
    const b = bar('capacitance.CHL.shiftPercent');
    expect(b.label).toBe('CHL capacitance shift vs baseline');
    expect(b.absolute).toBe(true);
    expect(b.thresholds).toEqual([
      { level: 'watch', at: -2 },
      { level: 'investigate', at: -3 },
      { level: 'critical', at: -5 },
    ]);
    expect(b.level).toBe('investigate');
    expect(b.basis).toBe('against own baseline');
    expect(b.reference).toBe('2016-01-10 baseline');
  });

  it("against the sisters' median the bands stop at the cap (investigate in set 2)", () => {
    expect(bar('capacitance.CH.shiftPercent').thresholds).toEqual([
      { level: 'watch', at: 2 },
      { level: 'investigate', at: 3 },
      { level: 'investigate', at: 5 },
    ]);
    expect(bar('capacitance.CH.shiftPercent').notes.join(' ')).toMatch(/investigate at most/);
  });

  it('power factor: rise bands 50 / 100 % (a rise only), with the 0.1 point floor in words', () => {
    const b = bar('powerFactor.CHL.riseFromBaselinePercent');
    expect(b.absolute).toBe(false);
    expect(b.thresholds).toEqual([
      { level: 'watch', at: 50 },
      { level: 'investigate', at: 100 },
    ]);
    expect(b.notes[0]).toMatch(/0\.1 percentage point/);
  });

  it('reactance: 0.5 / 1 / 1.5 × L with L = 2 % for 20 MVA (category II) → 1 / 2 / 3 %; spread change 1 / 2 points', () => {
    expect(bar('reactance.A.shiftPercent').thresholds).toEqual([
      { level: 'watch', at: 1 },
      { level: 'investigate', at: 2 },
      { level: 'critical', at: 3 },
    ]);
    expect(bar('reactance.phaseSpreadChangePoints').thresholds).toEqual([
      { level: 'watch', at: 1 },
      { level: 'investigate', at: 2 },
    ]);
  });

  it('resistance: |change| 2 % investigate; low confidence said in words', () => {
    const b = bar('resistance.A.changePercent');
    expect(b.thresholds).toEqual([{ level: 'investigate', at: -2 }]);
    expect(b.notes).toContain('low confidence: watch at most');
  });

  it('gases: acetylene rise 1 / 5 ppm; hydrogen 100 ppm critical only with acetylene present', () => {
    expect(bar('gas.C2H2.risePPM').thresholds).toEqual([
      { level: 'investigate', at: 1 },
      { level: 'critical', at: 5 },
    ]);
    expect(bar('gas.H2.risePPM').thresholds).toEqual([{ level: 'critical', at: 100 }]);
    expect(bar('gas.H2.risePPM').notes[0]).toMatch(/only with acetylene above 0 ppm/);
  });

  it('an informative change has a bar and no thresholds', () => {
    expect(bar('dfFrequency.CHL.seriesChangePercent').thresholds).toEqual([]);
    expect(bar('dfFrequency.CHL.seriesChangePercent').notes).toContain('no change bands in the criteria set (informative)');
  });

  it('reactance without the rating has no L, hence no thresholds', () => {
    expect(bandsForKey('reactance.A.shiftPercent', criteriaV2)).toBeNull();
  });

  it('set 1 has no PF floor, so no floor note', () => {
    expect(bandsForKey('powerFactor.CHL.riseFromBaselinePercent', criteriaV1)?.note).toBeUndefined();
  });
});

describe('words and axis', () => {
  const groups = shiftChart(RESULT, criteriaV2, { ratedKVA: 20000 });
  const bar = (key: string) => groups.flatMap((g) => g.bars).find((b) => b.key === key)!;

  it('writes the thresholds in words (criteria set 2 numbers)', () => {
    expect(thresholdWords(bar('capacitance.CHL.shiftPercent'))).toBe('Watch from |value| 2 %, Investigate from 3 %, Critical from 5 %');
    expect(thresholdWords(bar('powerFactor.CHL.riseFromBaselinePercent'))).toBe('Watch from +50 %, Investigate from +100 %');
    expect(thresholdWords(bar('gas.H2.risePPM'))).toBe('Critical from +100 ppm');
    expect(thresholdWords(bar('dfFrequency.CHL.seriesChangePercent'))).toBe('no thresholds');
  });

  it("spans zero, the values and each bar's first threshold on the value axis", () => {
    const ppm = groups.find((g) => g.unit === 'ppm')!;
    // values 3 and 140, first thresholds 1 and 100: 0 … 140, padded by 5 % of 140 = 7
    expect(shiftAxisRange(ppm)).toEqual({ min: 0, max: 147 });
    const pf = groups.find((g) => g.id === 'power-factor|%')!;
    // 0 … 60 (PF rise; its first threshold 50 is below it; the DF series change 12 has none): pad 5 % of 60 = 3
    expect(shiftAxisRange(pf)).toEqual({ min: 0, max: 63 });
    const cap = groups.find((g) => g.id === 'capacitance|%')!;
    // −3.4 (CHL shift, first threshold −2) … 6 (CH against the sisters, first threshold +2): pad 5 % of 9.4 = 0.47
    const r = shiftAxisRange(cap);
    expect(r.min).toBeCloseTo(-3.87, 10);
    expect(r.max).toBeCloseTo(6.47, 10);
  });
});
