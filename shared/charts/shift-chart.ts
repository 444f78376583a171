// The shift chart of a stored screening: every indicator whose value is a change (a shift against the unit's own
// baseline, previous test, pre-fault sample or the sisters' median) as a bar, with the watch/investigate/critical
// thresholds the engine judged it by, taken from the screening's own criteria set. Bars are grouped by test method and
// unit of measure (capacitance in %, power factor in %, reactance spread in percentage points, gases in ppm …) so that
// no axis mixes units and a 0.5 % capacitance shift is not drawn beside a 25 % power-factor rise. Pure; no Vue, no I/O.
import type { Band, Criteria } from '../screening/criteria.js';
import { criteriaV2 } from '../screening/criteria-sets.js';
import type { Indicator, Level, Method } from '../schemas/result.js';
import { iecReactanceCategory } from '../screening/reactance.js';
import { basisLabel, indicatorLabel, indicatorUnit, LEVEL_LABELS, METHOD_LABELS } from '../vocabulary.js';

export type ShiftUnit = '%' | 'points' | 'ppm';
export type ThresholdLevel = Exclude<Level, 'ok'>;

/** A threshold on the bar's side of zero: the value at which `level` starts. */
export interface ShiftThreshold {
  level: ThresholdLevel;
  at: number;
}

/** The bands the engine used for an indicator key, in the criteria's own terms. */
export interface ShiftBands {
  bands: Band[];
  /** The engine judges |value| (a fall counts as much as a rise). */
  absolute: boolean;
  /** Conditions the bands alone do not show (words). */
  note?: string;
}

export interface ShiftBar {
  key: string;
  /** Words: "CHL capacitance shift vs baseline". */
  label: string;
  value: number;
  level: Level;
  unit: ShiftUnit;
  /** What the value is compared with, in words ("against own baseline"), when the result says. */
  basis: string | null;
  reference: string | null;
  absolute: boolean;
  /** Thresholds on the side of zero the bar is on (a rise-only rule: above zero), ascending in magnitude. */
  thresholds: ShiftThreshold[];
  /** Band conditions, caps and low confidence in words. */
  notes: string[];
}

export interface ShiftGroup {
  /** `method|unit`: one chart per test method and unit. */
  id: string;
  method: Method;
  unit: ShiftUnit;
  /** Axis title with its unit. */
  axisTitle: string;
  bars: ShiftBar[];
}

export const SHIFT_AXIS_TITLES: Record<ShiftUnit, string> = {
  '%': 'Shift (%)',
  points: 'Change (percentage points)',
  ppm: 'Rise (ppm)',
};

const UNITS: readonly ShiftUnit[] = ['%', 'points', 'ppm'];
/** The order of the charts: the engine's methods as the indicator table lists them. */
const METHODS: readonly Method[] = ['capacitance', 'power-factor', 'reactance', 'sweep', 'excitation', 'resistance', 'ratio', 'gas', 'bushing', 'sisters', 'duty'];

/** A group's axis title: the method, then what is measured and its unit ("Capacitance: shift (%)"). */
function groupAxisTitle(method: Method, unit: ShiftUnit): string {
  const t = SHIFT_AXIS_TITLES[unit];
  return `${METHOD_LABELS[method]}: ${t.charAt(0).toLowerCase()}${t.slice(1)}`;
}

/**
 * The criteria bands behind an indicator key (as the engine's method files apply them); null when the key is judged by
 * no change bands (informative changes). `ratedKVA` sets the reactance limit L (IEC 60076-5 category, criteria).
 */
export function bandsForKey(key: string, criteria: Criteria, ratedKVA?: number): ShiftBands | null {
  const p = key.split('.');
  const [head] = p;
  const last = p[p.length - 1];
  const pfc = criteria.powerFactor;
  switch (head) {
    case 'capacitance':
      if (last === 'shiftPercent' || last === 'shiftFromPreviousPercent') return { bands: [...criteria.capacitance.shiftBands], absolute: true };
      return null;
    case 'powerFactor':
      if (last === 'riseFromBaselinePercent')
        return {
          bands: [...pfc.riseBands],
          absolute: false,
          note: pfc.minRisePoints ? `judged only when PF20 rose by at least ${pfc.minRisePoints} percentage point` : undefined,
        };
      return null;
    case 'reactance':
      if (last === 'shiftPercent' || last === 'shiftFromPreviousPercent') {
        if (ratedKVA === undefined) return null;
        const { category, limitPercent } = iecReactanceCategory(ratedKVA, criteria);
        return {
          bands: criteria.reactance.limitMultipleBands.map((b) => ({ from: b.from * limitPercent, level: b.level })),
          absolute: true,
          note: `multiples of L = ${limitPercent} % (IEC category ${category})`,
        };
      }
      if (p[1] === 'phaseSpreadChangePoints') return { bands: [...criteria.reactance.spreadChangeBands], absolute: false };
      return null;
    case 'excitation':
      if (last === 'changePercent') return { bands: [...criteria.excitation.changeBands], absolute: true };
      return null;
    case 'resistance':
      if (last === 'changePercent') return { bands: [...criteria.resistance.changeBands], absolute: true };
      return null;
    case 'ratio':
      if (last === 'changePercent') return { bands: [...criteria.ratio.changeBands], absolute: true };
      return null;
    case 'gas':
      if (p[1] === 'C2H2' && last === 'risePPM') return { bands: [...criteria.gas.acetyleneRiseBands], absolute: false };
      if (p[1] === 'H2' && last === 'risePPM')
        return {
          bands: [{ from: criteria.gas.hydrogenRiseWithAcetylenePPM, level: criteria.gas.hydrogenWithAcetyleneLevel }],
          absolute: false,
          note: `only with acetylene above ${criteria.gas.acetylenePresentPPM} ppm in the post-fault sample`,
        };
      return null;
    case 'bushing': {
      const bc = criteria.bushing ?? criteriaV2.bushing!;
      if (last === 'c1ShiftPercent') return { bands: [...bc.c1ShiftBands], absolute: true };
      if (last === 'c1Pf20RisePercent') return { bands: [...pfc.riseBands], absolute: false };
      return null;
    }
    case 'dfFrequency':
      if (last === 'conductiveChangePercent')
        return { bands: [...criteria.dfFrequency.conductiveRiseBands], absolute: false, note: `informative: ${criteria.dfFrequency.maxLevel} at most` };
      return null;
  }
  return null;
}

/** Whether an indicator's value is a change (basis change or sisters; before revision 2, a shift/rise/change key). */
export function isShiftIndicator(i: Pick<Indicator, 'key' | 'value' | 'basis'>): boolean {
  if (typeof i.value !== 'number' || !Number.isFinite(i.value)) return false;
  if (!(UNITS as readonly string[]).includes(indicatorUnit(i.key))) return false;
  if (i.basis) return i.basis === 'change' || i.basis === 'sisters';
  const last = i.key.split('.').pop() ?? '';
  return /(shift|rise|change)/i.test(last);
}

/** A band list as thresholds on the bar's side of zero (ok bands dropped; a cap lowers the levels above it). */
export function thresholdsOf(b: ShiftBands, value: number, cap?: Level): ShiftThreshold[] {
  const order: Level[] = ['ok', 'watch', 'investigate', 'critical'];
  const sign = b.absolute && value < 0 ? -1 : 1;
  return [...b.bands]
    .sort((x, y) => x.from - y.from)
    .map((band) => ({ level: cap && order.indexOf(band.level) > order.indexOf(cap) ? cap : band.level, at: sign * band.from }))
    .filter((t): t is ShiftThreshold => t.level !== 'ok');
}

/** The bars of a result's shift indicators under the screening's criteria set, one group per method and unit. */
export function shiftChart(indicators: readonly Indicator[], criteria: Criteria, opts: { ratedKVA?: number } = {}): ShiftGroup[] {
  const groups = new Map<string, { method: Method; unit: ShiftUnit; bars: ShiftBar[] }>();
  for (const i of indicators) {
    if (!isShiftIndicator(i)) continue;
    const unit = indicatorUnit(i.key) as ShiftUnit;
    const value = i.value as number;
    const bands = bandsForKey(i.key, criteria, opts.ratedKVA);
    const fromSisters = i.basis === 'sisters';
    const notes: string[] = [];
    if (bands?.note) notes.push(bands.note);
    if (fromSisters) notes.push(`sisters' median as reference: ${criteria.sisters.referenceCap} at most`);
    if (i.lowConfidence) notes.push(`low confidence: ${criteria.lowConfidenceCap ?? 'watch'} at most`);
    if (!bands) notes.push('no change bands in the criteria set (informative)');
    const bar: ShiftBar = {
      key: i.key,
      label: indicatorLabel(i.key),
      value,
      level: i.level,
      unit,
      basis: basisLabel(i),
      reference: i.reference ?? null,
      absolute: bands?.absolute ?? false,
      thresholds: bands ? thresholdsOf(bands, value, fromSisters ? criteria.sisters.referenceCap : undefined) : [],
      notes,
    };
    const id = `${i.method}|${unit}`;
    (groups.get(id) ?? groups.set(id, { method: i.method, unit, bars: [] }).get(id)!).bars.push(bar);
  }
  const rank = (g: { method: Method; unit: ShiftUnit }) => METHODS.indexOf(g.method) * UNITS.length + UNITS.indexOf(g.unit);
  return [...groups.entries()]
    .sort(([, a], [, b]) => rank(a) - rank(b))
    .map(([id, g]) => ({ id, method: g.method, unit: g.unit, axisTitle: groupAxisTitle(g.method, g.unit), bars: g.bars }));
}

const UNIT_TEXT: Record<ShiftUnit, string> = { '%': ' %', points: ' points', ppm: ' ppm' };

/** A bar's thresholds in words: "Watch from |value| 2 %, Investigate from 3 %" (a rise-only rule: "from +50 %"). */
export function thresholdWords(bar: Pick<ShiftBar, 'thresholds' | 'absolute' | 'unit'>): string {
  if (!bar.thresholds.length) return 'no thresholds';
  const u = UNIT_TEXT[bar.unit];
  return bar.thresholds
    .map((t, k) => `${LEVEL_LABELS[t.level]} from ${bar.absolute ? (k === 0 ? '|value| ' : '') + Math.abs(t.at) : (t.at > 0 ? '+' : '') + t.at}${u}`)
    .join(', ');
}

/**
 * The value axis of a group: zero, every value and each bar's first threshold (so the nearest level mark shows; the
 * higher ones would squeeze small shifts into a sliver), padded by 5 % of the span. Marks beyond it are in the table.
 */
export function shiftAxisRange(group: ShiftGroup): { min: number; max: number } {
  const xs = [0, ...group.bars.flatMap((b) => [b.value, ...b.thresholds.slice(0, 1).map((t) => t.at)])];
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const pad = hi > lo ? 0.05 * (hi - lo) : 1;
  return { min: lo < 0 ? lo - pad : 0, max: hi > 0 ? hi + pad : 0 };
}
