// Through-fault duty: the case-format example, the C57.109 check values, beyondCurve, frequent faults, I²t property.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Fault, Unit } from '../../shared/schemas/case.js';
import { computeThroughFault, criteriaV1, dutyIndicators, mechanicalTimeS, thermalCurveTimeS } from '../../shared/screening/index.js';

const UNIT_40: Unit = { serial: 'KVP-HX-T2', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5, systemImpedancePercent: 0 };
const fault = (shots: Array<[number, number]>, side: 'hv' | 'lv' = 'lv'): Fault => ({
  occurredAt: '2026-11-28T03:12:00Z',
  type: 'three-phase',
  side,
  shots: shots.map(([currentKA, durationS]) => ({ currentKA, durationS })),
});

describe('computeThroughFault', () => {
  it('reproduces every field of the case-format example', () => {
    const tf = computeThroughFault(UNIT_40, fault([[6.3, 0.12], [6.1, 0.08]]), [
      { occurredAt: '2024-02-11T18:40:00Z', type: 'phase-to-ground', side: 'lv', shots: [{ currentKA: 3.9, durationS: 0.25 }] },
    ])!;
    // values of the case-format.md result example (computed from IEEE C57.109 / C57.12.00 formulas)
    expect(tf.category).toBe('IV');
    expect(tf.ratedCurrentA).toBeCloseTo(699.819, 3);
    expect(tf.currentPerUnit).toBeCloseTo(9.0023, 4);
    expect(tf.maxCurrentPerUnit).toBeCloseTo(9.5238, 4);
    expect(tf.forceRatioPercent).toBeCloseTo(89.35, 2);
    expect(tf.segmentStartPerUnit).toBeCloseTo(4.7619, 4);
    expect(tf.highDuty).toBe(true);
    expect(tf.i2t).toBeCloseTo(15.803, 3);
    expect(tf.thermalLimitI2t).toBe(1250);
    expect(tf.mechanicalLimitI2t).toBeCloseTo(181.41, 2);
    expect(tf.eventDutyPercent).toBeCloseTo(8.71, 2);
    expect(tf.beyondCurve).toBe(false);
    expect(tf.cumulativeI2t).toBeCloseTo(23.568, 3);
    expect(tf.cumulativeDutyPercent).toBeCloseTo(12.99, 2);
    expect(tf.shotsAboveSegment).toBe(3);
    expect(tf.windingCurrentFactor).toBe(1);
    expect(tf.currentBasis).toBe('line-converted');
    expect(tf.thermalDurationPercent).toBeNull();
  });

  it('gives I²t 24.5 = 12.25 % of K 200 and an allowed time of 4.08 s for 7 pu for 0.5 s (Z_t 8 %, Z_s 2 %)', () => {
    const unit: Unit = { ...UNIT_40, impedancePercent: 8, systemImpedancePercent: 2 };
    const ratedHv = 40000 / (Math.sqrt(3) * 132);
    const tf = computeThroughFault(unit, fault([[(7 * ratedHv) / 1000, 0.5]], 'hv'))!;
    expect(tf.i2t).toBeCloseTo(24.5, 9); // computed from IEEE C57.109 (references.md)
    expect(tf.eventDutyPercent).toBeCloseTo(12.25, 9); // computed (references.md)
    expect(mechanicalTimeS(7, tf.mechanicalLimitI2t)).toBeCloseTo(4.08, 2); // computed from K/I² (references.md)
    expect(tf.beyondCurve).toBe(false);
  });

  it('is null without a fault or without shots', () => {
    expect(computeThroughFault(UNIT_40, undefined)).toBeNull();
    expect(computeThroughFault(UNIT_40, fault([]))).toBeNull();
  });

  it('measures each prior fault on its own side', () => {
    const tf = computeThroughFault(UNIT_40, fault([[1, 0.1]]), [
      { occurredAt: '2024-01-01T00:00:00Z', type: 'three-phase', side: 'hv', shots: [{ currentKA: 1, durationS: 0.1 }] },
    ])!;
    const puHv = 1000 / (40000 / (Math.sqrt(3) * 132));
    expect(tf.cumulativeI2t - tf.i2t).toBeCloseTo(puHv * puHv * 0.1, 9); // computed: per unit on the HV base
  });

  it('flags beyondCurve on the mechanical segment when I²t exceeds K', () => {
    const tf = computeThroughFault(UNIT_40, fault([[6.3, 2.5]]))!;
    expect(tf.highDuty).toBe(true);
    expect(tf.beyondCurve).toBe(true);
    expect(dutyIndicators(tf, criteriaV1).find((i) => i.key === 'duty.eventDutyPercent')!.level).toBe('investigate');
  });

  it('flags beyondCurve below the segment when the total duration exceeds the thermal curve time', () => {
    // 4 × rated lies between the curve points 3 × (300 s) and 4.75 × (60 s): log–log interpolation gives
    // t = 300·(4/3)^(ln(60/300)/ln(4.75/3)) = 109.5 s (computed by hand from the IEEE C57.109 points, references.md)
    const kA = (4 * 699.8185) / 1000;
    expect(computeThroughFault(UNIT_40, fault([[kA, 56], [kA, 56]]))!.beyondCurve).toBe(true); // 112 s > 109.5 s
    expect(computeThroughFault(UNIT_40, fault([[kA, 54], [kA, 54]]))!.beyondCurve).toBe(false); // 108 s < 109.5 s
  });

  it('interpolates the thermal curve at 4 × rated to 109.5 s', () => {
    expect(thermalCurveTimeS(4, criteriaV1)).toBeCloseTo(109.5, 1); // computed by hand as above (references.md)
  });

  it('flags a current above the design maximum as watch (check the impedances)', () => {
    const tf = computeThroughFault(UNIT_40, fault([[7.2, 0.1]]))!;
    // computed: 7.2 kA/699.819 A = 10.288 pu; (10.288/9.5238)² = 116.7 % of the design force (case-format.md formulas)
    expect(tf.forceRatioPercent).toBeCloseTo(116.7, 1);
    const ind = dutyIndicators(tf, criteriaV1).find((i) => i.key === 'duty.forceRatioPercent')!;
    expect(ind.level).toBe('watch');
    expect(ind.note).toMatch(/check the impedances/);
  });
});

describe('thermal curve (IEEE C57.109)', () => {
  it('returns every published point', () => {
    // IEEE C57.109 thermal curve points (references.md, Patterson & Price)
    for (const [i, t] of [[25, 2], [11.3, 10], [6.3, 30], [4.75, 60], [3, 300], [2, 1800]]) expect(thermalCurveTimeS(i, criteriaV1)).toBeCloseTo(t, 9);
  });
  it('interpolates log–log between points and has no limit below 2 × rated', () => {
    const mid = Math.sqrt(3 * 4.75);
    expect(thermalCurveTimeS(mid, criteriaV1)).toBeCloseTo(Math.sqrt(300 * 60), 6); // computed: geometric midpoint on a log–log line
    expect(thermalCurveTimeS(1.5, criteriaV1)).toBe(Infinity);
  });
});

describe('frequent-fault duty', () => {
  const unitII: Unit = { serial: 'II', phases: 3, ratedKVA: 2500, hvKV: 13.8, lvKV: 0.48, impedancePercent: 5.75 };
  const ratedLv = 2500 / (Math.sqrt(3) * 0.48);
  const shot = (pu: number) => ({ currentKA: (pu * ratedLv) / 1000, durationS: 0.05 });
  const priors = (n: number) => Array.from({ length: n }, (_, k) => ({ occurredAt: `2020-01-${String(k + 1).padStart(2, '0')}T00:00:00Z`, type: 'three-phase' as const, side: 'lv' as const, shots: [shot(13)] }));

  it('is watch above 10 shots at or above the segment start for category II, ok at 10', () => {
    const at10 = computeThroughFault(unitII, { ...fault([]), shots: [shot(13)] }, priors(9))!;
    expect(at10.shotsAboveSegment).toBe(10);
    expect(dutyIndicators(at10, criteriaV1).find((i) => i.key === 'duty.shotsAboveSegment')!.level).toBe('ok');
    const at11 = computeThroughFault(unitII, { ...fault([]), shots: [shot(13)] }, priors(10))!;
    expect(dutyIndicators(at11, criteriaV1).find((i) => i.key === 'duty.shotsAboveSegment')!.level).toBe('watch');
  });

  it('has no count rule for category IV', () => {
    const tf = computeThroughFault(UNIT_40, fault([[6, 0.05]]), Array.from({ length: 20 }, () => ({ occurredAt: '2020-01-01T00:00:00Z', type: 'three-phase' as const, side: 'lv' as const, shots: [{ currentKA: 6, durationS: 0.05 }] })))!;
    expect(tf.shotsAboveSegment).toBe(21);
    expect(dutyIndicators(tf, criteriaV1).find((i) => i.key === 'duty.shotsAboveSegment')!.level).toBe('ok');
  });
});

describe('I²t property', () => {
  it('never lowers I²t when a shot is added', () => {
    const shotArb = fc.record({ currentKA: fc.double({ min: 0.01, max: 30, noNaN: true }), durationS: fc.double({ min: 0.001, max: 5, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(shotArb, { minLength: 1, maxLength: 6 }), shotArb, (shots, extra) => {
        const before = computeThroughFault(UNIT_40, { ...fault([]), shots })!;
        const after = computeThroughFault(UNIT_40, { ...fault([]), shots: [...shots, extra] })!;
        expect(after.i2t).toBeGreaterThanOrEqual(before.i2t);
        expect(after.cumulativeI2t).toBeGreaterThanOrEqual(before.cumulativeI2t);
      }),
    );
  });
});
