// Trends of every quantity of one unit over its reading sets, for the unit file: values, or the change against the
// unit's baseline with the criteria set's watch/investigate/critical bands. Every corrected number comes from the
// engine's own functions (PF20: shared/screening/power-factor.ts; %X: reactance.ts; resistance at the reference
// temperature: resistance.ts), so the chart shows what a screening would compare. Pure; no Vue, no I/O.
//
// The baseline of a quantity is the one the engine's case uses (server case export → shared/readings/merge.ts): among
// the unit's baseline sets (shared/readings/baseline.ts: factory, commissioning, or marked as reference) the newest set
// that holds that quantity (that configuration, that phase). Dissolved gases are one measurement: the newest baseline
// set with an oil sample gives all of them.
import type { ReadingSet } from '../schemas/case.js';
import type { ReadingSetKind } from '../schemas/enums.js';
import type { Band, Criteria } from '../screening/criteria.js';
import type { Level } from '../schemas/result.js';
import { isBaselineSet } from '../readings/baseline.js';
import { pf20Percent } from '../screening/power-factor.js';
import { iecReactanceCategory, reactancePercent } from '../screening/reactance.js';
import { correctResistance, windingTemperature } from '../screening/resistance.js';
import { shiftPercent } from '../screening/reference.js';
import { faultTypeWord, GAS_LABELS } from '../vocabulary.js';

export type TrendMode = 'values' | 'change';
export type TrendGroupId = 'capacitance' | 'powerFactor' | 'reactance' | 'resistance' | 'excitation' | 'ratio' | 'gas';
export type BandLevel = Exclude<Level, 'ok'>;

/** A reading set as the unit file holds it (conditions at the top, values in the case format). */
export interface TrendReadingSet {
  id: number;
  kind: ReadingSetKind;
  isReference: boolean;
  takenAt: string;
  temperatureC?: number | null;
  windingTemperatureC?: number | null;
  hoursDeenergised?: number | null;
  values?: ReadingSet | null;
}

export interface TrendEvent {
  id: number;
  occurredAt: string;
  type: string;
}

export interface TrendUnit {
  hvKV: number;
  ratedKVA: number;
  conductor?: string | null;
}

export interface TrendPoint {
  /** Time in ms since 1970 (the chart's datetime axis). */
  x: number;
  y: number;
  setId: number;
  takenAt: string;
  kind: ReadingSetKind;
  /** This point is the series' baseline (what the changes are taken against). */
  isBaseline: boolean;
}

export interface TrendSeries {
  /** "capacitance.CHL", "reactance.A", "gas.H2" … */
  key: string;
  /** Words: "CHL", "Phase A", "Hydrogen (H2)". */
  name: string;
  points: TrendPoint[];
  /** The baseline point (in values: the value; in change: 0). */
  baseline: { x: number; y: number; setId: number } | null;
}

/** A level's y range in the change view; null ends are open (beyond the axis). */
export interface BandRange {
  level: BandLevel;
  from: number | null;
  to: number | null;
}

export interface TrendGroup {
  id: TrendGroupId;
  label: string;
  /** Axis title with its unit. */
  yTitle: string;
  /** Unit of the y numbers ("pF", "%", "Ω" …). */
  unit: string;
  series: TrendSeries[];
  /** Change view only: the criteria set's bands for this quantity (none for gases). */
  bands: BandRange[];
  /** Where the bands come from, in words (criteria set and its source); null without bands. */
  bandsSource: string | null;
  /** What was left out and why, in words. */
  notes: string[];
}

export interface EventMarker {
  x: number;
  eventId: number;
  occurredAt: string;
  /** "Fault: phase to ground". */
  label: string;
}

export interface UnitTrends {
  mode: TrendMode;
  xTitle: string;
  groups: TrendGroup[];
  markers: EventMarker[];
  criteriaVersion: number;
}

export const TREND_X_TITLE = 'Date of the reading set';
export const CHANGE_Y_TITLE = 'Change against the baseline (%)';

export const TREND_GROUP_LABELS: Record<TrendGroupId, string> = {
  capacitance: 'Capacitance',
  powerFactor: 'Power factor at 20 °C',
  reactance: 'Leakage reactance',
  resistance: 'Winding resistance',
  excitation: 'Excitation current',
  ratio: 'Turns ratio',
  gas: 'Dissolved gases',
};

const GAS_KEYS = ['H2', 'CH4', 'C2H2', 'C2H4', 'C2H6', 'CO', 'CO2'] as const;

/**
 * A criteria band list as y ranges of the change view. `absolute`: the engine judges |change| (a fall counts as much
 * as a rise), so each band appears above and below zero; otherwise only a rise is judged. Bands sorted by `from`; a band
 * runs to the next band's start.
 */
export function bandRanges(bands: readonly Band[], absolute: boolean, scale = 1): BandRange[] {
  const sorted = [...bands].filter((b) => b.level !== 'ok').sort((a, b) => a.from - b.from);
  const out: BandRange[] = [];
  sorted.forEach((b, i) => {
    const from = b.from * scale;
    const to = i + 1 < sorted.length ? sorted[i + 1].from * scale : null;
    out.push({ level: b.level as BandLevel, from, to });
    if (absolute) out.push({ level: b.level as BandLevel, from: to === null ? null : -to, to: -from });
  });
  return out;
}

/** The bands of a quantity group under a criteria set (none for gases: the criteria judge rises in ppm, not in %). */
export function trendBands(group: TrendGroupId, criteria: Criteria, unit: TrendUnit): { bands: BandRange[]; source: string | null } {
  const set = `criteria set ${criteria.version}`;
  switch (group) {
    case 'capacitance':
      return { bands: bandRanges(criteria.capacitance.shiftBands, true), source: `${set}: ${criteria.capacitance.shiftSource}` };
    case 'powerFactor':
      return { bands: bandRanges(criteria.powerFactor.riseBands, false), source: `${set}: ${criteria.powerFactor.riseSource}` };
    case 'reactance': {
      const { category, limitPercent } = iecReactanceCategory(unit.ratedKVA, criteria);
      return {
        bands: bandRanges(criteria.reactance.limitMultipleBands, true, limitPercent),
        source: `${set}: multiples of L = ${limitPercent} % (IEC category ${category}); ${criteria.reactance.iecSource}`,
      };
    }
    case 'resistance':
      return { bands: bandRanges(criteria.resistance.changeBands, true), source: `${set}: ${criteria.resistance.changeSource}` };
    case 'excitation':
      return { bands: bandRanges(criteria.excitation.changeBands, true), source: `${set}: ${criteria.excitation.changeSource}` };
    case 'ratio':
      return { bands: bandRanges(criteria.ratio.changeBands, true), source: `${set}: ${criteria.ratio.changeSource}` };
    case 'gas':
      return { bands: [], source: null };
  }
}

type Raw = { key: string; name: string; value: number; set: TrendReadingSet; x: number };

/** The case-format values of a set with its stored conditions filled in (values win). */
function valuesOf(s: TrendReadingSet): ReadingSet {
  return {
    ...(s.temperatureC != null ? { temperatureC: s.temperatureC } : {}),
    ...(s.windingTemperatureC != null ? { windingTemperatureC: s.windingTemperatureC } : {}),
    ...(s.hoursDeenergised != null ? { hoursDeEnergised: s.hoursDeenergised } : {}),
    ...(s.values ?? {}),
  };
}

const byName = (a: string, b: string) => a.localeCompare(b, 'en');

/** Raw values of one group over the sets (before the change view), and what was left out. */
function rawValues(group: TrendGroupId, sets: readonly TrendReadingSet[], criteria: Criteria, unit: TrendUnit): { raw: Raw[]; notes: string[] } {
  const raw: Raw[] = [];
  const notes: string[] = [];
  const skipped = { noTemperature: 0, outsideTable: 0, noWindingTemperature: 0 };
  for (const s of sets) {
    const v = valuesOf(s);
    const x = Date.parse(s.takenAt);
    const push = (key: string, name: string, value: number | null | undefined) => {
      if (typeof value === 'number' && Number.isFinite(value)) raw.push({ key, name, value, set: s, x });
    };
    switch (group) {
      case 'capacitance':
        for (const [cfg, pf] of Object.entries(v.capacitancePF ?? {})) push(`capacitance.${cfg}`, cfg, pf);
        break;
      case 'powerFactor':
        for (const [cfg, df] of Object.entries(v.dissipationPercent ?? {})) {
          if (v.temperatureC === undefined) {
            skipped.noTemperature++;
            continue;
          }
          const pf = pf20Percent(df, v.temperatureC, criteria);
          if (pf === null) skipped.outsideTable++;
          else push(`powerFactor.${cfg}`, cfg, pf);
        }
        break;
      case 'reactance':
        for (const [phase, entry] of Object.entries(v.reactance ?? {})) push(`reactance.${phase}`, `Phase ${phase}`, reactancePercent(entry, unit));
        break;
      case 'resistance': {
        const rc = criteria.resistance;
        const tk = rc.temperatureConstantC[unit.conductor === 'Al' ? 'Al' : 'Cu'];
        const t = windingTemperature(v, criteria, s.kind === 'post-fault').temperatureC;
        for (const [phase, ohm] of Object.entries(v.windingResistanceOhm ?? {})) {
          if (t === undefined) skipped.noWindingTemperature++;
          else push(`resistance.${phase}`, phase.length <= 2 ? `Phase ${phase}` : phase, correctResistance(ohm, t, rc.referenceTemperatureC, tk));
        }
        break;
      }
      case 'excitation':
        for (const [phase, mA] of Object.entries(v.excitationCurrentMA ?? {})) push(`excitation.${phase}`, `Phase ${phase}`, mA);
        break;
      case 'ratio':
        for (const [phase, r] of Object.entries(v.turnsRatio ?? {})) push(`ratio.${phase}`, `Phase ${phase}`, r);
        break;
      case 'gas':
        for (const g of GAS_KEYS) push(`gas.${g}`, GAS_LABELS[g], v.dissolvedGasPPM?.[g]);
        break;
    }
  }
  const range = `${Math.min(...criteria.powerFactor.temperatureFactors.map((p) => p[0]))}–${Math.max(...criteria.powerFactor.temperatureFactors.map((p) => p[0]))} °C`;
  if (skipped.noTemperature) notes.push(`${skipped.noTemperature} dissipation reading(s) without an insulation temperature left out (cannot correct to 20 °C)`);
  if (skipped.outsideTable) notes.push(`${skipped.outsideTable} dissipation reading(s) taken outside the correction table (${range}) left out`);
  if (skipped.noWindingTemperature) notes.push(`${skipped.noWindingTemperature} resistance reading(s) without a winding or oil temperature left out (cannot correct to ${criteria.resistance.referenceTemperatureC} °C)`);
  return { raw, notes };
}

function valueTitle(group: TrendGroupId, criteria: Criteria): { yTitle: string; unit: string } {
  switch (group) {
    case 'capacitance':
      return { yTitle: 'Capacitance (pF)', unit: 'pF' };
    case 'powerFactor':
      return { yTitle: 'PF at 20 °C (%)', unit: '%' };
    case 'reactance':
      return { yTitle: 'Leakage reactance (%X)', unit: '%' };
    case 'resistance':
      return { yTitle: `Winding resistance at ${criteria.resistance.referenceTemperatureC} °C (Ω)`, unit: 'Ω' };
    case 'excitation':
      return { yTitle: 'Excitation current (mA)', unit: 'mA' };
    case 'ratio':
      return { yTitle: 'Turns ratio (HV:LV)', unit: '' };
    case 'gas':
      return { yTitle: 'Dissolved gas (ppm)', unit: 'ppm' };
  }
}

/** Time of a set for ordering (an unreadable date sorts first). */
const timeOf = (s: TrendReadingSet) => {
  const t = Date.parse(s.takenAt);
  return Number.isNaN(t) ? -Infinity : t;
};

/** The sets oldest first (ties keep the given order), as the engine's merge orders them. */
function ordered(sets: readonly TrendReadingSet[]): TrendReadingSet[] {
  return sets.map((s, i) => ({ s, i })).sort((a, b) => timeOf(a.s) - timeOf(b.s) || a.i - b.i).map((e) => e.s);
}

/**
 * The trends of one quantity group. In the change view every point is 100·(value − baseline)/baseline; a series
 * without a baseline (or with a baseline of zero) is left out and named in the notes.
 */
export function trendGroup(
  group: TrendGroupId,
  sets: readonly TrendReadingSet[],
  unit: TrendUnit,
  criteria: Criteria,
  mode: TrendMode,
): TrendGroup {
  const sorted = ordered(sets);
  const { raw, notes } = rawValues(group, sorted, criteria, unit);
  const keys = [...new Map(raw.map((r) => [r.key, r.name])).entries()].sort((a, b) => (group === 'gas' ? 0 : byName(a[0], b[0])));
  if (group === 'gas') keys.sort((a, b) => GAS_KEYS.indexOf(a[0].slice(4) as never) - GAS_KEYS.indexOf(b[0].slice(4) as never));
  // The newest baseline set with an oil sample gives every gas (one measurement); elsewhere per key.
  const gasBaselineSet = group === 'gas' ? [...sorted].reverse().find((s) => isBaselineSet(s) && s.values?.dissolvedGasPPM && Object.keys(s.values.dissolvedGasPPM).length) : undefined;
  const series: TrendSeries[] = [];
  const noBaseline: string[] = [];
  for (const [key, name] of keys) {
    const rows = raw.filter((r) => r.key === key);
    const base = group === 'gas' ? rows.find((r) => r.set === gasBaselineSet) : [...rows].reverse().find((r) => isBaselineSet(r.set));
    if (mode === 'change' && (!base || base.value === 0)) {
      noBaseline.push(name);
      continue;
    }
    const points = rows.map((r) => ({
      x: r.x,
      y: mode === 'change' ? shiftPercent(r.value, base!.value) : r.value,
      setId: r.set.id,
      takenAt: r.set.takenAt,
      kind: r.set.kind,
      isBaseline: r === base,
    }));
    const bp = points.find((p) => p.isBaseline);
    series.push({ key, name, points, baseline: bp ? { x: bp.x, y: bp.y, setId: bp.setId } : null });
  }
  if (noBaseline.length) notes.push(`No baseline to compare with: ${noBaseline.join(', ')}`);
  const { bands, source } = mode === 'change' ? trendBands(group, criteria, unit) : { bands: [], source: null };
  const titles = mode === 'change' ? { yTitle: CHANGE_Y_TITLE, unit: '%' } : valueTitle(group, criteria);
  return { id: group, label: TREND_GROUP_LABELS[group], ...titles, series, bands, bandsSource: source, notes };
}

/** Fault events as markers on the time axis, oldest first. */
export function eventMarkers(events: readonly TrendEvent[]): EventMarker[] {
  return events
    .map((e) => ({ x: Date.parse(e.occurredAt), eventId: e.id, occurredAt: e.occurredAt, label: `Fault: ${faultTypeWord(e.type)}` }))
    .filter((m) => Number.isFinite(m.x))
    .sort((a, b) => a.x - b.x);
}

export const TREND_GROUPS: readonly TrendGroupId[] = ['capacitance', 'powerFactor', 'reactance', 'resistance', 'excitation', 'ratio', 'gas'];

/** Every quantity group the unit has readings of (groups without a series left out), and the fault markers. */
export function unitTrends(
  input: { unit: TrendUnit; readingSets: readonly TrendReadingSet[]; events: readonly TrendEvent[] },
  criteria: Criteria,
  mode: TrendMode,
): UnitTrends {
  // A group shows when the unit has any reading of it; in the change view it may then hold only its notes.
  const groups = TREND_GROUPS.map((g) => trendGroup(g, input.readingSets, input.unit, criteria, mode)).filter(
    (g) => g.series.length > 0 || g.notes.some((n) => n.startsWith('No baseline')),
  );
  return { mode, xTitle: TREND_X_TITLE, groups, markers: eventMarkers(input.events), criteriaVersion: criteria.version };
}

export interface TrendTableRow {
  setId: number;
  x: number;
  takenAt: string;
  kind: ReadingSetKind;
  /** One cell per series of the group (null: the set has no value of it). */
  cells: (number | null)[];
  /** Names of the series whose baseline this set is. */
  baselineOf: string[];
}

/** The same numbers as a table: one row per reading set that has any value of the group, oldest first. */
export function trendTable(group: TrendGroup): { columns: string[]; rows: TrendTableRow[] } {
  const bySet = new Map<number, TrendTableRow>();
  group.series.forEach((s, i) => {
    for (const p of s.points) {
      let row = bySet.get(p.setId);
      if (!row) {
        row = { setId: p.setId, x: p.x, takenAt: p.takenAt, kind: p.kind, cells: group.series.map(() => null), baselineOf: [] };
        bySet.set(p.setId, row);
      }
      row.cells[i] = p.y;
      if (p.isBaseline) row.baselineOf.push(s.name);
    }
  });
  return { columns: group.series.map((s) => s.name), rows: [...bySet.values()].sort((a, b) => a.x - b.x || a.setId - b.setId) };
}

/**
 * The y range of a group's chart: the data and zero, and in the change view at least one and a half times the first
 * band's start on each side that has bands (so the first band shows even when nothing has reached it), 5 % padding.
 */
export function trendYRange(group: TrendGroup): { min: number; max: number } {
  const ys = group.series.flatMap((s) => s.points.map((p) => p.y));
  let lo = Math.min(...ys, ...(group.bands.length ? [0] : []));
  let hi = Math.max(...ys, ...(group.bands.length ? [0] : []));
  if (!ys.length) [lo, hi] = [0, 1];
  const up = group.bands.filter((b) => b.from !== null && b.from > 0).map((b) => b.from as number);
  const down = group.bands.filter((b) => b.to !== null && b.to < 0).map((b) => b.to as number);
  if (up.length) hi = Math.max(hi, 1.5 * Math.min(...up));
  if (down.length) lo = Math.min(lo, 1.5 * Math.max(...down));
  const pad = hi > lo ? 0.05 * (hi - lo) : Math.abs(hi) * 0.05 || 1;
  return { min: lo - pad, max: hi + pad };
}

/** The band ranges clipped to a y range (open ends closed at the range), dropping those wholly outside it. */
export function clipBands(bands: readonly BandRange[], range: { min: number; max: number }): { level: BandLevel; y: number; y2: number }[] {
  return bands
    .map((b) => ({ level: b.level, y: Math.max(b.from ?? range.min, range.min), y2: Math.min(b.to ?? range.max, range.max) }))
    .filter((b) => b.y2 > b.y);
}

/** The time range of a chart: every point and every fault marker, padded by 3 % (30 days when all fall on one day). */
export function trendXRange(group: TrendGroup, markers: readonly EventMarker[]): { min: number; max: number } | null {
  const xs = [...group.series.flatMap((s) => s.points.map((p) => p.x)), ...markers.map((m) => m.x)];
  if (!xs.length) return null;
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const pad = hi > lo ? 0.03 * (hi - lo) : 30 * 86400000;
  return { min: lo - pad, max: hi + pad };
}

