// The through-fault duty curve of a unit (IEEE C57.109 as the engine reads it, shared/screening/through-fault.ts): the
// thermal curve of the criteria, the mechanical segment I²t = K (categories II–IV) or the category I line I²t = 1250,
// this event's shots and the unit's earlier faults' shots (winding current in per unit of rated, duration), and the
// cumulative duty. Every number comes from the engine's functions; this file only lays them out for a chart.
//
//   dutyCurveSeries({ unit, fault, priorFaults?, criteria? }) → DutyCurve (null-free; no fault → no shots)
//   dutyCurvePlotSpec(curve, { width?, height? }) → PlotSpec for svgPlot (shared/charts/svg-plot.ts)
//   dutyCurveSvg(curve, size?) → the SVG string (the PDF report)
//   decadeRange(min, max) → [lo, hi] log10 exponents of the whole decades around a range (the screen chart's log axes)
import type { Fault, PriorFault, Unit } from '../schemas/case.js';
import type { IeeeCategory } from '../schemas/result.js';
import type { Criteria } from '../screening/criteria.js';
import { criteriaV1 } from '../screening/criteria-sets.js';
import {
  faultI2t,
  ieeeCategory,
  maxCurrentPerUnit,
  mechanicalLimitI2t,
  mechanicalTimeS,
  segmentStartPerUnit,
  shotsPerUnit,
  thermalCurveTimeS,
} from '../screening/through-fault.js';
import { svgPlot, type PlotSeries, type PlotSpec } from './svg-plot.js';

export const DUTY_CURRENT_AXIS_TITLE = 'Current (per unit of rated)';
export const DUTY_TIME_AXIS_TITLE = 'Time (s)';
export const DUTY_I2T_UNIT = 'per-unit² · s';

/** A point of a curve: current in per unit of rated, time in seconds. */
export type CurvePoint = readonly [currentPerUnit: number, timeS: number];

export interface DutyShot {
  /** Winding current in per unit of rated (the engine's `shotsPerUnit`). */
  currentPerUnit: number;
  durationS: number;
  /** currentPerUnit² · durationS. */
  i2t: number;
  /** Time the curve allows at this current (K/I² at or above the segment start, else the thermal curve; Infinity below it). */
  allowedS: number;
}

export interface DutyFaultShots {
  occurredAt: string;
  /** The fault's date (YYYY-MM-DD of its time as logged). */
  label: string;
  shots: DutyShot[];
  i2t: number;
}

export interface DutyCurve {
  category: IeeeCategory;
  /** Largest through-fault current I_sc in per unit (category I capped). */
  maxCurrentPerUnit: number;
  /** Where the mechanical segment starts (per unit); I_sc for category I (no segment). */
  segmentStartPerUnit: number;
  /** K = 2·I_sc² (categories II–IV) or 1250 (category I), per-unit² · s. */
  mechanicalLimitI2t: number;
  /** The criteria's thermal curve, ascending current. */
  thermal: CurvePoint[];
  /** I²t = K from the segment start to I_sc (II–IV), or the category I line I²t = 1250; with its label. */
  mechanical: { label: string; points: CurvePoint[] };
  /** This event's shots (null: no fault). */
  event: DutyFaultShots | null;
  /** The unit's earlier faults, in time order. */
  prior: DutyFaultShots[];
  x: { title: string; min: number; max: number };
  y: { title: string; min: number; max: number };
  summary: {
    eventI2t: number;
    priorI2t: number;
    cumulativeI2t: number;
    /** Event I²t as % of K. */
    eventDutyPercent: number;
    /** Cumulative I²t as % of K (the Gapsight tally). */
    cumulativeDutyPercent: number;
    unit: string;
  };
}

export interface DutyCurveInput {
  unit: Unit;
  fault: (Fault | PriorFault) | null | undefined;
  priorFaults?: readonly PriorFault[];
  criteria?: Criteria;
}

/** The largest 1, 2, 5 × 10^n at or below v (v > 0). */
export function logFloor(v: number): number {
  const e = Math.floor(Math.log10(v));
  const m = [5, 2, 1].find((k) => k * 10 ** e <= v * (1 + 1e-9)) ?? 1;
  return Number((m * 10 ** e).toPrecision(12));
}

/** The smallest 1, 2, 5 × 10^n at or above v (v > 0). */
export function logCeil(v: number): number {
  const e = Math.floor(Math.log10(v));
  const m = [1, 2, 5, 10].find((k) => k * 10 ** e >= v * (1 - 1e-9)) ?? 10;
  return Number((m * 10 ** e).toPrecision(12));
}

/** The whole decades around [min, max] (0 < min ≤ max) as log10 exponents: a log axis drawn as log10 values (ApexCharts
 * 4.7 has no logarithmic x axis) with a tick at each decade. */
export function decadeRange(min: number, max: number): [number, number] {
  const lo = Math.floor(Math.log10(min) + 1e-9);
  const hi = Math.ceil(Math.log10(max) - 1e-9);
  return [lo, Math.max(hi, lo + 1)];
}

/** Samples of t = K/I² between two currents, evenly spaced in log I (a straight line on log–log axes needs two; more
 * keep the table readable). */
function i2tLine(k: number, from: number, to: number, steps = 4): CurvePoint[] {
  if (!(to > from)) return [[from, mechanicalTimeS(from, k)]];
  const out: CurvePoint[] = [];
  for (let j = 0; j <= steps; j++) {
    const i = 10 ** (Math.log10(from) + (j / steps) * (Math.log10(to) - Math.log10(from)));
    out.push([i, mechanicalTimeS(i, k)]);
  }
  return out;
}

/** The time the curve allows at a current: K/I² on the mechanical segment (II–IV, at or above its start), else the
 * thermal curve (Infinity below its lowest point). */
export function allowedTimeS(currentPerUnit: number, curve: Pick<DutyCurve, 'category' | 'segmentStartPerUnit' | 'mechanicalLimitI2t'>, criteria: Criteria = criteriaV1): number {
  if (curve.category !== 'I' && currentPerUnit >= curve.segmentStartPerUnit) return mechanicalTimeS(currentPerUnit, curve.mechanicalLimitI2t);
  return thermalCurveTimeS(currentPerUnit, criteria);
}

/** The duty curve, the shots and the cumulative duty of a fault on a unit. */
export function dutyCurveSeries(input: DutyCurveInput): DutyCurve {
  const criteria = input.criteria ?? criteriaV1;
  const unit = input.unit;
  const category = ieeeCategory(unit.ratedKVA, unit.phases, criteria);
  const isc = maxCurrentPerUnit(unit, category, criteria);
  const segment = segmentStartPerUnit(isc, category, criteria);
  const k = mechanicalLimitI2t(isc, category, criteria);
  const thermal: CurvePoint[] = [...criteria.throughFault.thermalCurve].sort((a, b) => a[0] - b[0]).map(([i, t]) => [i, t] as const);

  let mechanical: DutyCurve['mechanical'];
  if (category === 'I') {
    // Category I: the line I²t = 1250 over the thermal curve's top span (its second-highest point to I_sc): the top
    // span of the criteria's curve is itself close to that line (11.3²·10 = 1277, 25²·2 = 1250, computed from the points).
    const from = thermal.length >= 2 ? thermal[thermal.length - 2][0] : isc / 2;
    mechanical = { label: `Category I: I²t = ${round(k)}`, points: i2tLine(k, Math.min(from, isc), isc) };
  } else {
    mechanical = { label: `Mechanical segment: I²t = K = ${round(k)}`, points: i2tLine(k, segment, isc) };
  }

  const shape = { category, segmentStartPerUnit: segment, mechanicalLimitI2t: k };
  const shotsOf = (f: Fault | PriorFault): DutyFaultShots => {
    const pu = shotsPerUnit(unit, f);
    const shots = f.shots.map((s, j) => ({
      currentPerUnit: pu[j],
      durationS: s.durationS,
      i2t: pu[j] * pu[j] * s.durationS,
      allowedS: allowedTimeS(pu[j], shape, criteria),
    }));
    return { occurredAt: f.occurredAt, label: f.occurredAt.slice(0, 10), shots, i2t: faultI2t(unit, f) };
  };
  const event = input.fault && input.fault.shots.length > 0 ? shotsOf(input.fault) : null;
  const prior = [...(input.priorFaults ?? [])]
    .filter((f) => f.shots.length > 0)
    .sort((a, b) => Date.parse(a.occurredAt) - Date.parse(b.occurredAt))
    .map(shotsOf);

  // Log–log ranges covering the curves and every shot, widened to 1, 2, 5 × 10^n.
  const allShots = [...(event?.shots ?? []), ...prior.flatMap((p) => p.shots)];
  const currents = [...thermal.map((p) => p[0]), ...mechanical.points.map((p) => p[0]), ...allShots.map((s) => s.currentPerUnit)].filter((v) => v > 0);
  const times = [...thermal.map((p) => p[1]), ...mechanical.points.map((p) => p[1]), ...allShots.map((s) => s.durationS)].filter((v) => v > 0);
  const x = { title: DUTY_CURRENT_AXIS_TITLE, min: logFloor(Math.min(1, ...currents)), max: logCeil(Math.max(...currents) * 1.1) };
  const y = { title: DUTY_TIME_AXIS_TITLE, min: logFloor(Math.min(...times) * 0.9), max: logCeil(Math.max(...times) * 1.1) };

  const eventI2t = event?.i2t ?? 0;
  const priorI2t = prior.reduce((s, p) => s + p.i2t, 0);
  const cumulativeI2t = eventI2t + priorI2t;
  return {
    category,
    maxCurrentPerUnit: isc,
    segmentStartPerUnit: segment,
    mechanicalLimitI2t: k,
    thermal,
    mechanical,
    event,
    prior,
    x,
    y,
    summary: {
      eventI2t,
      priorI2t,
      cumulativeI2t,
      eventDutyPercent: (100 * eventI2t) / k,
      cumulativeDutyPercent: (100 * cumulativeI2t) / k,
      unit: DUTY_I2T_UNIT,
    },
  };
}

/** A figure for a label: four significant digits, no trailing zeros. */
function round(v: number): string {
  return String(Number(v.toPrecision(4)));
}

/** Series colours and shapes (the app's palette: slate, copper, teal, graphite); shapes and dashes tell them apart too. */
export const DUTY_STYLE = {
  thermal: { stroke: '#3d5467', dash: [] as number[], width: 1.75 },
  mechanical: { stroke: '#a4582a', dash: [6, 3], width: 1.75 },
  event: { stroke: '#c2410c', marker: 'triangle' as const },
  prior: [
    { stroke: '#0f766e', marker: 'square' as const },
    { stroke: '#24292f', marker: 'circle' as const },
    { stroke: '#6b4f9e', marker: 'cross' as const },
  ],
};

/** The chart for paper: both curves, the shots, the mechanical segment shaded. */
export function dutyCurvePlotSpec(curve: DutyCurve, size: { width?: number; height?: number } = {}): PlotSpec {
  const series: PlotSeries[] = [
    { label: 'Thermal curve', points: curve.thermal, ...DUTY_STYLE.thermal },
    { label: curve.mechanical.label, points: curve.mechanical.points, ...DUTY_STYLE.mechanical },
  ];
  curve.prior.forEach((p, j) => {
    const st = DUTY_STYLE.prior[j % DUTY_STYLE.prior.length];
    series.push({ label: `Earlier fault ${p.label}`, points: p.shots.map((s) => [s.currentPerUnit, s.durationS] as const), stroke: st.stroke, line: false, marker: st.marker, markerSize: 5 });
  });
  if (curve.event) {
    series.push({
      label: `This fault ${curve.event.label}`,
      points: curve.event.shots.map((s) => [s.currentPerUnit, s.durationS] as const),
      stroke: DUTY_STYLE.event.stroke,
      line: false,
      marker: DUTY_STYLE.event.marker,
      markerSize: 7,
    });
  }
  return {
    width: size.width ?? 480,
    height: size.height ?? 300,
    x: { title: curve.x.title, min: curve.x.min, max: curve.x.max, scale: 'log' },
    y: { title: curve.y.title, min: curve.y.min, max: curve.y.max, scale: 'log' },
    series,
    bands:
      curve.category === 'I'
        ? []
        : [{ x0: curve.segmentStartPerUnit, x1: curve.maxCurrentPerUnit, fill: '#a4582a', opacity: 0.1, label: 'Mechanical segment' }],
    idPrefix: 'duty',
  };
}

/** The duty curve as an SVG string (the PDF report). */
export function dutyCurveSvg(curve: DutyCurve, size?: { width?: number; height?: number }): string {
  return svgPlot(dutyCurvePlotSpec(curve, size));
}
