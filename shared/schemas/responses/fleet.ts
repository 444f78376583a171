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
} from '../case.js';
import { EVENT_STATUSES, READING_SET_KINDS, RECOMMENDATIONS } from '../enums.js';
import { throughFaultSchema } from '../result.js';
import { isoDateTime, pageOf, rowId } from './common.js';

// Answers of the site, design and unit routes (and the reading sets and sweep traces they list). Strict objects: a key
// the server adds or drops fails the response tests. Case-format documents inside them (`values`) stay open.

const phases = z.union([z.literal(1), z.literal(3)]);

/** GET /api/sites (each), POST/PATCH /api/sites. */
export const siteViewSchema = z.strictObject({
  id: rowId,
  name: z.string(),
  /** IANA time zone, e.g. Europe/London: the site's dates are shown in it. */
  timeZone: z.string(),
  /** How the site's dates are written (BCP 47); null: ISO form. */
  locale: z.string().nullable(),
  /** Where decisions are mailed (on the sites routes). */
  controlRoomEmail: z.string().nullable().optional(),
});
export type SiteView = z.infer<typeof siteViewSchema>;

/** A design family's own record (POST/PATCH /api/designs, and inside a unit). */
export const designViewSchema = z.strictObject({
  id: rowId,
  reference: z.string(),
  maker: z.string(),
  windings: windingsSchema,
  vectorGroup: z.string(),
  phases,
  hvKV: z.number(),
  lvKV: z.number(),
  tvKV: z.number().nullable(),
  coolingStages: z.array(z.strictObject({ stage: z.string(), kVA: z.number() })),
  impedancePercent: z.number(),
  impedanceBaseKVA: z.number(),
  conductor: conductorSchema,
  requiredCapacitance: z.array(z.string()),
  notes: z.string().nullable(),
});
export type DesignView = z.infer<typeof designViewSchema>;

/** GET /api/designs (each). */
export const designListItemSchema = designViewSchema.extend({ unitCount: z.number().int().nonnegative() });
export type DesignListItem = z.infer<typeof designListItemSchema>;

/** GET /api/designs/:id — the design with its sister units. */
export const designDetailSchema = designViewSchema.extend({
  units: z.array(
    z.strictObject({
      id: rowId,
      serial: z.string(),
      position: z.string(),
      siteId: rowId,
      siteName: z.string(),
      year: z.number().int().nullable(),
      lastRecommendation: z.enum(RECOMMENDATIONS).nullable(),
    }),
  ),
});
export type DesignDetail = z.infer<typeof designDetailSchema>;

/** A unit's own record: nameplate and the denormalised last event (POST/PATCH /api/units). */
export const unitViewSchema = z.strictObject({
  id: rowId,
  serial: z.string(),
  position: z.string(),
  siteId: rowId,
  designId: rowId,
  year: z.number().int().nullable(),
  phases,
  hvKV: z.number(),
  lvKV: z.number(),
  ratedKVA: z.number(),
  impedancePercent: z.number(),
  systemImpedancePercent: z.number(),
  conductor: conductorSchema,
  lastEventId: rowId.nullable(),
  lastEventAt: isoDateTime.nullable(),
  lastEventStatus: z.enum(EVENT_STATUSES).nullable(),
  lastRecommendation: z.enum(RECOMMENDATIONS).nullable(),
});
export type UnitView = z.infer<typeof unitViewSchema>;

/** GET /api/units (each item). */
export const unitListItemSchema = unitViewSchema.extend({
  siteName: z.string(),
  siteTimeZone: z.string(),
  /** The site's date format (BCP 47); null or absent: ISO form. */
  siteLocale: z.string().nullable().optional(),
  designReference: z.string(),
  /** Restrictions of release-with-restrictions decisions on the unit not yet lifted (null: none). */
  activeRestrictions: z.string().nullable(),
});
export type UnitListItem = z.infer<typeof unitListItemSchema>;

/** GET /api/units — one page of the fleet. */
export const unitListPageSchema = pageOf(unitListItemSchema);
export type UnitListPage = z.infer<typeof unitListPageSchema>;

/** A sweep trace without its points (POST /api/units/:id/sweeps, POST /api/sessions/:id/sweeps, and in lists). */
export const sweepMetaSchema = z.strictObject({
  id: rowId,
  readingSetId: rowId,
  label: z.string(),
  testType: sweepTestTypeSchema,
  terminals: z.string().nullable(),
  /** Winding and phase of the trace (null winding counts as HV). */
  winding: sweepWindingSchema.nullable(),
  phase: sweepPhaseSchema.nullable(),
  tapPosition: z.string().nullable(),
  /** Post-fault traces: the tap of the baseline trace compared with (null: that trace's own tap). */
  baselineTapPosition: z.string().nullable(),
  demagnetised: z.boolean().nullable(),
  pointCount: z.number().int().nonnegative(),
  minHz: z.number(),
  maxHz: z.number(),
  sha256: z.string(),
  fileName: z.string().nullable(),
  createdAt: isoDateTime,
});
export type SweepMeta = z.infer<typeof sweepMetaSchema>;

/** A reading set's stored conditions (no values). */
export const readingSetConditionsSchema = z.strictObject({
  id: rowId,
  unitId: rowId,
  kind: z.enum(READING_SET_KINDS),
  eventId: rowId.nullable(),
  isReference: z.boolean(),
  takenAt: isoDateTime,
  temperatureC: z.number().nullable(),
  topOilC: z.number().nullable(),
  bottomOilC: z.number().nullable(),
  ambientC: z.number().nullable(),
  humidityPercent: z.number().nullable(),
  tapPosition: z.string().nullable(),
  instrument: z.string().nullable(),
  instrumentSerial: z.string().nullable(),
  testKV: z.number().nullable(),
  testFrequencyHz: z.number().nullable(),
  hoursDeenergised: z.number().nullable(),
  demagnetised: z.boolean().nullable(),
  windingTemperatureC: z.number().nullable(),
  notes: z.string().nullable(),
  createdById: rowId.nullable(),
  createdAt: isoDateTime,
});
export type ReadingSetConditions = z.infer<typeof readingSetConditionsSchema>;

/** POST /api/units/:id/reading-sets — the stored conditions and the values in the case format (none: no key). */
export const createdReadingSetSchema = readingSetConditionsSchema.extend({ values: readingSetSchema.optional() });
export type CreatedReadingSet = z.infer<typeof createdReadingSetSchema>;

/** A reading set in a unit or event file: conditions, values, its sweep traces listed. */
export const readingSetViewSchema = createdReadingSetSchema.extend({ sweeps: z.array(sweepMetaSchema) });
export type ReadingSetView = z.infer<typeof readingSetViewSchema>;

/** An event as the unit file lists it, with its own duty (no earlier faults counted). */
export const unitEventSummarySchema = z.strictObject({
  id: rowId,
  occurredAt: isoDateTime,
  type: faultTypeSchema,
  side: faultSideSchema,
  /** Side the fault was on (null: the same as `side`), and what the shot currents are (null: line). */
  location: faultSideSchema.nullable(),
  currentIs: currentIsSchema.nullable(),
  status: z.enum(EVENT_STATUSES),
  transformerTripped: z.boolean(),
  protectionOperated: z.array(protectionSchema),
  shots: z.array(shotSchema),
  throughFault: throughFaultSchema.nullable(),
});
export type UnitEventSummary = z.infer<typeof unitEventSummarySchema>;

/** GET /api/units/:id — the unit file: design, site, reading sets (newest first), events (newest first). */
export const unitDetailSchema = unitViewSchema.extend({
  site: siteViewSchema,
  design: designViewSchema,
  readingSets: z.array(readingSetViewSchema),
  events: z.array(unitEventSummarySchema),
  /** Restrictions of release-with-restrictions decisions on the unit not yet lifted (null: none). */
  activeRestrictions: z.string().nullable(),
});
export type UnitDetail = z.infer<typeof unitDetailSchema>;

/** A quantity a design family can be compared on (`capacitance.CHL`, `reactance.A`), in words and with its unit. */
export const familyQuantitySchema = z.strictObject({ name: z.string(), label: z.string(), unit: z.string() });

/** One unit of a design family on one quantity. */
export const designSisterItemSchema = z.strictObject({
  unitId: rowId,
  serial: z.string(),
  /** The unit's latest value (newest non-post-fault reading set that has it), in `unit`. */
  value: z.number(),
  /** When that reading set was taken. */
  takenAt: isoDateTime.nullable(),
  /** Modified z over every unit of the family with the value (null: too few sisters, or MAD/median zero). */
  modifiedZ: z.number().nullable(),
  deviationFromMedianPercent: z.number().nullable(),
  /** |M| at or above the criteria's limit. */
  outlier: z.boolean(),
});
export type DesignSisterItem = z.infer<typeof designSisterItemSchema>;

/** GET /api/designs/:id/sisters?quantity= — the family compared on one quantity (the engine's functions and constants). */
export const designSistersSchema = z.strictObject({
  designId: rowId,
  /** The quantity compared (null: no unit of the family has a comparable value). */
  quantity: z.string().nullable(),
  label: z.string().nullable(),
  unit: z.string().nullable(),
  /** Every quantity the family can be compared on. */
  quantities: z.array(familyQuantitySchema),
  items: z.array(designSisterItemSchema),
  median: z.number().nullable(),
  /** The MAD the modified z used (floored at the criteria's fraction of |median|; `madFloored` says so). */
  mad: z.number().nullable(),
  madFloored: z.boolean(),
  /** M = constant·(x − median)/MAD; outlier at |M| ≥ limit (the criteria set's `sisters` values). */
  constant: z.number(),
  limit: z.number(),
  criteriaVersion: z.number().int(),
  /** Why there are no modified z-scores, in words (null when there are). */
  note: z.string().nullable(),
});
export type DesignSisters = z.infer<typeof designSistersSchema>;
