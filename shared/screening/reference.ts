// References for shift indicators: the unit's own baseline or previous value, or the sisters' median standing in.
import { median } from 'simple-statistics';
import type { Indicator, Level, Method } from '../schemas/result.js';
import type { Band, Criteria } from './criteria.js';
import { criteriaV2 } from './criteria-sets.js';
import { capLevel, indicator, levelFromBands, roundSignificant } from './levels.js';

export type Reference = {
  value: number;
  /** Words for reasons: "2019-05-02 baseline", "previous (2024-06-20)", "sisters' median (5 units)". */
  label: string;
  fromSisters: boolean;
};

export const SISTERS_REFERENCE_NOTE = "sisters' median as reference";

/** Percentage change of `value` against `reference`: 100·(value − reference)/reference. */
export function shiftPercent(value: number, reference: number): number {
  return (100 * (value - reference)) / reference;
}

/** Words for an own reference set ("2019-05-02 baseline"). */
export function ownReferenceLabel(kind: 'baseline' | 'previous', takenAt: string | undefined): string {
  if (kind === 'baseline') return takenAt ? `${takenAt} baseline` : 'baseline (undated)';
  return takenAt ? `${takenAt} previous test` : 'previous test (undated)';
}

/** The sisters' median of a quantity, when at least `minSisters` sisters have it. */
export function sistersMedianReference(values: number[], minSisters: number): Reference | null {
  if (values.length < minSisters) return null;
  return { value: median(values), label: `sisters' median (${values.length} units)`, fromSisters: true };
}

/** The own baseline value, else the sisters' median (≥ minSisters). */
export function baselineOrSisters(
  own: number | undefined,
  takenAt: string | undefined,
  sisterValues: number[],
  criteria: Criteria,
): Reference | null {
  if (own !== undefined) return { value: own, label: ownReferenceLabel('baseline', takenAt), fromSisters: false };
  return sistersMedianReference(sisterValues, criteria.sisters.minSistersDeviation);
}

/** A shift indicator judged on |shift| with banded levels; capped when the sisters' median stands in. */
export function shiftIndicator(args: {
  key: string;
  value: number;
  reference: Reference;
  bands: readonly Band[];
  method: Method;
  rule: string;
  source: string;
  location?: string;
  criteria: Criteria;
  /** Multiply band starts by this (reactance bands are multiples of L). */
  scale?: number;
  note?: string;
}): Indicator {
  const { criteria, reference } = args;
  const shift = shiftPercent(args.value, reference.value);
  const bands = args.scale === undefined ? args.bands : args.bands.map((b) => ({ from: b.from * (args.scale as number), level: b.level }));
  let level: Level = levelFromBands(Math.abs(shift), bands, criteria.rounding.significantDigits);
  const notes: string[] = [];
  let source = args.source;
  if (reference.fromSisters) {
    level = capLevel(level, criteria.sisters.referenceCap);
    notes.push(SISTERS_REFERENCE_NOTE);
    source = `${source}; ${criteria.sisters.referenceSource}`;
  }
  if (args.note) notes.push(args.note);
  return indicator(args.key, shift, level, args.method, args.rule, source, {
    basis: reference.fromSisters ? 'sisters' : 'change',
    note: notes.length ? notes.join('; ') : undefined,
    location: args.location,
    reference: reference.label,
  });
}

export const IMPLAUSIBLE_NOTE = 'implausible against the reference — check the unit of measure and the connection';

/** Plausibility limits of a criteria set (revision 2; version 1 sets use the revision-2 defaults). */
export function plausibilityOf(criteria: Criteria): NonNullable<Criteria['plausibility']> {
  return criteria.plausibility ?? criteriaV2.plausibility!;
}

/** A tap position as words (the sets give strings or numbers). */
export const tapText = (t: string | number | undefined): string => (t === undefined ? '' : String(t));

/** Whether two tap positions, both given, differ (then the tap-dependent readings are unreliable). */
export const tapsDiffer = (a: string | number | undefined, b: string | number | undefined): boolean =>
  a !== undefined && b !== undefined && tapText(a) !== tapText(b);

/** Whether a turns ratio is more than the criteria's percentage off a reference ratio (an entry or connection error). */
export function isRatioImplausible(value: number, reference: number, criteria: Criteria): boolean {
  if (!(reference > 0) || !(value > 0)) return false;
  const d = criteria.rounding.significantDigits;
  return roundSignificant(Math.abs(shiftPercent(value, reference)), d) > plausibilityOf(criteria).ratioMaxPercent;
}

/** Whether a value is more than `maxFactor` × or less than 1/`maxFactor` × its reference (a unit or connection error). */
export function isImplausible(value: number, reference: number, criteria: Criteria): boolean {
  if (!(reference > 0) || !(value > 0)) return false;
  const f = plausibilityOf(criteria).maxFactor;
  const ratio = value / reference;
  return ratio > f || ratio < 1 / f;
}
