// The duty curve for charts: its points, limits, shots and tally against the worked values of references.md
// ("Through-fault duty": IEEE C57.109 thermal curve; K = 2·I_sc²; segment start 70 % / 50 % of I_sc, from memory).
import { describe, expect, it } from 'vitest';
import type { Fault, PriorFault, Unit } from '../../../shared/schemas/case.js';
import { ratedCurrentA } from '../../../shared/screening/through-fault.js';
import { allowedTimeS, decadeRange, dutyCurvePlotSpec, dutyCurveSeries, dutyCurveSvg, logCeil, logFloor } from '../../../shared/charts/duty-curve.js';

// references.md: Z_t 0.08, Z_s 0.02 → I_sc 10 pu, K 200 (40 MVA three-phase: category IV, system impedance counted).
const unitIV: Unit = { serial: 'T-IV', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 8, systemImpedancePercent: 2 };
// references.md: category II with Z_t 5.75 % → K 604.9 (2.5 MVA three-phase is category II).
const unitII: Unit = { serial: 'T-II', phases: 3, ratedKVA: 2500, hvKV: 33, lvKV: 11, impedancePercent: 5.75 };
// A three-phase fault on the LV side: winding per unit = line per unit (factor 1). 7 pu = 7 × the rated LV line current.
const kA = (pu: number, u: Unit) => (pu * ratedCurrentA(u.ratedKVA, u.lvKV, u.phases)) / 1000;
const fault = (u: Unit, at: string, shots: [number, number][]): Fault => ({
  occurredAt: at,
  type: 'three-phase',
  side: 'lv',
  shots: shots.map(([pu, s]) => ({ currentKA: kA(pu, u), durationS: s })),
});

describe('dutyCurveSeries', () => {
  it('carries the thermal curve points of the criteria, ascending current (references.md: 25 → 2 s … 2 → 1800 s)', () => {
    const c = dutyCurveSeries({ unit: unitIV, fault: null });
    expect(c.thermal).toEqual([
      [2, 1800],
      [3, 300],
      [4.75, 60],
      [6.3, 30],
      [11.3, 10],
      [25, 2],
    ]);
  });

  it('category IV with Z_t 0.08, Z_s 0.02: I_sc 10 pu, K 200, segment from 50 % = 5 pu (references.md)', () => {
    const c = dutyCurveSeries({ unit: unitIV, fault: null });
    expect(c.category).toBe('IV');
    expect(c.maxCurrentPerUnit).toBeCloseTo(10, 10); // references.md: I_sc 10 pu
    expect(c.mechanicalLimitI2t).toBeCloseTo(200, 10); // references.md: K 200
    expect(c.segmentStartPerUnit).toBeCloseTo(5, 10); // references.md: 50 % (III, IV) of I_sc
    const pts = c.mechanical.points;
    expect(pts[0][0]).toBeCloseTo(5, 10);
    expect(pts[0][1]).toBeCloseTo(8, 10); // computed: K/I² = 200/25 = 8 s at the segment start
    expect(pts[pts.length - 1][0]).toBeCloseTo(10, 10);
    expect(pts[pts.length - 1][1]).toBeCloseTo(2, 10); // computed: 200/100 = 2 s at I_sc
    for (const [i, t] of pts) expect(i * i * t).toBeCloseTo(200, 8); // the segment is I²t = K
    expect(c.mechanical.label).toBe('Mechanical segment: I²t = K = 200');
  });

  it('category II with Z_t 5.75 %: K 604.9, segment from 70 % of I_sc (references.md)', () => {
    const c = dutyCurveSeries({ unit: unitII, fault: null });
    expect(c.category).toBe('II');
    expect(c.mechanicalLimitI2t).toBeCloseTo(604.9, 1); // references.md: K 604.9
    expect(c.maxCurrentPerUnit).toBeCloseTo(100 / 5.75, 10); // references.md: I_sc = 1/Z_t
    expect(c.segmentStartPerUnit).toBeCloseTo(0.7 * (100 / 5.75), 10); // references.md: 70 % (II) = 12.17 pu
    expect(c.mechanical.points[0][0]).toBeCloseTo(12.174, 3);
  });

  it('category I draws the line I²t = 1250 up to 25 × rated (references.md: category I I²t = 1250)', () => {
    const c = dutyCurveSeries({ unit: { serial: 'T-I', phases: 3, ratedKVA: 300, hvKV: 11, lvKV: 0.4, impedancePercent: 4 }, fault: null });
    expect(c.category).toBe('I');
    expect(c.mechanicalLimitI2t).toBe(1250);
    const last = c.mechanical.points[c.mechanical.points.length - 1];
    expect(last[0]).toBeCloseTo(25, 10); // 100/4 = 25, the category I cap
    expect(last[1]).toBeCloseTo(2, 10); // 1250/25² = 2 s, the thermal curve's top point
    expect(c.mechanical.points[0][0]).toBe(11.3);
    expect(c.mechanical.label).toBe('Category I: I²t = 1250');
  });

  it('a shot of 7 pu for 0.5 s: I²t 24.5 = 12.25 % of K 200, allowed 4.08 s at 7 pu (references.md)', () => {
    const c = dutyCurveSeries({ unit: unitIV, fault: fault(unitIV, '2026-11-28T03:12:00Z', [[7, 0.5]]) });
    const shot = c.event!.shots[0];
    expect(shot.currentPerUnit).toBeCloseTo(7, 10);
    expect(shot.durationS).toBe(0.5);
    expect(shot.i2t).toBeCloseTo(24.5, 10); // references.md: 24.5
    expect(shot.allowedS).toBeCloseTo(4.08, 2); // references.md: 4.08 s
    expect(c.summary.eventI2t).toBeCloseTo(24.5, 10);
    expect(c.summary.eventDutyPercent).toBeCloseTo(12.25, 10); // references.md: 12.25 % of K
    expect(c.summary.unit).toBe('per-unit² · s');
    expect(c.event!.label).toBe('2026-11-28');
  });

  it('below the segment start the allowed time is the thermal curve (references.md: 4.75 pu → 60 s; 3 pu → 300 s)', () => {
    const c = dutyCurveSeries({ unit: unitIV, fault: null });
    expect(allowedTimeS(4.75, c)).toBeCloseTo(60, 8);
    expect(allowedTimeS(3, c)).toBeCloseTo(300, 8);
    expect(allowedTimeS(1.5, c)).toBe(Infinity); // below the curve's lowest point: no limit
  });

  it("adds the earlier faults' shots, labelled by date and in time order, to the cumulative tally", () => {
    const prior: PriorFault[] = [
      fault(unitIV, '2025-06-01T10:00:00Z', [[6, 0.2], [6, 0.3]]),
      fault(unitIV, '2024-02-10T08:00:00Z', [[4, 1]]),
    ];
    const c = dutyCurveSeries({ unit: unitIV, fault: fault(unitIV, '2026-11-28T03:12:00Z', [[7, 0.5]]), priorFaults: prior });
    expect(c.prior.map((p) => p.label)).toEqual(['2024-02-10', '2025-06-01']);
    // computed: 4²·1 = 16; 6²·0.2 + 6²·0.3 = 18; the event 24.5 → 58.5 = 29.25 % of K 200.
    expect(c.prior[0].i2t).toBeCloseTo(16, 10);
    expect(c.prior[1].i2t).toBeCloseTo(18, 10);
    expect(c.summary.priorI2t).toBeCloseTo(34, 10);
    expect(c.summary.cumulativeI2t).toBeCloseTo(58.5, 10);
    expect(c.summary.cumulativeDutyPercent).toBeCloseTo(29.25, 10);
  });

  it('log–log ranges cover the curves and every shot, on 1, 2, 5 × 10^n', () => {
    const c = dutyCurveSeries({ unit: unitIV, fault: fault(unitIV, '2026-11-28T03:12:00Z', [[7, 0.05]]) });
    expect(c.x).toEqual({ title: 'Current (per unit of rated)', min: 1, max: 50 }); // 25 pu × 1.1 → 50
    expect(c.y).toEqual({ title: 'Time (s)', min: 0.02, max: 2000 }); // 0.05 s × 0.9 → 0.02; 1800 s × 1.1 → 2000
    expect([logFloor(0.045), logFloor(1), logFloor(3.3), logCeil(27.5), logCeil(1980), logCeil(5)]).toEqual([0.02, 1, 2, 50, 2000, 5]);
  });
});

describe('decadeRange', () => {
  it('gives the whole decades around a range as log10 exponents (hand computed)', () => {
    expect(decadeRange(1, 50)).toEqual([0, 2]); // 1 = 10^0, 50 → 100 = 10^2
    expect(decadeRange(0.02, 2000)).toEqual([-2, 4]); // 0.02 → 0.01 = 10^-2, 2000 → 10 000 = 10^4
    expect(decadeRange(10, 10)).toEqual([1, 2]); // never an empty axis
  });
});

describe('dutyCurveSvg', () => {
  it('draws the axis titles, the curves, the shaded segment and a marker per shot', () => {
    const c = dutyCurveSeries({
      unit: unitIV,
      fault: fault(unitIV, '2026-11-28T03:12:00Z', [[7, 0.5], [6, 0.2]]),
      priorFaults: [fault(unitIV, '2025-06-01T10:00:00Z', [[6, 0.3]])],
    });
    const spec = dutyCurvePlotSpec(c);
    expect(spec.x.scale).toBe('log');
    expect(spec.y.scale).toBe('log');
    expect(spec.bands).toEqual([{ x0: 5, x1: 10, fill: '#a4582a', opacity: 0.1, label: 'Mechanical segment' }]);
    const svg = dutyCurveSvg(c);
    expect(svg).toContain('>Current (per unit of rated)</text>');
    expect(svg).toContain('>Time (s)</text>');
    expect(svg).toContain('>This fault 2026-11-28</text>');
    expect(svg).toContain('>Earlier fault 2025-06-01</text>');
    expect(svg.match(/<polygon /g)!.length).toBe(3); // two event shots + the legend's sample
    expect(svg.match(/<polyline /g)!.length).toBe(2); // thermal curve and mechanical segment
  });
});
