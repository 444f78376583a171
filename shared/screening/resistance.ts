// Winding resistance corrected to a reference temperature: change against baseline and phase imbalance.
import type { GapsightCase, ReadingSet } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { criteriaV2 } from './criteria-sets.js';
import { capLevel, describeBands, indicator, levelFromBands } from './levels.js';
import { ownReferenceLabel, shiftPercent, tapsDiffer, tapText } from './reference.js';

/** R_s = R_m·(T_s + T_k)/(T_m + T_k) (IEEE C57.12.90); T_k 234.5 copper, 225 aluminium. */
export function correctResistance(measuredOhm: number, measuredC: number, referenceC: number, tkC: number): number {
  return (measuredOhm * (referenceC + tkC)) / (measuredC + tkC);
}

/** Phase imbalance: 100·(max − min)/mean. */
export function phaseImbalancePercent(values: readonly number[]): number {
  const m = values.reduce((a, b) => a + b, 0) / values.length;
  return (100 * (Math.max(...values) - Math.min(...values))) / m;
}

export type WindingTemperature = { temperatureC: number | undefined; doubt?: string };

/**
 * The winding temperature a set's resistance is corrected with (revision 2): the measured winding temperature
 * (`windingTemperatureC`, or `resistanceTemperatureC`) when given; else the insulation (oil) temperature, trusted only
 * after `minHoursDeEnergised` hours de-energised — otherwise the correction is doubtful (low confidence).
 * `strict` false (reference sets, taken on a cold unit) takes the oil temperature without doubt.
 */
export function windingTemperature(s: ReadingSet | undefined, criteria: Criteria, strict: boolean): WindingTemperature {
  const measured = s?.windingTemperatureC ?? s?.resistanceTemperatureC;
  if (measured !== undefined) return { temperatureC: measured };
  const oil = s?.temperatureC;
  if (oil === undefined || !strict) return { temperatureC: oil };
  const hours = criteria.resistance.minHoursDeEnergised;
  if (hours === undefined) return { temperatureC: oil };
  if (s?.hoursDeEnergised !== undefined && s.hoursDeEnergised >= hours) return { temperatureC: oil };
  return {
    temperatureC: oil,
    doubt: `winding temperature not measured and ${s?.hoursDeEnergised === undefined ? 'time de-energised unknown' : `only ${s.hoursDeEnergised} h de-energised`} (the oil temperature stands for the winding after ${hours} h): temperature correction uncertain`,
  };
}


export type ResistanceOutcome = { indicators: Indicator[]; unreliable: string[] };

/** Resistance indicators: `resistance.<phase>.changePercent` (both corrected), `resistance.phaseImbalancePercent`. */
export function resistanceIndicators(c: GapsightCase, criteria: Criteria): ResistanceOutcome {
  const post = c.postFault?.windingResistanceOhm;
  const unreliable: string[] = [];
  if (!post) return { indicators: [], unreliable };
  const rc = criteria.resistance;
  const d = criteria.rounding.significantDigits;
  const tk = rc.temperatureConstantC[c.unit.conductor ?? 'Cu'];
  const out: Indicator[] = [];
  const base = c.baseline?.windingResistanceOhm;
  const tPost = windingTemperature(c.postFault, criteria, true);
  const tBase = windingTemperature(c.baseline, criteria, false);
  const postTap = c.postFault?.tapPosition;
  const baseTap = c.baseline?.tapPosition;
  const mismatch = !!base && tapsDiffer(postTap, baseTap);
  if (mismatch) unreliable.push('windingResistanceOhm');
  const rule = `${describeBands(rc.changeBands, ' %', '|change| at ' + rc.referenceTemperatureC + ' °C')}`;
  const hoursSource = rc.hoursSource ?? criteriaV2.resistance.hoursSource!;
  for (const [phase, value] of Object.entries(post)) {
    const b = base?.[phase];
    if (b === undefined) continue;
    let change: number | null = null;
    const notes: string[] = [];
    if (tPost.temperatureC === undefined || tBase.temperatureC === undefined) notes.push('winding temperature missing: cannot correct to the reference temperature');
    else change = shiftPercent(correctResistance(value, tPost.temperatureC, rc.referenceTemperatureC, tk), correctResistance(b, tBase.temperatureC, rc.referenceTemperatureC, tk));
    let level = change === null || mismatch ? 'ok' : levelFromBands(Math.abs(change), rc.changeBands, d);
    const lowConfidence = change !== null && !mismatch && !!tPost.doubt;
    if (lowConfidence) {
      level = capLevel(level, criteria.lowConfidenceCap ?? 'watch');
      notes.push(tPost.doubt!);
    }
    if (mismatch) notes.push(`tap mismatch (baseline at tap ${tapText(baseTap)}, post-fault at ${tapText(postTap)}): repeat at tap ${tapText(baseTap)}; not judged`);
    out.push(
      indicator(`resistance.${phase}.changePercent`, change, level, 'resistance', rule, [rc.changeSource, rc.correctionSource, lowConfidence ? hoursSource : undefined].filter(Boolean).join('; '), {
        basis: 'change',
        lowConfidence,
        note: notes.length ? notes.join('; ') : undefined,
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
      indicator('resistance.phaseImbalancePercent', imb, applies && !mismatch ? levelFromBands(imb, rc.imbalanceBands, d) : 'ok', 'resistance', `${describeBands(rc.imbalanceBands, ' %', 'imbalance')} (units above ${rc.imbalanceAboveKVA} kVA; a state)`, rc.imbalanceSource, {
        basis: 'state',
      }),
    );
  }
  return { indicators: out, unreliable };
}
