// Capacitance shift per configuration (against baseline, previous, or sisters) and the GST/UST consistency check.
import type { GapsightCase } from '../schemas/case.js';
import type { Indicator } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, roundSignificant } from './levels.js';
import { baselineOrSisters, IMPLAUSIBLE_NOTE, isImplausible, ownReferenceLabel, shiftIndicator, type Reference } from './reference.js';

/** Consistency of a two-winding set: 100·((GST − GST-guard) − UST)/UST (IEEE C57.152 test terms). */
export function capacitanceConsistencyPercent(gstPF: number, gstGuardPF: number, ustPF: number): number {
  return (100 * (gstPF - gstGuardPF - ustPF)) / ustPF;
}

/** Whether a consistency difference makes the configuration unreliable (|difference| ≥ limit, inclusive). */
export function isInconsistent(consistencyPercent: number, criteria: Criteria): boolean {
  const digits = criteria.rounding.significantDigits;
  return roundSignificant(Math.abs(consistencyPercent), digits) >= roundSignificant(criteria.capacitance.consistencyLimitPercent, digits);
}

export type CapacitanceOutcome = { indicators: Indicator[]; unreliable: string[] };

/** Capacitance indicators for every configuration of the post-fault set. */
export function capacitanceIndicators(c: GapsightCase, criteria: Criteria): CapacitanceOutcome {
  const indicators: Indicator[] = [];
  const unreliable: string[] = [];
  const post = c.postFault?.capacitancePF ?? {};
  const cc = criteria.capacitance;
  const rule = describeBands(cc.shiftBands, ' %', '|shift|');
  for (const [cfg, value] of Object.entries(post)) {
    const modes = c.postFault?.capacitanceModes?.[cfg];
    let unreliableNote: string | undefined;
    if (modes) {
      const consistency = capacitanceConsistencyPercent(modes.gstPF, modes.gstGuardPF, modes.ustPF);
      const bad = isInconsistent(consistency, criteria);
      if (bad) {
        unreliable.push(`capacitance.${cfg}`);
        unreliableNote = 'configuration unreliable (GST − GST-guard does not match UST): repeat the test; not judged';
      }
      indicators.push(
        indicator(
          `capacitance.${cfg}.consistencyPercent`,
          consistency,
          'ok',
          'capacitance',
          `|(GST − GST-guard) − UST| ≥ ${cc.consistencyLimitPercent} % → unreliable (repeat the test)`,
          cc.consistencySource,
          { basis: 'state', location: cfg, note: bad ? 'unreliable: repeat the test' : undefined },
        ),
      );
    }
    const sisterValues = (c.sisters ?? []).map((s) => s.capacitancePF?.[cfg]).filter((v): v is number => v !== undefined);
    const baseRef = baselineOrSisters(c.baseline?.capacitancePF?.[cfg], c.baseline?.takenAt, sisterValues, criteria);
    const prevValue = c.previous?.capacitancePF?.[cfg];
    if (!unreliableNote && [baseRef?.value, prevValue].some((r) => r !== undefined && isImplausible(value, r, criteria))) {
      unreliable.push(`capacitance.${cfg}`);
      unreliableNote = `${IMPLAUSIBLE_NOTE}: not judged`;
    }
    // A shift from one reference; an unreliable configuration is shown but not judged.
    const pushShift = (key: string, reference: Reference) => {
      const ind = shiftIndicator({
        key,
        value,
        reference,
        bands: cc.shiftBands,
        method: 'capacitance',
        rule,
        source: cc.shiftSource,
        location: cfg,
        criteria,
        note: unreliableNote,
      });
      if (unreliableNote) ind.level = 'ok';
      indicators.push(ind);
    };
    if (baseRef) pushShift(`capacitance.${cfg}.shiftPercent`, baseRef);
    if (prevValue !== undefined) {
      pushShift(`capacitance.${cfg}.shiftFromPreviousPercent`, {
        value: prevValue,
        label: ownReferenceLabel('previous', c.previous?.takenAt),
        fromSisters: false,
      });
    }
  }
  return { indicators, unreliable };
}

/** Pattern hints from the brief: CL up with CHL down → inner winding inward; CH up with CHL down → outer expanded. */
export function capacitancePatternHints(indicators: readonly Indicator[]): string[] {
  const shift = (cfg: string) => {
    const i = indicators.find((x) => x.key === `capacitance.${cfg}.shiftPercent`);
    return typeof i?.value === 'number' && i.level !== 'ok' ? i.value : undefined;
  };
  const hints: string[] = [];
  const chl = indicators.find((x) => x.key === 'capacitance.CHL.shiftPercent');
  const chlDown = typeof chl?.value === 'number' && chl.value < 0;
  const cl = shift('CL');
  const ch = shift('CH');
  if (chlDown && cl !== undefined && cl > 0) hints.push('CL up with CHL down: pattern of the inner winding buckled inward');
  if (chlDown && ch !== undefined && ch > 0) hints.push('CH up with CHL down: pattern of the outer winding expanded (CH includes the HV bushings\' C1)');
  return hints;
}
