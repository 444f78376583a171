// A sweep overlay as vector drawings (plain SVG strings from svg-plot.ts): the magnitude traces on a log frequency axis
// with the three bands shaded, and the difference trace. The PDF report draws them (server/reports/pdf-sweep.ts) and
// the printed event file shows them in place of the screen chart. Pure.
import { decadeTicks, frequencyTick, type SweepOverlay, type XY } from './sweep-overlay.js';
import { linearTicks, svgPlot, type PlotSeries } from './svg-plot.js';

/** Width of the drawings on the page (A4 with 40 pt margins leaves 515 pt). */
export const SWEEP_DRAWING_WIDTH = 500;

const SLATE = '#3d5467';
const COPPER = '#a4582a';
const TEAL = '#0f766e';
const BAND_FILLS = ['#3d5467', '#a4582a', '#3d5467'];

const pairs = (pts: XY[]): [number, number][] => pts.map((p) => [p.x, p.y]);

/** A y range with a little room, on nice ticks. */
function yRange(values: number[], minSpan: number): { min: number; max: number; ticks: number[] } {
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return { min: -1, max: 1, ticks: [-1, 0, 1] };
  if (hi - lo < minSpan) {
    const mid = (hi + lo) / 2;
    lo = mid - minSpan / 2;
    hi = mid + minSpan / 2;
  }
  const ticks = linearTicks(lo, hi, 5);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : minSpan;
  const min = Math.floor(lo / step) * step;
  const max = Math.ceil(hi / step) * step;
  return { min, max, ticks: linearTicks(min, max, 5) };
}

/** The magnitude drawing of one overlay (SVG string). */
export function sweepMagnitudeSvg(o: SweepOverlay, width = SWEEP_DRAWING_WIDTH): string {
  const xs = [...o.reference, ...o.trace].map((p) => p.x);
  const ticks = decadeTicks(Math.min(...xs), Math.max(...xs));
  const y = yRange([...o.reference, ...o.trace].map((p) => p.y), 10);
  const series: PlotSeries[] = [];
  if (o.reference.length) series.push({ label: o.referenceName, points: pairs(o.reference), stroke: SLATE, width: 1 });
  series.push({ label: o.traceName, points: pairs(o.trace), stroke: COPPER, width: 1, dash: [4, 2] });
  return svgPlot({
    width,
    height: 210,
    idPrefix: `sweep-${o.id}`,
    x: { title: o.axes.frequency, min: ticks[0], max: ticks[ticks.length - 1], scale: 'log', ticks, tickLabel: frequencyTick },
    y: { title: o.axes.magnitude, min: y.min, max: y.max, ticks: y.ticks },
    series,
    bands: o.bands.map((b, k) => ({
      x0: Math.max(b.fromHz, ticks[0]),
      x1: Math.min(b.toHz, ticks[ticks.length - 1]),
      fill: BAND_FILLS[k % BAND_FILLS.length],
      opacity: b.judged ? 0.08 : 0.03,
      label: b.band,
    })),
  });
}

/** The difference drawing of one overlay (SVG string); null without a common grid. */
export function sweepDifferenceSvg(o: SweepOverlay, width = SWEEP_DRAWING_WIDTH): string | null {
  if (!o.difference.length) return null;
  const xs = [...o.reference, ...o.trace].map((p) => p.x);
  const ticks = decadeTicks(Math.min(...xs), Math.max(...xs));
  const y = yRange([0, ...o.difference.map((p) => p.y)], 1);
  return svgPlot({
    width,
    height: 120,
    idPrefix: `sweep-diff-${o.id}`,
    x: { title: o.axes.frequency, min: ticks[0], max: ticks[ticks.length - 1], scale: 'log', ticks, tickLabel: frequencyTick },
    y: { title: o.axes.difference, min: y.min, max: y.max, ticks: y.ticks },
    series: [{ label: o.differenceName, points: pairs(o.difference), stroke: TEAL, width: 0.8 }],
  });
}
