// Each formula of the engine against a published or computed check value; the source is named beside each value.
import { describe, expect, it } from 'vitest';
import {
  correctResistance,
  criteriaV1,
  dissipationFromPowerFactor,
  duvalTriangle1Zone,
  ieeeCategory,
  iecReactanceCategory,
  levelFromBands,
  mechanicalLimitI2t,
  maxCurrentPerUnit,
  perPhaseReactance,
  phaseImbalancePercent,
  powerFactorFromDissipation,
  ratedCurrentA,
  ratioDeviationPercent,
  segmentStartPerUnit,
  temperatureFactor,
  threePhaseEquivalentPercent,
  zBaseOhm,
  capacitanceConsistencyPercent,
  roundSignificant,
  fitDissipationOverFrequency,
} from '../../shared/screening/index.js';
import type { Unit } from '../../shared/schemas/case.js';

describe('leakage reactance (IEEE 62-1995 / IEEE C57.152)', () => {
  it('computes the wye-equivalent impedance base of 50 MVA at 138 kV as 380.88 Ω', () => {
    expect(zBaseOhm(138, 50000)).toBeCloseTo(380.88, 2); // computed from IEEE 62-1995 Z_base = kV²·1000/kVA (references.md)
  });

  it('derives Z, R, X and %X of a per-phase test of 240 V, 6.30 A, 7.5 W', () => {
    const r = perPhaseReactance(240, 6.3, 7.5, zBaseOhm(138, 50000));
    expect(r.zOhm).toBeCloseTo(38.0952, 4); // computed from IEEE 62-1995 Z = V/I (references.md)
    expect(r.rOhm).toBeCloseTo(0.18896, 5); // computed from IEEE 62-1995 R = P/I² (references.md)
    expect(r.xOhm).toBeCloseTo(38.0948, 4); // computed from IEEE 62-1995 X = √(Z² − R²) (references.md)
    expect(r.percentX).toBeCloseTo(10.0018, 4); // computed from IEEE 62-1995 %X = 100·X/Z_base (references.md)
  });

  it('gives a three-phase equivalent of 8 % for 10 MVA, 33 kV at 5 A with 87.12 V on each pair', () => {
    expect(threePhaseEquivalentPercent(87.12, 87.12, 87.12, 5, 10000, 33)).toBeCloseTo(8, 6); // computed from IEEE 62-1995 / C57.152 (1/60)·ΣE/I·kVA/kV² (references.md)
  });

  it('uses the IEC 60076-5 category for the reactance limit at every bound', () => {
    // IEC 60076-5:2006 clause 4.2.7 and categories, from memory (references.md): I ≤ 2 500, II ≤ 100 000, III above
    expect(iecReactanceCategory(2500, criteriaV1)).toEqual({ category: 'I', limitPercent: 2 });
    expect(iecReactanceCategory(2501, criteriaV1)).toEqual({ category: 'II', limitPercent: 2 });
    expect(iecReactanceCategory(100000, criteriaV1)).toEqual({ category: 'II', limitPercent: 2 });
    expect(iecReactanceCategory(100001, criteriaV1)).toEqual({ category: 'III', limitPercent: 1 });
  });
});

describe('capacitance and power factor', () => {
  it('turns DF 10 % into PF 9.9504 % and DF 1 % into PF 0.99995 % (on fractions)', () => {
    expect(100 * powerFactorFromDissipation(0.1)).toBeCloseTo(9.9504, 4); // computed from PF = DF/√(1 + DF²) (references.md)
    expect(100 * powerFactorFromDissipation(0.01)).toBeCloseTo(0.99995, 5); // computed from PF = DF/√(1 + DF²) (references.md)
  });

  it('turns PF 60 % into DF 75 % and PF 9.9504 % back into DF 10 % (on fractions)', () => {
    expect(dissipationFromPowerFactor(0.6)).toBeCloseTo(0.75, 12); // computed by hand from DF = PF/√(1 − PF²): 0.6/0.8 (references.md)
    expect(dissipationFromPowerFactor(0.0995037190)).toBeCloseTo(0.1, 9); // computed by hand: PF of DF 10 % is 0.1/√1.01 (references.md)
  });

  it('reads every point of the temperature table exactly', () => {
    // IEEE C57.12.90-style table, from memory (references.md / brief)
    const table: Array<[number, number]> = [[10, 1.25], [15, 1.12], [20, 1.0], [25, 0.89], [30, 0.8], [35, 0.71], [40, 0.64], [45, 0.56], [50, 0.5], [60, 0.39], [70, 0.31]];
    for (const [t, f] of table) expect(temperatureFactor(t, criteriaV1)).toBeCloseTo(f, 12);
  });

  it('interpolates linearly between table points and gives null outside 10–70 °C (ends inclusive)', () => {
    expect(temperatureFactor(27.5, criteriaV1)).toBeCloseTo(0.845, 12); // computed: midway between 25 °C 0.89 and 30 °C 0.80
    expect(temperatureFactor(55, criteriaV1)).toBeCloseTo(0.445, 12); // computed: midway between 50 °C 0.50 and 60 °C 0.39
    expect(temperatureFactor(9.99, criteriaV1)).toBeNull();
    expect(temperatureFactor(70.01, criteriaV1)).toBeNull();
  });

  it('computes the GST/UST consistency as 100·((GST − GST-guard) − UST)/UST', () => {
    expect(capacitanceConsistencyPercent(8536, 3131, 5405)).toBe(0); // IEEE C57.152 test terms: CHL = GST − GST-guard (case-format example)
    expect(capacitanceConsistencyPercent(8600, 3100, 5445)).toBeCloseTo(1.01010101, 6); // computed: (5500 − 5445)/5445
  });
});

describe('through-fault categories and curve (IEEE C57.12.00 / C57.109)', () => {
  it('puts three-phase units in categories I–IV with upper-inclusive bounds', () => {
    // IEEE C57.12.00 categories (references.md): I 15–500, II 501–5000, III 5001–30000, IV above; below 15 counts as I
    const cases: Array<[number, string]> = [[10, 'I'], [15, 'I'], [500, 'I'], [501, 'II'], [5000, 'II'], [5001, 'III'], [30000, 'III'], [30001, 'IV']];
    for (const [kva, cat] of cases) expect(ieeeCategory(kva, 3, criteriaV1)).toBe(cat);
  });

  it('puts single-phase units in categories I–IV with upper-inclusive bounds', () => {
    // IEEE C57.12.00 categories (references.md): I 5–500, II 501–1667, III 1668–10000, IV above; below 5 counts as I
    const cases: Array<[number, string]> = [[3, 'I'], [500, 'I'], [501, 'II'], [1667, 'II'], [1668, 'III'], [10000, 'III'], [10001, 'IV']];
    for (const [kva, cat] of cases) expect(ieeeCategory(kva, 1, criteriaV1)).toBe(cat);
  });

  it('gives 100.41 A as the base current of 20 MVA at 115 kV', () => {
    expect(ratedCurrentA(20000, 115, 3)).toBeCloseTo(100.41, 2); // computed from kVA/(√3·kV) (references.md, Patterson & Price)
  });

  it('gives 699.819 A for 40 000 kVA at 33 kV (the case-format example)', () => {
    expect(ratedCurrentA(40000, 33, 3)).toBeCloseTo(699.819, 3); // computed from kVA/(√3·kV) (case-format.md example)
  });

  it('uses kVA/kV for single-phase units', () => {
    expect(ratedCurrentA(500, 7.2, 1)).toBeCloseTo(69.4444, 4); // computed from kVA/kV (case-format.md)
  });

  it('gives I_sc 10 pu, K 200 and segment start 5 pu for Z_t 8 %, Z_s 2 % (category IV)', () => {
    const unit: Unit = { serial: 'X', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 8, systemImpedancePercent: 2 };
    const max = maxCurrentPerUnit(unit, 'IV', criteriaV1);
    expect(max).toBeCloseTo(10, 12); // computed from IEEE C57.109 I_sc = 1/(Z_t + Z_s) (references.md)
    expect(mechanicalLimitI2t(max, 'IV', criteriaV1)).toBeCloseTo(200, 10); // computed from IEEE C57.109 K = 2·I_sc² (references.md)
    expect(segmentStartPerUnit(max, 'IV', criteriaV1)).toBeCloseTo(5, 12); // IEEE C57.109 segment from 50 % of I_sc, from memory (references.md)
  });

  it('gives K 604.9 and a segment start at 70 % of I_sc for category II with Z_t 5.75 %', () => {
    const unit: Unit = { serial: 'X', phases: 3, ratedKVA: 2500, hvKV: 13.8, lvKV: 0.48, impedancePercent: 5.75, systemImpedancePercent: 3 };
    const max = maxCurrentPerUnit(unit, 'II', criteriaV1);
    expect(max).toBeCloseTo(17.3913, 4); // computed: categories II use Z_t alone, 1/0.0575 (IEEE C57.109, references.md)
    expect(mechanicalLimitI2t(max, 'II', criteriaV1)).toBeCloseTo(604.9, 1); // computed from IEEE C57.109 K = 2·I_sc² (references.md)
    expect(segmentStartPerUnit(max, 'II', criteriaV1)).toBeCloseTo(12.1739, 3); // computed: 70 % of 17.3913 (IEEE C57.109 segment from 70 %, references.md)
  });

  it('caps category I at 25 × rated with a mechanical limit of 1250 and no mechanical segment', () => {
    const unit: Unit = { serial: 'X', phases: 3, ratedKVA: 300, hvKV: 13.8, lvKV: 0.48, impedancePercent: 2 };
    const max = maxCurrentPerUnit(unit, 'I', criteriaV1);
    expect(max).toBe(25); // from memory: the category I curve ends at 25 × rated for 2 s (case-format.md)
    expect(mechanicalLimitI2t(max, 'I', criteriaV1)).toBe(1250); // IEEE C57.109 category I I²t = 1250 (references.md)
    expect(segmentStartPerUnit(max, 'I', criteriaV1)).toBe(25);
  });
});

describe('other post-fault tests', () => {
  it('corrects 0.3215 Ω at 30 °C to 0.3762 Ω at 75 °C for copper', () => {
    expect(correctResistance(0.3215, 30, 75, 234.5)).toBeCloseTo(0.3762, 4); // computed from IEEE C57.12.90 R_s = R_m·(T_s + T_k)/(T_m + T_k) (references.md)
  });

  it('uses T_k 225 for aluminium', () => {
    expect(correctResistance(1, 25, 75, 225)).toBeCloseTo(300 / 250, 12); // computed from the same formula with T_k 225 (references.md)
  });

  it('computes phase imbalance as (max − min)/mean', () => {
    expect(phaseImbalancePercent([0.4, 0.41, 0.405])).toBeCloseTo(2.4691358, 6); // computed: 0.01/0.405 (references.md formula)
  });

  it('gives +0.38 % for a measured ratio of 8.3650 against 115/13.8', () => {
    expect(ratioDeviationPercent(8.365, 115 / 13.8)).toBeCloseTo(0.38, 2); // computed: 100·(8.365 − 8.3333)/8.3333, IEEE C57.12.00 ±0.5 % rule's deviation (references.md)
  });

  it('places the six Duval triangle 1 check vectors in their zones', () => {
    // Duval triangle 1, IEC 60599 annex, from memory; computed vectors (ppm CH4, C2H4, C2H2 → zone) from references.md
    expect(duvalTriangle1Zone(100, 200, 10, criteriaV1)).toBe('T3');
    expect(duvalTriangle1Zone(10, 10, 80, criteriaV1)).toBe('D1');
    expect(duvalTriangle1Zone(20, 30, 50, criteriaV1)).toBe('D2');
    expect(duvalTriangle1Zone(60, 30, 10, criteriaV1)).toBe('DT');
    expect(duvalTriangle1Zone(90, 8, 2, criteriaV1)).toBe('T1');
    expect(duvalTriangle1Zone(60, 38, 2, criteriaV1)).toBe('T2');
  });

  it('places pure methane in PD and gives no zone without gas', () => {
    expect(duvalTriangle1Zone(99, 1, 0, criteriaV1)).toBe('PD'); // Duval triangle 1: PD CH4 ≥ 98 % (references.md, from memory)
    expect(duvalTriangle1Zone(0, 0, 0, criteriaV1)).toBeNull();
  });

  it('recovers A, B and C of DF(f) = A/f + B·f + C from exact data', () => {
    // computed: points generated from A 3, B 0.0004, C 0.2 (common practice model, brief indicator 12)
    const pts: Array<[number, number]> = [15, 30, 60, 120, 250, 400].map((f) => [f, 3 / f + 0.0004 * f + 0.2]);
    const fit = fitDissipationOverFrequency(pts)!;
    expect(fit.a).toBeCloseTo(3, 9);
    expect(fit.b).toBeCloseTo(0.0004, 12);
    expect(fit.c).toBeCloseTo(0.2, 9);
    expect(fit.rSquared).toBeCloseTo(1, 12);
  });
});

describe('levels', () => {
  it('counts +3 % computed as 2.999999999999997 as 3 (rounding to 9 significant digits; lower ends inclusive)', () => {
    const bands = criteriaV1.capacitance.shiftBands;
    expect(roundSignificant(2.999999999999997, 9)).toBe(3);
    expect(levelFromBands(2.999999999999997, bands, 9)).toBe('investigate'); // case-format "Rules that decide numbers"
    expect(levelFromBands(3, bands, 9)).toBe('investigate');
    expect(levelFromBands(2.9999, bands, 9)).toBe('watch');
    expect(levelFromBands(1.99, bands, 9)).toBe('ok');
    expect(levelFromBands(5, bands, 9)).toBe('critical');
  });
});
