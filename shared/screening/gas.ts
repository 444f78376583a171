// Dissolved gases: acetylene and hydrogen rise against the pre-fault sample, and the Duval triangle 1 zone.
import type { DissolvedGas, GapsightCase } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, levelFromBands, roundSignificant } from './levels.js';

export type DuvalZone = 'PD' | 'D1' | 'D2' | 'T1' | 'T2' | 'T3' | 'DT';

/** Duval triangle 1 zone from CH4, C2H4, C2H2 in ppm (relative percentages of their sum); null when the sum is 0. */
export function duvalTriangle1Zone(ch4: number, c2h4: number, c2h2: number, criteria: Criteria): DuvalZone | null {
  const sum = ch4 + c2h4 + c2h2;
  if (!(sum > 0)) return null;
  const d = criteria.rounding.significantDigits;
  const z = criteria.gas.duval;
  const m = roundSignificant((100 * ch4) / sum, d);
  const e = roundSignificant((100 * c2h4) / sum, d);
  const a = roundSignificant((100 * c2h2) / sum, d);
  if (m >= z.pdMinCH4) return 'PD';
  if (e < z.d1MaxC2H4 && a > z.d1MinC2H2) return 'D1';
  if ((a > z.d2MinC2H2 && e >= z.d2MinC2H4 && e <= z.d2MaxC2H4) || (a > z.d2HighMinC2H2 && e > z.d2HighMinC2H4)) return 'D2';
  if (a < z.t1MaxC2H2 && e < z.t1MaxC2H4) return 'T1';
  if (a < z.t2MaxC2H2 && e >= z.t1MaxC2H4 && e < z.t2MaxC2H4) return 'T2';
  if (a < z.t3MaxC2H2 && e >= z.t3MinC2H4) return 'T3';
  return 'DT';
}

/** The pre-fault sample: `previous`, else `baseline`. */
export function preFaultGas(c: GapsightCase): { gas: DissolvedGas; label: string } | undefined {
  if (c.previous?.dissolvedGasPPM) return { gas: c.previous.dissolvedGasPPM, label: `${c.previous.takenAt ?? 'previous'} pre-fault sample` };
  if (c.baseline?.dissolvedGasPPM) return { gas: c.baseline.dissolvedGasPPM, label: `${c.baseline.takenAt ?? 'baseline'} pre-fault sample` };
  return undefined;
}

/** Gas indicators: `gas.C2H2.risePPM`, `gas.H2.risePPM`, `gas.duvalZone`. */
export function gasIndicators(c: GapsightCase, criteria: Criteria): Indicator[] {
  const post = c.postFault?.dissolvedGasPPM;
  if (!post) return [];
  const gc = criteria.gas;
  const d = criteria.rounding.significantDigits;
  const pre = preFaultGas(c);
  const out: Indicator[] = [];
  const noPre = 'no pre-fault sample (previous or baseline) to compare with';
  if (post.C2H2 !== undefined) {
    const rise = pre ? post.C2H2 - (pre.gas.C2H2 ?? 0) : null;
    out.push(
      indicator('gas.C2H2.risePPM', rise, rise === null ? 'ok' : levelFromBands(rise, gc.acetyleneRiseBands, d), 'gas', describeBands(gc.acetyleneRiseBands, ' ppm', 'acetylene rise'), gc.source, {
        basis: 'change',
        note: rise === null ? noPre : undefined,
        reference: pre?.label,
      }),
    );
  }
  if (post.H2 !== undefined) {
    const rise = pre ? post.H2 - (pre.gas.H2 ?? 0) : null;
    const acetylenePresent = post.C2H2 !== undefined && post.C2H2 > gc.acetylenePresentPPM;
    let level: Level = 'ok';
    if (rise !== null && acetylenePresent && roundSignificant(rise, d) >= gc.hydrogenRiseWithAcetylenePPM) level = gc.hydrogenWithAcetyleneLevel;
    out.push(
      indicator('gas.H2.risePPM', rise, level, 'gas', `hydrogen rise ≥ ${gc.hydrogenRiseWithAcetylenePPM} ppm with acetylene present → ${gc.hydrogenWithAcetyleneLevel}`, gc.source, {
        basis: 'change',
        note: rise === null ? noPre : undefined,
        reference: pre?.label,
      }),
    );
  }
  if (post.CH4 !== undefined || post.C2H4 !== undefined || post.C2H2 !== undefined) {
    const zone = duvalTriangle1Zone(post.CH4 ?? 0, post.C2H4 ?? 0, post.C2H2 ?? 0, criteria);
    out.push(
      indicator('gas.duvalZone', zone, 'ok', 'gas', 'informative: Duval triangle 1 zone of the post-fault sample', gc.duvalSource, {
        basis: 'state',
        note: zone === null ? 'CH4 + C2H4 + C2H2 is zero' : undefined,
      }),
    );
  }
  return out;
}
