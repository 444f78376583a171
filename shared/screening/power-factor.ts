// Power factor from dissipation factor, corrected to 20 °C, judged on its change against the baseline.
import type { GapsightCase } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { capLevel, describeBands, indicator, levelFromBands, roundSignificant } from './levels.js';
import { ownReferenceLabel } from './reference.js';

/** PF = DF/√(1 + DF²), both as fractions (0.0028 for 0.28 %). */
export function powerFactorFromDissipation(df: number): number {
  return df / Math.sqrt(1 + df * df);
}

/** DF = PF/√(1 − PF²), both as fractions. */
export function dissipationFromPowerFactor(pf: number): number {
  return pf / Math.sqrt(1 - pf * pf);
}

/** Temperature correction factor to 20 °C by linear interpolation in the table; null outside the table (ends inclusive). */
export function temperatureFactor(temperatureC: number, criteria: Criteria): number | null {
  const table = [...criteria.powerFactor.temperatureFactors].sort((a, b) => a[0] - b[0]);
  const digits = criteria.rounding.significantDigits;
  const t = roundSignificant(temperatureC, digits);
  if (t < table[0][0] || t > table[table.length - 1][0]) return null;
  for (let i = 0; i < table.length - 1; i++) {
    const [t0, f0] = table[i];
    const [t1, f1] = table[i + 1];
    if (t >= t0 && t <= t1) return f0 + ((f1 - f0) * (t - t0)) / (t1 - t0);
  }
  return table[table.length - 1][1];
}

/** PF at 20 °C in percent from DF in percent at the insulation temperature; null outside the table. */
export function pf20Percent(dissipationPercent: number, temperatureC: number, criteria: Criteria): number | null {
  const factor = temperatureFactor(temperatureC, criteria);
  if (factor === null) return null;
  return 100 * powerFactorFromDissipation(dissipationPercent / 100) * factor;
}

export type PfRise = { value: number | null; level: Level; note?: string; lowConfidence: boolean };

/**
 * Rise of PF20 against a reference set, judged as the case format says (revision 2): the change bands apply only when
 * PF20 rose by at least `minRisePoints` percentage points ("within repeatability" below); insulation temperatures more
 * than `temperatureDoubtC` apart make the rise low-confidence and at most watch ("temperature correction uncertain").
 */
export function pfRise(
  postDf: number,
  postT: number | undefined,
  baseDf: number,
  baseT: number | undefined,
  criteria: Criteria,
  what: { post: string; base: string } = { post: 'post-fault set', base: 'baseline set' },
): PfRise {
  const pfc = criteria.powerFactor;
  const d = criteria.rounding.significantDigits;
  const table = pfc.temperatureFactors.map((p) => p[0]);
  const range = `${Math.min(...table)}–${Math.max(...table)} °C`;
  if (postT === undefined) return { value: null, level: 'ok', note: `no insulation temperature in the ${what.post}`, lowConfidence: false };
  const post = pf20Percent(postDf, postT, criteria);
  if (post === null) return { value: null, level: 'ok', note: `insulation temperature ${postT} °C outside the correction table (${range})`, lowConfidence: false };
  if (baseT === undefined) return { value: null, level: 'ok', note: `no insulation temperature in the ${what.base}`, lowConfidence: false };
  const base = pf20Percent(baseDf, baseT, criteria);
  if (base === null) return { value: null, level: 'ok', note: `reference temperature ${baseT} °C outside the correction table (${range})`, lowConfidence: false };
  if (base === 0) return { value: null, level: 'ok', note: 'reference PF20 is zero', lowConfidence: false };
  const value = (100 * (post - base)) / base;
  const floor = pfc.minRisePoints ?? 0;
  if (floor > 0 && roundSignificant(post - base, d) < roundSignificant(floor, d)) {
    return { value, level: 'ok', note: `PF20 moved ${(post - base).toFixed(3)} points: within repeatability (below ${floor} point)`, lowConfidence: false };
  }
  let level = levelFromBands(value, pfc.riseBands, d);
  const doubt = pfc.temperatureDoubtC;
  if (doubt !== undefined && roundSignificant(Math.abs(postT - baseT), d) > doubt) {
    level = capLevel(level, criteria.lowConfidenceCap ?? 'watch');
    return { value, level, note: `temperature correction uncertain (sets ${Math.abs(postT - baseT).toFixed(1)} °C apart, more than ${doubt} °C)`, lowConfidence: true };
  }
  return { value, level, lowConfidence: false };
}

/** Power-factor indicators for every configuration with a post-fault DF. */
export function powerFactorIndicators(c: GapsightCase, criteria: Criteria, unreliableConfigs: readonly string[]): Indicator[] {
  const out: Indicator[] = [];
  const pfc = criteria.powerFactor;
  const digits = criteria.rounding.significantDigits;
  const table = pfc.temperatureFactors.map((p) => p[0]);
  const range = `${Math.min(...table)}–${Math.max(...table)} °C`;
  for (const [cfg, df] of Object.entries(c.postFault?.dissipationPercent ?? {})) {
    const unreliable = unreliableConfigs.includes(`capacitance.${cfg}`);
    const t = c.postFault?.temperatureC;
    const post = t === undefined ? null : pf20Percent(df, t, criteria);
    const note =
      t === undefined
        ? 'no insulation temperature in the post-fault set'
        : post === null
          ? `insulation temperature ${t} °C outside the correction table (${range})`
          : undefined;
    // An absolute value is a state, not a change: watch at most (an aged unit whose PF has not moved is no finding).
    const level: Level = post === null || unreliable ? 'ok' : levelFromBands(post, [{ from: pfc.absoluteWatchPercent, level: 'watch' }], digits);
    out.push(
      indicator(`powerFactor.${cfg}.pf20Percent`, post, level, 'power-factor', `PF20 ≥ ${pfc.absoluteWatchPercent} % → watch (at most; a state, not a change)`, `${pfc.absoluteSource}; ${pfc.temperatureSource}`, {
        basis: 'state',
        note: unreliable ? [note, 'configuration unreliable: not judged'].filter(Boolean).join('; ') : note,
        location: cfg,
      }),
    );
    const baseDf = c.baseline?.dissipationPercent?.[cfg];
    if (baseDf === undefined) continue;
    const rise = pfRise(df, t, baseDf, c.baseline?.temperatureC, criteria);
    const notes = [rise.note, unreliable ? 'configuration unreliable: not judged' : undefined].filter(Boolean);
    const floorText = pfc.minRisePoints ? ` when PF20 rose by ≥ ${pfc.minRisePoints} point` : '';
    out.push(
      indicator(`powerFactor.${cfg}.riseFromBaselinePercent`, rise.value, unreliable ? 'ok' : rise.level, 'power-factor', `${describeBands(pfc.riseBands, ' %', 'PF20 rise')}${floorText}`, [pfc.riseSource, pfc.minRiseSource, rise.lowConfidence ? pfc.temperatureDoubtSource : undefined].filter(Boolean).join('; '), {
        basis: 'change',
        lowConfidence: rise.lowConfidence,
        note: notes.length ? notes.join('; ') : undefined,
        location: cfg,
        reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
      }),
    );
  }
  return out;
}
