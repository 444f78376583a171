// A strip plot of a design family on one quantity: one point per unit (one row per unit in serial order, the value
// across),
// the unit being looked at highlighted, the family's median as a line and the band inside which |M| < limit, in value
// terms: |M| = constant·|x − median|/MAD < limit  ⇔  |x − median| < limit·MAD/constant (drawn only when MAD > 0).
// Pure: no DOM, no chart library; the chart component only renders this.

export interface StripUnit {
  serial: string;
  value: number;
  outlier: boolean;
  isThisUnit?: boolean;
}

export interface StripInput {
  /** The quantity in words and its unit: "CHL capacitance", "pF". */
  label: string;
  unit: string;
  median: number | null;
  mad: number | null;
  constant: number;
  limit: number;
  items: readonly StripUnit[];
}

export type StripGroup = 'family' | 'outlier' | 'this-unit';

export interface StripPoint {
  /** 1-based position of the unit in serial order (its row). */
  position: number;
  value: number;
  serial: string;
  group: StripGroup;
}

export interface StripSeries {
  group: StripGroup;
  name: string;
  /** Marker shape, so the groups differ by more than colour. */
  shape: 'circle' | 'triangle' | 'square';
  data: { position: number; value: number; serial: string }[];
}

export interface SisterStrip {
  points: StripPoint[];
  /** Only the groups that have points: family units, outliers, this unit. */
  series: StripSeries[];
  /** Serials in position order (position = index + 1). */
  categories: string[];
  median: number | null;
  /** median ± limit·MAD/constant; null when MAD is 0 or unknown. */
  band: { low: number; high: number } | null;
  /** The value range that holds every point and the band, padded by 5 % of its span (or 1 % of |median| when flat). */
  valueMin: number;
  valueMax: number;
  /** Axis titles: the units' axis and the value's axis (with its unit). */
  unitsTitle: string;
  valueTitle: string;
}

const GROUPS: { group: StripGroup; name: string; shape: StripSeries['shape'] }[] = [
  { group: 'family', name: 'Units of the family', shape: 'circle' },
  { group: 'outlier', name: 'Outliers (|M| at or above the limit)', shape: 'triangle' },
  { group: 'this-unit', name: 'This unit', shape: 'square' },
];

/** The strip plot of a family: points, series by group, median, band, axis range and titles with units. */
export function sisterStrip(input: StripInput): SisterStrip {
  const ordered = [...input.items].sort((a, b) => a.serial.localeCompare(b.serial));
  const points: StripPoint[] = ordered.map((u, i) => ({
    position: i + 1,
    value: u.value,
    serial: u.serial,
    group: u.isThisUnit ? 'this-unit' : u.outlier ? 'outlier' : 'family',
  }));
  const half = input.median !== null && input.mad !== null && input.mad > 0 ? (input.limit * input.mad) / input.constant : null;
  const band = half !== null && input.median !== null ? { low: input.median - half, high: input.median + half } : null;
  const ys = [...points.map((p) => p.value), ...(band ? [band.low, band.high] : []), ...(input.median !== null ? [input.median] : [])];
  const lo = ys.length ? Math.min(...ys) : 0;
  const hi = ys.length ? Math.max(...ys) : 1;
  const span = hi - lo;
  const pad = span > 0 ? 0.05 * span : Math.abs(input.median ?? lo) * 0.01 || 1;
  return {
    points,
    series: GROUPS.map((g) => ({ ...g, data: points.filter((p) => p.group === g.group).map((p) => ({ position: p.position, value: p.value, serial: p.serial })) })).filter((s) => s.data.length),
    categories: points.map((p) => p.serial),
    median: input.median,
    band,
    valueMin: lo - pad,
    valueMax: hi + pad,
    unitsTitle: 'Unit of the family (by serial)',
    valueTitle: `${input.label} (${input.unit})`,
  };
}
