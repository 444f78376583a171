// Two results of the same event side by side. Inputs hand built; expected rows hand computed.
import { describe, expect, it } from 'vitest';
import { compareResults } from '../../shared/screening/compare-results.js';
import type { Indicator } from '../../shared/schemas/result.js';

const ind = (key: string, value: number | null, level: Indicator['level']): Indicator =>
  ({ key, value, level, rule: 'r', source: 's', method: 'capacitance', ...(value === null ? { note: 'not measured' } : {}) }) as Indicator;

const current = {
  recommendation: 'conditional' as const,
  overallLevel: 'investigate' as const,
  reasons: ['CHL capacitance shift vs baseline 3.5 % (investigate)'],
  indicators: [ind('capacitance.CHL.shiftPercent', 3.5, 'investigate'), ind('capacitance.CH.shiftPercent', 0.4, 'ok'), ind('capacitance.CL.shiftPercent', 0.2, 'ok')],
};

describe('compareResults', () => {
  it('gives each side and only the indicators that differ (hand computed: CHL investigate → watch)', () => {
    const other = {
      recommendation: 'go' as const,
      overallLevel: 'watch' as const,
      reasons: ['CHL capacitance shift vs baseline 3.5 % (watch)'],
      indicators: [ind('capacitance.CHL.shiftPercent', 3.5, 'watch'), ind('capacitance.CH.shiftPercent', 0.4, 'ok'), ind('capacitance.CL.shiftPercent', 0.2, 'ok')],
    };
    const c = compareResults(current, other);
    expect(c.current).toEqual({ recommendation: 'conditional', overallLevel: 'investigate', reasons: current.reasons });
    expect(c.other).toEqual({ recommendation: 'go', overallLevel: 'watch', reasons: other.reasons });
    expect(c.sameRecommendation).toBe(false);
    expect(c.indicators).toEqual([
      { key: 'capacitance.CHL.shiftPercent', label: 'CHL capacitance shift vs baseline', currentLevel: 'investigate', otherLevel: 'watch', currentValue: 3.5, otherValue: 3.5, levelDiffers: true },
    ]);
  });

  it('keeps an indicator whose value differs at the same level, and those one side lacks', () => {
    const other = {
      recommendation: 'conditional' as const,
      reasons: [],
      indicators: [ind('capacitance.CHL.shiftPercent', 3.5, 'investigate'), ind('capacitance.CH.shiftPercent', 0.5, 'ok'), ind('capacitance.CT.shiftPercent', 1, 'ok')],
    };
    const c = compareResults(current, other);
    expect(c.other.overallLevel).toBeNull();
    expect(c.sameRecommendation).toBe(true);
    expect(c.indicators.map((i) => [i.key, i.currentLevel, i.otherLevel, i.levelDiffers])).toEqual([
      ['capacitance.CH.shiftPercent', 'ok', 'ok', false],
      ['capacitance.CL.shiftPercent', 'ok', null, true],
      ['capacitance.CT.shiftPercent', null, 'ok', true],
    ]);
  });

  it('finds no difference between a result and itself', () => {
    expect(compareResults(current, current).indicators).toEqual([]);
  });
});
