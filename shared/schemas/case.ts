// Zod schema and inferred types of a screening case (`gapsight-case/1`, public contract: product case-format).
// Unknown extra fields are allowed everywhere (the contract lets callers add optional fields).
import { z } from 'zod';
import { PROTECTIONS } from '../screening/protections.js';
import { CONDUCTORS, WINDINGS } from './enums.js';

const finite = () => z.number().finite();
const positive = () => z.number().finite().positive();
const nonNegative = () => z.number().finite().nonnegative();
const isoDate = () =>
  z
    .string()
    .min(1)
    .refine((s) => !Number.isNaN(Date.parse(s)), { message: 'not an ISO 8601 date or date-time' });

export const faultTypeSchema = z.enum(['three-phase', 'phase-to-phase', 'phase-to-phase-to-ground', 'phase-to-ground']);
export const faultSideSchema = z.enum(['hv', 'lv']);
/** What the shots' `currentKA` are (rules revision 2): line currents (default) or winding currents. */
export const currentIsSchema = z.enum(['line', 'winding']);
export const sweepWindingSchema = z.enum(['hv', 'lv', 'tv']);
export const sweepPhaseSchema = z.enum(['A', 'B', 'C']);
export const protectionSchema = z.enum(PROTECTIONS);
export const windingsSchema = z.enum(WINDINGS);
export const conductorSchema = z.enum(CONDUCTORS);

export const unitSchema = z.looseObject({
  serial: z.string().min(1),
  phases: z.union([z.literal(1), z.literal(3)]),
  ratedKVA: positive(),
  hvKV: positive(),
  lvKV: positive(),
  impedancePercent: positive(),
  systemImpedancePercent: nonNegative().optional(),
  windings: windingsSchema.optional(),
  vectorGroup: z.string().optional(),
  conductor: conductorSchema.optional(),
  /** Capacitance configurations the design requires (overrides the default set by `windings`). */
  requiredCapacitance: z.array(z.string().min(1)).optional(),
  /** Nameplate turns (voltage) ratio as the ratio test set reports it; default hvKV/lvKV. */
  nameplateTurnsRatio: positive().optional(),
});

/** One reclose shot of a fault: current measured on the fault's `side`, in kA, and its duration. */
export const shotSchema = z.looseObject({
  currentKA: positive(),
  durationS: positive(),
});

/** A fault as logged (the event under screening). */
export const faultSchema = z.looseObject({
  occurredAt: isoDate(),
  type: faultTypeSchema,
  side: faultSideSchema,
  /** Side the fault was on (default: `side`, where the current was measured). */
  location: faultSideSchema.optional(),
  currentIs: currentIsSchema.optional(),
  transformerTripped: z.boolean().optional(),
  protectionOperated: z.array(protectionSchema).optional(),
  shots: z.array(shotSchema),
});

/** An earlier fault on the same unit (counts toward the cumulative duty). */
export const priorFaultSchema = z.looseObject({
  occurredAt: isoDate(),
  type: faultTypeSchema,
  side: faultSideSchema,
  location: faultSideSchema.optional(),
  currentIs: currentIsSchema.optional(),
  shots: z.array(shotSchema),
});

export const reactancePhaseSchema = z.union([
  z.looseObject({ percent: positive() }),
  z.looseObject({
    volts: positive(),
    amps: positive(),
    watts: nonNegative().optional(),
    zBaseOhm: positive().optional(),
  }),
]);

export const capacitanceModeSchema = z.looseObject({
  gstPF: positive(),
  gstGuardPF: positive(),
  ustPF: positive(),
});

export const threePhaseEquivalentSchema = z.looseObject({
  e12: positive(),
  e23: positive(),
  e31: positive(),
  amps: positive(),
});

export const dissolvedGasSchema = z.looseObject({
  H2: nonNegative().optional(),
  CH4: nonNegative().optional(),
  C2H6: nonNegative().optional(),
  C2H4: nonNegative().optional(),
  C2H2: nonNegative().optional(),
  CO: nonNegative().optional(),
  CO2: nonNegative().optional(),
});

const phaseValues = () => z.record(z.string().min(1), positive());

/** A tap position as text or a number; text fits the stored column (20 characters). */
const tapPositionSchema = () => z.union([z.string().max(20, 'at most 20 characters'), finite()]);

/** One bushing terminal's readings (C1 main insulation, C2 tap insulation, their DF in percent). */
export const bushingSchema = z.looseObject({
  c1PF: positive(),
  c1DissipationPercent: nonNegative().optional(),
  c2PF: positive().optional(),
  c2DissipationPercent: nonNegative().optional(),
  /** Winding the terminal belongs to; default HV when the label starts with `H` or `1`. */
  winding: sweepWindingSchema.optional(),
});

/** A reading set (baseline, previous, post-fault, or a sister's latest set) — every section optional. */
export const readingSetSchema = z.looseObject({
  takenAt: isoDate().optional(),
  temperatureC: finite().optional(),
  tapPosition: tapPositionSchema().optional(),
  /** The core was demagnetised before the excitation and sweep tests (or they came before any DC test). */
  demagnetised: z.boolean().optional(),
  /** Hours between de-energising and the tests. */
  hoursDeEnergised: nonNegative().optional(),
  /** Measured winding temperature for the resistance correction (`resistanceTemperatureC` means the same). */
  windingTemperatureC: finite().optional(),
  capacitancePF: z.record(z.string().min(1), positive()).optional(),
  capacitanceModes: z.record(z.string().min(1), capacitanceModeSchema).optional(),
  dissipationPercent: z.record(z.string().min(1), nonNegative()).optional(),
  reactance: z.record(z.string().min(1), reactancePhaseSchema).optional(),
  threePhaseEquivalent: threePhaseEquivalentSchema.optional(),
  excitationCurrentMA: phaseValues().optional(),
  excitationKV: positive().optional(),
  windingResistanceOhm: phaseValues().optional(),
  resistanceTemperatureC: finite().optional(),
  turnsRatio: phaseValues().optional(),
  dissolvedGasPPM: dissolvedGasSchema.optional(),
  dissipationByFrequency: z.record(z.string().min(1), z.array(z.tuple([positive(), nonNegative()]))).optional(),
  bushings: z.record(z.string().min(1), bushingSchema).optional(),
});

export const sisterSchema = readingSetSchema.extend({ serial: z.string().min(1) });

/** A sweep point: [frequencyHz, magnitudeDb] with an optional phase in degrees. */
export const sweepPointSchema = z.tuple([positive(), finite()], finite());
export const sweepTestTypeSchema = z.enum([
  'open-circuit',
  'short-circuit',
  'capacitive-interwinding',
  'inductive-interwinding',
]);
export const sweepSchema = z.looseObject({
  label: z.string().min(1).max(60, 'at most 60 characters'),
  testType: sweepTestTypeSchema,
  winding: sweepWindingSchema.optional(),
  phase: sweepPhaseSchema.optional(),
  baselineTapPosition: tapPositionSchema().optional(),
  tapPosition: tapPositionSchema().optional(),
  demagnetised: z.boolean().optional(),
  baseline: z.array(sweepPointSchema).optional(),
  postFault: z.array(sweepPointSchema),
});

export const caseSchema = z.looseObject({
  format: z.literal('gapsight-case/1'),
  unit: unitSchema,
  fault: faultSchema.optional(),
  priorFaults: z.array(priorFaultSchema).optional(),
  baseline: readingSetSchema.optional(),
  previous: readingSetSchema.optional(),
  postFault: readingSetSchema.optional(),
  sisters: z.array(sisterSchema).optional(),
  sweeps: z.array(sweepSchema).optional(),
});

export type GapsightCase = z.infer<typeof caseSchema>;
export type Unit = z.infer<typeof unitSchema>;
export type Fault = z.infer<typeof faultSchema>;
export type PriorFault = z.infer<typeof priorFaultSchema>;
export type Shot = z.infer<typeof shotSchema>;
export type ReadingSet = z.infer<typeof readingSetSchema>;
export type ReactancePhase = z.infer<typeof reactancePhaseSchema>;
export type Sister = z.infer<typeof sisterSchema>;
export type Sweep = z.infer<typeof sweepSchema>;
export type SweepPoint = z.infer<typeof sweepPointSchema>;
export type DissolvedGas = z.infer<typeof dissolvedGasSchema>;
export type Bushing = z.infer<typeof bushingSchema>;
export type CurrentIs = z.infer<typeof currentIsSchema>;
export type FaultType = z.infer<typeof faultTypeSchema>;
export type Protection = z.infer<typeof protectionSchema>;

export type FieldError = { path: string; message: string };
export type ParseResult<T> = { ok: true; value: T } | { ok: false; errors: FieldError[] };

/** Turn zod issues into `{ path, message }` with dotted paths (`fault.shots.0.currentKA`). */
export function issuesToFieldErrors(issues: readonly z.core.$ZodIssue[]): FieldError[] {
  return issues.map((issue) => ({
    path: issue.path.length ? issue.path.map((p) => String(p)).join('.') : '(root)',
    message: issue.message,
  }));
}

/** Validate an unknown value as a `gapsight-case/1` document, naming every bad field by its dotted path. */
export function parseCase(input: unknown): ParseResult<GapsightCase> {
  const parsed = caseSchema.safeParse(input);
  if (parsed.success) return { ok: true, value: parsed.data };
  return { ok: false, errors: issuesToFieldErrors(parsed.error.issues) };
}
