// Excitation current per phase: change against baseline at the same test voltage, and the outer-phase pattern.
import type { GapsightCase } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { criteriaV2 } from './criteria-sets.js';
import { describeBands, indicator, levelFromBands, roundSignificant } from './levels.js';
import { ownReferenceLabel, shiftPercent } from './reference.js';

/** Difference of the two outer phases, in percent of the smaller one. */
export function outerPhaseDifferencePercent(a: number, c: number): number {
  return (100 * Math.abs(a - c)) / Math.min(a, c);
}

export const REMANENCE_NOTE = 'all phases moved the same way on a core not demagnetised (residual magnetism likely): demagnetise and repeat; take excitation and sweeps before DC tests';

export type ExcitationOutcome = { indicators: Indicator[]; unreliable: string[] };

/** Excitation indicators: `excitation.<phase>.changePercent`, `excitation.outerPhaseDifferencePercent`. */
export function excitationIndicators(c: GapsightCase, criteria: Criteria): ExcitationOutcome {
  const post = c.postFault?.excitationCurrentMA;
  const out: Indicator[] = [];
  const unreliable: string[] = [];
  if (!post) return { indicators: out, unreliable };
  const ec = criteria.excitation;
  const d = criteria.rounding.significantDigits;
  const base = c.baseline?.excitationCurrentMA;
  const pkv = c.postFault?.excitationKV;
  const bkv = c.baseline?.excitationKV;
  const voltageDiffers = pkv !== undefined && bkv !== undefined && roundSignificant(pkv, d) !== roundSignificant(bkv, d);
  if (base && voltageDiffers) unreliable.push('excitationCurrentMA');
  // Residual magnetism (revision 2): all three phases moved the same way by the remanence threshold or more, and the
  // core was not demagnetised: the core, not the winding, is the likely cause.
  const rem = criteria.remanence ?? criteriaV2.remanence!;
  const changes = ['A', 'B', 'C'].map((p) => (post[p] !== undefined && base?.[p] !== undefined ? shiftPercent(post[p], base[p]) : null));
  const remanence =
    !voltageDiffers &&
    c.unit.phases === 3 &&
    c.postFault?.demagnetised !== true &&
    changes.every((x) => x !== null && roundSignificant(Math.abs(x), d) >= rem.allPhasesChangePercent) &&
    (changes.every((x) => (x as number) > 0) || changes.every((x) => (x as number) < 0));
  if (remanence) unreliable.push('excitationCurrentMA');
  for (const [phase, value] of Object.entries(post)) {
    const b = base?.[phase];
    if (b === undefined) continue;
    const change = shiftPercent(value, b);
    const notJudged = voltageDiffers || remanence;
    out.push(
      indicator(`excitation.${phase}.changePercent`, change, notJudged ? 'ok' : levelFromBands(Math.abs(change), ec.changeBands, d), 'excitation', describeBands(ec.changeBands, ' %', '|change|'), remanence ? `${ec.changeSource}; ${rem.source}` : ec.changeSource, {
        basis: 'change',
        note: voltageDiffers
          ? `test voltage differs (baseline ${bkv} kV, post-fault ${pkv} kV): not judged`
          : remanence
            ? `${REMANENCE_NOTE}; not judged`
            : undefined,
        location: phase,
        reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
      }),
    );
  }
  if (c.unit.phases === 3 && post.A !== undefined && post.C !== undefined) {
    const diff = outerPhaseDifferencePercent(post.A, post.C);
    const limit = Math.max(post.A, post.C) < ec.outerSplitMA ? ec.outerLimitBelowSplitPercent : ec.outerLimitFromSplitPercent;
    const level: Level = remanence ? 'ok' : levelFromBands(diff, [{ from: limit, level: ec.outerLevel }], d);
    out.push(
      indicator('excitation.outerPhaseDifferencePercent', diff, level, 'excitation', `outer phases A and C differ by ≥ ${ec.outerLimitBelowSplitPercent} % (< ${ec.outerSplitMA} mA) or ≥ ${ec.outerLimitFromSplitPercent} % (≥ ${ec.outerSplitMA} mA) → ${ec.outerLevel} (a state)`, ec.outerSource, {
        basis: 'state',
        note: remanence ? 'residual magnetism suspected: pattern not judged' : undefined,
      }),
    );
  }
  return { indicators: out, unreliable };
}
