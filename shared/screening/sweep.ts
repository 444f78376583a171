// Frequency-response sweeps: common grid, Pearson correlation, DL/T 911 relative factors and class, ASLE.
import { sampleCorrelation } from 'simple-statistics';
import type { Sweep, SweepPoint } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { capLevel, indicator, roundSignificant } from './levels.js';

export type Dlt911Class = 'normal' | 'slight' | 'obvious' | 'severe';
export type GridPoint = { frequencyHz: number; baselineDb: number; postFaultDb: number };

/** Relative factor R = −log10(1 − ρ); R = max (10) when 1 − ρ < 1e-10 (DL/T 911). */
export function relativeFactor(rho: number, criteria: Criteria): number {
  const gap = 1 - rho;
  if (gap < criteria.sweep.oneMinusRhoFloor) return criteria.sweep.maxRelativeFactor;
  return -Math.log10(gap);
}

/** Pearson (centred) correlation of two equal-length sequences; null when undefined (flat trace, < 2 points). */
export function pearsonCorrelation(x: readonly number[], y: readonly number[]): number | null {
  if (x.length < 2 || x.length !== y.length) return null;
  const r = sampleCorrelation([...x], [...y]);
  return Number.isFinite(r) ? r : null;
}

/** ASLE: mean absolute difference in dB. */
export function asleDb(x: readonly number[], y: readonly number[]): number {
  return x.reduce((s, v, k) => s + Math.abs(v - y[k]), 0) / x.length;
}

/** The post-fault trace interpolated onto the baseline grid, linearly in log10(f), only where both traces cover. */
export function commonGrid(baseline: readonly SweepPoint[], postFault: readonly SweepPoint[]): GridPoint[] {
  const b = [...baseline].sort((p, q) => p[0] - q[0]);
  const p = [...postFault].sort((u, v) => u[0] - v[0]);
  if (b.length === 0 || p.length === 0) return [];
  const lo = Math.max(b[0][0], p[0][0]);
  const hi = Math.min(b[b.length - 1][0], p[p.length - 1][0]);
  const out: GridPoint[] = [];
  let j = 0;
  for (const [f, db] of b) {
    if (f < lo || f > hi) continue;
    while (j < p.length - 2 && p[j + 1][0] < f) j++;
    let value: number;
    if (p.length === 1 || p[j][0] === f) value = p[j][1];
    else if (p[j + 1][0] === f) value = p[j + 1][1];
    else {
      const [f0, d0] = p[j];
      const [f1, d1] = p[j + 1];
      const t = (Math.log10(f) - Math.log10(f0)) / (Math.log10(f1) - Math.log10(f0));
      value = d0 + t * (d1 - d0);
    }
    out.push({ frequencyHz: f, baselineDb: db, postFaultDb: value });
  }
  return out;
}

/** DL/T 911 class from the band factors that exist (null = band left out); the open case counts as slight. */
export function dlt911Class(rLF: number | null, rMF: number | null, rHF: number | null, criteria: Criteria): Dlt911Class | null {
  if (rLF === null && rMF === null && rHF === null) return null;
  const t = criteria.sweep.dlt911;
  const d = criteria.rounding.significantDigits;
  const r = (x: number | null) => (x === null ? null : roundSignificant(x, d));
  const lf = r(rLF);
  const mf = r(rMF);
  const hf = r(rHF);
  if (lf !== null && lf < t.severeBelowLF) return 'severe';
  if ((lf !== null && lf < t.obviousBelowLF) || (mf !== null && mf < t.obviousBelowMF)) return 'obvious';
  if ((lf !== null && lf < t.slightBelowLF) || (mf !== null && mf < t.slightBelowMF)) return 'slight';
  if (hf !== null && hf < t.normalFromHF) return 'slight';
  return 'normal';
}

export type SweepAnalysis = {
  points: number;
  correlation: number | null;
  rLF: number | null;
  rMF: number | null;
  rHF: number | null;
  asleDb: number | null;
  class: Dlt911Class | null;
  level: Level;
  coreRegion: boolean;
  bandNotes: Record<'low' | 'mid' | 'high', string | undefined>;
};

/** Analyse one sweep trace against its baseline trace. */
export function analyseSweep(sweep: Sweep, criteria: Criteria): SweepAnalysis | null {
  if (!sweep.baseline || sweep.baseline.length === 0) return null;
  const sc = criteria.sweep;
  const grid = commonGrid(sweep.baseline, sweep.postFault);
  const bandR = (name: 'low' | 'mid' | 'high'): { r: number | null; note?: string } => {
    const [lo, hi] = sc.bandsHz[name];
    const inBand = grid.filter((g) => g.frequencyHz >= lo && (name === 'high' ? g.frequencyHz <= hi : g.frequencyHz < hi));
    if (inBand.length < sc.minPoints) return { r: null, note: `fewer than ${sc.minPoints} common points in the ${name} band (${inBand.length})` };
    const rho = pearsonCorrelation(inBand.map((g) => g.baselineDb), inBand.map((g) => g.postFaultDb));
    if (rho === null) return { r: null, note: `correlation undefined in the ${name} band (a flat trace)` };
    return { r: relativeFactor(rho, criteria) };
  };
  const low = bandR('low');
  const mid = bandR('mid');
  const high = bandR('high');
  const enough = grid.length >= sc.minPoints;
  const correlation = enough ? pearsonCorrelation(grid.map((g) => g.baselineDb), grid.map((g) => g.postFaultDb)) : null;
  const asle = grid.length > 0 ? asleDb(grid.map((g) => g.baselineDb), grid.map((g) => g.postFaultDb)) : null;
  const cls = dlt911Class(low.r, mid.r, high.r, criteria);
  let level: Level = cls === null ? 'ok' : sc.classLevels[cls];
  let coreRegion = false;
  if (sweep.testType === 'open-circuit' && cls !== null && cls !== 'normal' && low.r !== null) {
    if (dlt911Class(null, mid.r, high.r, criteria) === 'normal') {
      coreRegion = true;
      level = capLevel(sc.openCircuitCoreRegionLevels[cls], sc.classLevels[cls]);
    }
  }
  return {
    points: grid.length,
    correlation,
    rLF: low.r,
    rMF: mid.r,
    rHF: high.r,
    asleDb: asle,
    class: cls,
    level,
    coreRegion,
    bandNotes: { low: low.note, mid: mid.note, high: high.note },
  };
}

export const CORE_REGION_NOTE = 'core region: demagnetise and repeat';

/** Sweep indicators for every trace; the trace's level sits on `sweep.<label>.class`. */
export function sweepIndicators(sweeps: readonly Sweep[], criteria: Criteria): Indicator[] {
  const out: Indicator[] = [];
  const sc = criteria.sweep;
  const info = 'informative: the trace is judged by its DL/T 911 class';
  for (const s of sweeps) {
    const key = (k: string) => `sweep.${s.label}.${k}`;
    const a = analyseSweep(s, criteria);
    if (!a) {
      out.push(indicator(key('class'), null, 'ok', 'sweep', 'DL/T 911 class', sc.source, { note: 'no baseline trace to compare with', location: s.label }));
      continue;
    }
    const gridNote = a.points < sc.minPoints ? `fewer than ${sc.minPoints} common points (${a.points})` : undefined;
    out.push(
      indicator(key('correlation'), a.correlation, 'ok', 'sweep', `${info} (Pearson ρ of dB magnitudes over the common grid)`, sc.source, {
        note: a.correlation === null ? (gridNote ?? 'correlation undefined (a flat trace)') : undefined,
        location: s.label,
      }),
    );
    out.push(indicator(key('rLF'), a.rLF, 'ok', 'sweep', info, sc.source, { note: a.bandNotes.low, location: s.label }));
    out.push(indicator(key('rMF'), a.rMF, 'ok', 'sweep', info, sc.source, { note: a.bandNotes.mid, location: s.label }));
    out.push(indicator(key('rHF'), a.rHF, 'ok', 'sweep', info, sc.source, { note: a.bandNotes.high, location: s.label }));
    out.push(indicator(key('asleDb'), a.asleDb, 'ok', 'sweep', 'informative: mean |difference| in dB over the common grid', 'common practice (ASLE)', {
      note: a.asleDb === null ? 'no common frequency range' : undefined,
      location: s.label,
    }));
    const t = sc.dlt911;
    const rule = `DL/T 911: severe R_LF < ${t.severeBelowLF}; obvious R_LF < ${t.obviousBelowLF} or R_MF < ${t.obviousBelowMF}; slight R_LF < ${t.slightBelowLF} or R_MF < ${t.slightBelowMF} (or R_HF < ${t.normalFromHF}); levels normal ${sc.classLevels.normal}, slight ${sc.classLevels.slight}, obvious ${sc.classLevels.obvious}, severe ${sc.classLevels.severe}`;
    const notes: string[] = [];
    if (a.class === null) notes.push('no band with enough common points');
    if (a.coreRegion) notes.push(CORE_REGION_NOTE);
    out.push(
      indicator(key('class'), a.class, a.level, 'sweep', rule, a.coreRegion ? `${sc.source}; ${sc.coreRegionSource}` : sc.source, {
        note: notes.length ? notes.join('; ') : undefined,
        location: s.label,
        reference: 'baseline trace',
      }),
    );
  }
  return out;
}
