// Levels: ordering, rounding before comparison, bands with inclusive lower ends, caps.
import type { Basis, Indicator, Level, Method } from '../schemas/result.js';
import type { Band } from './criteria.js';

export const LEVELS: readonly Level[] = ['ok', 'watch', 'investigate', 'critical'];

/** Rank of a level (ok 0 … critical 3). */
export function levelRank(level: Level): number {
  return LEVELS.indexOf(level);
}

/** The stricter of two levels. */
export function maxLevel(a: Level, b: Level): Level {
  return levelRank(a) >= levelRank(b) ? a : b;
}

/** The milder of two levels (used for caps). */
export function capLevel(level: Level, cap: Level): Level {
  return levelRank(level) <= levelRank(cap) ? level : cap;
}

/** One step stricter (critical stays critical). */
export function raiseOneStep(level: Level): Level {
  return LEVELS[Math.min(levelRank(level) + 1, LEVELS.length - 1)];
}

/** Round to `digits` significant digits so that 2.999999999999997 compares as 3. */
export function roundSignificant(value: number, digits: number): number {
  if (!Number.isFinite(value) || value === 0) return value;
  return Number(value.toPrecision(digits));
}

/** Level of a value against ascending bands; each band's lower end is inclusive; below every band → ok. */
export function levelFromBands(value: number, bands: readonly Band[], digits: number): Level {
  const v = roundSignificant(value, digits);
  let level: Level = 'ok';
  for (const band of bands) {
    if (v >= roundSignificant(band.from, digits)) level = maxLevel(level, band.level);
  }
  return level;
}

/** Human text of a band set: "watch ≥ 2, investigate ≥ 3, critical ≥ 5". */
export function describeBands(bands: readonly Band[], unit: string, subject: string): string {
  return `${subject}: ${bands.map((b) => `${b.level} ≥ ${b.from}${unit}`).join(', ')}`;
}

/** Build an indicator; a null value must carry a note. */
export function indicator(
  key: string,
  value: number | string | boolean | null,
  level: Level,
  method: Method,
  rule: string,
  source: string,
  extra: { basis: Basis; note?: string; location?: string; reference?: string; lowConfidence?: boolean },
): Indicator {
  const out: Indicator = { key, value, level, rule, source, method, basis: extra.basis };
  if (value === null && !extra.note) throw new Error(`indicator ${key}: a null value needs a note`);
  if (extra.lowConfidence) out.lowConfidence = true;
  if (extra.note) out.note = extra.note;
  if (extra.location) out.location = extra.location;
  if (extra.reference) out.reference = extra.reference;
  return out;
}

/** Append a sentence to an indicator's note. */
export function addNote(ind: Indicator, text: string): void {
  ind.note = ind.note ? `${ind.note}; ${text}` : text;
}
