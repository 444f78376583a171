// Zod schema and inferred types of a screening case (`gapsight-case/1`, public contract: product case-format).
// Strict at every level: a field the format does not name is refused ("unit.foo: unknown field"), so a misspelt key is
// not silently ignored; the project adds optional fields here (shared/README "Additions to the public contract").
// Every number, string, list and date is bounded (shared/schemas/bounds.ts, shared/README "Input bounds").
import { z } from 'zod';
import { PROTECTIONS } from '../screening/protections.js';
import { dateInRange, issueEntries, keyedBy, LIST_MAX, listOf, quantity } from './bounds.js';
import { CONDUCTORS, WINDINGS } from './enums.js';

/** Longest stored text of each kind (the database columns: unit serial 60, configuration, gas and terminal labels 20,
 * phase 8, tap position 20, sweep label 60, vector group 20). */
export const TEXT_MAX = { serial: 60, configuration: 20, phase: 8, tapPosition: 20, sweepLabel: 60, vectorGroup: 20 } as const;

export const faultTypeSchema = z.enum(['three-phase', 'phase-to-phase', 'phase-to-phase-to-ground', 'phase-to-ground']);
export const faultSideSchema = z.enum(['hv', 'lv']);
/** What the shots' `currentKA` are (rules revision 2): line currents (default) or winding currents. */
export const currentIsSchema = z.enum(['line', 'winding']);
export const sweepWindingSchema = z.enum(['hv', 'lv', 'tv']);
export const sweepPhaseSchema = z.enum(['A', 'B', 'C']);
export const protectionSchema = z.enum(PROTECTIONS);
export const windingsSchema = z.enum(WINDINGS);
export const conductorSchema = z.enum(CONDUCTORS);

/** A configuration label (CH, CHL, …) as stored. */
const configurationLabel = () => z.string().min(1).max(TEXT_MAX.configuration, `a configuration label of 1 to ${TEXT_MAX.configuration} characters`);

export const unitSchema = z.strictObject({
  serial: z.string().min(1).max(TEXT_MAX.serial, `at most ${TEXT_MAX.serial} characters`),
  phases: z.union([z.literal(1), z.literal(3)]),
  ratedKVA: quantity('kVA'),
  hvKV: quantity('kV'),
  lvKV: quantity('kV'),
  impedancePercent: quantity('impedancePercent'),
  systemImpedancePercent: quantity('systemImpedancePercent').optional(),
  windings: windingsSchema.optional(),
  vectorGroup: z.string().max(TEXT_MAX.vectorGroup, `at most ${TEXT_MAX.vectorGroup} characters`).optional(),
  conductor: conductorSchema.optional(),
  /** Capacitance configurations the design requires (overrides the default set by `windings`). */
  requiredCapacitance: listOf(configurationLabel(), 'configurations').optional(),
  /** Nameplate turns (voltage) ratio as the ratio test set reports it; default hvKV/lvKV. */
  nameplateTurnsRatio: quantity('ratio').optional(),
});

/** One reclose shot of a fault: current measured on the fault's `side`, in kA, and its duration. */
export const shotSchema = z.strictObject({
  currentKA: quantity('faultKA'),
  durationS: quantity('shotS'),
});
const shotsSchema = () => listOf(shotSchema, 'shots');

/** A fault as logged (the event under screening). */
export const faultSchema = z.strictObject({
  occurredAt: dateInRange(),
  type: faultTypeSchema,
  side: faultSideSchema,
  /** Side the fault was on (default: `side`, where the current was measured). */
  location: faultSideSchema.optional(),
  currentIs: currentIsSchema.optional(),
  transformerTripped: z.boolean().optional(),
  protectionOperated: listOf(protectionSchema, 'protections').optional(),
  shots: shotsSchema(),
});

/** An earlier fault on the same unit (counts toward the cumulative duty). */
export const priorFaultSchema = z.strictObject({
  occurredAt: dateInRange(),
  type: faultTypeSchema,
  side: faultSideSchema,
  location: faultSideSchema.optional(),
  currentIs: currentIsSchema.optional(),
  shots: shotsSchema(),
});

export const reactancePhaseSchema = z.union([
  z.strictObject({ percent: quantity('reactancePercent') }),
  z.strictObject({
    volts: quantity('testVolts'),
    amps: quantity('testAmps'),
    watts: quantity('testWatts').optional(),
    zBaseOhm: quantity('ohmBase').optional(),
  }),
]);

export const capacitanceModeSchema = z.strictObject({
  gstPF: quantity('capacitancePF'),
  gstGuardPF: quantity('capacitancePF'),
  ustPF: quantity('capacitancePF'),
});

export const threePhaseEquivalentSchema = z.strictObject({
  e12: quantity('testVolts'),
  e23: quantity('testVolts'),
  e31: quantity('testVolts'),
  amps: quantity('testAmps'),
});

/** Gases in ppm: the seven key gases by name, and others (O2, N2, C3H8, …) as keyed values; labels as stored (20). */
export const dissolvedGasSchema = z
  .object({
    H2: quantity('gasPPM').optional(),
    CH4: quantity('gasPPM').optional(),
    C2H6: quantity('gasPPM').optional(),
    C2H4: quantity('gasPPM').optional(),
    C2H2: quantity('gasPPM').optional(),
    CO: quantity('gasPPM').optional(),
    CO2: quantity('gasPPM').optional(),
  })
  .catchall(quantity('gasPPM'))
  .superRefine((g, ctx) => {
    const keys = Object.keys(g);
    if (keys.length > LIST_MAX.gases) ctx.addIssue({ code: 'custom', message: `at most ${LIST_MAX.gases} gases` });
    for (const k of keys) if (k.length < 1 || k.length > TEXT_MAX.configuration) ctx.addIssue({ code: 'custom', path: [k], message: `a gas label of 1 to ${TEXT_MAX.configuration} characters` });
  });

/** Phase → value (A, B, C): phase labels as stored (8 characters), at most a few. */
const phaseValues = (q: Parameters<typeof quantity>[0]) => keyedBy(quantity(q), TEXT_MAX.phase, 'phases', 'phase');

/** A tap position as text or a number; text fits the stored column (20 characters). */
const tapPositionSchema = () => z.union([z.string().max(TEXT_MAX.tapPosition, `at most ${TEXT_MAX.tapPosition} characters`), quantity('tapNumber')]);

/** One bushing terminal's readings (C1 main insulation, C2 tap insulation, their DF in percent). */
export const bushingSchema = z.strictObject({
  c1PF: quantity('capacitancePF'),
  c1DissipationPercent: quantity('dissipationPercent').optional(),
  c2PF: quantity('capacitancePF').optional(),
  c2DissipationPercent: quantity('dissipationPercent').optional(),
  /** Winding the terminal belongs to; default HV when the label starts with `H` or `1`. */
  winding: sweepWindingSchema.optional(),
});

/** A reading set (baseline, previous, post-fault, or a sister's latest set) — every section optional. */
export const readingSetSchema = z.strictObject({
  takenAt: dateInRange().optional(),
  /** Free text about the set (how or in what order it was taken); the API's session notes. */
  notes: z.string().max(5000, 'at most 5000 characters').optional(),
  temperatureC: quantity('temperatureC').optional(),
  tapPosition: tapPositionSchema().optional(),
  /** The core was demagnetised before the excitation and sweep tests (or they came before any DC test). */
  demagnetised: z.boolean().optional(),
  /** Hours between de-energising and the tests. */
  hoursDeEnergised: quantity('hours').optional(),
  /** Measured winding temperature for the resistance correction (`resistanceTemperatureC` means the same). */
  windingTemperatureC: quantity('windingTemperatureC').optional(),
  capacitancePF: keyedBy(quantity('capacitancePF'), TEXT_MAX.configuration, 'configurations', 'configuration').optional(),
  capacitanceModes: keyedBy(capacitanceModeSchema, TEXT_MAX.configuration, 'configurations', 'configuration').optional(),
  dissipationPercent: keyedBy(quantity('dissipationPercent'), TEXT_MAX.configuration, 'configurations', 'configuration').optional(),
  reactance: keyedBy(reactancePhaseSchema, TEXT_MAX.phase, 'phases', 'phase').optional(),
  threePhaseEquivalent: threePhaseEquivalentSchema.optional(),
  excitationCurrentMA: phaseValues('excitationMA').optional(),
  excitationKV: quantity('kV').optional(),
  windingResistanceOhm: phaseValues('resistanceOhm').optional(),
  resistanceTemperatureC: quantity('windingTemperatureC').optional(),
  turnsRatio: phaseValues('ratio').optional(),
  dissolvedGasPPM: dissolvedGasSchema.optional(),
  dissipationByFrequency: keyedBy(
    listOf(z.tuple([quantity('frequencyHz'), quantity('dissipationSweepPercent')]), 'dfPoints', 'points'),
    TEXT_MAX.configuration,
    'configurations',
    'configuration',
  ).optional(),
  bushings: keyedBy(bushingSchema, TEXT_MAX.configuration, 'bushings', 'bushing terminal').optional(),
});

export const sisterSchema = readingSetSchema.extend({ serial: unitSchema.shape.serial });

/** A sweep point: [frequencyHz, magnitudeDb] with an optional phase in degrees. */
export const sweepPointSchema = z.tuple([quantity('frequencyHz'), quantity('magnitudeDb')], quantity('phaseDeg')).refine((p) => p.length <= 3, { message: 'frequency, magnitude and at most a phase' });
export const sweepTestTypeSchema = z.enum([
  'open-circuit',
  'short-circuit',
  'capacitive-interwinding',
  'inductive-interwinding',
]);
export const sweepSchema = z.strictObject({
  label: z.string().min(1).max(TEXT_MAX.sweepLabel, `at most ${TEXT_MAX.sweepLabel} characters`),
  testType: sweepTestTypeSchema,
  winding: sweepWindingSchema.optional(),
  phase: sweepPhaseSchema.optional(),
  baselineTapPosition: tapPositionSchema().optional(),
  tapPosition: tapPositionSchema().optional(),
  demagnetised: z.boolean().optional(),
  baseline: listOf(sweepPointSchema, 'sweepPoints', 'points').optional(),
  postFault: listOf(sweepPointSchema, 'sweepPoints', 'points'),
});

export const caseSchema = z.strictObject({
  format: z.literal('gapsight-case/1'),
  unit: unitSchema,
  fault: faultSchema.optional(),
  priorFaults: listOf(priorFaultSchema, 'priorFaults', 'earlier faults').optional(),
  baseline: readingSetSchema.optional(),
  previous: readingSetSchema.optional(),
  postFault: readingSetSchema.optional(),
  sisters: listOf(sisterSchema, 'sisters').optional(),
  sweeps: listOf(sweepSchema, 'sweeps').optional(),
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
  return issueEntries(issues).map((e) => ({ path: e.path.length ? e.path.join('.') : '(root)', message: e.message }));
}

/** Validate an unknown value as a `gapsight-case/1` document, naming every bad field by its dotted path. */
export function parseCase(input: unknown): ParseResult<GapsightCase> {
  const parsed = caseSchema.safeParse(input);
  if (parsed.success) return { ok: true, value: parsed.data };
  return { ok: false, errors: issuesToFieldErrors(parsed.error.issues) };
}
