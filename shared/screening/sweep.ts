// Frequency-response sweeps: common grid, Pearson correlation, DL/T 911 relative factors and class, ASLE.
import { sampleCorrelation } from 'simple-statistics';
import type { Sweep, SweepPoint } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { criteriaV2 } from './criteria-sets.js';
import { capLevel, indicator, roundSignificant } from './levels.js';
import { tapsDiffer, tapText } from './reference.js';

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

/** A trace's magnitude at `f`, linearly in log10(f) between its points (sorted ascending, f inside their range). */
function interpolateAt(pts: readonly SweepPoint[], f: number, from: number): { value: number; next: number } {
  let j = from;
  while (j < pts.length - 2 && pts[j + 1][0] < f) j++;
  if (pts.length === 1 || pts[j][0] === f) return { value: pts[j][1], next: j };
  if (pts[j + 1][0] === f) return { value: pts[j + 1][1], next: j };
  const [f0, d0] = pts[j];
  const [f1, d1] = pts[j + 1];
  const t = (Math.log10(f) - Math.log10(f0)) / (Math.log10(f1) - Math.log10(f0));
  return { value: d0 + t * (d1 - d0), next: j };
}

export type SweepGrid = { fromHz: number; toHz: number; stepHz: number };

/** The fixed grid of a criteria set (revision 2: 1, 2, … 1000 kHz). */
export function sweepGridOf(criteria: Criteria): SweepGrid {
  const g = criteria.sweep.grid ?? criteriaV2.sweep.grid!;
  return { fromHz: g.fromHz, toHz: g.toHz, stepHz: g.stepHz };
}

/**
 * Both traces interpolated, linearly in log10(f), onto the fixed linear grid (revision 2: f = 1, 2, … 1000 kHz), keeping
 * the grid points inside the range both traces cover (no extrapolation).
 */
export function commonGrid(baseline: readonly SweepPoint[], postFault: readonly SweepPoint[], grid: SweepGrid = sweepGridOf(criteriaV2)): GridPoint[] {
  const b = [...baseline].sort((p, q) => p[0] - q[0]);
  const p = [...postFault].sort((u, v) => u[0] - v[0]);
  if (b.length === 0 || p.length === 0) return [];
  const lo = Math.max(b[0][0], p[0][0], grid.fromHz);
  const hi = Math.min(b[b.length - 1][0], p[p.length - 1][0], grid.toHz);
  const out: GridPoint[] = [];
  let jb = 0;
  let jp = 0;
  const first = Math.max(1, Math.ceil(roundSignificant(lo / grid.stepHz, 12)));
  const last = Math.floor(roundSignificant(hi / grid.stepHz, 12));
  for (let k = first; k <= last; k++) {
    const f = k * grid.stepHz;
    const bi = interpolateAt(b, f, jb);
    const pi = interpolateAt(p, f, jp);
    jb = bi.next;
    jp = pi.next;
    out.push({ frequencyHz: f, baselineDb: bi.value, postFaultDb: pi.value });
  }
  return out;
}

/** Measured points of a trace inside [lo, hi) (hi inclusive for the top band). */
function measuredIn(pts: readonly SweepPoint[], lo: number, hi: number, top: boolean): number {
  let n = 0;
  for (const [f] of pts) if (f >= lo && (top ? f <= hi : f < hi)) n++;
  return n;
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
  /** A trace reaches beyond the judged range (1 kHz–1 MHz). */
  beyondRange: boolean;
};

type Band = 'low' | 'mid' | 'high';

/**
 * Compare two traces (revision 2): the fixed grid, a relative factor per band where both traces have at least
 * `minPoints` measured points in it, correlation and ASLE over the common grid. `bands` limits the bands judged (the
 * A–C phase comparison leaves the core's low band out). Level as the class says, with the open-circuit core-region cap
 * for traces that were not demagnetised.
 */
export function compareTraces(
  reference: readonly SweepPoint[],
  trace: readonly SweepPoint[],
  criteria: Criteria,
  opts: { bands?: readonly Band[]; coreRegionCap?: boolean } = {},
): SweepAnalysis {
  const sc = criteria.sweep;
  const grid = sweepGridOf(criteria);
  const points = commonGrid(reference, trace, grid);
  const judged = opts.bands ?? ['low', 'mid', 'high'];
  const bandR = (name: Band): { r: number | null; note?: string } => {
    const [lo, hi] = sc.bandsHz[name];
    if (!judged.includes(name)) return { r: null, note: `${name} band not judged in this comparison` };
    const top = name === 'high';
    const nRef = measuredIn(reference, lo, hi, top);
    const nTrace = measuredIn(trace, lo, hi, top);
    if (Math.min(nRef, nTrace) < sc.minPoints) return { r: null, note: `fewer than ${sc.minPoints} measured points in the ${name} band (${Math.min(nRef, nTrace)})` };
    const inBand = points.filter((g) => g.frequencyHz >= lo && (top ? g.frequencyHz <= hi : g.frequencyHz < hi));
    if (inBand.length < sc.minPoints) return { r: null, note: `fewer than ${sc.minPoints} common grid points in the ${name} band (${inBand.length})` };
    const rho = pearsonCorrelation(inBand.map((g) => g.baselineDb), inBand.map((g) => g.postFaultDb));
    if (rho === null) return { r: null, note: `correlation undefined in the ${name} band (a flat trace)` };
    return { r: relativeFactor(rho, criteria) };
  };
  const low = bandR('low');
  const mid = bandR('mid');
  const high = bandR('high');
  const enough = points.length >= sc.minPoints;
  const correlation = enough ? pearsonCorrelation(points.map((g) => g.baselineDb), points.map((g) => g.postFaultDb)) : null;
  const asle = points.length > 0 ? asleDb(points.map((g) => g.baselineDb), points.map((g) => g.postFaultDb)) : null;
  const cls = dlt911Class(low.r, mid.r, high.r, criteria);
  let level: Level = cls === null ? 'ok' : sc.classLevels[cls];
  let coreRegion = false;
  if (opts.coreRegionCap && cls !== null && cls !== 'normal' && low.r !== null && dlt911Class(null, mid.r, high.r, criteria) === 'normal') {
    coreRegion = true;
    level = capLevel(sc.openCircuitCoreRegionLevels[cls], sc.classLevels[cls]);
  }
  const all = [...reference, ...trace];
  const beyondRange = all.some(([f]) => f < grid.fromHz || f > grid.toHz);
  return {
    points: points.length,
    correlation,
    rLF: low.r,
    rMF: mid.r,
    rHF: high.r,
    asleDb: asle,
    class: cls,
    level,
    coreRegion,
    bandNotes: { low: low.note, mid: mid.note, high: high.note },
    beyondRange,
  };
}

/** Analyse one sweep trace against its baseline trace (null without a baseline trace). */
export function analyseSweep(sweep: Sweep, criteria: Criteria): SweepAnalysis | null {
  if (!sweep.baseline || sweep.baseline.length === 0) return null;
  return compareTraces(sweep.baseline, sweep.postFault, criteria, { coreRegionCap: sweep.testType === 'open-circuit' && sweep.demagnetised !== true });
}

export const CORE_REGION_NOTE = 'core region: demagnetise and repeat';
export const NO_BASELINE_TRACE_NOTE = 'no baseline trace to compare with';
const BEYOND_NOTE = 'points outside 1 kHz–1 MHz are not judged';


/** The winding of a trace: `winding`, else HV (traces without a winding count as HV). */
export const sweepWinding = (s: Sweep): string => s.winding ?? 'hv';

/** Whether a trace's own tap differs from its baseline trace's tap (then it is unreliable). */
export function sweepTapMismatch(s: Sweep): boolean {
  return tapsDiffer(s.tapPosition, s.baselineTapPosition ?? s.tapPosition);
}

export type SweepOutcome = { indicators: Indicator[]; unreliable: string[] };

/** A–C phase comparisons: per winding, the open-circuit traces of phases A and C when neither has a baseline trace. */
export function phaseComparisons(sweeps: readonly Sweep[]): { winding: string; a: Sweep; c: Sweep }[] {
  const out: { winding: string; a: Sweep; c: Sweep }[] = [];
  const oc = sweeps.filter((s) => s.testType === 'open-circuit' && !(s.baseline && s.baseline.length) && !sweepTapMismatch(s));
  for (const winding of [...new Set(oc.map(sweepWinding))]) {
    const a = oc.find((s) => sweepWinding(s) === winding && s.phase === 'A');
    const c = oc.find((s) => sweepWinding(s) === winding && s.phase === 'C');
    if (a && c) out.push({ winding, a, c });
  }
  return out;
}

/** Sweep indicators for every trace (the trace's level sits on `sweep.<label>.class`), and the A–C comparisons. */
export function sweepIndicators(sweeps: readonly Sweep[], criteria: Criteria): SweepOutcome {
  const out: Indicator[] = [];
  const unreliable: string[] = [];
  const sc = criteria.sweep;
  const info = 'informative: the trace is judged by its DL/T 911 class';
  const t = sc.dlt911;
  const classRule = `DL/T 911: severe R_LF < ${t.severeBelowLF}; obvious R_LF < ${t.obviousBelowLF} or R_MF < ${t.obviousBelowMF}; slight R_LF < ${t.slightBelowLF} or R_MF < ${t.slightBelowMF} (or R_HF < ${t.normalFromHF}); levels normal ${sc.classLevels.normal}, slight ${sc.classLevels.slight}, obvious ${sc.classLevels.obvious}, severe ${sc.classLevels.severe}`;
  const gridSource = (criteria.sweep.grid ?? criteriaV2.sweep.grid!).source;
  for (const s of sweeps) {
    const key = (k: string) => `sweep.${s.label}.${k}`;
    const a = analyseSweep(s, criteria);
    if (!a) {
      out.push(indicator(key('class'), null, 'ok', 'sweep', 'DL/T 911 class', sc.source, { basis: 'change', note: NO_BASELINE_TRACE_NOTE, location: s.label }));
      continue;
    }
    const mismatch = sweepTapMismatch(s);
    const mismatchNote = `tap mismatch (baseline trace at tap ${tapText(s.baselineTapPosition ?? s.tapPosition)}, post-fault at ${tapText(s.tapPosition)}): repeat at tap ${tapText(s.baselineTapPosition ?? s.tapPosition)}; not judged`;
    if (mismatch) unreliable.push(`sweep.${s.label}`);
    const gridNote = a.points < sc.minPoints ? `fewer than ${sc.minPoints} common points (${a.points})` : undefined;
    const base = { basis: 'change' as const, location: s.label };
    out.push(
      indicator(key('correlation'), a.correlation, 'ok', 'sweep', `${info} (Pearson ρ of dB magnitudes over the fixed 1 kHz grid)`, `${sc.source}; ${gridSource}`, {
        ...base,
        note: a.correlation === null ? (gridNote ?? 'correlation undefined (a flat trace)') : undefined,
      }),
    );
    out.push(indicator(key('rLF'), a.rLF, 'ok', 'sweep', info, sc.source, { ...base, note: a.bandNotes.low }));
    out.push(indicator(key('rMF'), a.rMF, 'ok', 'sweep', info, sc.source, { ...base, note: a.bandNotes.mid }));
    out.push(indicator(key('rHF'), a.rHF, 'ok', 'sweep', info, sc.source, { ...base, note: a.bandNotes.high }));
    out.push(
      indicator(key('asleDb'), a.asleDb, 'ok', 'sweep', 'informative: mean |difference| in dB over the fixed 1 kHz grid', 'common practice (ASLE)', {
        ...base,
        note: a.asleDb === null ? 'no common frequency range' : undefined,
      }),
    );
    const notes: string[] = [];
    if (a.class === null) notes.push('no band with enough measured points');
    if (a.coreRegion) notes.push(CORE_REGION_NOTE);
    if (a.beyondRange) notes.push(BEYOND_NOTE);
    if (mismatch) notes.push(mismatchNote);
    out.push(
      indicator(key('class'), a.class, mismatch ? 'ok' : a.level, 'sweep', classRule, a.coreRegion ? `${sc.source}; ${sc.coreRegionSource}` : sc.source, {
        ...base,
        lowConfidence: a.coreRegion && !mismatch,
        note: notes.length ? notes.join('; ') : undefined,
        reference: 'baseline trace',
      }),
    );
  }
  for (const pc of phaseComparisons(sweeps)) {
    const a = compareTraces(pc.a.postFault, pc.c.postFault, criteria, { bands: ['mid', 'high'] });
    const cap = sc.phaseComparisonCap ?? criteriaV2.sweep.phaseComparisonCap!;
    const source = `${sc.source}; ${sc.phaseComparisonSource ?? criteriaV2.sweep.phaseComparisonSource!}`;
    const key = (k: string) => `sweep.${pc.winding}.AC.${k}`;
    const base = { basis: 'phase-comparison' as const, location: pc.winding.toUpperCase(), reference: `phase C trace (${pc.c.label})` };
    out.push(indicator(key('rMF'), a.rMF, 'ok', 'sweep', `${info} (phase A against phase C, mid band)`, source, { ...base, note: a.bandNotes.mid }));
    out.push(indicator(key('rHF'), a.rHF, 'ok', 'sweep', `${info} (phase A against phase C, high band)`, source, { ...base, note: a.bandNotes.high }));
    const notes = [a.class === null ? 'no band with enough measured points' : undefined, 'phase A against phase C of one winding over the mid and high bands (no baseline trace)'].filter(Boolean);
    out.push(
      indicator(key('class'), a.class, capLevel(a.level, cap), 'sweep', `${classRule}; phase comparison capped at ${cap}`, source, {
        ...base,
        note: notes.join('; '),
      }),
    );
  }
  return { indicators: out, unreliable };
}
