// Turns ratio: change against baseline and deviation from nameplate.
import type { GapsightCase, Unit } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, levelFromBands } from './levels.js';
import { ownReferenceLabel, shiftPercent } from './reference.js';

/** Nameplate ratio as a ratio set reports it: `unit.nameplateTurnsRatio`, else hvKV/lvKV. */
export function nameplateRatio(unit: Unit): number {
  return unit.nameplateTurnsRatio ?? unit.hvKV / unit.lvKV;
}

/** Deviation of a measured ratio from nameplate in percent. */
export function ratioDeviationPercent(measured: number, nameplate: number): number {
  return shiftPercent(measured, nameplate);
}

/** Ratio indicators: `ratio.<phase>.changePercent`, `ratio.<phase>.deviationFromNameplatePercent`. */
export function ratioIndicators(c: GapsightCase, criteria: Criteria): Indicator[] {
  const post = c.postFault?.turnsRatio;
  if (!post) return [];
  const rc = criteria.ratio;
  const d = criteria.rounding.significantDigits;
  const np = nameplateRatio(c.unit);
  const out: Indicator[] = [];
  for (const [phase, value] of Object.entries(post)) {
    const b = c.baseline?.turnsRatio?.[phase];
    if (b !== undefined) {
      const change = shiftPercent(value, b);
      out.push(
        indicator(`ratio.${phase}.changePercent`, change, levelFromBands(Math.abs(change), rc.changeBands, d), 'ratio', describeBands(rc.changeBands, ' %', '|change|'), rc.changeSource, {
          location: phase,
          reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
        }),
      );
    }
    const dev = ratioDeviationPercent(value, np);
    out.push(
      indicator(`ratio.${phase}.deviationFromNameplatePercent`, dev, levelFromBands(Math.abs(dev), rc.nameplateBands, d), 'ratio', describeBands(rc.nameplateBands, ' %', '|deviation from nameplate|'), rc.nameplateSource, {
        location: phase,
        reference: `nameplate ratio ${np}`,
      }),
    );
  }
  return out;
}
