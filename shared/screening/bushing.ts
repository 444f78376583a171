// Bushings (revision 2): C1 shift and C1 power-factor rise per terminal, and whether the HV bushings explain a CH change.
import type { Bushing, GapsightCase } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { criteriaV2 } from './criteria-sets.js';
import { addNote, describeBands, indicator, levelFromBands } from './levels.js';
import { pfRise } from './power-factor.js';
import { ownReferenceLabel, shiftPercent } from './reference.js';

/** Whether a bushing terminal belongs to the HV winding: `winding: "hv"`, else a label starting with `H` or `1`. */
export function isHvBushing(terminal: string, b: Bushing): boolean {
  if (b.winding) return b.winding === 'hv';
  return /^[Hh1]/.test(terminal);
}

/** A terminal's reference reading: the baseline's, else the previous routine test's. */
function referenceOf(c: GapsightCase, terminal: string): { b: Bushing; temperatureC: number | undefined; label: string } | undefined {
  const base = c.baseline?.bushings?.[terminal];
  if (base) return { b: base, temperatureC: c.baseline?.temperatureC, label: ownReferenceLabel('baseline', c.baseline?.takenAt) };
  const prev = c.previous?.bushings?.[terminal];
  if (prev) return { b: prev, temperatureC: c.previous?.temperatureC, label: ownReferenceLabel('previous', c.previous?.takenAt) };
  return undefined;
}

/** Bushing indicators: `bushing.<terminal>.c1ShiftPercent` and `.c1Pf20RisePercent` (method bushing, basis change). */
export function bushingIndicators(c: GapsightCase, criteria: Criteria): Indicator[] {
  const bc = criteria.bushing ?? criteriaV2.bushing!;
  const d = criteria.rounding.significantDigits;
  const out: Indicator[] = [];
  for (const [terminal, post] of Object.entries(c.postFault?.bushings ?? {})) {
    const ref = referenceOf(c, terminal);
    if (!ref) continue;
    const shift = shiftPercent(post.c1PF, ref.b.c1PF);
    out.push(
      indicator(`bushing.${terminal}.c1ShiftPercent`, shift, levelFromBands(Math.abs(shift), bc.c1ShiftBands, d), 'bushing', describeBands(bc.c1ShiftBands, ' %', '|C1 shift|'), bc.c1ShiftSource, {
        basis: 'change',
        location: terminal,
        reference: ref.label,
      }),
    );
    if (post.c1DissipationPercent !== undefined && ref.b.c1DissipationPercent !== undefined) {
      const rise = pfRise(post.c1DissipationPercent, c.postFault?.temperatureC, ref.b.c1DissipationPercent, ref.temperatureC, criteria, { post: 'post-fault set', base: 'reference set' });
      out.push(
        indicator(`bushing.${terminal}.c1Pf20RisePercent`, rise.value, rise.level, 'bushing', `${describeBands(criteria.powerFactor.riseBands, ' %', 'C1 PF20 rise')} (as for windings)`, criteria.powerFactor.riseSource, {
          basis: 'change',
          lowConfidence: rise.lowConfidence,
          note: rise.note,
          location: terminal,
          reference: ref.label,
        }),
      );
    }
  }
  return out;
}

/**
 * When the HV terminals' C1 changes (pF) add up to at least `hvShareOfCH` of the CH change (same direction), the CH
 * indicators say that the change may sit in the bushings (CH includes the HV bushings' C1). Mutates the CH indicators'
 * notes; returns the sentence for the reasons, if any.
 */
export function noteBushingsOnCH(c: GapsightCase, indicators: Indicator[], criteria: Criteria): string | undefined {
  const bc = criteria.bushing ?? criteriaV2.bushing!;
  const postCH = c.postFault?.capacitancePF?.CH;
  const refCH = c.baseline?.capacitancePF?.CH ?? c.previous?.capacitancePF?.CH;
  if (postCH === undefined || refCH === undefined) return undefined;
  let sum = 0;
  let n = 0;
  for (const [terminal, post] of Object.entries(c.postFault?.bushings ?? {})) {
    if (!isHvBushing(terminal, post)) continue;
    const ref = referenceOf(c, terminal);
    if (!ref) continue;
    sum += post.c1PF - ref.b.c1PF;
    n++;
  }
  const deltaCH = postCH - refCH;
  if (n === 0 || deltaCH === 0 || sum / deltaCH < bc.hvShareOfCH) return undefined;
  const text = `the change may sit in the HV bushings: their C1 changed by ${sum.toFixed(1)} pF of the ${deltaCH.toFixed(1)} pF CH change`;
  for (const i of indicators) if (i.key === 'capacitance.CH.shiftPercent' || i.key === 'capacitance.CH.shiftFromPreviousPercent') addNote(i, text);
  return `CH: ${text} (CH includes the HV bushings' C1)`;
}
