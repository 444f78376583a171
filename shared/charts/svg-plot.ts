// A small chart for paper: a plot description in, a plain SVG 1.1 string out (no CSS classes, no foreignObject, text
// in font-family "Roboto"), drawn by pdfmake's `svg` node (its bundled svg-to-pdfkit) and by any browser.
//
// API
//   svgPlot(spec: PlotSpec): string
//     spec.width, spec.height      size in points (pdfmake) / pixels (browser); the SVG has width, height and viewBox
//     spec.x, spec.y: PlotAxis     { title, min, max, scale?: 'linear' | 'log', ticks?: number[], tickLabel?: (v) => string }
//                                  log axes need 0 < min < max; default ticks: linearTicks / logTicks (1, 2, 5 × 10^n)
//     spec.series: PlotSeries[]    { label, points: [x, y][], stroke, width?, dash?: number[], line?: boolean (default
//                                  true), marker?: 'circle' | 'square' | 'triangle' | 'cross', markerSize?, legend?: boolean }
//                                  points that are not finite (or ≤ 0 on a log axis) break the line; everything is
//                                  clipped to the plot area
//     spec.bands?: PlotBand[]      shaded x-ranges { x0, x1, fill, opacity?, label? } (label at the top of the band)
//     spec.annotations?: PlotAnnotation[]  { x, y, text, anchor?: 'start' | 'middle' | 'end', color?, dx?, dy? } (data units)
//     spec.legend?: boolean        legend rows under the x-axis title (default true when a series has a label)
//     spec.title?: string          a line above the plot area
//     spec.fontSize?: number       default 8; spec.idPrefix?: string for the clip path id (default "plot")
//   axisScale(axis, from, to): (v: number) => number   data → position (linear, or linear in log10 v)
//   linearTicks(min, max, count?): number[]            "nice" steps 1, 2, 5 × 10^n
//   logTicks(min, max): number[]                       1, 2, 5 × 10^n inside [min, max]
//   formatTick(v): string                              short plain number ("0.5", "20", "1000", "1e+6")
//   escapeXml(text): string
// Pure: no DOM, no I/O.

export type AxisScale = 'linear' | 'log';
export type MarkerShape = 'circle' | 'square' | 'triangle' | 'cross';

export interface PlotAxis {
  title: string;
  min: number;
  max: number;
  scale?: AxisScale;
  ticks?: number[];
  tickLabel?: (v: number) => string;
}

export interface PlotSeries {
  label: string;
  points: ReadonlyArray<readonly [number, number]>;
  stroke: string;
  width?: number;
  dash?: number[];
  line?: boolean;
  marker?: MarkerShape;
  markerSize?: number;
  legend?: boolean;
}

export interface PlotBand {
  x0: number;
  x1: number;
  fill: string;
  opacity?: number;
  label?: string;
}

export interface PlotAnnotation {
  x: number;
  y: number;
  text: string;
  anchor?: 'start' | 'middle' | 'end';
  color?: string;
  dx?: number;
  dy?: number;
}

export interface PlotSpec {
  width: number;
  height: number;
  x: PlotAxis;
  y: PlotAxis;
  series: PlotSeries[];
  bands?: PlotBand[];
  annotations?: PlotAnnotation[];
  legend?: boolean;
  title?: string;
  fontSize?: number;
  idPrefix?: string;
}

const FONT = 'Roboto';
const INK = '#263238';
const GRID = '#cfd8dc';

/** Text safe inside an SVG element or attribute. */
export function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

/** A coordinate with at most two decimals, no trailing zeros. */
function n(v: number): string {
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

/** Data → position on [from, to]: linear, or linear in log10 for a log axis. */
export function axisScale(axis: Pick<PlotAxis, 'min' | 'max' | 'scale'>, from: number, to: number): (v: number) => number {
  if (axis.scale === 'log') {
    if (!(axis.min > 0 && axis.max > axis.min)) throw new Error('a log axis needs 0 < min < max');
    const l0 = Math.log10(axis.min);
    const span = Math.log10(axis.max) - l0;
    return (v) => from + ((Math.log10(v) - l0) / span) * (to - from);
  }
  if (!(axis.max > axis.min)) throw new Error('an axis needs min < max');
  return (v) => from + ((v - axis.min) / (axis.max - axis.min)) * (to - from);
}

/** Ticks 1, 2, 5 × 10^n inside [min, max] (with a small tolerance at the ends). */
export function logTicks(min: number, max: number): number[] {
  if (!(min > 0 && max > min)) return [];
  const out: number[] = [];
  for (let e = Math.floor(Math.log10(min)); e <= Math.ceil(Math.log10(max)); e++) {
    for (const m of [1, 2, 5]) {
      const v = Number((m * 10 ** e).toPrecision(12));
      if (v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9)) out.push(v);
    }
  }
  return out;
}

/** About `count` ticks at a "nice" step (1, 2 or 5 × 10^n) inside [min, max]. */
export function linearTicks(min: number, max: number, count = 5): number[] {
  if (!(max > min)) return [];
  const raw = (max - min) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + step * 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}

/**
 * A range widened outward to whole "nice" steps (1, 2 or 5 × 10^n, about five intervals: `linearTicks` of the paper
 * plots, and the screen charts' value axes) with the number of intervals, so the chart's tick labels read 2, 4, 6 rather than 1.976, 3.742.
 */
export function niceRange(r: { min: number; max: number }, count = 5): { min: number; max: number; tickAmount: number } {
  const ticks = linearTicks(r.min, r.max, count);
  if (ticks.length < 2) return { ...r, tickAmount: count };
  const step = ticks[1] - ticks[0];
  const min = ticks[0] > r.min ? ticks[0] - step : ticks[0];
  const max = ticks[ticks.length - 1] < r.max ? ticks[ticks.length - 1] + step : ticks[ticks.length - 1];
  return { min: Number(min.toPrecision(12)), max: Number(max.toPrecision(12)), tickAmount: Math.round((max - min) / step) };
}

/** A short plain label for a tick value. */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) return v.toExponential(0);
  return String(Number(v.toPrecision(6)));
}

function marker(shape: MarkerShape, x: number, y: number, size: number, color: string): string {
  const r = size / 2;
  switch (shape) {
    case 'circle':
      return `<circle cx="${n(x)}" cy="${n(y)}" r="${n(r)}" fill="${color}" stroke="${color}" stroke-width="0.5"/>`;
    case 'square':
      return `<rect x="${n(x - r)}" y="${n(y - r)}" width="${n(size)}" height="${n(size)}" fill="${color}" stroke="${color}" stroke-width="0.5"/>`;
    case 'triangle':
      return `<polygon points="${n(x)},${n(y - r * 1.15)} ${n(x + r)},${n(y + r * 0.85)} ${n(x - r)},${n(y + r * 0.85)}" fill="${color}" stroke="${color}" stroke-width="0.5"/>`;
    case 'cross':
      return `<path d="M${n(x - r)},${n(y - r)}L${n(x + r)},${n(y + r)}M${n(x - r)},${n(y + r)}L${n(x + r)},${n(y - r)}" fill="none" stroke="${color}" stroke-width="1.5"/>`;
  }
}

/** Rough text width for layout (Roboto averages about 0.52 em per character). */
const textWidth = (text: string, size: number) => text.length * size * 0.52;

/** The plot as an SVG string. */
export function svgPlot(spec: PlotSpec): string {
  const fs = spec.fontSize ?? 8;
  const id = `${(spec.idPrefix ?? 'plot').replace(/[^A-Za-z0-9_-]/g, '')}-area`;
  const xTicks = spec.x.ticks ?? (spec.x.scale === 'log' ? logTicks(spec.x.min, spec.x.max) : linearTicks(spec.x.min, spec.x.max));
  const yTicks = spec.y.ticks ?? (spec.y.scale === 'log' ? logTicks(spec.y.min, spec.y.max) : linearTicks(spec.y.min, spec.y.max));
  const xLabel = spec.x.tickLabel ?? formatTick;
  const yLabel = spec.y.tickLabel ?? formatTick;

  const inLegend = spec.series.filter((s) => s.legend !== false && s.label);
  const showLegend = (spec.legend ?? true) && inLegend.length > 0;
  // Legend rows: entries placed left to right, wrapped at the width.
  const entryW = (s: PlotSeries) => 26 + textWidth(s.label, fs) + 12;
  const rows: PlotSeries[][] = [];
  if (showLegend) {
    let row: PlotSeries[] = [];
    let w = 0;
    for (const s of inLegend) {
      if (row.length > 0 && w + entryW(s) > spec.width - 16) {
        rows.push(row);
        row = [];
        w = 0;
      }
      row.push(s);
      w += entryW(s);
    }
    rows.push(row);
  }
  const legendH = rows.length * (fs + 6);
  const yTickW = Math.max(...yTicks.map((t) => textWidth(yLabel(t), fs)), textWidth('0', fs));
  const left = 6 + fs + 6 + yTickW + 6;
  const right = 12;
  const top = (spec.title ? fs + 10 : 0) + 8;
  const bottom = 6 + fs + 6 + fs + 8 + (showLegend ? legendH + 4 : 0);
  const px0 = left;
  const px1 = spec.width - right;
  const py0 = spec.height - bottom; // y axis goes up
  const py1 = top;
  const sx = axisScale(spec.x, px0, px1);
  const sy = axisScale(spec.y, py0, py1);
  const okX = (v: number) => Number.isFinite(v) && (spec.x.scale !== 'log' || v > 0);
  const okY = (v: number) => Number.isFinite(v) && (spec.y.scale !== 'log' || v > 0);
  const textAttrs = (size: number, color = INK) => `font-family="${FONT}" font-size="${n(size)}" fill="${color}"`;

  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${n(spec.width)}" height="${n(spec.height)}" viewBox="0 0 ${n(spec.width)} ${n(spec.height)}">`);
  out.push(`<defs><clipPath id="${id}"><rect x="${n(px0)}" y="${n(py1)}" width="${n(px1 - px0)}" height="${n(py0 - py1)}"/></clipPath></defs>`);
  out.push(`<rect x="0" y="0" width="${n(spec.width)}" height="${n(spec.height)}" fill="#ffffff"/>`);
  if (spec.title) out.push(`<text x="${n(px0)}" y="${n(fs + 4)}" ${textAttrs(fs + 1)} font-weight="bold">${escapeXml(spec.title)}</text>`);

  // Bands (under everything else), each labelled at its top.
  for (const b of spec.bands ?? []) {
    if (!okX(b.x0) || !okX(b.x1)) continue;
    const a = Math.max(px0, Math.min(px1, sx(Math.min(b.x0, b.x1))));
    const z = Math.max(px0, Math.min(px1, sx(Math.max(b.x0, b.x1))));
    if (z <= a) continue;
    out.push(`<rect x="${n(a)}" y="${n(py1)}" width="${n(z - a)}" height="${n(py0 - py1)}" fill="${b.fill}" fill-opacity="${b.opacity ?? 0.15}"/>`);
    if (b.label) out.push(`<text x="${n((a + z) / 2)}" y="${n(py1 + fs + 2)}" text-anchor="middle" ${textAttrs(fs)}>${escapeXml(b.label)}</text>`);
  }

  // Grid and tick labels.
  for (const t of xTicks) {
    if (!okX(t)) continue;
    const x = sx(t);
    if (x < px0 - 0.01 || x > px1 + 0.01) continue;
    out.push(`<line x1="${n(x)}" y1="${n(py0)}" x2="${n(x)}" y2="${n(py1)}" stroke="${GRID}" stroke-width="0.5"/>`);
    out.push(`<line x1="${n(x)}" y1="${n(py0)}" x2="${n(x)}" y2="${n(py0 + 3)}" stroke="${INK}" stroke-width="0.75"/>`);
    out.push(`<text x="${n(x)}" y="${n(py0 + 4 + fs)}" text-anchor="middle" ${textAttrs(fs)}>${escapeXml(xLabel(t))}</text>`);
  }
  for (const t of yTicks) {
    if (!okY(t)) continue;
    const y = sy(t);
    if (y > py0 + 0.01 || y < py1 - 0.01) continue;
    out.push(`<line x1="${n(px0)}" y1="${n(y)}" x2="${n(px1)}" y2="${n(y)}" stroke="${GRID}" stroke-width="0.5"/>`);
    out.push(`<line x1="${n(px0 - 3)}" y1="${n(y)}" x2="${n(px0)}" y2="${n(y)}" stroke="${INK}" stroke-width="0.75"/>`);
    out.push(`<text x="${n(px0 - 5)}" y="${n(y + fs * 0.35)}" text-anchor="end" ${textAttrs(fs)}>${escapeXml(yLabel(t))}</text>`);
  }
  out.push(`<rect x="${n(px0)}" y="${n(py1)}" width="${n(px1 - px0)}" height="${n(py0 - py1)}" fill="none" stroke="${INK}" stroke-width="0.75"/>`);

  // Axis titles.
  out.push(`<text x="${n((px0 + px1) / 2)}" y="${n(py0 + 4 + fs + 6 + fs)}" text-anchor="middle" ${textAttrs(fs)}>${escapeXml(spec.x.title)}</text>`);
  const ytx = 6 + fs;
  const yty = (py0 + py1) / 2;
  out.push(`<text x="${n(ytx)}" y="${n(yty)}" text-anchor="middle" transform="rotate(-90 ${n(ytx)} ${n(yty)})" ${textAttrs(fs)}>${escapeXml(spec.y.title)}</text>`);

  // Series: lines broken at unplottable points, then markers, all clipped to the plot area.
  out.push(`<g clip-path="url(#${id})">`);
  for (const s of spec.series) {
    const w = s.width ?? 1.5;
    const dash = s.dash && s.dash.length > 0 ? ` stroke-dasharray="${s.dash.map(n).join(',')}"` : '';
    if (s.line !== false) {
      let run: string[] = [];
      const flush = () => {
        if (run.length >= 2) out.push(`<polyline points="${run.join(' ')}" fill="none" stroke="${s.stroke}" stroke-width="${n(w)}"${dash} stroke-linejoin="round"/>`);
        run = [];
      };
      for (const [x, y] of s.points) {
        if (okX(x) && okY(y)) run.push(`${n(sx(x))},${n(sy(y))}`);
        else flush();
      }
      flush();
    }
    if (s.marker) for (const [x, y] of s.points) if (okX(x) && okY(y)) out.push(marker(s.marker, sx(x), sy(y), s.markerSize ?? 5, s.stroke));
  }
  out.push('</g>');

  // Annotations (data coordinates, not clipped).
  for (const a of spec.annotations ?? []) {
    if (!okX(a.x) || !okY(a.y)) continue;
    out.push(
      `<text x="${n(sx(a.x) + (a.dx ?? 0))}" y="${n(sy(a.y) + (a.dy ?? 0))}" text-anchor="${a.anchor ?? 'start'}" ${textAttrs(fs, a.color ?? INK)}>${escapeXml(a.text)}</text>`,
    );
  }

  // Legend: a sample of the line (dash and marker) and the label, rows under the x-axis title.
  if (showLegend) {
    let y = py0 + 4 + fs + 6 + fs + 8 + fs * 0.5;
    for (const row of rows) {
      let x = px0;
      for (const s of row) {
        const dash = s.dash && s.dash.length > 0 ? ` stroke-dasharray="${s.dash.map(n).join(',')}"` : '';
        if (s.line !== false) out.push(`<line x1="${n(x)}" y1="${n(y)}" x2="${n(x + 20)}" y2="${n(y)}" stroke="${s.stroke}" stroke-width="${n(s.width ?? 1.5)}"${dash}/>`);
        if (s.marker) out.push(marker(s.marker, x + 10, y, s.markerSize ?? 5, s.stroke));
        out.push(`<text x="${n(x + 24)}" y="${n(y + fs * 0.35)}" ${textAttrs(fs)}>${escapeXml(s.label)}</text>`);
        x += entryW(s);
      }
      y += fs + 6;
    }
  }
  out.push('</svg>');
  return out.join('');
}
