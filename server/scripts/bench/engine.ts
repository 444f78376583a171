import { parseCase } from '../../../shared/schemas/case.js';
import { screenCase } from '../../../shared/screening/index.js';
import { median } from 'simple-statistics';

// The engine figure: one full case (3 capacitance configurations, 3 phases of reactance, 3 × 1 000-point sweeps with
// their baseline traces, 50 sisters) through parseCase → screenCase, against the floor: one hand-written pass over the
// same arrays that checks every number is finite and computes the sums the engine's figures rest on.

const CONFIGS = ['CH', 'CL', 'CHL'] as const;
const PHASES = ['A', 'B', 'C'] as const;
const SWEEP_POINTS = 1000;
const SISTERS = 50;

/** Log-spaced sweep trace from 1 kHz to 1 MHz, `n` points, with a resonance pattern moved by `shift`. */
function trace(n: number, shift: number): [number, number][] {
  return Array.from({ length: n }, (_, i) => {
    const f = 1000 * Math.pow(1000, i / (n - 1));
    const lf = Math.log10(f);
    return [f, -40 - 20 * Math.sin(lf * 3 + shift) - 5 * Math.cos(lf * 11)];
  });
}

/** The full case as a plain JSON value (what the API's body parser would hand over). */
export function fullCaseJson(): Record<string, unknown> {
  const set = (k: number, takenAt: string) => ({
    takenAt,
    temperatureC: 25 + k,
    tapPosition: '9b',
    capacitancePF: Object.fromEntries(CONFIGS.map((c, i) => [c, 3000 * (i + 1) * (1 + k * 0.004)])),
    dissipationPercent: Object.fromEntries(CONFIGS.map((c) => [c, 0.25 + k * 0.01])),
    reactance: Object.fromEntries(PHASES.map((p, i) => [p, { percent: 11.6 + i * 0.02 + k * 0.03 }])),
  });
  return {
    format: 'gapsight-case/1',
    unit: { serial: 'BENCH-CASE', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5, systemImpedancePercent: 0.8, windings: 'two-winding', conductor: 'Cu', requiredCapacitance: [...CONFIGS] },
    fault: { occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', transformerTripped: true, protectionOperated: ['overcurrent'], shots: [{ currentKA: 2.8, durationS: 0.12 }, { currentKA: 2.7, durationS: 0.08 }] },
    priorFaults: [{ occurredAt: '2024-02-11T18:40:00Z', type: 'phase-to-ground', side: 'lv', shots: [{ currentKA: 2.9, durationS: 0.25 }] }],
    baseline: set(0, '2019-05-02'),
    previous: set(1, '2024-06-20'),
    postFault: set(3, '2026-11-29'),
    sisters: Array.from({ length: SISTERS }, (_, s) => ({ serial: `SIS-${s}`, ...set(((s * 7) % 11) / 5 - 1, '2025-04-10') })),
    sweeps: PHASES.map((p, i) => ({ label: `HV-${p}-open`, testType: 'open-circuit', winding: 'hv', phase: p, demagnetised: true, baseline: trace(SWEEP_POINTS, 0), postFault: trace(SWEEP_POINTS, 0.002 * (i + 1)) })),
  };
}

/** Median of a list of numbers (simple-statistics). */
export const medianOf = (xs: readonly number[]): number => median([...xs]);

type Json = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

function finite(x: unknown): number {
  if (typeof x !== 'number' || !Number.isFinite(x)) throw new Error('not a finite number');
  return x;
}

/**
 * The floor: one pass over the case's arrays. Capacitance % change (post against baseline and previous), dissipation
 * rise, %X change per phase and its spread, the shots' I²t, per sweep both traces interpolated in log10(f) onto the
 * 1 kHz grid with Pearson sums (n, Σx, Σy, Σx², Σy², Σxy) per band (1–100 kHz, 100–600 kHz, 600 kHz–1 MHz) and over the
 * whole grid, ρ and R = −log10(1 − ρ), Σ|x − y| (ASLE); per capacitance configuration and phase the sisters' median,
 * MAD (median of |x − median|), mean and standard deviation (Grubbs) and the gaps at both ends (Dixon). Returns a sum
 * of everything so that nothing is optimised away.
 */
export function floorPass(c: Json): number {
  let acc = 0;
  const base = c.baseline, prev = c.previous, post = c.postFault;
  for (const cfg of CONFIGS) {
    const b = finite(base.capacitancePF[cfg]), p = finite(prev.capacitancePF[cfg]), x = finite(post.capacitancePF[cfg]);
    acc += (100 * (x - b)) / b + (100 * (x - p)) / p;
    acc += finite(post.dissipationPercent[cfg]) - finite(base.dissipationPercent[cfg]);
  }
  let xs = 0;
  for (const ph of PHASES) {
    const b = finite(base.reactance[ph].percent), x = finite(post.reactance[ph].percent);
    acc += (100 * (x - b)) / b;
    xs += x;
  }
  for (const ph of PHASES) acc += Math.abs(post.reactance[ph].percent - xs / 3);
  for (const f of [c.fault, ...c.priorFaults]) for (const s of f.shots) acc += finite(s.currentKA) ** 2 * finite(s.durationS);
  // Sweeps.
  const bands = [1000, 100000, 600000, 1000000];
  for (const sw of c.sweeps) {
    const bt: number[][] = sw.baseline, pt: number[][] = sw.postFault;
    for (const q of bt) { finite(q[0]); finite(q[1]); }
    for (const q of pt) { finite(q[0]); finite(q[1]); }
    const sums = [0, 1, 2, 3].map(() => [0, 0, 0, 0, 0, 0]); // per band and overall: n Σx Σy Σxx Σyy Σxy
    let asle = 0;
    let jb = 0, jp = 0;
    const lo = Math.max(bt[0][0], pt[0][0]), hi = Math.min(bt[bt.length - 1][0], pt[pt.length - 1][0]);
    for (let k = Math.ceil(lo / 1000); k * 1000 <= hi; k++) {
      const f = k * 1000;
      while (jb < bt.length - 2 && bt[jb + 1][0] < f) jb++;
      while (jp < pt.length - 2 && pt[jp + 1][0] < f) jp++;
      const lf = Math.log10(f);
      const x = bt[jb][1] + ((lf - Math.log10(bt[jb][0])) / (Math.log10(bt[jb + 1][0]) - Math.log10(bt[jb][0]))) * (bt[jb + 1][1] - bt[jb][1]);
      const y = pt[jp][1] + ((lf - Math.log10(pt[jp][0])) / (Math.log10(pt[jp + 1][0]) - Math.log10(pt[jp][0]))) * (pt[jp + 1][1] - pt[jp][1]);
      const band = f < bands[1] ? 0 : f < bands[2] ? 1 : 2;
      for (const s of [sums[band], sums[3]]) { s[0]++; s[1] += x; s[2] += y; s[3] += x * x; s[4] += y * y; s[5] += x * y; }
      asle += Math.abs(x - y);
    }
    for (const [n, sx, sy, sxx, syy, sxy] of sums) {
      const rho = (n * sxy - sx * sy) / Math.sqrt((n * sxx - sx * sx) * (n * syy - sy * sy));
      acc += rho + (1 - rho < 1e-10 ? 10 : -Math.log10(1 - rho));
    }
    acc += asle / sums[3][0];
  }
  // Sisters: per quantity the values of the 50 sisters and the unit.
  const stats = (vals: number[]) => {
    const n = vals.length;
    const s = vals.sort((a, b) => a - b);
    const med = n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
    const dev = s.map((v) => Math.abs(v - med)).sort((a, b) => a - b);
    const mad = n % 2 ? dev[(n - 1) / 2] : (dev[n / 2 - 1] + dev[n / 2]) / 2;
    let sum = 0, sq = 0;
    for (const v of s) { sum += v; sq += v * v; }
    const mean = sum / n;
    const sd = Math.sqrt((sq - n * mean * mean) / (n - 1));
    return med + mad + mean + sd + (s[1] - s[0]) / (s[n - 1] - s[0]) + (s[n - 1] - s[n - 2]) / (s[n - 1] - s[0]);
  };
  for (const cfg of CONFIGS) acc += stats([...c.sisters.map((s: Json) => finite(s.capacitancePF[cfg])), post.capacitancePF[cfg]]);
  for (const ph of PHASES) acc += stats([...c.sisters.map((s: Json) => finite(s.reactance[ph].percent)), post.reactance[ph].percent]);
  return acc;
}

export interface EngineFigure {
  runs: number;
  engineMs: number;
  /** screenCase alone (the case parsed once beforehand). */
  screenOnlyMs: number;
  floorMs: number;
  indicators: number;
}

/** Median ms of parseCase → screenCase on the full case, of screenCase alone, and of the floor pass, over `runs` runs each (after a warm-up). */
export function benchEngine(runs: number): EngineFigure {
  const json = fullCaseJson();
  const parsed = parseCase(json);
  if (!parsed.ok) throw new Error(`the bench case is not valid: ${JSON.stringify(parsed.errors.slice(0, 3))}`);
  const result = screenCase(parsed.value);
  if (!Number.isFinite(floorPass(structuredClone(json)))) throw new Error('the floor pass gave no number');
  const warm = Math.max(5, Math.floor(runs / 5));
  const time = (fn: () => unknown): number => {
    for (let i = 0; i < warm; i++) fn();
    const ms: number[] = [];
    for (let i = 0; i < runs; i++) {
      const t = performance.now();
      fn();
      ms.push(performance.now() - t);
    }
    return medianOf(ms);
  };
  let sink = 0;
  const engineMs = time(() => {
    const p = parseCase(json);
    if (p.ok) sink += screenCase(p.value).indicators.length;
  });
  const screenOnlyMs = time(() => (sink += screenCase(parsed.value).indicators.length));
  // The floor sorts the sisters' arrays it builds, never the case's own.
  const floorMs = time(() => (sink += floorPass(json)));
  if (!Number.isFinite(sink)) throw new Error('no result');
  return { runs, engineMs, screenOnlyMs, floorMs, indicators: result.indicators.length };
}
