// Input bounds, in one place: the physical range of every quantity the API and the case format take, the longest list of
// each kind, and the span of event and test dates. A value outside is refused with a 400 naming the field, before it can
// reach the engine (1e308 kV) or the database (year 10000, 10 000 configurations). The ranges are wide on purpose: a value
// typed in the wrong unit (nF as pF, mΩ as Ω: ×1000) must still reach the engine's plausibility check, which says so in
// words; only values no instrument can give are refused here. Sources beside each range; shared/README "Input bounds".
import { z } from 'zod';

/** A range of one quantity: `min` inclusive unless `minExclusive`; `max` inclusive. */
export interface QuantityRange {
  min: number;
  minExclusive?: boolean;
  max: number;
  /** Unit as written in the message ("kV", "pF", "%"). */
  unit: string;
  source: string;
}

const COMMON = 'common practice';

/** The range of every bounded quantity (all "common practice" unless said otherwise; the engine has no absolute ranges:
 * its plausibility check compares a reading with its own reference, criteria set `plausibility`). */
export const RANGES = {
  /** System voltage: the highest AC transmission voltages in service are 1 000–1 200 kV. */
  kV: { min: 0, minExclusive: true, max: 1200, unit: 'kV', source: COMMON },
  /** Rated power, kVA: the largest single units are near 2 000 MVA. */
  kVA: { min: 0, minExclusive: true, max: 2_000_000, unit: 'kVA', source: COMMON },
  /** Impedance on the unit's base: a short-circuit impedance cannot exceed 100 %. */
  impedancePercent: { min: 0, minExclusive: true, max: 100, unit: '%', source: COMMON },
  systemImpedancePercent: { min: 0, max: 100, unit: '%', source: COMMON },
  /** Turns ratio (1 200 kV / 0.1 kV = 12 000). */
  ratio: { min: 0, minExclusive: true, max: 20_000, unit: 'ratio', source: COMMON },
  /** Fault current per shot, kA (the largest breakers interrupt 63–80 kA; ×5 for a value given in the wrong side). */
  faultKA: { min: 0, minExclusive: true, max: 500, unit: 'kA', source: COMMON },
  /** Duration of one shot, s: protection clears within seconds; 60 s leaves room for slow back-up stages. */
  shotS: { min: 0, minExclusive: true, max: 60, unit: 's', source: COMMON },
  /** Insulation / oil temperature, °C. */
  temperatureC: { min: -60, max: 150, unit: '°C', source: COMMON },
  /** Winding temperature for the resistance correction, °C (as the readings import: kelvin or °F would be above). */
  windingTemperatureC: { min: -60, max: 250, unit: '°C', source: COMMON },
  /** Hours de-energised before the tests (≈ 11 years). */
  hours: { min: 0, max: 100_000, unit: 'h', source: COMMON },
  /** Capacitance, pF: windings 1–100 nF, bushings 100–1 000 pF; ×/÷1 000 for a value in the wrong unit. */
  capacitancePF: { min: 0, minExclusive: true, max: 1e8, unit: 'pF', source: COMMON },
  /** Dissipation (power) factor at power frequency, %: 100 % is tan δ = 1, no insulation in service. */
  dissipationPercent: { min: 0, max: 100, unit: '%', source: COMMON },
  /** Dissipation factor over frequency, %: at mHz a wet insulation's tan δ exceeds 1 (dielectric frequency response). */
  dissipationSweepPercent: { min: 0, max: 10_000, unit: '%', source: COMMON },
  /** Reactance in % of the unit's impedance base. */
  reactancePercent: { min: 0, minExclusive: true, max: 100, unit: '%', source: COMMON },
  /** Test voltage of a per-phase measurement, V. */
  testVolts: { min: 0, minExclusive: true, max: 1_000_000, unit: 'V', source: COMMON },
  /** Test current of a per-phase measurement, A. */
  testAmps: { min: 0, minExclusive: true, max: 100_000, unit: 'A', source: COMMON },
  testWatts: { min: 0, max: 1e8, unit: 'W', source: COMMON },
  /** Impedance base, Ω (1 200 kV² · 1 000 / 1 kVA = 1.44e9). */
  ohmBase: { min: 0, minExclusive: true, max: 1e10, unit: 'Ω', source: COMMON },
  /** Excitation current, mA (up to 1 000 A). */
  excitationMA: { min: 0, minExclusive: true, max: 1e6, unit: 'mA', source: COMMON },
  /** Winding resistance, Ω (mΩ on LV windings, tens of Ω on HV; ×1 000 for mΩ given as Ω). */
  resistanceOhm: { min: 0, minExclusive: true, max: 1e5, unit: 'Ω', source: COMMON },
  /** Dissolved gas, ppm (µL/L): a million is the whole sample. */
  gasPPM: { min: 0, max: 1e6, unit: 'ppm', source: COMMON },
  /** Frequency of a sweep or DF point, Hz (dielectric response down to 0.1 mHz; FRA up to tens of MHz). */
  frequencyHz: { min: 0, minExclusive: true, max: 1e8, unit: 'Hz', source: COMMON },
  /** Sweep magnitude, dB. */
  magnitudeDb: { min: -200, max: 100, unit: 'dB', source: COMMON },
  /** Sweep phase, degrees (some instruments unwrap it). */
  phaseDeg: { min: -3600, max: 3600, unit: '°', source: COMMON },
  /** A numbered tap position. */
  tapNumber: { min: -1000, max: 1000, unit: 'tap', source: COMMON },
  /** Test frequency of a session, Hz. */
  testFrequencyHz: { min: 0, minExclusive: true, max: 1e6, unit: 'Hz', source: COMMON },
  /** Test voltage of a session, kV. */
  testKV: { min: 0, minExclusive: true, max: 1200, unit: 'kV', source: COMMON },
  humidityPercent: { min: 0, max: 100, unit: '%', source: 'physics: relative humidity' },
} as const satisfies Record<string, QuantityRange>;
export type QuantityName = keyof typeof RANGES;

/** The longest list of each kind a body may carry (common practice; a real unit uses a fraction of each). */
export const LIST_MAX = {
  /** Reclose shots of one fault (a reclosing sequence has at most 4–5). */
  shots: 20,
  /** Capacitance (and dissipation) configurations of one set (a three-winding unit has 6–9). */
  configurations: 50,
  /** Phase-keyed values of one set (A, B, C, and a few spare keys for neutral or other phase labels). */
  phases: 6,
  /** Gases of one sample (seven key gases, O2, N2, C3 gases…). */
  gases: 20,
  /** Bushing terminals of one unit (three windings × four terminals, and spare). */
  bushings: 30,
  /** Points of one dissipation-over-frequency curve. */
  dfPoints: 1000,
  /** Earlier faults of a unit in one case. */
  priorFaults: 1000,
  /** Sister units of a design family in one case. */
  sisters: 5000,
  /** Sweeps of one case (windings × phases × test types, with room). */
  sweeps: 200,
  /** Points of one sweep: the sweep file's cap (shared/imports/sweep-csv.ts SWEEP_MAX_POINTS). */
  sweepPoints: 20_000,
  /** Cooling stages of a design (ONAN/ONAF/OFAF…). */
  coolingStages: 10,
  /** Protections that operated (the list has 7). */
  protections: 20,
  /** Follow-ups proposed with one decision. */
  followUps: 20,
} as const;

/** Longest JSON nesting a request body may have (a case is 5 levels deep; 32 leaves room). */
export const MAX_BODY_DEPTH = 32;

function fmt(n: number): string {
  return Math.abs(n) >= 1e6 || (n !== 0 && Math.abs(n) < 1e-3) ? n.toExponential().replace('e+', 'e') : String(n);
}

/** A finite number within the named quantity's range, with messages that give the bound and the unit. */
export function quantity(name: QuantityName) {
  const r: QuantityRange = RANGES[name];
  const n = z.number({ error: (i) => (i.input === undefined ? 'required' : 'a number') }).finite('a finite number');
  const lower = r.minExclusive
    ? n.gt(r.min, `must be greater than ${fmt(r.min)} ${r.unit}`)
    : n.gte(r.min, `must be ${fmt(r.min)} ${r.unit} or more`);
  return lower.lte(r.max, `must be ${fmt(r.max)} ${r.unit} or less (check the unit)`);
}

/** A list of at most `LIST_MAX[kind]` items. */
export function listOf<T extends z.ZodType>(item: T, kind: keyof typeof LIST_MAX, what: string = kind) {
  const max = LIST_MAX[kind];
  return z.array(item).max(max, `at most ${max} ${what}`);
}

/**
 * A keyed section (configuration, phase, gas or terminal → value): keys of 1 to `maxKey` characters (the stored
 * column's length), at most `LIST_MAX[kind]` keys.
 */
export function keyedBy<T extends z.ZodType>(values: T, maxKey: number, kind: keyof typeof LIST_MAX, what: string) {
  const max = LIST_MAX[kind];
  return z
    .record(z.string().min(1).max(maxKey), values, {
      error: (issue) => (issue.code === 'invalid_key' ? `a ${what} label of 1 to ${maxKey} characters` : undefined),
    })
    .refine((r) => Object.keys(r).length <= max, { message: `at most ${max} ${kind}` });
}

/** Earliest event or test date taken. */
export const EARLIEST_DATE = '1900-01-01';
const EARLIEST_MS = Date.UTC(1900, 0, 1);
const DAY_MS = 86_400_000;

/** ISO 8601 date or date-time (a zone or none; seconds and fractions optional). */
const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,9})?)?(?:Z|[+-]\d{2}:?\d{2})?)?$/;

export type DateProblem = 'format' | 'not-real' | 'too-early' | 'too-late';

/**
 * Why a date text is not an event or test date between 1900-01-01 and `latestMs` (null when it is one): not ISO 8601,
 * not a real calendar date (2026-02-30), before 1900, or after the latest allowed instant.
 */
export function dateProblem(text: string, latestMs: number): DateProblem | null {
  const m = ISO.exec(text.trim());
  if (!m) return 'format';
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  // setUTCFullYear, not Date.UTC: Date.UTC reads years 0–99 as 1900–1999.
  const day = new Date(Date.UTC(2000, mo - 1, d));
  day.setUTCFullYear(y, mo - 1, d);
  if (day.getUTCFullYear() !== y || day.getUTCMonth() !== mo - 1 || day.getUTCDate() !== d) return 'not-real';
  if (m[4] !== undefined && (Number(m[4]) > 23 || Number(m[5]) > 59 || Number(m[6] ?? 0) > 59)) return 'not-real';
  const t = Date.parse(text.trim().replace(' ', 'T'));
  if (Number.isNaN(t)) return 'format';
  if (t < EARLIEST_MS - 14 * 3600_000) return 'too-early';
  if (t > latestMs) return 'too-late';
  return null;
}

/** How far after "now" a date may be: one day for events and tests (clock skew, time zones); planned dates further. */
export interface DateRangeOptions {
  /** The caller's now (ms); default `Date.now()` when the schema is checked. */
  now?: () => number;
  /** Days after now still allowed (default 1). */
  daysAhead?: number;
  /** Words for the kind of date in the "too late" message (default "a day after now"). */
  aheadWords?: string;
  /** Message for a text that is no ISO 8601 date (default "not an ISO 8601 date or date-time"). */
  formatMessage?: string;
}

/**
 * An ISO 8601 date or date-time of an event or a test, between 1900-01-01 and a day after now (the upper bound reads
 * `Date.now()` when the schema runs unless the caller passes its clock; the schema is used on the client too).
 */
export function dateInRange(opts: DateRangeOptions = {}) {
  const days = opts.daysAhead ?? 1;
  const ahead = opts.aheadWords ?? (days === 1 ? 'a day after now' : `${days} days after now`);
  return z
    .string({ error: (i) => (i.input === undefined ? 'required' : 'an ISO 8601 date or date-time as text') })
    .min(1, 'required')
    .max(40, opts.formatMessage ?? 'not an ISO 8601 date or date-time')
    .superRefine((s, ctx) => {
      const latest = (opts.now ? opts.now() : Date.now()) + days * DAY_MS;
      const p = dateProblem(s, latest);
      if (!p) return;
      const message =
        p === 'format'
          ? (opts.formatMessage ?? 'not an ISO 8601 date or date-time')
          : p === 'not-real'
            ? `not a real date or time (${s.slice(0, 25)})`
            : p === 'too-early'
              ? `before ${EARLIEST_DATE}: check the year`
              : `later than ${ahead}: check the year`;
      ctx.addIssue({ code: 'custom', message });
    });
}

/** A planned date (a follow-up's due date): a real ISO date between 1900 and 100 years after now. */
export const plannedDate = () => dateInRange({ daysAhead: 36_525, aheadWords: '100 years after now' });

/** Field path → message of an `unrecognized_keys` issue: one entry per unknown key ("readingSets.0.foo: unknown field"). */
export const UNKNOWN_FIELD = 'unknown field';

/**
 * Zod issues as dotted field paths and messages, with one entry per unknown key (a strict object's `unrecognized_keys`
 * issue names the object; the path here names the key).
 */
export function issueEntries(issues: readonly z.core.$ZodIssue[], base: string[] = []): { path: string[]; message: string }[] {
  const out: { path: string[]; message: string }[] = [];
  for (const issue of issues) {
    const path = [...base, ...issue.path.map((p) => String(p))];
    if (issue.code === 'unrecognized_keys') for (const key of issue.keys.slice(0, 20)) out.push({ path: [...path, key], message: UNKNOWN_FIELD });
    else if (issue.code === 'invalid_union' && issue.errors.length) out.push(...issueEntries(closestBranch(issue.errors), path));
    else out.push({ path, message: issue.message });
  }
  return out;
}

/**
 * The issues of the union branch the value was closest to (a reactance phase `{ "percent": "11.6" }` is a percent with
 * a bad number, not a volts/amps measurement missing both): the fewest issues, unknown keys and missing fields counting
 * against a branch, so the message names the field itself ("reactance.A.percent") rather than "reactance.A".
 */
function closestBranch(branches: readonly (readonly z.core.$ZodIssue[])[]): readonly z.core.$ZodIssue[] {
  const cost = (b: readonly z.core.$ZodIssue[]) =>
    b.reduce((n, i) => n + (i.code === 'unrecognized_keys' ? 10 * i.keys.length : i.code === 'invalid_type' && i.input === undefined ? 5 : 1), 0);
  return branches.reduce((best, b) => (cost(b) < cost(best) ? b : best));
}

/** The depth of a parsed JSON value (a scalar 0, `{}` 1, `{"a":{}}` 2), counted without recursion; stops past `limit`. */
export function jsonDepth(value: unknown, limit: number): number {
  let max = 0;
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length) {
    const [v, d] = stack.pop()!;
    if (v === null || typeof v !== 'object') continue;
    const depth = d + 1;
    if (depth > max) max = depth;
    if (max > limit) return max;
    for (const x of Array.isArray(v) ? v : Object.values(v)) if (x !== null && typeof x === 'object') stack.push([x, depth]);
  }
  return max;
}
