// Merging several reading sets into one: for each quantity the newest value wins.
// Used for the baseline (newest value over the reference sets), `previous` (routine sets before the fault),
// the post-fault readings (all sessions of an event) and a sister unit's latest readings.
import type { ReadingSet } from '../schemas/case.js';

/**
 * Sections merged key by key (a configuration, a phase, a bushing terminal): a newer set replaces only the keys it has
 * (a bushing terminal's C1/C2 readings come whole from the newest set that tested that terminal).
 */
const PER_KEY = ['capacitancePF', 'capacitanceModes', 'dissipationPercent', 'reactance', 'excitationCurrentMA', 'windingResistanceOhm', 'turnsRatio', 'dissipationByFrequency', 'bushings'] as const;
/** Sections that are one measurement: the newest set that has it gives all of it. */
const WHOLE = ['threePhaseEquivalent', 'dissolvedGasPPM'] as const;

function time(s: ReadingSet): number {
  const t = s.takenAt ? Date.parse(s.takenAt) : NaN;
  return Number.isNaN(t) ? -Infinity : t;
}

const has = (s: ReadingSet, key: string) => {
  const v = (s as Record<string, unknown>)[key];
  return v !== undefined && v !== null && (typeof v !== 'object' || Object.keys(v as object).length > 0);
};

/**
 * Merges reading sets, oldest first, so that each quantity keeps its newest value (ties keep input order).
 * Conditions follow the values they qualify: the insulation temperature comes from the newest set that gave a
 * dissipation factor, the tap position from the newest set that gave reactance, the excitation voltage and the
 * resistance temperature from the newest set that gave those currents and resistances. Rules revision 2: `demagnetised`
 * qualifies the excitation test, `hoursDeEnergised` and `windingTemperatureC` the resistance test — each comes from the
 * newest set that gave those values (absent there = absent, never borrowed from an older test), or, when no set gave
 * them, from the newest set that has it.
 */
export function mergeReadingSets(sets: readonly ReadingSet[]): ReadingSet | undefined {
  if (!sets.length) return undefined;
  const ordered = sets.map((s, i) => ({ s, i })).sort((a, b) => time(a.s) - time(b.s) || a.i - b.i).map((x) => x.s);
  const out: Record<string, unknown> = {};
  for (const s of ordered) {
    const rec = s as Record<string, unknown>;
    for (const key of PER_KEY) if (has(s, key)) out[key] = { ...(out[key] as object), ...(rec[key] as object) };
    for (const key of WHOLE) if (has(s, key)) out[key] = rec[key];
    if (has(s, 'excitationCurrentMA') && rec.excitationKV !== undefined) out.excitationKV = rec.excitationKV;
    if (has(s, 'windingResistanceOhm') && rec.resistanceTemperatureC !== undefined) out.resistanceTemperatureC = rec.resistanceTemperatureC;
    if (s.takenAt) out.takenAt = s.takenAt;
  }
  const newest = (pred: (s: ReadingSet) => boolean) => [...ordered].reverse().find(pred);
  const tempSource = newest((s) => has(s, 'dissipationPercent') && s.temperatureC !== undefined) ?? newest((s) => s.temperatureC !== undefined);
  if (tempSource) out.temperatureC = tempSource.temperatureC;
  const tapSource = newest((s) => has(s, 'reactance') && s.tapPosition !== undefined) ?? newest((s) => s.tapPosition !== undefined);
  if (tapSource) out.tapPosition = tapSource.tapPosition;
  const conditionOf = (key: 'demagnetised' | 'hoursDeEnergised' | 'windingTemperatureC', qualifies: string) => {
    const source = newest((s) => has(s, qualifies)) ?? newest((s) => s[key] !== undefined);
    if (source && source[key] !== undefined) out[key] = source[key];
  };
  conditionOf('demagnetised', 'excitationCurrentMA');
  conditionOf('hoursDeEnergised', 'windingResistanceOhm');
  conditionOf('windingTemperatureC', 'windingResistanceOhm');
  if (out.excitationKV === undefined) {
    const kv = newest((s) => s.excitationKV !== undefined);
    if (kv) out.excitationKV = kv.excitationKV;
  }
  return out as ReadingSet;
}
