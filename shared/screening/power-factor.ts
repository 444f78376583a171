// Power factor from dissipation factor, corrected to 20 °C, judged on its change against the baseline.
import type { GapsightCase } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, levelFromBands, roundSignificant } from './levels.js';
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
    // Inclusive lower end like every band (case format, "Rules that decide numbers"); watch is the most it can give.
    const level: Level = post === null || unreliable ? 'ok' : levelFromBands(post, [{ from: pfc.absoluteWatchPercent, level: 'watch' }], digits);
    out.push(
      indicator(`powerFactor.${cfg}.pf20Percent`, post, level, 'power-factor', `PF20 ≥ ${pfc.absoluteWatchPercent} % → watch (at most)`, `${pfc.absoluteSource}; ${pfc.temperatureSource}`, {
        note: unreliable ? [note, 'configuration unreliable: not judged'].filter(Boolean).join('; ') : note,
        location: cfg,
      }),
    );
    const baseDf = c.baseline?.dissipationPercent?.[cfg];
    if (baseDf === undefined) continue;
    const bt = c.baseline?.temperatureC;
    const base = bt === undefined ? null : pf20Percent(baseDf, bt, criteria);
    let rise: number | null = null;
    let riseNote: string | undefined;
    if (post === null) riseNote = `post-fault PF20 not available (${note})`;
    else if (bt === undefined) riseNote = 'no insulation temperature in the baseline set';
    else if (base === null) riseNote = `baseline temperature ${bt} °C outside the correction table (${range})`;
    else if (base === 0) riseNote = 'baseline PF20 is zero';
    else rise = (100 * (post - base)) / base;
    const riseLevel = rise === null || unreliable ? 'ok' : levelFromBands(rise, pfc.riseBands, digits);
    out.push(
      indicator(`powerFactor.${cfg}.riseFromBaselinePercent`, rise, riseLevel, 'power-factor', describeBands(pfc.riseBands, ' %', 'PF20 rise'), pfc.riseSource, {
        note: unreliable ? [riseNote, 'configuration unreliable: not judged'].filter(Boolean).join('; ') : riseNote,
        location: cfg,
        reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
      }),
    );
  }
  return out;
}
