// A design family compared on one quantity: every unit's latest value, its modified z-score over the family, its
// deviation from the family's median, the family's median and MAD, and whether the unit is an outlier.
// The quantities are the engine's sister quantities (capacitance per configuration in pF, %X per phase through the
// engine's `reactancePercent`), and every statistic comes from the engine's own `modifiedZScore` with the criteria
// set's constants: the family page, the screening's sister comparison and the screening itself give the same numbers.
// Pure: no I/O.
import type { GapsightCase, ReadingSet, Unit } from '../schemas/case.js';
import type { Criteria } from '../screening/criteria.js';
import { levelFromBands } from '../screening/levels.js';
import { reactancePercent } from '../screening/reactance.js';
import { modifiedZScore } from '../screening/sisters.js';

export { outliersFirst } from './family-order.js';

/** One unit of a family with its latest readings (merged, newest value per quantity) and the ratings %X needs. */
export interface FamilyMember {
  unitId?: number;
  serial: string;
  /** The unit whose case is screened (highlighted on the charts). */
  isThisUnit?: boolean;
  values: ReadingSet | undefined;
  unit: Pick<Unit, 'hvKV' | 'ratedKVA'>;
}

export type FamilyQuantityKind = 'capacitance' | 'reactance';

/** A quantity a family can be compared on: `capacitance.CHL` or `reactance.A`. */
export interface FamilyQuantity {
  name: string;
  kind: FamilyQuantityKind;
  location: string;
  /** In words: "CHL capacitance", "Phase A leakage reactance". */
  label: string;
  /** The value's unit: "pF" or "%" (of the rated impedance base). */
  unit: string;
}

/** A quantity's kind, location, words and unit from its name; null when the name is not a family quantity. */
export function familyQuantity(name: string): FamilyQuantity | null {
  const m = /^(capacitance|reactance)\.([A-Za-z0-9]+)$/.exec(name);
  if (!m) return null;
  const kind = m[1] as FamilyQuantityKind;
  const location = m[2];
  return kind === 'capacitance'
    ? { name, kind, location, label: `${location} capacitance`, unit: 'pF' }
    : { name, kind, location, label: `Phase ${location} leakage reactance`, unit: '%' };
}

/** The sister quantities one reading set gives (the engine's `sisterQuantities` names and values): name → value. */
export function memberQuantities(values: ReadingSet | undefined, unit: Pick<Unit, 'hvKV' | 'ratedKVA'>): Map<string, number> {
  const out = new Map<string, number>();
  for (const [cfg, v] of Object.entries(values?.capacitancePF ?? {})) if (typeof v === 'number') out.set(`capacitance.${cfg}`, v);
  for (const [phase, entry] of Object.entries(values?.reactance ?? {})) if (entry) out.set(`reactance.${phase}`, reactancePercent(entry, unit));
  return out;
}

const KIND_ORDER: Record<FamilyQuantityKind, number> = { capacitance: 0, reactance: 1 };

/** Every quantity at least one unit of the family has: capacitance configurations first, then reactance phases. */
export function familyQuantities(members: readonly FamilyMember[]): FamilyQuantity[] {
  const names = new Set<string>();
  for (const m of members) for (const name of memberQuantities(m.values, m.unit).keys()) names.add(name);
  return [...names]
    .map((n) => familyQuantity(n)!)
    .sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || a.location.localeCompare(b.location));
}

export interface FamilyItem {
  unitId?: number;
  serial: string;
  isThisUnit: boolean;
  value: number;
  /** Modified z-score over every unit that has the value (null: too few units, MAD or median zero). */
  modifiedZ: number | null;
  /** 100·(value − family median)/median (null when the median is zero). */
  deviationFromMedianPercent: number | null;
  /** |M| at or above the criteria's limit (the engine's rule for the sister modified z). */
  outlier: boolean;
}

export interface FamilyComparison {
  quantity: FamilyQuantity;
  items: FamilyItem[];
  median: number | null;
  /** The MAD the modified z used (raised to the floor when the raw MAD was below it). */
  mad: number | null;
  madFloored: boolean;
  /** The criteria's constants: M = constant·(x − median)/MAD, outlier at |M| ≥ limit. */
  constant: number;
  limit: number;
  /** Why there are no modified z-scores, in words (null when there are). */
  note: string | null;
}

/**
 * The family compared on one quantity. Each unit's modified z is the engine's `modifiedZScore(x, values, …)` over
 * every unit that has the value (x among them), as the engine computes a unit against its sisters; it is given only
 * when the unit has at least `minSistersModifiedZ` sisters with the value (as the engine requires).
 */
export function compareFamily(members: readonly FamilyMember[], quantityName: string, criteria: Criteria): FamilyComparison {
  const quantity = familyQuantity(quantityName);
  if (!quantity) throw new Error(`not a family quantity: ${quantityName}`);
  const sc = criteria.sisters;
  const present = members
    .map((m) => ({ m, value: memberQuantities(m.values, m.unit).get(quantityName) }))
    .filter((x): x is { m: FamilyMember; value: number } => x.value !== undefined);
  const values = present.map((x) => x.value);
  const base = { quantity, constant: sc.modifiedZConstant, limit: sc.modifiedZLimit };
  if (!values.length) return { ...base, items: [], median: null, mad: null, madFloored: false, note: 'No unit of the family has this value.' };
  const enough = values.length - 1 >= sc.minSistersModifiedZ;
  let median: number | null = null;
  let mad: number | null = null;
  let madFloored = false;
  let note: string | null = enough ? null : `A modified z-score needs at least ${sc.minSistersModifiedZ} sisters with the value; this family has ${values.length} units with it.`;
  const items: FamilyItem[] = present.map(({ m, value }) => {
    const z = modifiedZScore(value, values, sc.modifiedZConstant, sc.madFloorFractionOfMedian);
    median = z.median;
    mad = z.mad;
    madFloored = z.madFloored;
    if (enough && z.value === null && z.note) note = z.note;
    const modifiedZ = enough ? z.value : null;
    return {
      ...(m.unitId !== undefined ? { unitId: m.unitId } : {}),
      serial: m.serial,
      isThisUnit: m.isThisUnit ?? false,
      value,
      modifiedZ,
      deviationFromMedianPercent: z.median === 0 ? null : (100 * (value - z.median)) / z.median,
      outlier: modifiedZ !== null && levelFromBands(Math.abs(modifiedZ), [{ from: sc.modifiedZLimit, level: 'investigate' }], criteria.rounding.significantDigits) !== 'ok',
    };
  });
  return { ...base, items, median, mad, madFloored, note };
}

/** The family of a screened case: this unit with its post-fault readings, each sister with its latest readings. */
export function caseFamilyMembers(c: GapsightCase): FamilyMember[] {
  return [
    { serial: c.unit.serial, isThisUnit: true, values: c.postFault, unit: c.unit },
    ...(c.sisters ?? []).map((s) => ({ serial: s.serial ?? 'sister', values: s, unit: c.unit })),
  ];
}

/**
 * The sister comparisons of a screened case: one per quantity the engine compares (this unit has it post-fault), the
 * family being this unit and the sisters that have the value — the engine's `sisterQuantities` set, so this unit's
 * modified z equals the screening's `sisters.<quantity>.modifiedZ`.
 */
export function caseSisterComparisons(c: GapsightCase, criteria: Criteria): FamilyComparison[] {
  if (!c.sisters?.length) return [];
  const members = caseFamilyMembers(c);
  const own = memberQuantities(c.postFault, c.unit);
  return familyQuantities(members)
    .filter((q) => own.has(q.name))
    .map((q) => compareFamily(members, q.name, criteria));
}
