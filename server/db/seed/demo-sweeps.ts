// Frequency-response traces for the demo data: the magnitude of a simple winding model (a core or leakage branch in
// series with parallel-resonant sections, Foster form) seen through the 50 Ω measuring impedance. Plausible shapes,
// not a design calculation: open-circuit traces start near −30 dB, dip at the core resonance around 1 kHz and show
// winding resonances up to 1 MHz; short-circuit traces start near 0 dB and fall with the leakage inductance.
import { createHash } from 'node:crypto';
import type { SweepTrace } from '../../features/readings/sweep-trace.entity.js';
import { DemoRandom, roundTo } from './demo-random.js';

export type SweepKind = 'open-circuit' | 'short-circuit';

export interface Resonance {
  /** Resonant frequency, Hz. */
  f: number;
  /** Reactance level ωL at resonance, Ω (sets the depth of the dip). */
  x: number;
  /** Quality factor. */
  q: number;
}

export interface SweepModel {
  kind: SweepKind;
  /** First branch: magnetising (open circuit) or leakage (short circuit) inductance in H, its parallel resonance with
   * the winding's shunt capacitance (Hz) and Q; `rdc` the winding's DC resistance in series (Ω). */
  l0: number;
  f0: number;
  q0: number;
  rdc: number;
  sections: Resonance[];
}

const TWO_PI = 2 * Math.PI;

type C = { re: number; im: number };
const add = (a: C, b: C): C => ({ re: a.re + b.re, im: a.im + b.im });
const inv = (a: C): C => {
  const d = a.re * a.re + a.im * a.im;
  return { re: a.re / d, im: -a.im / d };
};

/** Impedance of a parallel R-L-C section with resonance f, reactance x at resonance and quality q. */
function parallelSection(w: number, f: number, x: number, q: number): C {
  const wr = TWO_PI * f;
  const l = x / wr;
  const c = 1 / (wr * wr * l);
  const r = q * x;
  return inv({ re: 1 / r, im: w * c - 1 / (w * l) });
}

/** Magnitude in dB of 50/(50 + Z) at frequency f. */
export function modelMagnitudeDb(model: SweepModel, f: number): number {
  const w = TWO_PI * f;
  let z: C = add(parallelSection(w, model.f0, TWO_PI * model.f0 * model.l0, model.q0), { re: model.rdc, im: 0 });
  for (const s of model.sections) z = add(z, parallelSection(w, s.f, s.x, s.q));
  const h = inv(add(z, { re: 50, im: 0 }));
  return 20 * Math.log10(50 * Math.hypot(h.re, h.im));
}

/** Log-spaced frequencies from `minHz` to `maxHz` (inclusive), rounded to 6 significant digits. */
export function logGrid(count: number, minHz = 20, maxHz = 1e6): number[] {
  const a = Math.log10(minHz);
  const b = Math.log10(maxHz);
  return Array.from({ length: count }, (_, k) => Number((10 ** (a + ((b - a) * k) / (count - 1))).toPrecision(6)));
}

/** Points [frequencyHz, magnitudeDb] of a model on a grid, with a little seeded instrument noise (dB). */
export function tracePoints(model: SweepModel, grid: number[], noiseDb: number, seed: string): number[][] {
  const rnd = new DemoRandom(seed);
  return grid.map((f) => [f, roundTo(modelMagnitudeDb(model, f) + rnd.normal(noiseDb), 3)]);
}

/** The base model of one HV phase of a design family (outer limbs A, C alike; the centre limb B lower inductance). */
export function familySweepModel(kind: SweepKind, phase: 'A' | 'B' | 'C', family: 'large' | 'small', unitSeed: string): SweepModel {
  const rnd = new DemoRandom(`${unitSeed}/${kind}/${phase}`);
  const scale = family === 'large' ? 1 : 1.6; // the smaller units resonate higher
  const unitSpread = () => 1 + rnd.normal(0.004); // manufacturing spread between sister units
  if (kind === 'open-circuit') {
    const l0 = (family === 'large' ? 6 : 3.2) * (phase === 'B' ? 0.62 : phase === 'C' ? 0.97 : 1);
    const f0 = (phase === 'B' ? 1250 : 880) * scale * unitSpread();
    const fs = [9e3, 24e3, 55e3, 118e3, 205e3, 335e3, 470e3, 690e3, 870e3];
    const xs = [6500, 4200, 3100, 2200, 1600, 1100, 760, 520, 330];
    return {
      kind,
      l0,
      f0,
      q0: 7,
      rdc: 0,
      sections: fs.map((f, k) => ({ f: Math.min(f * scale * unitSpread(), 9.6e5), x: xs[k], q: 5 + (k % 3) })),
    };
  }
  const fs = [52e3, 98e3, 165e3, 260e3, 410e3, 620e3, 850e3];
  const xs = [2400, 1900, 1500, 1100, 800, 540, 350];
  return {
    kind,
    l0: (family === 'large' ? 0.146 : 0.092) * (phase === 'B' ? 0.985 : 1) * unitSpread(),
    f0: 16500 * scale * unitSpread(),
    q0: 6,
    rdc: family === 'large' ? 0.9 : 2.2,
    sections: fs.map((f, k) => ({ f: Math.min(f * scale * unitSpread(), 9.6e5), x: xs[k], q: 5 + (k % 2) })),
  };
}

/** A changed winding: resonances between `fromHz` and `toHz` move by `shift` (fraction) and their level by `levelFactor`. */
export function deformModel(model: SweepModel, opts: { fromHz: number; toHz: number; shift: number; levelFactor: number; l0Factor?: number }): SweepModel {
  return {
    ...model,
    l0: model.l0 * (opts.l0Factor ?? 1),
    sections: model.sections.map((s) =>
      s.f >= opts.fromHz && s.f <= opts.toHz ? { ...s, f: s.f * (1 + opts.shift), x: s.x * opts.levelFactor } : s,
    ),
  };
}

export interface TraceSpec {
  label: string;
  testType: SweepKind;
  /** Winding and phase of the trace (rules revision 2): every demo trace is on the HV winding. */
  winding: 'hv' | 'lv' | 'tv';
  phase: 'A' | 'B' | 'C';
  terminals: string;
  tapPosition: string;
  demagnetised: boolean | null;
  points: number[][];
  fileName: string;
}

/** The row values of a sweep_trace (without ids), with the checksum of the JSON of its points. */
export function sweepRow(spec: TraceSpec): Pick<SweepTrace, 'label' | 'testType' | 'winding' | 'phase' | 'terminals' | 'tapPosition' | 'demagnetised' | 'points' | 'pointCount' | 'minHz' | 'maxHz' | 'sha256' | 'fileName'> {
  const freqs = spec.points.map((p) => p[0]);
  return {
    label: spec.label,
    testType: spec.testType,
    winding: spec.winding,
    phase: spec.phase,
    terminals: spec.terminals,
    tapPosition: spec.tapPosition,
    demagnetised: spec.demagnetised,
    points: spec.points,
    pointCount: spec.points.length,
    minHz: Math.min(...freqs),
    maxHz: Math.max(...freqs),
    sha256: createHash('sha256').update(JSON.stringify(spec.points)).digest('hex'),
    fileName: spec.fileName,
  };
}
