// Dissipation over frequency: least-squares fit DF(f) = A/f + B·f + C (informative, watch at most).
import type { GapsightCase } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { capLevel, describeBands, indicator, levelFromBands } from './levels.js';
import { shiftPercent } from './reference.js';

export type DfFit = { a: number; b: number; c: number; rSquared: number | null };

/** Solve a 3×3 linear system by Gaussian elimination with partial pivoting; null when singular. */
function solve3(m: number[][], v: number[]): number[] | null {
  const a = m.map((row, i) => [...row, v[i]]);
  for (let col = 0; col < 3; col++) {
    let pivot = col;
    for (let r = col + 1; r < 3; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
    if (Math.abs(a[pivot][col]) < 1e-300) return null;
    [a[col], a[pivot]] = [a[pivot], a[col]];
    for (let r = 0; r < 3; r++) {
      if (r === col) continue;
      const f = a[r][col] / a[col][col];
      for (let k = col; k < 4; k++) a[r][k] -= f * a[col][k];
    }
  }
  return [a[0][3] / a[0][0], a[1][3] / a[1][1], a[2][3] / a[2][2]];
}

/** Least-squares fit of DF(f) = A/f + B·f + C to [frequencyHz, DF %] points (≥ 3 distinct frequencies). */
export function fitDissipationOverFrequency(points: ReadonlyArray<readonly [number, number]>): DfFit | null {
  if (points.length < 3) return null;
  const basis = points.map(([f]) => [1 / f, f, 1]);
  const ata = [0, 1, 2].map((i) => [0, 1, 2].map((j) => basis.reduce((s, row) => s + row[i] * row[j], 0)));
  const aty = [0, 1, 2].map((i) => basis.reduce((s, row, k) => s + row[i] * points[k][1], 0));
  const x = solve3(ata, aty);
  if (!x || x.some((v) => !Number.isFinite(v))) return null;
  const [a, b, c] = x;
  const ys = points.map((p) => p[1]);
  const mean = ys.reduce((s, y) => s + y, 0) / ys.length;
  const ssTot = ys.reduce((s, y) => s + (y - mean) ** 2, 0);
  const ssRes = points.reduce((s, [f, y]) => s + (y - (a / f + b * f + c)) ** 2, 0);
  return { a, b, c, rSquared: ssTot === 0 ? null : 1 - ssRes / ssTot };
}

/** DF(f) indicators per configuration (method power-factor: the same test as capacitance). */
export function dfFrequencyIndicators(c: GapsightCase, criteria: Criteria): Indicator[] {
  const post = c.postFault?.dissipationByFrequency;
  if (!post) return [];
  const dc = criteria.dfFrequency;
  const d = criteria.rounding.significantDigits;
  const out: Indicator[] = [];
  const info = 'informative: DF(f) = A/f + B·f + C, least squares';
  for (const [cfg, points] of Object.entries(post)) {
    const key = (k: string) => `dfFrequency.${cfg}.${k}`;
    const fit = points.length >= dc.minPoints ? fitDissipationOverFrequency(points) : null;
    const why = points.length < dc.minPoints ? `fewer than ${dc.minPoints} frequencies (${points.length})` : 'fit not possible (repeated frequencies)';
    out.push(indicator(key('conductiveCoefficient'), fit ? fit.a : null, 'ok', 'power-factor', `${info}: A (% ·Hz), parallel-equivalent (conductive) loss`, dc.source, { basis: 'state', note: fit ? undefined : why, location: cfg }));
    out.push(indicator(key('seriesCoefficient'), fit ? fit.b : null, 'ok', 'power-factor', `${info}: B (%/Hz), series-equivalent loss`, dc.source, { basis: 'state', note: fit ? undefined : why, location: cfg }));
    out.push(indicator(key('constantPercent'), fit ? fit.c : null, 'ok', 'power-factor', `${info}: C (%)`, dc.source, { basis: 'state', note: fit ? undefined : why, location: cfg }));
    out.push(
      indicator(key('rSquared'), fit ? fit.rSquared : null, 'ok', 'power-factor', `${info}: fit quality R²`, dc.source, {
        basis: 'state',
        note: !fit ? why : fit.rSquared === null ? 'all DF values equal: R² undefined' : undefined,
        location: cfg,
      }),
    );
    const basePoints = c.baseline?.dissipationByFrequency?.[cfg];
    if (!fit || !basePoints) continue;
    const baseFit = basePoints.length >= dc.minPoints ? fitDissipationOverFrequency(basePoints) : null;
    const change = baseFit && baseFit.a > 0 ? shiftPercent(fit.a, baseFit.a) : null;
    out.push(
      indicator(key('conductiveChangePercent'), change, change === null ? 'ok' : capLevel(levelFromBands(change, dc.conductiveRiseBands, d), dc.maxLevel), 'power-factor', `${describeBands(dc.conductiveRiseBands, ' %', 'rise of the A/f term')} (informative, ${dc.maxLevel} at most)`, dc.source, {
        basis: 'change',
        note: change === null ? (baseFit ? 'baseline A term not positive: change not meaningful' : 'baseline fit not possible') : undefined,
        location: cfg,
      }),
    );
    const sChange = baseFit && baseFit.b > 0 ? shiftPercent(fit.b, baseFit.b) : null;
    out.push(
      indicator(key('seriesChangePercent'), sChange, 'ok', 'power-factor', 'informative: change of the B·f term against the baseline fit', dc.source, {
        basis: 'change',
        note: sChange === null ? (baseFit ? 'baseline B term not positive: change not meaningful' : 'baseline fit not possible') : undefined,
        location: cfg,
      }),
    );
  }
  return out;
}
