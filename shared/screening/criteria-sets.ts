// The built-in criteria sets: every threshold and table the engine uses, with its source, as plain data. No schema
// library here (the type comes from criteria.ts and is erased), so a client page can use the defaults without zod.
import type { Criteria } from './criteria.js';
import { INTERNAL_PROTECTIONS } from './protections.js';

const FROM_MEMORY = 'from memory';

/** Criteria set version 1: the defaults of the product brief. */
export const criteriaV1: Criteria = {
  version: 1,
  name: 'Gapsight defaults (product brief, criteria set 1)',
  rounding: {
    significantDigits: 9,
    source: 'Gapsight case format, "Rules that decide numbers": compare after rounding to 9 significant digits',
  },
  capacitance: {
    shiftBands: [
      { from: 2, level: 'watch' },
      { from: 3, level: 'investigate' },
      { from: 5, level: 'critical' },
    ],
    shiftSource:
      'no IEEE/IEC limit for winding capacitance; 3 % warning: utility practice (from memory); 5 % critical: conservative Gapsight default',
    consistencyLimitPercent: 1,
    consistencySource: 'IEEE C57.152 test terms: CHL = GST − GST-guard should match UST; 1 % tolerance: Gapsight default',
    requiredByWindings: {
      'two-winding': ['CH', 'CL', 'CHL'],
      'three-winding': ['CH', 'CL', 'CHL', 'CT', 'CHT', 'CLT'],
      auto: ['CH', 'CL', 'CHL'],
      'auto-tertiary': ['CH', 'CL', 'CHL'],
    },
    requiredSource: 'Gapsight case format: two-winding CH, CL, CHL; three-winding also CT, CHT, CLT; auto: the design record',
  },
  powerFactor: {
    temperatureFactors: [
      [10, 1.25],
      [15, 1.12],
      [20, 1.0],
      [25, 0.89],
      [30, 0.8],
      [35, 0.71],
      [40, 0.64],
      [45, 0.56],
      [50, 0.5],
      [60, 0.39],
      [70, 0.31],
    ],
    temperatureSource: 'IEEE C57.12.90-style correction table (from memory), linear interpolation',
    riseBands: [
      { from: 50, level: 'watch' },
      { from: 100, level: 'investigate' },
    ],
    riseSource: 'common practice (from memory): rise against the baseline 50 % watch, 100 % investigate',
    absoluteWatchPercent: 1,
    absoluteSource: 'common practice (from memory): PF20 above 1 % is watch at most (an aged unit is not a fault finding)',
  },
  reactance: {
    iecCategories: [
      { category: 'I', maxKVA: 2500, limitPercent: 2 },
      { category: 'II', maxKVA: 100000, limitPercent: 2 },
      { category: 'III', maxKVA: null, limitPercent: 1 },
    ],
    iecSource: `IEC 60076-5:2006 clause 4.2.7 (${FROM_MEMORY}): 2 % categories I and II, 1 % category III`,
    limitMultipleBands: [
      { from: 0.5, level: 'watch' },
      { from: 1, level: 'investigate' },
      { from: 1.5, level: 'critical' },
    ],
    spreadChangeBands: [
      { from: 1, level: 'watch' },
      { from: 2, level: 'investigate' },
    ],
    spreadSource: 'IEEE C57.152 / IEEE 62 practice (from memory): change of per-phase spread, 1 point watch, 2 points investigate',
    threePhaseTolerancePercent: 3,
    threePhaseLevel: 'watch',
    threePhaseSource: 'IEEE C57.152 practice (from memory): three-phase equivalent within ±3 % of nameplate',
    threePhaseFactor: 1 / 60,
    formulaSource: 'IEEE 62-1995 / IEEE C57.152: Z = V/I, R = P/I², X = √(Z² − R²), %X = 100·X/Z_base',
  },
  sweep: {
    bandsHz: { low: [1000, 100000], mid: [100000, 600000], high: [600000, 1000000] },
    minPoints: 5,
    maxRelativeFactor: 10,
    oneMinusRhoFloor: 1e-10,
    dlt911: {
      severeBelowLF: 0.6,
      obviousBelowLF: 1.0,
      obviousBelowMF: 0.6,
      slightBelowLF: 2.0,
      slightBelowMF: 1.0,
      normalFromHF: 0.6,
    },
    classLevels: { normal: 'ok', slight: 'watch', obvious: 'investigate', severe: 'critical' },
    openCircuitCoreRegionLevels: { normal: 'ok', slight: 'watch', obvious: 'investigate', severe: 'investigate' },
    source: 'DL/T 911 appendix: relative factor R = −log10(1 − ρ) per band and deformation classes',
    coreRegionSource: 'Gapsight rule: open-circuit low band is the core region (residual magnetism): at most investigate',
  },
  sisters: {
    modifiedZConstant: 0.6745,
    modifiedZLimit: 3.5,
    modifiedZLevel: 'investigate',
    madFloorFractionOfMedian: 0.001,
    minSistersModifiedZ: 5,
    minSistersDeviation: 3,
    modifiedZSource: 'Iglewicz & Hoaglin 1993; NIST/SEMATECH e-Handbook 1.3.5.17: |M| > 3.5',
    grubbsAlpha: 0.05,
    grubbsSource: 'Grubbs 1969, two-sided test, α = 0.05 (NIST/SEMATECH e-Handbook 1.3.5.17.1)',
    dixonQ95: { '3': 0.97, '4': 0.829, '5': 0.71, '6': 0.625, '7': 0.568, '8': 0.526, '9': 0.493, '10': 0.466 },
    dixonSource: "Dixon's Q, Rorabacher 1991, Anal. Chem. 63:139, 95 % two-sided",
    referenceCap: 'investigate',
    referenceSource: "Gapsight rule: sisters' median as reference, capped at investigate (design tolerances of a few %)",
  },
  throughFault: {
    categoriesThreePhase: [
      { category: 'I', maxKVA: 500 },
      { category: 'II', maxKVA: 5000 },
      { category: 'III', maxKVA: 30000 },
      { category: 'IV', maxKVA: null },
    ],
    categoriesSinglePhase: [
      { category: 'I', maxKVA: 500 },
      { category: 'II', maxKVA: 1667 },
      { category: 'III', maxKVA: 10000 },
      { category: 'IV', maxKVA: null },
    ],
    categorySource: 'IEEE C57.12.00 / C57.109 categories by kVA (upper-inclusive)',
    categoryIMaxPerUnit: 25,
    categoryIMechanicalI2t: 1250,
    categoryISource: 'IEEE C57.109 category I curve ends at 25 × rated for 2 s (from memory): I²t 1250',
    thermalLimitI2t: 1250,
    mechanicalFactor: 2,
    segmentStartFraction: { II: 0.7, III: 0.5, IV: 0.5 },
    systemImpedanceCategories: ['III', 'IV'],
    thermalCurve: [
      [25, 2],
      [11.3, 10],
      [6.3, 30],
      [4.75, 60],
      [3, 300],
      [2, 1800],
    ],
    curveSource: 'IEEE C57.109 through-fault curves (Patterson & Price on C57.109-1993): K = 2·I_sc², thermal curve points',
    frequentFaultCounts: { II: 10, III: 5, IV: null },
    frequentFaultLevel: 'watch',
    frequentFaultSource: 'IEEE C57.109 frequent-fault duty: more than 10 (category II) / 5 (category III) faults',
    beyondCurveLevel: 'investigate',
    overMaxCurrentLevel: 'watch',
    tallySource: 'Gapsight tally: cumulative I²t (IEEE C57.109 gives no consumption formula)',
  },
  gas: {
    acetyleneRiseBands: [
      { from: 1, level: 'investigate' },
      { from: 5, level: 'critical' },
    ],
    acetylenePresentPPM: 0,
    hydrogenRiseWithAcetylenePPM: 100,
    hydrogenWithAcetyleneLevel: 'critical',
    source: 'common practice (from memory): acetylene rise 1 ppm investigate, 5 ppm (or with H2 rise 100 ppm) critical',
    duval: {
      pdMinCH4: 98,
      d1MaxC2H4: 23,
      d1MinC2H2: 13,
      d2MinC2H2: 13,
      d2MinC2H4: 23,
      d2MaxC2H4: 40,
      d2HighMinC2H2: 29,
      d2HighMinC2H4: 40,
      t1MaxC2H2: 4,
      t1MaxC2H4: 20,
      t2MaxC2H2: 4,
      t2MaxC2H4: 50,
      t3MaxC2H2: 15,
      t3MinC2H4: 50,
    },
    duvalSource: 'Duval triangle 1, IEC 60599 annex (from memory)',
  },
  excitation: {
    changeBands: [{ from: 10, level: 'investigate' }],
    changeSource: 'IEEE C57.152 practice (from memory): change against baseline 10 % investigate',
    outerSplitMA: 50,
    outerLimitBelowSplitPercent: 10,
    outerLimitFromSplitPercent: 5,
    outerLevel: 'watch',
    outerSource: 'IEEE C57.152 practice (from memory): outer phases within 10 % (< 50 mA) or 5 % (≥ 50 mA)',
  },
  resistance: {
    referenceTemperatureC: 75,
    temperatureConstantC: { Cu: 234.5, Al: 225 },
    correctionSource: 'IEEE C57.12.90: R_s = R_m·(T_s + T_k)/(T_m + T_k), T_k 234.5 Cu / 225 Al',
    changeBands: [{ from: 2, level: 'investigate' }],
    changeSource: 'common practice (from memory): 2 % change against baseline investigate',
    imbalanceBands: [{ from: 2, level: 'watch' }],
    imbalanceAboveKVA: 1600,
    imbalanceSource: 'common practice (from memory): phase imbalance 2 % for units above 1.6 MVA',
  },
  ratio: {
    changeBands: [{ from: 0.1, level: 'investigate' }],
    changeSource: 'common practice (from memory): 0.1 % ≈ one shorted turn of an HV winding',
    nameplateBands: [{ from: 0.5, level: 'watch' }],
    nameplateSource: 'IEEE C57.12.00: turns ratio within ±0.5 % of nameplate',
  },
  dfFrequency: {
    minPoints: 4,
    conductiveRiseBands: [{ from: 50, level: 'watch' }],
    maxLevel: 'watch',
    source: 'common practice: DF(f) = A/f + B·f + C least squares; rising A/f points to moisture or contamination (informative)',
  },
  verdict: {
    internalProtections: [...INTERNAL_PROTECTIONS],
    internalSource: 'Gapsight case format: an internal protection operated → investigate as an internal fault',
    independentMethods: ['capacitance', 'reactance', 'sweep', 'excitation', 'resistance', 'ratio', 'gas'],
    sameTestAs: { 'power-factor': 'capacitance' },
    corroborationMinMethods: 2,
    corroborationSource: 'Gapsight case format: two or more independent methods at watch or above raise one step',
  },
};

/**
 * Criteria set version 2 (rules revision 2): version 1 plus auto-transformer defaults, the power-factor repeatability
 * floor and temperature doubt, the resistance cooling time, per-phase reactance against the phases' mean, the fixed
 * sweep grid, bushings, plausibility and remanence. Published by a migration: never change it once landed.
 */
export const criteriaV2: Criteria = {
  ...criteriaV1,
  version: 2,
  name: 'Gapsight defaults, rules revision 2 (criteria set 2)',
  capacitance: {
    ...criteriaV1.capacitance,
    requiredByWindings: {
      'two-winding': ['CH', 'CL', 'CHL'],
      'three-winding': ['CH', 'CL', 'CT', 'CHL', 'CHT', 'CLT'],
      auto: ['CH'],
      'auto-tertiary': ['CH', 'CT', 'CHT'],
    },
    requiredSource:
      'Gapsight case format (revision 2): two-winding CH, CL, CHL; three-winding CH, CL, CT, CHL, CHT, CLT; auto CH; auto-tertiary CH, CT, CHT (series and common windings are one circuit)',
  },
  powerFactor: {
    ...criteriaV1.powerFactor,
    minRisePoints: 0.1,
    minRiseSource: 'common practice (from memory): a PF20 change below 0.1 percentage point is within test repeatability',
    temperatureDoubtC: 10,
    temperatureDoubtSource:
      'common practice (from memory): one generic correction curve cannot stand for every insulation system; sets more than 10 °C apart are compared with low confidence',
  },
  reactance: {
    ...criteriaV1.reactance,
    phaseAverageTolerancePercent: 3,
    phaseAverageSource: 'IEEE C57.152 / IEEE 62 practice (from memory): per-phase values within ±3 % of their average',
  },
  sweep: {
    ...criteriaV1.sweep,
    grid: {
      fromHz: 1000,
      toHz: 1000000,
      stepHz: 1000,
      source: 'DL/T 911 thresholds assume a linear sweep about 1 kHz apart (from memory): fixed grid 1, 2, … 1000 kHz',
    },
    phaseComparisonCap: 'investigate',
    phaseComparisonSource: 'Gapsight rule: phases A and C of one winding compared over the mid and high bands (no baseline trace), capped at investigate',
  },
  resistance: {
    ...criteriaV1.resistance,
    minHoursDeEnergised: 4,
    hoursSource: "common practice (from memory): after 4 h de-energised the windings have cooled to the oil's temperature",
  },
  bushing: {
    c1ShiftBands: [
      { from: 5, level: 'investigate' },
      { from: 10, level: 'critical' },
    ],
    c1ShiftSource: 'IEEE 62-1995 lineage: C1 change < 5 % acceptable, 5–10 % investigate; above 10 % dangerous (common practice)',
    hvShareOfCH: 0.5,
    hvShareSource: 'Gapsight rule: HV bushings whose C1 changes add up to at least half of the CH change explain it',
  },
  plausibility: {
    maxFactor: 1.5,
    ratioMaxPercent: 10,
    source: 'Gapsight rule: a reading 1.5 × (or 1/1.5 ×) its reference, or a ratio 10 % off, is a unit or connection error, not a deformation',
  },
  remanence: {
    allPhasesChangePercent: 10,
    source: 'common practice (from memory): a trip or a DC test leaves the core magnetised; all phases moving the same way points to remanence',
  },
  stateCap: 'watch',
  lowConfidenceCap: 'watch',
};

/** Criteria sets the engine knows by heart, by version (the database holds the published copies). */
export const BUILT_IN_CRITERIA: readonly Criteria[] = [criteriaV1, criteriaV2];

/** Rules revision the engine implements (result field `engineRevision`). */
export const ENGINE_REVISION = 2;
