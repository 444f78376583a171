// Winding resistance corrected to a reference temperature: change against baseline and phase imbalance.
import type { GapsightCase, ReadingSet } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, levelFromBands } from './levels.js';
import { ownReferenceLabel, shiftPercent } from './reference.js';

/** R_s = R_m·(T_s + T_k)/(T_m + T_k) (IEEE C57.12.90); T_k 234.5 copper, 225 aluminium. */
export function correctResistance(measuredOhm: number, measuredC: number, referenceC: number, tkC: number): number {
  return (measuredOhm * (referenceC + tkC)) / (measuredC + tkC);
}

/** Phase imbalance: 100·(max − min)/mean. */
export function phaseImbalancePercent(values: readonly number[]): number {
  const m = values.reduce((a, b) => a + b, 0) / values.length;
  return (100 * (Math.max(...values) - Math.min(...values))) / m;
}

const windingTemperature = (s: ReadingSet | undefined) => s?.resistanceTemperatureC ?? s?.temperatureC;

/** Resistance indicators: `resistance.<phase>.changePercent` (both corrected), `resistance.phaseImbalancePercent`. */
export function resistanceIndicators(c: GapsightCase, criteria: Criteria): Indicator[] {
  const post = c.postFault?.windingResistanceOhm;
  if (!post) return [];
  const rc = criteria.resistance;
  const d = criteria.rounding.significantDigits;
  const tk = rc.temperatureConstantC[c.unit.conductor ?? 'Cu'];
  const out: Indicator[] = [];
  const base = c.baseline?.windingResistanceOhm;
  const tPost = windingTemperature(c.postFault);
  const tBase = windingTemperature(c.baseline);
  const rule = `${describeBands(rc.changeBands, ' %', '|change| at ' + rc.referenceTemperatureC + ' °C')}`;
  for (const [phase, value] of Object.entries(post)) {
    const b = base?.[phase];
    if (b === undefined) continue;
    let change: number | null = null;
    let note: string | undefined;
    if (tPost === undefined || tBase === undefined) note = 'winding temperature missing: cannot correct to the reference temperature';
    else change = shiftPercent(correctResistance(value, tPost, rc.referenceTemperatureC, tk), correctResistance(b, tBase, rc.referenceTemperatureC, tk));
    out.push(
      indicator(`resistance.${phase}.changePercent`, change, change === null ? 'ok' : levelFromBands(Math.abs(change), rc.changeBands, d), 'resistance', rule, `${rc.changeSource}; ${rc.correctionSource}`, {
        note,
        location: phase,
        reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
      }),
    );
  }
  const values = Object.values(post);
  if (c.unit.phases === 3 && values.length >= 2) {
    const imb = phaseImbalancePercent(values);
    const applies = c.unit.ratedKVA > rc.imbalanceAboveKVA;
    out.push(
      indicator('resistance.phaseImbalancePercent', imb, applies ? levelFromBands(imb, rc.imbalanceBands, d) : 'ok', 'resistance', `${describeBands(rc.imbalanceBands, ' %', 'imbalance')} (units above ${rc.imbalanceAboveKVA} kVA)`, rc.imbalanceSource),
    );
  }
  return out;
}
