// Plausibility of readings as they are typed: a capacitance or reactance %X more than 1.5 × (or less than 1/1.5 ×) its
// reference, or a turns ratio more than 10 % off, is most likely a unit-of-measure or connection error (rules revision
// 2, "Plausibility"). The limits, the nameplate ratio and the words come from the engine; this file finds the
// reference a typed value is compared with: the event's case (baseline, then previous, then the sisters' median), the
// nameplate ratio from the vector group, or — with no reference — the other values typed in the form.
import { median } from 'simple-statistics';
import type { GapsightCase, ReadingSet, Unit } from '../shared/schemas/case';
import type { Criteria } from '../shared/screening/criteria';
import { criteriaV2 } from '../shared/screening/criteria-sets';
import { nameplateRatio } from '../shared/screening/ratio';
import { reactancePercent } from '../shared/screening/reactance';
import { IMPLAUSIBLE_NOTE, isImplausible, isRatioImplausible, ownReferenceLabel, plausibilityOf } from '../shared/screening/reference';
import { formatSignificant } from './format';

export { IMPLAUSIBLE_NOTE };
export const NF_NOTE = 'this looks like nF';

export interface Reference {
  value: number;
  /** Where it comes from, in words ("2019-05-02 baseline", "nameplate ratio", "the other phases typed"). */
  label: string;
}

/** The references of the quantities checked, by case field path (`capacitancePF.CH`, `reactance.A.percent`, …). */
export type References = Record<string, Reference>;

export type UnitForReferences = Pick<Unit, 'phases' | 'hvKV' | 'lvKV' | 'ratedKVA'> & { vectorGroup?: string | null; nameplateTurnsRatio?: number };

function setLabel(kind: 'baseline' | 'previous', set: ReadingSet): string {
  return ownReferenceLabel(kind, set.takenAt);
}

/**
 * References from the event's case document: for each capacitance configuration, reactance phase, turns-ratio phase and
 * bushing terminal, the baseline value, else the previous (routine) one, else the sisters' median (at least as many
 * sisters as the criteria ask for a deviation). The turns ratio's reference is the nameplate ratio from the vector group
 * when it can be derived. `unit` stands in for the case's unit when the case could not be loaded.
 */
export function referencesFor(c: GapsightCase | null, unit: UnitForReferences, criteria: Criteria = criteriaV2): References {
  const out: References = {};
  const caseUnit: Unit = { serial: '', impedancePercent: 1, ...unit, ...(c?.unit ?? {}), vectorGroup: (c?.unit.vectorGroup ?? unit.vectorGroup) || undefined } as Unit;
  const own: Array<['baseline' | 'previous', ReadingSet | undefined]> = [
    ['baseline', c?.baseline],
    ['previous', c?.previous],
  ];
  const sisters = c?.sisters ?? [];
  const minSisters = criteria.sisters.minSistersDeviation;

  const put = (path: string, pick: (s: ReadingSet) => number | undefined) => {
    for (const [kind, set] of own) {
      const v = set ? pick(set) : undefined;
      if (v !== undefined && v > 0) {
        out[path] = { value: v, label: setLabel(kind, set!) };
        return;
      }
    }
    const values = sisters.map(pick).filter((v): v is number => v !== undefined && v > 0);
    if (values.length >= minSisters) out[path] = { value: median(values), label: `sisters' median (${values.length} units)` };
  };

  const keys = (section: 'capacitancePF' | 'reactance' | 'turnsRatio' | 'bushings') =>
    new Set([...own.flatMap(([, s]) => Object.keys(s?.[section] ?? {})), ...sisters.flatMap((s) => Object.keys(s[section] ?? {}))]);

  for (const cfg of keys('capacitancePF')) put(`capacitancePF.${cfg}`, (s) => s.capacitancePF?.[cfg]);
  for (const phase of keys('reactance')) {
    put(`reactance.${phase}.percent`, (s) => {
      const r = s.reactance?.[phase];
      return r ? reactancePercent(r, caseUnit) : undefined;
    });
  }
  for (const terminal of keys('bushings')) {
    put(`bushings.${terminal}.c1PF`, (s) => s.bushings?.[terminal]?.c1PF);
    put(`bushings.${terminal}.c2PF`, (s) => s.bushings?.[terminal]?.c2PF);
  }
  const nameplate = nameplateRatio(caseUnit);
  const phases = new Set([...keys('turnsRatio'), ...(unit.phases === 1 ? ['A'] : ['A', 'B', 'C'])]);
  for (const phase of phases) {
    if (nameplate.ratio !== null) {
      out[`turnsRatio.${phase}`] = { value: nameplate.ratio, label: caseUnit.nameplateTurnsRatio === undefined && caseUnit.phases !== 1 ? `nameplate ratio of ${caseUnit.vectorGroup}` : 'nameplate ratio' };
    }
    else put(`turnsRatio.${phase}`, (s) => s.turnsRatio?.[phase]);
  }
  return out;
}

export interface PlausibilityWarning {
  kind: 'nF' | 'implausible';
  message: string;
}

function referenceText(ref: Reference, unit: string): string {
  return `${formatSignificant(ref.value, 4)}${unit ? ` ${unit}` : ''}, ${ref.label}`;
}

/**
 * A capacitance (pF) or reactance (%) against its reference: about 1000 × too small for a pF reference reads as a value
 * typed in nF; otherwise beyond the criteria's factor either way is implausible.
 */
export function checkAgainstReference(value: number, ref: Reference, unit: 'pF' | '%', criteria: Criteria = criteriaV2): PlausibilityWarning | null {
  if (!(value > 0) || !(ref.value > 0)) return null;
  const f = plausibilityOf(criteria).maxFactor;
  const ratio = value / ref.value;
  if (unit === 'pF' && ratio >= 1 / (1000 * f) && ratio <= f / 1000) {
    return { kind: 'nF', message: `${NF_NOTE}: enter picofarads (reference ${referenceText(ref, unit)})` };
  }
  if (isImplausible(value, ref.value, criteria)) return { kind: 'implausible', message: `${IMPLAUSIBLE_NOTE} (reference ${referenceText(ref, unit)})` };
  return null;
}

/** A turns ratio more than the criteria's percentage off its reference (nameplate ratio, else the unit's own ratio). */
export function checkRatio(value: number, ref: Reference, criteria: Criteria = criteriaV2): PlausibilityWarning | null {
  if (!(value > 0) || !(ref.value > 0)) return null;
  const limit = plausibilityOf(criteria).ratioMaxPercent;
  if (!isRatioImplausible(value, ref.value, criteria)) return null;
  return { kind: 'implausible', message: `${IMPLAUSIBLE_NOTE} (reference ${referenceText(ref, '')}; more than ${limit} % off)` };
}

/** The median of the other values of a group (the same quantity on the other phases), as a stand-in reference. */
export function othersReference(values: Record<string, number>, own: string, label: string): Reference | null {
  const others = Object.entries(values)
    .filter(([k, v]) => k !== own && v > 0)
    .map(([, v]) => v);
  return others.length ? { value: median(others), label } : null;
}

/**
 * Capacitances with no reference at all: only a value at least 100 × smaller than the median of the others typed is
 * told (configurations and terminals differ legitimately by a few times, so the 1.5 × rule cannot apply between them).
 */
export function checkAmongCapacitances(value: number, others: Reference | null): PlausibilityWarning | null {
  if (!others || !(value > 0)) return null;
  if (value * 100 <= others.value) return { kind: 'nF', message: `${NF_NOTE}: enter picofarads (the other capacitances typed are about ${formatSignificant(others.value, 3)} pF)` };
  return null;
}
