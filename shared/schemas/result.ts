// Zod schema and inferred types of a screening result (`gapsight-result/1`, public contract: product case-format).
import { z } from 'zod';
import { RECOMMENDATIONS } from './enums.js';

export const levelSchema = z.enum(['ok', 'watch', 'investigate', 'critical']);
export const recommendationSchema = z.enum(RECOMMENDATIONS);
export const methodSchema = z.enum([
  'capacitance',
  'power-factor',
  'reactance',
  'sweep',
  'excitation',
  'resistance',
  'ratio',
  'gas',
  'bushing',
  'sisters',
  'duty',
]);

/** What an indicator compares (rules revision 2). */
export const basisSchema = z.enum(['change', 'sisters', 'phase-comparison', 'state', 'duty']);

export const indicatorSchema = z
  .looseObject({
    key: z.string().min(1),
    value: z.union([z.number(), z.string(), z.boolean(), z.null()]),
    level: levelSchema,
    rule: z.string(),
    source: z.string(),
    method: methodSchema,
    /** Revision 2: always present in new results; results stored before it lack it. */
    basis: basisSchema.optional(),
    /** A change judged under a known doubt (temperature, remanence): never corroborates. */
    lowConfidence: z.boolean().optional(),
    note: z.string().optional(),
    /** Optional: phase or capacitance configuration the indicator is about (used to say where methods agree). */
    location: z.string().optional(),
    /** Optional: what the value was compared with ("2019-05-02 baseline", "sisters' median", …). */
    reference: z.string().optional(),
  })
  .refine((i) => i.value !== null || (typeof i.note === 'string' && i.note.length > 0), {
    message: 'an indicator whose value is null needs a note',
    path: ['note'],
  });

export const throughFaultSchema = z.looseObject({
  category: z.enum(['I', 'II', 'III', 'IV']),
  ratedCurrentA: z.number(),
  currentPerUnit: z.number(),
  maxCurrentPerUnit: z.number(),
  forceRatioPercent: z.number(),
  segmentStartPerUnit: z.number(),
  highDuty: z.boolean(),
  i2t: z.number(),
  thermalLimitI2t: z.number(),
  mechanicalLimitI2t: z.number(),
  eventDutyPercent: z.number(),
  beyondCurve: z.boolean(),
  cumulativeI2t: z.number(),
  cumulativeDutyPercent: z.number(),
  shotsAboveSegment: z.number().int(),
  /** Revision 2 (absent in results stored before it). */
  windingCurrentFactor: z.number().nullable().optional(),
  currentBasis: z.enum(['winding', 'line-converted', 'line-assumed']).optional(),
  thermalDurationPercent: z.number().nullable().optional(),
});

export const resultSchema = z.looseObject({
  format: z.literal('gapsight-result/1'),
  recommendation: recommendationSchema,
  reasons: z.array(z.string()),
  missing: z.array(z.string()),
  unreliable: z.array(z.string()),
  followUps: z.array(z.string()),
  cautions: z.array(z.string()),
  throughFault: throughFaultSchema.nullable(),
  indicators: z.array(indicatorSchema),
  /** Optional additions: the overall level after corroboration and the criteria-set version used. */
  overallLevel: levelSchema.optional(),
  criteriaVersion: z.number().int().optional(),
  /** Rules revision the result was computed with (2); a result without it was computed with revision 1. */
  engineRevision: z.number().int().optional(),
});

export type Level = z.infer<typeof levelSchema>;
export type Recommendation = z.infer<typeof recommendationSchema>;
export type Method = z.infer<typeof methodSchema>;
export type Basis = z.infer<typeof basisSchema>;
export type Indicator = z.infer<typeof indicatorSchema>;
export type ThroughFault = z.infer<typeof throughFaultSchema>;
export type IeeeCategory = ThroughFault['category'];
export type GapsightResult = z.infer<typeof resultSchema>;
