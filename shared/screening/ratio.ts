// Turns ratio: change against baseline and deviation from the nameplate ratio expected from the vector group.
import type { GapsightCase, Unit } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, levelFromBands } from './levels.js';
import { IMPLAUSIBLE_NOTE, isRatioImplausible, ownReferenceLabel, shiftPercent, tapsDiffer, tapText } from './reference.js';
import { parseVectorGroup } from './through-fault.js';

export type NameplateRatio = { ratio: number | null; note?: string; how: string };

/**
 * Expected per-phase winding (turns) ratio from the nameplate and the vector group (revision 2): Yy, Dd, auto and
 * single-phase hvKV/lvKV; Yd hvKV/(√3·lvKV); Dy √3·hvKV/lvKV; zigzag or no vector group: no comparison.
 * `unit.nameplateTurnsRatio` overrides.
 */
export function nameplateRatio(unit: Unit): NameplateRatio {
  if (unit.nameplateTurnsRatio !== undefined) return { ratio: unit.nameplateTurnsRatio, how: 'nameplate turns ratio of the unit record' };
  if (unit.phases === 1) return { ratio: unit.hvKV / unit.lvKV, how: 'hvKV/lvKV (single-phase)' };
  const vg = parseVectorGroup(unit.vectorGroup);
  if (!vg || !vg.lv) return { ratio: null, how: '', note: 'no vector group on the unit: no nameplate comparison' };
  if (vg.hv.kind === 'zigzag' || vg.lv.kind === 'zigzag') return { ratio: null, how: '', note: 'zigzag winding: no nameplate comparison' };
  if (vg.hv.kind === vg.lv.kind) return { ratio: unit.hvKV / unit.lvKV, how: `hvKV/lvKV (${unit.vectorGroup})` };
  if (vg.hv.kind === 'wye') return { ratio: unit.hvKV / (Math.sqrt(3) * unit.lvKV), how: `hvKV/(√3·lvKV) (${unit.vectorGroup})` };
  return { ratio: (Math.sqrt(3) * unit.hvKV) / unit.lvKV, how: `√3·hvKV/lvKV (${unit.vectorGroup})` };
}

/** Deviation of a measured ratio from nameplate in percent. */
export function ratioDeviationPercent(measured: number, nameplate: number): number {
  return shiftPercent(measured, nameplate);
}


export type RatioOutcome = { indicators: Indicator[]; unreliable: string[] };

/** Ratio indicators: `ratio.<phase>.changePercent` (change), `ratio.<phase>.deviationFromNameplatePercent` (state). */
export function ratioIndicators(c: GapsightCase, criteria: Criteria): RatioOutcome {
  const post = c.postFault?.turnsRatio;
  const unreliable: string[] = [];
  if (!post) return { indicators: [], unreliable };
  const rc = criteria.ratio;
  const d = criteria.rounding.significantDigits;
  const np = nameplateRatio(c.unit);
  const out: Indicator[] = [];
  const postTap = c.postFault?.tapPosition;
  const baseTap = c.baseline?.tapPosition;
  const mismatch = !!c.baseline?.turnsRatio && tapsDiffer(postTap, baseTap);
  const mismatchNote = `tap mismatch (baseline at tap ${tapText(baseTap)}, post-fault at ${tapText(postTap)}): repeat at tap ${tapText(baseTap)}; not judged`;
  // Plausibility: a ratio more than 10 % off a reference (baseline or the nameplate ratio of the vector group) is a
  // connection or entry error (a line-voltage ratio entered for a Yd unit is √3 off), not a shorted turn.
  const implausible = Object.entries(post).some(([phase, v]) =>
    [c.baseline?.turnsRatio?.[phase], np.ratio].some((ref) => typeof ref === 'number' && isRatioImplausible(v, ref, criteria)),
  );
  if (mismatch || implausible) unreliable.push('turnsRatio');
  const notJudged = [mismatch ? mismatchNote : undefined, implausible ? `${IMPLAUSIBLE_NOTE}: not judged` : undefined].filter(Boolean).join('; ') || undefined;
  for (const [phase, value] of Object.entries(post)) {
    const b = c.baseline?.turnsRatio?.[phase];
    if (b !== undefined) {
      const change = shiftPercent(value, b);
      out.push(
        indicator(`ratio.${phase}.changePercent`, change, notJudged ? 'ok' : levelFromBands(Math.abs(change), rc.changeBands, d), 'ratio', describeBands(rc.changeBands, ' %', '|change|'), rc.changeSource, {
          basis: 'change',
          note: notJudged,
          location: phase,
          reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
        }),
      );
    }
    if (np.ratio === null) {
      out.push(indicator(`ratio.${phase}.deviationFromNameplatePercent`, null, 'ok', 'ratio', describeBands(rc.nameplateBands, ' %', '|deviation from nameplate|'), rc.nameplateSource, { basis: 'state', note: np.note!, location: phase }));
      continue;
    }
    const dev = ratioDeviationPercent(value, np.ratio);
    out.push(
      indicator(`ratio.${phase}.deviationFromNameplatePercent`, dev, notJudged ? 'ok' : levelFromBands(Math.abs(dev), rc.nameplateBands, d), 'ratio', `${describeBands(rc.nameplateBands, ' %', '|deviation from nameplate|')} (a state)`, rc.nameplateSource, {
        basis: 'state',
        note: notJudged,
        location: phase,
        reference: `nameplate ratio ${np.ratio.toPrecision(6)} = ${np.how}`,
      }),
    );
  }
  return { indicators: out, unreliable };
}
