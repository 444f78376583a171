// Series for the dissipation-over-frequency chart of one capacitance configuration: the measured DF points, the
// engine's least-squares fit DF(f) = A/f + B·f + C (fitDissipationOverFrequency in shared/screening/df-frequency.ts)
// drawn as a curve, and its parts A/f, B·f and C, with the fit's R². Pure; no Vue, no I/O.
import type { GapsightCase } from '../schemas/case.js';
import type { Criteria } from '../screening/criteria.js';
import { fitDissipationOverFrequency, type DfFit } from '../screening/df-frequency.js';
import { formatSignificant } from '../format.js';

/** A point of a chart: x in Hz, y in % (DF). */
export type XY = { x: number; y: number };

export const DF_AXIS_TITLES = { frequency: 'Frequency (Hz)', dissipation: 'Dissipation factor (%)' } as const;

export interface DfFrequencyChart {
  /** The configuration label (CH, CL, CHL, …). */
  configuration: string;
  title: string;
  /** Measured post-fault points, sorted by frequency. */
  measured: XY[];
  /** Measured baseline points of the same configuration, when the case has them (sorted). */
  baselineMeasured: XY[];
  /** The engine's fit of the post-fault points (null: fewer than the criteria's minimum, or not possible). */
  fit: DfFit | null;
  /** The fit, and its parts, sampled at `samples` frequencies spaced evenly in log10(f) over the measured range. */
  curve: XY[];
  conductivePart: XY[];
  seriesPart: XY[];
  constantPart: XY[];
  /** The table view: each measured frequency with its DF and the fit's value there (null without a fit). */
  rows: { frequencyHz: number; dfPercent: number; fittedPercent: number | null }[];
  /** Why there is no fit. */
  note?: string;
  /** "A = 12.3 % · Hz, B = 0.000512 %/Hz, C = 0.241 %, R² = 0.998". */
  fitText: string;
  axes: typeof DF_AXIS_TITLES;
}

const sortedXY = (pts: ReadonlyArray<readonly [number, number]>): XY[] => [...pts].sort((p, q) => p[0] - q[0]).map((p) => ({ x: p[0], y: p[1] }));

/** `n` frequencies from `lo` to `hi` (both included), evenly spaced in log10(f). */
export function logSpaced(lo: number, hi: number, n: number): number[] {
  if (!(lo > 0) || !(hi > 0) || n < 2 || lo === hi) return lo > 0 ? [lo] : [];
  const a = Math.log10(lo);
  const b = Math.log10(hi);
  return Array.from({ length: n }, (_, k) => (k === n - 1 ? hi : k === 0 ? lo : 10 ** (a + ((b - a) * k) / (n - 1))));
}

/** The fit and its parts in words, with 4 significant digits. */
export function fitInWords(fit: DfFit | null): string {
  if (!fit) return 'no fit';
  const r2 = fit.rSquared === null ? 'R² undefined (all DF values equal)' : `R² = ${fit.rSquared.toFixed(4)}`;
  return `A = ${formatSignificant(fit.a, 4)} % · Hz, B = ${formatSignificant(fit.b, 4)} %/Hz, C = ${formatSignificant(fit.c, 4)} %, ${r2}`;
}

/** The chart of one configuration's DF points (post-fault; baseline points shown beside when given). */
export function dfFrequencyChart(
  configuration: string,
  points: ReadonlyArray<readonly [number, number]>,
  criteria: Criteria,
  baselinePoints: ReadonlyArray<readonly [number, number]> = [],
  samples = 60,
): DfFrequencyChart {
  const measured = sortedXY(points);
  const minPoints = criteria.dfFrequency.minPoints;
  const fit = points.length >= minPoints ? fitDissipationOverFrequency(points) : null;
  const note = fit
    ? undefined
    : points.length < minPoints
      ? `fewer than ${minPoints} frequencies (${points.length}): no fit`
      : 'fit not possible (repeated frequencies)';
  const fs = fit && measured.length ? logSpaced(measured[0].x, measured[measured.length - 1].x, samples) : [];
  return {
    configuration,
    title: `${configuration}: dissipation factor over frequency`,
    measured,
    baselineMeasured: sortedXY(baselinePoints),
    fit,
    curve: fit ? fs.map((f) => ({ x: f, y: fit.a / f + fit.b * f + fit.c })) : [],
    conductivePart: fit ? fs.map((f) => ({ x: f, y: fit.a / f })) : [],
    seriesPart: fit ? fs.map((f) => ({ x: f, y: fit.b * f })) : [],
    constantPart: fit ? fs.map((f) => ({ x: f, y: fit.c })) : [],
    rows: measured.map((p) => ({ frequencyHz: p.x, dfPercent: p.y, fittedPercent: fit ? fit.a / p.x + fit.b * p.x + fit.c : null })),
    note,
    fitText: fitInWords(fit),
    axes: DF_AXIS_TITLES,
  };
}

/** Whether a case has DF at several frequencies (post-fault) for some configuration. */
export function hasDfAtFrequencies(c: GapsightCase): boolean {
  return Object.values(c.postFault?.dissipationByFrequency ?? {}).some((pts) => new Set(pts.map((p) => p[0])).size >= 2);
}

/** One chart per configuration that has post-fault DF at several frequencies. */
export function dfFrequencyCharts(c: GapsightCase, criteria: Criteria): DfFrequencyChart[] {
  const post = c.postFault?.dissipationByFrequency ?? {};
  return Object.entries(post)
    .filter(([, pts]) => new Set(pts.map((p) => p[0])).size >= 2)
    .map(([cfg, pts]) => dfFrequencyChart(cfg, pts, criteria, c.baseline?.dissipationByFrequency?.[cfg] ?? []));
}
