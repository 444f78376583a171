import { z } from 'zod';
import {
  conductorSchema,
  currentIsSchema,
  faultSideSchema,
  faultTypeSchema,
  protectionSchema,
  readingSetSchema,
  shotSchema,
  sweepPhaseSchema,
  sweepTestTypeSchema,
  sweepWindingSchema,
  windingsSchema,
} from './case.js';
import { dateInRange, keyedBy, listOf, quantity } from './bounds.js';
import { validLocale } from '../format.js';
import { parseDateOrInstant } from '../lists.js';
import { ROW_KEYS } from '../readings/rows.js';
import { EVENT_SORTS, EVENT_STATUSES, FOLLOW_UP_DUE, RECOMMENDATIONS, UNIT_READING_SET_KINDS, UNIT_SORTS } from './enums.js';
export { UNIT_SORTS };

// Request bodies of the fleet, reading and event routes (api.md), shared by server validation and client forms.

const finite = z.number().finite();
/** An event or test date: ISO 8601, a real day, 1900-01-01 … a day after now (shared/schemas/bounds.ts). */
const isoDateTime = dateInRange();
const idSchema = z.number().int().positive('not a valid id');

export const siteBodySchema = z.strictObject({
  name: z.string().trim().min(1, 'required').max(120),
  timeZone: z
    .string()
    .min(1, 'required')
    .max(64, 'at most 64 characters')
    .refine(
      (tz) => {
        try {
          new Intl.DateTimeFormat('en', { timeZone: tz });
          return true;
        } catch {
          return false;
        }
      },
      { message: 'not an IANA time zone (e.g. Europe/London)' },
    ),
  /** How the site's dates are written (BCP 47, e.g. en-GB); empty or null: the international ISO form. */
  locale: z
    .string()
    .trim()
    .max(35)
    .transform((s) => s || null)
    .nullable()
    .optional()
    .refine((l) => l == null || validLocale(l) !== null, { message: 'not a known locale (e.g. en-GB, de-DE, en-US)' }),
  /** Where decisions on the site's units are mailed; empty or null: none. */
  controlRoomEmail: z
    .string()
    .trim()
    .max(254)
    .transform((s) => s || null)
    .pipe(z.email('not an e-mail address').nullable())
    .nullable()
    .optional(),
});
/** PATCH /api/sites/:siteId — only the fields sent change (the site body has no defaults). */
export const sitePatchSchema = siteBodySchema.partial();

/** A design's fields without create defaults: the patch schema is built from these, so an absent field stays absent. */
const designFields = {
  reference: z.string().trim().min(1, 'required').max(80),
  maker: z.string().trim().min(1, 'required').max(120),
  windings: windingsSchema,
  vectorGroup: z.string().trim().min(1, 'required').max(20),
  phases: z.union([z.literal(1), z.literal(3)]),
  hvKV: quantity('kV'),
  lvKV: quantity('kV'),
  tvKV: quantity('kV').nullable().optional(),
  coolingStages: listOf(z.strictObject({ stage: z.string().trim().min(1).max(20), kVA: quantity('kVA') }), 'coolingStages', 'cooling stages').min(1, 'at least one cooling stage'),
  impedancePercent: quantity('impedancePercent'),
  impedanceBaseKVA: quantity('kVA'),
  conductor: conductorSchema,
  requiredCapacitance: listOf(z.string().trim().regex(/^[A-Za-z]{1,10}$/, 'letters only, e.g. CHL'), 'configurations'),
  notes: z.string().max(5000).nullable().optional(),
};
export const designBodySchema = z.strictObject({
  ...designFields,
  windings: designFields.windings.default('two-winding'),
  phases: designFields.phases.default(3),
  conductor: designFields.conductor.default('Cu'),
  requiredCapacitance: designFields.requiredCapacitance.default([]),
});
/** PATCH /api/designs/:designId — only the fields sent change: no create defaults (zod's `.partial()` keeps them). */
export const designPatchSchema = z.strictObject(designFields).partial();

/** A unit's fields without create defaults: the patch schema is built from these, so an absent field stays absent. */
const unitFields = {
  serial: z.string().trim().min(1, 'required').max(60),
  position: z.string().trim().max(60),
  siteId: idSchema,
  designId: idSchema,
  year: z.number().int().min(1900).max(2100).nullable().optional(),
  phases: z.union([z.literal(1), z.literal(3)]).optional(),
  hvKV: quantity('kV').optional(),
  lvKV: quantity('kV').optional(),
  ratedKVA: quantity('kVA').optional(),
  impedancePercent: quantity('impedancePercent').optional(),
  systemImpedancePercent: quantity('systemImpedancePercent'),
  conductor: conductorSchema.optional(),
};
export const unitBodySchema = z.strictObject({
  ...unitFields,
  position: unitFields.position.default(''),
  systemImpedancePercent: unitFields.systemImpedancePercent.default(0),
});
/** PATCH /api/units/:unitId — only the fields sent change: no create defaults (zod's `.partial()` keeps them). */
export const unitPatchSchema = z.strictObject(unitFields).partial();

export const unitListQuerySchema = z.object({
  q: z.string().trim().max(60).optional(),
  siteId: z.coerce.number().int().positive().optional(),
  designId: z.coerce.number().int().positive().optional(),
  recommendation: z.enum(RECOMMENDATIONS).optional(),
  sort: z.enum(UNIT_SORTS).default('serial'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
});

/** Conditions of a test session beyond the case format's reading set. */
const sessionConditions = {
  takenAt: isoDateTime,
  topOilC: finite.min(-50).max(150).optional(),
  bottomOilC: finite.min(-50).max(150).optional(),
  ambientC: finite.min(-60).max(70).optional(),
  humidityPercent: finite.min(0).max(100).optional(),
  instrument: z.string().max(120).optional(),
  instrumentSerial: z.string().max(60).optional(),
  testKV: quantity('testKV').optional(),
  testFrequencyHz: quantity('testFrequencyHz').optional(),
  /** The older spelling of the case format's `hoursDeEnergised` (still accepted; give one of the two). */
  hoursDeenergised: quantity('hours').optional(),
  notes: z.string().max(5000).optional(),
};

/** The case format's reading-set sections as the API takes them: the case's own bounded shapes (labels fit the reading
 * rows' columns: a configuration, gas or bushing terminal 20 characters, a phase 8; values in their physical ranges). */
const caseSections = readingSetSchema.shape;
const readingSections = {
  capacitancePF: caseSections.capacitancePF,
  capacitanceModes: caseSections.capacitanceModes,
  dissipationPercent: caseSections.dissipationPercent,
  reactance: caseSections.reactance,
  excitationCurrentMA: caseSections.excitationCurrentMA,
  excitationKV: caseSections.excitationKV,
  windingResistanceOhm: caseSections.windingResistanceOhm,
  resistanceTemperatureC: caseSections.resistanceTemperatureC,
  turnsRatio: caseSections.turnsRatio,
  /** Gases in ppm: H2, CH4, C2H6, C2H4, C2H2, CO, CO2 (others, such as O2 and N2, are kept too). */
  dissolvedGasPPM: keyedBy(quantity('gasPPM'), 20, 'gases', 'gas').optional(),
  dissipationByFrequency: caseSections.dissipationByFrequency,
  bushings: caseSections.bushings,
  demagnetised: caseSections.demagnetised,
  hoursDeEnergised: caseSections.hoursDeEnergised,
  windingTemperatureC: finite.min(-60, 'must be -60 or more (°C)').max(250, 'must be 250 or less (°C: check the unit)').optional(),
};

/** The reading sections a session correction may replace (each stored as reading rows): the row keys but
 * `threePhaseEquivalent`. */
export type SessionReadingSection = Exclude<(typeof ROW_KEYS)[number], 'threePhaseEquivalent'>;
export const SESSION_READING_SECTIONS: readonly SessionReadingSection[] = ROW_KEYS.filter(
  (k): k is SessionReadingSection => k !== 'threePhaseEquivalent',
);

/** Both spellings of the hours de-energised may be given only when they agree. */
function sameHours(body: { hoursDeEnergised?: number; hoursDeenergised?: number }, ctx: z.RefinementCtx) {
  if (body.hoursDeEnergised !== undefined && body.hoursDeenergised !== undefined && body.hoursDeEnergised !== body.hoursDeenergised) {
    ctx.addIssue({ code: 'custom', path: ['hoursDeEnergised'], message: `differs from hoursDeenergised (${body.hoursDeenergised}): give one of the two` });
  }
}

export const readingSetBodySchema = readingSetSchema
  .extend({
    ...readingSections,
    ...sessionConditions,
    kind: z.enum(UNIT_READING_SET_KINDS),
    isReference: z.boolean().optional(),
  })
  .superRefine(sameHours);
export type ReadingSetBody = z.infer<typeof readingSetBodySchema>;

/**
 * The unit's pre-fault dissolved-gas sample, entered with a post-fault session: stored as a routine reading set of the
 * unit dated at its sampling time (before the fault), so that the case's `previous` carries it.
 */
export const preFaultGasSchema = z.strictObject({
  takenAt: isoDateTime,
  dissolvedGasPPM: readingSections.dissolvedGasPPM.unwrap().refine((g) => Object.keys(g).length > 0, { message: 'at least one gas (H2, CH4, C2H6, C2H4, C2H2, CO, CO2) in ppm' }),
});
export type PreFaultGas = z.infer<typeof preFaultGasSchema>;

export const sessionBodySchema = readingSetSchema
  .extend({ ...readingSections, ...sessionConditions, preFaultGas: preFaultGasSchema.optional() })
  .superRefine(sameHours);
export type SessionBody = z.infer<typeof sessionBodySchema>;

/** Session conditions a correction may clear (null); `takenAt` is always kept. */
const clearable = <T extends z.ZodType>(t: T) => t.nullable().optional();

/**
 * PATCH /api/sessions/:sessionId — a correction of a session's conditions and readings: only the fields named change
 * (no defaults); a reading section named replaces that section (null or {} removes it); conditions may be cleared with
 * null. Checked as on create.
 */
export const sessionPatchSchema = z
  .strictObject({
    takenAt: isoDateTime.optional(),
    temperatureC: clearable(readingSetSchema.shape.temperatureC.unwrap()),
    tapPosition: clearable(z.union([z.string().trim().min(1).max(20, 'at most 20 characters'), quantity('tapNumber')])),
    topOilC: clearable(sessionConditions.topOilC.unwrap()),
    bottomOilC: clearable(sessionConditions.bottomOilC.unwrap()),
    ambientC: clearable(sessionConditions.ambientC.unwrap()),
    humidityPercent: clearable(sessionConditions.humidityPercent.unwrap()),
    instrument: clearable(sessionConditions.instrument.unwrap()),
    instrumentSerial: clearable(sessionConditions.instrumentSerial.unwrap()),
    testKV: clearable(sessionConditions.testKV.unwrap()),
    testFrequencyHz: clearable(sessionConditions.testFrequencyHz.unwrap()),
    hoursDeenergised: clearable(sessionConditions.hoursDeenergised.unwrap()),
    hoursDeEnergised: clearable(readingSections.hoursDeEnergised.unwrap()),
    demagnetised: clearable(readingSections.demagnetised.unwrap()),
    windingTemperatureC: clearable(readingSections.windingTemperatureC.unwrap()),
    notes: clearable(sessionConditions.notes.unwrap()),
    capacitancePF: clearable(readingSections.capacitancePF.unwrap()),
    capacitanceModes: clearable(readingSections.capacitanceModes.unwrap()),
    dissipationPercent: clearable(readingSections.dissipationPercent.unwrap()),
    reactance: clearable(readingSections.reactance.unwrap()),
    excitationCurrentMA: clearable(readingSections.excitationCurrentMA.unwrap()),
    excitationKV: clearable(readingSections.excitationKV.unwrap()),
    windingResistanceOhm: clearable(readingSections.windingResistanceOhm.unwrap()),
    resistanceTemperatureC: clearable(readingSections.resistanceTemperatureC.unwrap()),
    turnsRatio: clearable(readingSections.turnsRatio.unwrap()),
    dissolvedGasPPM: clearable(readingSections.dissolvedGasPPM.unwrap()),
    dissipationByFrequency: clearable(readingSections.dissipationByFrequency.unwrap()),
    bushings: clearable(readingSections.bushings.unwrap()),
  })
  .superRefine((body, ctx) => sameHours({ hoursDeEnergised: body.hoursDeEnergised ?? undefined, hoursDeenergised: body.hoursDeenergised ?? undefined }, ctx));
export type SessionPatch = z.infer<typeof sessionPatchSchema>;

/** A fault's facts as protection logs them (no defaults here: the correction schema below reuses them). */
const eventFacts = {
  occurredAt: isoDateTime,
  type: faultTypeSchema,
  side: faultSideSchema,
  /** Side the fault was on (rules revision 2; default: `side`, where the current was measured). */
  location: faultSideSchema,
  /** What the shots' currents are (rules revision 2): `line` (default) or `winding`. */
  currentIs: currentIsSchema,
  faultedPhases: z.string().trim().regex(/^[ABCN]{1,4}$/, 'phases like A, BC or ABC'),
  shots: listOf(
    shotSchema.extend({ currentKA: finite.positive().max(500, 'above 500 kA: check the unit'), durationS: finite.positive().max(60, 'above 60 s: check the unit') }),
    'shots',
  ).min(1, 'at least one shot'),
  transformerTripped: z.boolean(),
  protectionOperated: listOf(protectionSchema, 'protections'),
  notes: z.string().max(5000),
};

export const eventBodySchema = z.strictObject({
  unitId: idSchema,
  occurredAt: eventFacts.occurredAt,
  type: eventFacts.type,
  side: eventFacts.side,
  location: eventFacts.location.optional(),
  currentIs: eventFacts.currentIs.optional(),
  faultedPhases: eventFacts.faultedPhases.optional(),
  shots: eventFacts.shots,
  transformerTripped: eventFacts.transformerTripped.default(true),
  protectionOperated: eventFacts.protectionOperated.default([]),
  notes: eventFacts.notes.optional(),
});
export type EventBody = z.infer<typeof eventBodySchema>;

/**
 * PATCH /api/events/:eventId — a correction of a logged fault: only the fields named change (no defaults), checked as on
 * create; the optional facts may be cleared with null. The unit is not a fact that can be corrected.
 */
export const eventPatchSchema = z.strictObject({
  occurredAt: eventFacts.occurredAt.optional(),
  type: eventFacts.type.optional(),
  side: eventFacts.side.optional(),
  location: eventFacts.location.nullable().optional(),
  currentIs: eventFacts.currentIs.nullable().optional(),
  faultedPhases: eventFacts.faultedPhases.nullable().optional(),
  shots: eventFacts.shots.optional(),
  transformerTripped: eventFacts.transformerTripped.optional(),
  protectionOperated: eventFacts.protectionOperated.optional(),
  notes: eventFacts.notes.nullable().optional(),
});
export type EventPatch = z.infer<typeof eventPatchSchema>;

/** A query parameter of one or several values (`status=logged,testing` or `status=logged&status=testing`). */
function oneOrSeveral<T extends string>(values: readonly T[], what: string) {
  return z.preprocess(
    (v) => (v === undefined || v === '' ? undefined : (Array.isArray(v) ? v : [v]).flatMap((s) => String(s).split(',')).map((s) => s.trim()).filter(Boolean)),
    z
      .array(z.string())
      .superRefine((list, ctx) => {
        const bad = list.filter((s) => !(values as readonly string[]).includes(s));
        if (bad.length) ctx.addIssue({ code: 'custom', message: `unknown ${what} ${bad.map((b) => `"${b.slice(0, 30)}"`).join(', ')}: one or several of ${values.join(', ')}` });
      })
      .transform((list) => [...new Set(list)] as T[])
      .optional(),
  );
}

/** An ISO date (a whole day, UTC) or an instant; `to` keeps the whole of its day. */
function dateOrInstant(endOfDay: boolean) {
  return z
    .string()
    .trim()
    .transform((s, ctx) => {
      const d = parseDateOrInstant(s, endOfDay);
      if (d && d.getUTCFullYear() < 1900) {
        ctx.addIssue({ code: 'custom', message: 'a date from 1900-01-01 on' });
        return z.NEVER;
      }
      if (!d) {
        ctx.addIssue({ code: 'custom', message: 'an ISO date (2026-07-01) or date-time (2026-07-01T03:12:00Z)' });
        return z.NEVER;
      }
      return d;
    })
    .optional();
}

export const eventListQuerySchema = z
  .object({
    /** Part of a unit serial. */
    q: z.string().trim().max(60).optional(),
    status: oneOrSeveral(EVENT_STATUSES, 'status'),
    type: oneOrSeveral(faultTypeSchema.options, 'fault type'),
    unitId: z.coerce.number().int().positive().optional(),
    siteId: z.coerce.number().int().positive().optional(),
    /** Fault time from (inclusive) and to (inclusive; a date keeps its whole day). */
    from: dateOrInstant(false),
    to: dateOrInstant(true),
    /** Only events without a relay record attached. */
    withoutAttachments: z.enum(['true', 'false'], { message: 'true or false' }).transform((v) => v === 'true').optional(),
    sort: z.enum(EVENT_SORTS).default('-occurredAt'),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(500).default(50),
  })
  .superRefine((q, ctx) => {
    if (q.from && q.to && q.from.getTime() > q.to.getTime()) ctx.addIssue({ code: 'custom', path: ['to'], message: 'before from' });
  });
export type EventListQuery = z.infer<typeof eventListQuerySchema>;

/** GET /api/follow-ups: the open follow-ups of a due bucket, across events, optionally of one site. */
export const followUpListQuerySchema = z.object({
  due: z.enum(FOLLOW_UP_DUE, { message: `one of ${FOLLOW_UP_DUE.join(', ')}` }).default('open'),
  siteId: z.coerce.number().int().positive().optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
});
export type FollowUpListQuery = z.infer<typeof followUpListQuerySchema>;

export const sweepUploadFieldsSchema = z.strictObject({
  label: z.string().trim().min(1, 'required').max(60),
  testType: sweepTestTypeSchema,
  terminals: z.string().trim().max(60).optional(),
  tapPosition: z.string().trim().max(20, 'at most 20 characters').optional(),
  demagnetised: z.enum(['true', 'false'], { message: 'true or false' }).transform((v) => v === 'true').optional(),
  /** Rules revision 2: the winding (`hv`, `lv`, `tv`; none counts as HV) and the phase (`A`, `B`, `C`) of the trace. */
  winding: z.enum(sweepWindingSchema.options, { message: 'hv, lv or tv' }).optional(),
  phase: z.enum(sweepPhaseSchema.options, { message: 'A, B or C' }).optional(),
  /** Tap of the baseline trace this post-fault trace is compared with (default: the baseline trace's own tap). */
  baselineTapPosition: z.string().trim().max(20, 'at most 20 characters').optional(),
});
export const unitSweepUploadFieldsSchema = sweepUploadFieldsSchema.extend({
  readingSetId: z.coerce.number().int().positive('not a valid id'),
  baselineTapPosition: z.undefined({ message: 'only for post-fault traces: the tap of a baseline trace is its tapPosition' }).optional(),
});
