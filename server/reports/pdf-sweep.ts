// The PDF report's frequency-response part: each sweep overlay of the screened case (or A–C phase pair) as a vector
// drawing — magnitude traces on a log frequency axis with the three bands shaded and their R and DL/T 911 class, the
// difference trace below — and a small table of ρ, R and class per band. Series from shared/charts/sweep-overlay.ts
// (the engine's own functions), drawn with shared/charts/svg-plot.ts. Pure.
import type { Content } from 'pdfmake/interfaces.js';
import type { GapsightCase } from '../../shared/schemas/case.js';
import type { Criteria } from '../../shared/screening/criteria.js';
import { BUILT_IN_CRITERIA, criteriaV1 } from '../../shared/screening/criteria-sets.js';
import type { ScreeningReportData } from './report-data.js';
import { decadeTicks, frequencyTick, sweepOverlays, type SweepOverlay, type XY } from '../../shared/charts/sweep-overlay.js';
import { linearTicks, svgPlot, type PlotSeries } from '../../shared/charts/svg-plot.js';

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

/** The bands' R and class in one line: "Bands — low: R 0.223, Severe deformation · mid: R 3.357, Normal · …". */
export function bandsInWords(o: SweepOverlay): string {
  return `Bands (shaded) — ${o.bands.map((b) => (b.judged ? `${b.band}: R ${b.rText}, ${b.classText}` : `${b.band}: not judged`)).join(' · ')}`;
}

function bandTable(o: SweepOverlay): Content {
  const head = ['Band', 'ρ', 'R', 'Class from this band', 'Note'].map((t) => ({ text: t, style: 'th' }));
  const rows = o.bands.map((b) => [b.label, b.rhoText, b.rText, b.judged ? b.classText : 'not judged', b.note ?? '']);
  rows.push(['All bands', o.correlation === null ? '—' : o.correlation.toFixed(4), '', o.overallClassText, `${o.gridPoints} common grid points`]);
  return {
    table: { headerRows: 1, widths: ['auto', 'auto', 'auto', 'auto', '*'], body: [head, ...rows] },
    layout: 'lightHorizontalLines',
    style: 'table',
    margin: [0, 2, 0, 6],
  };
}

/** The frequency-response part of the report: a small heading, then per overlay its title, drawings and band table. */
export function frequencyResponseContent(c: GapsightCase, criteria: Criteria): Content[] {
  const overlays = sweepOverlays(c, criteria);
  if (!overlays.length) return [];
  const out: Content[] = [
    { text: 'Frequency response', bold: true, fontSize: 10, margin: [0, 8, 0, 1] },
    {
      text: 'Magnitude against frequency (log scale), the bands shaded with the relative factor R and DL/T 911 class the screening computed; the difference on the 1 kHz grid below.',
      style: 'small',
      margin: [0, 0, 0, 3],
    },
  ];
  for (const o of overlays) {
    const block: Content[] = [{ text: o.title, bold: true, margin: [0, 4, 0, 2] }];
    if (o.kind === 'single') {
      block.push({ svg: sweepMagnitudeSvg(o), width: SWEEP_DRAWING_WIDTH });
      block.push({ text: `Not judged: ${o.notes.join('; ')}.`, style: 'small', margin: [0, 2, 0, 6] });
    } else {
      block.push({ svg: sweepMagnitudeSvg(o), width: SWEEP_DRAWING_WIDTH });
      const diff = sweepDifferenceSvg(o);
      if (diff) block.push({ svg: diff, width: SWEEP_DRAWING_WIDTH });
      block.push({ text: bandsInWords(o), style: 'small', margin: [0, 2, 0, 1] });
      block.push({ text: `DL/T 911 class: ${o.overallClassText}${o.notes.length ? ` (${o.notes.join('; ')})` : ''}`, style: 'small', bold: true, margin: [0, 1, 0, 1] });
      block.push(bandTable(o));
    }
    out.push({ stack: block, unbreakable: true });
  }
  return out;
}

/** The frequency-response part of a screening's report, under the screening's own criteria set (else the built-in one of its version). */
export function frequencyResponseOf(d: ScreeningReportData): Content[] {
  const criteria = d.criteria ?? BUILT_IN_CRITERIA.find((c) => c.version === d.screening.criteriaVersion) ?? criteriaV1;
  return frequencyResponseContent(d.case, criteria);
}
