// Sister-unit statistics: modified z-score (level), deviation from the sisters' median, Grubbs and Dixon (supporting).
import jstat from 'jstat';
import { mean, median, medianAbsoluteDeviation, sampleStandardDeviation } from 'simple-statistics';
import type { GapsightCase, ReactancePhase } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { capLevel, indicator, levelFromBands } from './levels.js';
import { reactancePercent } from './reactance.js';

export type ModifiedZ = { value: number | null; median: number; mad: number; madFloored: boolean; note?: string };

/** Modified z-score M = k·(x − median)/MAD over `values` (which include x); MAD floored at a fraction of |median|. */
export function modifiedZScore(x: number, values: readonly number[], constant: number, madFloorFraction: number): ModifiedZ {
  const med = median([...values]);
  const rawMad = medianAbsoluteDeviation([...values]);
  if (med === 0) return { value: null, median: med, mad: rawMad, madFloored: false, note: 'median is zero: modified z undefined' };
  const floor = madFloorFraction * Math.abs(med);
  const floored = rawMad < floor;
  const mad = floored ? floor : rawMad;
  if (mad === 0) return { value: null, median: med, mad, madFloored: floored, note: 'MAD = 0: modified z undefined' };
  return { value: (constant * (x - med)) / mad, median: med, mad, madFloored: floored };
}

/** Grubbs statistic of one value: |x − mean|/s (null when s = 0 or n < 3). */
export function grubbsStatistic(x: number, values: readonly number[]): number | null {
  if (values.length < 3) return null;
  const s = sampleStandardDeviation([...values]);
  if (!(s > 0)) return null;
  return Math.abs(x - mean([...values])) / s;
}

/** Largest Grubbs statistic of a sample: max|x − mean|/s. */
export function grubbsMaxStatistic(values: readonly number[]): number | null {
  const gs = values.map((v) => grubbsStatistic(v, values));
  return gs.some((g) => g === null) ? null : Math.max(...(gs as number[]));
}

/** Two-sided Grubbs critical value: ((n−1)/√n)·√(t²/(n − 2 + t²)), t = t(α/(2n), n − 2) (upper quantile, jstat). */
export function grubbsCritical(n: number, alpha: number): number {
  const t = jstat.jStat.studentt.inv(1 - alpha / (2 * n), n - 2);
  return ((n - 1) / Math.sqrt(n)) * Math.sqrt((t * t) / (n - 2 + t * t));
}

/** Dixon's Q of x when it is the smallest or largest of `values`: gap to its neighbour / range; null otherwise. */
export function dixonQ(x: number, values: readonly number[]): number | null {
  const sorted = [...values].sort((a, b) => a - b);
  const n = sorted.length;
  if (n < 3) return null;
  const range = sorted[n - 1] - sorted[0];
  if (range === 0) return null;
  if (x === sorted[n - 1]) return (sorted[n - 1] - sorted[n - 2]) / range;
  if (x === sorted[0]) return (sorted[1] - sorted[0]) / range;
  return null;
}

/** Dixon Q95 critical value for n (Rorabacher 1991), undefined outside the table. */
export function dixonCritical(n: number, criteria: Criteria): number | undefined {
  return criteria.sisters.dixonQ95[String(n)];
}

type Quantity = { name: string; location: string; value: number; sisters: number[] };

/** The quantities a unit can be compared with its sisters on: capacitance per configuration, %X per phase. */
export function sisterQuantities(c: GapsightCase): Quantity[] {
  const out: Quantity[] = [];
  const sisters = c.sisters ?? [];
  for (const [cfg, value] of Object.entries(c.postFault?.capacitancePF ?? {})) {
    const vals = sisters.map((s) => s.capacitancePF?.[cfg]).filter((v): v is number => v !== undefined);
    out.push({ name: `capacitance.${cfg}`, location: cfg, value, sisters: vals });
  }
  for (const [phase, entry] of Object.entries(c.postFault?.reactance ?? {})) {
    const vals = sisters
      .map((s) => s.reactance?.[phase])
      .filter((v): v is ReactancePhase => v !== undefined)
      .map((v) => reactancePercent(v, c.unit));
    out.push({ name: `reactance.${phase}`, location: phase, value: reactancePercent(entry, c.unit), sisters: vals });
  }
  return out;
}

/** Sister statistics indicators (method `sisters`: they restate other evidence and never count for corroboration). */
export function sisterIndicators(c: GapsightCase, criteria: Criteria): Indicator[] {
  const sc = criteria.sisters;
  const out: Indicator[] = [];
  for (const q of sisterQuantities(c)) {
    const n = q.sisters.length;
    if (n < sc.minSistersDeviation) continue;
    const med = median(q.sisters);
    out.push(
      indicator(
        `sisters.${q.name}.deviationFromMedianPercent`,
        med === 0 ? null : (100 * (q.value - med)) / med,
        'ok',
        'sisters',
        `informative: 100·(x − median of ${n} sisters)/median`,
        'common practice',
        { basis: 'state', note: med === 0 ? 'sisters\' median is zero' : undefined, location: q.location, reference: `sisters' median (${n} units)` },
      ),
    );
    const all = [...q.sisters, q.value];
    if (n >= sc.minSistersModifiedZ) {
      const m = modifiedZScore(q.value, all, sc.modifiedZConstant, sc.madFloorFractionOfMedian);
      // A sister statistic describes a state (a unit may always have been the family's outlier): at most the state cap.
      const stateCap = criteria.stateCap ?? 'watch';
      const level = m.value === null ? 'ok' : capLevel(levelFromBands(Math.abs(m.value), [{ from: sc.modifiedZLimit, level: sc.modifiedZLevel }], criteria.rounding.significantDigits), stateCap);
      const notes = [m.note, m.madFloored ? `MAD raised to the floor of ${sc.madFloorFractionOfMedian * 100} % of |median|` : undefined].filter(Boolean);
      out.push(
        indicator(`sisters.${q.name}.modifiedZ`, m.value, level, 'sisters', `|M| ≥ ${sc.modifiedZLimit} → ${capLevel(sc.modifiedZLevel, stateCap)} (over this unit and ${n} sisters; a state, ${stateCap} at most)`, sc.modifiedZSource, {
          basis: 'state',
          note: notes.length ? notes.join('; ') : undefined,
          location: q.location,
        }),
      );
    }
    const g = grubbsStatistic(q.value, all);
    const gCrit = grubbsCritical(all.length, sc.grubbsAlpha);
    out.push(
      indicator(`sisters.${q.name}.grubbsG`, g, 'ok', 'sisters', `supporting: G > G_crit ${gCrit.toFixed(4)} (n ${all.length}, α ${sc.grubbsAlpha}) marks an outlier`, sc.grubbsSource, {
        basis: 'state',
        note: g === null ? 'standard deviation is zero' : g > gCrit ? 'Grubbs: outlier' : 'Grubbs: not an outlier',
        location: q.location,
      }),
    );
    const qCrit = dixonCritical(all.length, criteria);
    if (qCrit !== undefined) {
      const dq = dixonQ(q.value, all);
      out.push(
        indicator(`sisters.${q.name}.dixonQ`, dq, 'ok', 'sisters', `supporting: Q > Q95 ${qCrit} (n ${all.length}) marks an outlier`, sc.dixonSource, {
          basis: 'state',
          note: dq === null ? 'this unit is not the extreme value of the set (or the range is zero)' : dq > qCrit ? 'Dixon: outlier' : 'Dixon: not an outlier',
          location: q.location,
        }),
      );
    }
  }
  return out;
}
