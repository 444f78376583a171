// Criteria set: every threshold and table the engine uses, with its source. Plain JSON (stored in a database column).
import { z } from 'zod';
import { levelSchema, methodSchema } from '../schemas/result.js';

/** A band starts at `from` (inclusive, after rounding to the criteria's significant digits) and carries `level`. */
const bandSchema = z.object({ from: z.number(), level: levelSchema });
const bandsSchema = z.array(bandSchema);
const source = () => z.string().min(1);
const curvePointSchema = z.tuple([z.number().positive(), z.number().positive()]);

export const criteriaSchema = z.object({
  version: z.number().int().positive(),
  name: z.string(),
  rounding: z.object({ significantDigits: z.number().int().min(1).max(17), source: source() }),
  capacitance: z.object({
    shiftBands: bandsSchema,
    shiftSource: source(),
    consistencyLimitPercent: z.number().positive(),
    consistencySource: source(),
    requiredByWindings: z.object({
      'two-winding': z.array(z.string()),
      'three-winding': z.array(z.string()),
      auto: z.array(z.string()),
      'auto-tertiary': z.array(z.string()),
    }),
    requiredSource: source(),
  }),
  powerFactor: z.object({
    temperatureFactors: z.array(z.tuple([z.number(), z.number().positive()])).min(2),
    temperatureSource: source(),
    riseBands: bandsSchema,
    riseSource: source(),
    absoluteWatchPercent: z.number().positive(),
    absoluteSource: source(),
    /** Revision 2: a PF20 rise below this many percentage points is within repeatability (ok). */
    minRisePoints: z.number().nonnegative().optional(),
    minRiseSource: source().optional(),
    /** Revision 2: insulation temperatures further apart than this make the rise low-confidence (at most watch). */
    temperatureDoubtC: z.number().positive().optional(),
    temperatureDoubtSource: source().optional(),
  }),
  reactance: z.object({
    iecCategories: z.array(
      z.object({ category: z.string(), maxKVA: z.number().positive().nullable(), limitPercent: z.number().positive() }),
    ),
    iecSource: source(),
    /** Level bands as multiples of the IEC limit L. */
    limitMultipleBands: bandsSchema,
    spreadChangeBands: bandsSchema,
    spreadSource: source(),
    threePhaseTolerancePercent: z.number().positive(),
    threePhaseLevel: levelSchema,
    threePhaseSource: source(),
    threePhaseFactor: z.number().positive(),
    formulaSource: source(),
    /** Revision 2: per-phase %X more than this from the phases' mean → watch (state). */
    phaseAverageTolerancePercent: z.number().positive().optional(),
    phaseAverageSource: source().optional(),
  }),
  sweep: z.object({
    bandsHz: z.object({
      low: z.tuple([z.number(), z.number()]),
      mid: z.tuple([z.number(), z.number()]),
      high: z.tuple([z.number(), z.number()]),
    }),
    minPoints: z.number().int().min(2),
    maxRelativeFactor: z.number().positive(),
    oneMinusRhoFloor: z.number().positive(),
    dlt911: z.object({
      severeBelowLF: z.number(),
      obviousBelowLF: z.number(),
      obviousBelowMF: z.number(),
      slightBelowLF: z.number(),
      slightBelowMF: z.number(),
      normalFromHF: z.number(),
    }),
    classLevels: z.object({ normal: levelSchema, slight: levelSchema, obvious: levelSchema, severe: levelSchema }),
    openCircuitCoreRegionLevels: z.object({
      normal: levelSchema,
      slight: levelSchema,
      obvious: levelSchema,
      severe: levelSchema,
    }),
    source: source(),
    coreRegionSource: source(),
    /** Revision 2: the fixed linear grid (Hz) both traces are interpolated onto. */
    grid: z.object({ fromHz: z.number().positive(), toHz: z.number().positive(), stepHz: z.number().positive(), source: source() }).optional(),
    /** Revision 2: A–C phase comparison (no baseline trace) is judged on these bands only, capped at this level. */
    phaseComparisonCap: levelSchema.optional(),
    phaseComparisonSource: source().optional(),
  }),
  sisters: z.object({
    modifiedZConstant: z.number().positive(),
    modifiedZLimit: z.number().positive(),
    modifiedZLevel: levelSchema,
    madFloorFractionOfMedian: z.number().nonnegative(),
    minSistersModifiedZ: z.number().int().min(1),
    minSistersDeviation: z.number().int().min(1),
    modifiedZSource: source(),
    grubbsAlpha: z.number().positive().lt(1),
    grubbsSource: source(),
    dixonQ95: z.record(z.string(), z.number().positive()),
    dixonSource: source(),
    referenceCap: levelSchema,
    referenceSource: source(),
  }),
  throughFault: z.object({
    categoriesThreePhase: z.array(z.object({ category: z.enum(['I', 'II', 'III', 'IV']), maxKVA: z.number().nullable() })),
    categoriesSinglePhase: z.array(z.object({ category: z.enum(['I', 'II', 'III', 'IV']), maxKVA: z.number().nullable() })),
    categorySource: source(),
    categoryIMaxPerUnit: z.number().positive(),
    categoryIMechanicalI2t: z.number().positive(),
    categoryISource: source(),
    thermalLimitI2t: z.number().positive(),
    mechanicalFactor: z.number().positive(),
    segmentStartFraction: z.object({ II: z.number(), III: z.number(), IV: z.number() }),
    systemImpedanceCategories: z.array(z.enum(['I', 'II', 'III', 'IV'])),
    thermalCurve: z.array(curvePointSchema).min(2),
    curveSource: source(),
    frequentFaultCounts: z.object({ II: z.number().int().nullable(), III: z.number().int().nullable(), IV: z.number().int().nullable() }),
    frequentFaultLevel: levelSchema,
    frequentFaultSource: source(),
    beyondCurveLevel: levelSchema,
    overMaxCurrentLevel: levelSchema,
    tallySource: source(),
  }),
  gas: z.object({
    acetyleneRiseBands: bandsSchema,
    acetylenePresentPPM: z.number().nonnegative(),
    hydrogenRiseWithAcetylenePPM: z.number().positive(),
    hydrogenWithAcetyleneLevel: levelSchema,
    source: source(),
    duval: z.object({
      pdMinCH4: z.number(),
      d1MaxC2H4: z.number(),
      d1MinC2H2: z.number(),
      d2MinC2H2: z.number(),
      d2MinC2H4: z.number(),
      d2MaxC2H4: z.number(),
      d2HighMinC2H2: z.number(),
      d2HighMinC2H4: z.number(),
      t1MaxC2H2: z.number(),
      t1MaxC2H4: z.number(),
      t2MaxC2H2: z.number(),
      t2MaxC2H4: z.number(),
      t3MaxC2H2: z.number(),
      t3MinC2H4: z.number(),
    }),
    duvalSource: source(),
  }),
  excitation: z.object({
    changeBands: bandsSchema,
    changeSource: source(),
    outerSplitMA: z.number().positive(),
    outerLimitBelowSplitPercent: z.number().positive(),
    outerLimitFromSplitPercent: z.number().positive(),
    outerLevel: levelSchema,
    outerSource: source(),
  }),
  resistance: z.object({
    referenceTemperatureC: z.number(),
    temperatureConstantC: z.object({ Cu: z.number().positive(), Al: z.number().positive() }),
    correctionSource: source(),
    changeBands: bandsSchema,
    changeSource: source(),
    imbalanceBands: bandsSchema,
    imbalanceAboveKVA: z.number().nonnegative(),
    imbalanceSource: source(),
    /** Revision 2: without a measured winding temperature, the oil temperature stands in only after this many hours de-energised. */
    minHoursDeEnergised: z.number().nonnegative().optional(),
    hoursSource: source().optional(),
  }),
  ratio: z.object({
    changeBands: bandsSchema,
    changeSource: source(),
    nameplateBands: bandsSchema,
    nameplateSource: source(),
  }),
  /** Revision 2 blocks (absent from version 1: the engine then uses version 2's values). */
  bushing: z
    .object({
      c1ShiftBands: bandsSchema,
      c1ShiftSource: source(),
      hvShareOfCH: z.number().positive(),
      hvShareSource: source(),
    })
    .optional(),
  plausibility: z
    .object({
      maxFactor: z.number().gt(1),
      ratioMaxPercent: z.number().positive(),
      source: source(),
    })
    .optional(),
  remanence: z
    .object({
      allPhasesChangePercent: z.number().positive(),
      source: source(),
    })
    .optional(),
  stateCap: levelSchema.optional(),
  lowConfidenceCap: levelSchema.optional(),
  dfFrequency: z.object({
    minPoints: z.number().int().min(4),
    conductiveRiseBands: bandsSchema,
    maxLevel: levelSchema,
    source: source(),
  }),
  verdict: z.object({
    internalProtections: z.array(z.string()),
    internalSource: source(),
    independentMethods: z.array(methodSchema),
    /** Methods that are the same test as another (power factor is measured with capacitance). */
    sameTestAs: z.record(z.string(), methodSchema),
    corroborationMinMethods: z.number().int().min(2),
    corroborationSource: source(),
  }),
});

export type Criteria = z.infer<typeof criteriaSchema>;
export type CriteriaBushing = NonNullable<Criteria['bushing']>;
export type Band = z.infer<typeof bandSchema>;

// The built-in sets are plain data in their own module (no schema library), so the client can read them cheaply.
export * from './criteria-sets.js';
