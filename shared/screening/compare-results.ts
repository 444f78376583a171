// Two screenings of the same event side by side (e.g. the decisive one and a comparison run under another criteria
// set): each one's recommendation and overall level, the indicators whose level or value differs, each one's reasons.
import type { GapsightResult, Level, Recommendation } from '../schemas/result.js';
import { indicatorLabel } from '../vocabulary.js';

export interface ResultSide {
  recommendation: Recommendation;
  /** The overall level after corroboration; null for a result stored without it. */
  overallLevel: Level | null;
  reasons: string[];
}

/** An indicator judged differently: its level and value on each side (null where that side does not have it). */
export interface IndicatorDifference {
  key: string;
  label: string;
  currentLevel: Level | null;
  otherLevel: Level | null;
  currentValue: number | string | boolean | null;
  otherValue: number | string | boolean | null;
  levelDiffers: boolean;
}

export interface ResultComparison {
  current: ResultSide;
  other: ResultSide;
  sameRecommendation: boolean;
  indicators: IndicatorDifference[];
}

type Comparable = Pick<GapsightResult, 'recommendation' | 'reasons' | 'indicators'> & { overallLevel?: Level };

const side = (r: Comparable): ResultSide => ({ recommendation: r.recommendation, overallLevel: r.overallLevel ?? null, reasons: [...r.reasons] });

/** `current` against `other`: indicators in `current`'s order, then those only `other` has. */
export function compareResults(current: Comparable, other: Comparable): ResultComparison {
  const otherByKey = new Map(other.indicators.map((i) => [i.key, i]));
  const currentKeys = new Set(current.indicators.map((i) => i.key));
  const indicators: IndicatorDifference[] = [];
  for (const c of current.indicators) {
    const o = otherByKey.get(c.key);
    if (o && o.level === c.level && Object.is(o.value, c.value)) continue;
    indicators.push({
      key: c.key,
      label: indicatorLabel(c.key),
      currentLevel: c.level,
      otherLevel: o?.level ?? null,
      currentValue: c.value,
      otherValue: o ? o.value : null,
      levelDiffers: !o || o.level !== c.level,
    });
  }
  for (const o of other.indicators) {
    if (currentKeys.has(o.key)) continue;
    indicators.push({ key: o.key, label: indicatorLabel(o.key), currentLevel: null, otherLevel: o.level, currentValue: null, otherValue: o.value, levelDiffers: true });
  }
  return { current: side(current), other: side(other), sameRecommendation: current.recommendation === other.recommendation, indicators };
}
