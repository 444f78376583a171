// Leakage reactance per phase (IEEE 62 / C57.152), its shift (IEC 60076-5 limit), phase spread and three-phase equivalent.
import type { GapsightCase, ReactancePhase, Unit } from '../schemas/case.js';
import type { Indicator, Level } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { describeBands, indicator, levelFromBands } from './levels.js';
import { criteriaV2 } from './criteria-sets.js';
import { baselineOrSisters, IMPLAUSIBLE_NOTE, isImplausible, ownReferenceLabel, shiftIndicator, tapsDiffer, tapText } from './reference.js';

/** Wye-equivalent impedance base in ohms: kV²·1000/kVA. */
export function zBaseOhm(kV: number, kVA: number): number {
  return (kV * kV * 1000) / kVA;
}

export type PerPhaseReactance = { zOhm: number; rOhm: number; xOhm: number; percentX: number };

/** Per-phase test: Z = V/I, R = P/I², X = √(Z² − R²), %X = 100·X/Z_base (IEEE 62-1995). */
export function perPhaseReactance(volts: number, amps: number, watts: number, zBase: number): PerPhaseReactance {
  const zOhm = volts / amps;
  const rOhm = watts / (amps * amps);
  const xOhm = Math.sqrt(Math.max(zOhm * zOhm - rOhm * rOhm, 0));
  return { zOhm, rOhm, xOhm, percentX: (100 * xOhm) / zBase };
}

/** %X of one reactance phase entry; volts/amps use the phase's own zBaseOhm or the unit's HV base. */
export function reactancePercent(phase: ReactancePhase, unit: Pick<Unit, 'hvKV' | 'ratedKVA'>): number {
  if ('percent' in phase && typeof phase.percent === 'number') return phase.percent;
  const p = phase as { volts: number; amps: number; watts?: number; zBaseOhm?: number };
  return perPhaseReactance(p.volts, p.amps, p.watts ?? 0, p.zBaseOhm ?? zBaseOhm(unit.hvKV, unit.ratedKVA)).percentX;
}

/** Whether the entry was given as a measurement (volts/amps) rather than a percent. */
export function isMeasured(phase: ReactancePhase): boolean {
  return !('percent' in phase && typeof phase.percent === 'number');
}

/** Three-phase equivalent %Z = factor·((e12 + e23 + e31)/amps)·(kVA/kV²), factor 1/60 (IEEE 62 / C57.152). */
export function threePhaseEquivalentPercent(
  e12: number,
  e23: number,
  e31: number,
  amps: number,
  ratedKVA: number,
  hvKV: number,
  factor = 1 / 60,
): number {
  return factor * ((e12 + e23 + e31) / amps) * (ratedKVA / (hvKV * hvKV));
}

/** IEC 60076-5 category and reactance limit L (%) for a kVA rating (upper-inclusive bounds). */
export function iecReactanceCategory(ratedKVA: number, criteria: Criteria): { category: string; limitPercent: number } {
  for (const c of criteria.reactance.iecCategories) {
    if (c.maxKVA === null || ratedKVA <= c.maxKVA) return { category: c.category, limitPercent: c.limitPercent };
  }
  const last = criteria.reactance.iecCategories[criteria.reactance.iecCategories.length - 1];
  return { category: last.category, limitPercent: last.limitPercent };
}

/** Spread of per-phase values: 100·(max − min)/mean. */
export function phaseSpreadPercent(values: readonly number[]): number {
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  return (100 * (Math.max(...values) - Math.min(...values))) / mean;
}

export type ReactanceOutcome = { indicators: Indicator[]; unreliable: string[] };


/** Reactance indicators: per-phase %X and shifts, spread change, three-phase equivalent against nameplate. */
export function reactanceIndicators(c: GapsightCase, criteria: Criteria): ReactanceOutcome {
  const out: Indicator[] = [];
  const unreliable: string[] = [];
  const rc = criteria.reactance;
  const digits = criteria.rounding.significantDigits;
  const unit = c.unit;
  const post = c.postFault?.reactance ?? {};
  const { category, limitPercent } = iecReactanceCategory(unit.ratedKVA, criteria);
  const scaled = rc.limitMultipleBands.map((b) => ({ from: b.from * limitPercent, level: b.level }));
  const rule = `${describeBands(scaled, ' %', '|shift|')} (L = ${limitPercent} %, IEC category ${category})`;
  const source = `${rc.iecSource}; ${rc.formulaSource}`;
  const postTap = c.postFault?.tapPosition;
  const baseTap = c.baseline?.tapPosition;
  const prevTap = c.previous?.tapPosition;
  const baseMismatch = tapsDiffer(postTap, baseTap);
  const prevMismatch = tapsDiffer(postTap, prevTap);
  const mismatchNote = (refTap: string | number | undefined, what: string) =>
    `tap mismatch (${what} at tap ${tapText(refTap)}, post-fault at ${tapText(postTap)}): repeat at tap ${tapText(refTap)}; not judged`;

  const postPercent: Record<string, number> = {};
  for (const [phase, entry] of Object.entries(post)) {
    const value = reactancePercent(entry, unit);
    postPercent[phase] = value;
    out.push(indicator(`reactance.${phase}.percent`, value, 'ok', 'reactance', 'post-fault per-phase %X (never compared with nameplate)', rc.formulaSource, { basis: 'state', location: phase }));
    const sisterValues = (c.sisters ?? [])
      .map((s) => s.reactance?.[phase])
      .filter((v): v is ReactancePhase => v !== undefined)
      .map((v) => reactancePercent(v, unit));
    const baseEntry = c.baseline?.reactance?.[phase];
    const ref = baselineOrSisters(baseEntry ? reactancePercent(baseEntry, unit) : undefined, c.baseline?.takenAt, sisterValues, criteria);
    const prevEntry = c.previous?.reactance?.[phase];
    const prevValue = prevEntry ? reactancePercent(prevEntry, unit) : undefined;
    const implausible = [ref?.value, prevValue].some((r) => r !== undefined && isImplausible(value, r, criteria));
    if ((baseMismatch && ref && !ref.fromSisters) || implausible) unreliable.push(`reactance.${phase}`);
    if (ref) {
      const notes: string[] = [];
      if (baseEntry && isMeasured(baseEntry) !== isMeasured(entry)) notes.push('data quality: one side gives volts/amps and the other a percent');
      if (baseMismatch && !ref.fromSisters) notes.push(mismatchNote(baseTap, 'baseline'));
      if (implausible) notes.push(`${IMPLAUSIBLE_NOTE}: not judged`);
      const ind = shiftIndicator({ key: `reactance.${phase}.shiftPercent`, value, reference: ref, bands: scaled, method: 'reactance', rule, source, location: phase, criteria, note: notes.join('; ') || undefined });
      if ((baseMismatch && !ref.fromSisters) || implausible) ind.level = 'ok';
      out.push(ind);
    }
    if (prevEntry && prevValue !== undefined) {
      const notes: string[] = [];
      if (isMeasured(prevEntry) !== isMeasured(entry)) notes.push('data quality: one side gives volts/amps and the other a percent');
      if (prevMismatch) notes.push(mismatchNote(prevTap, 'previous'));
      if (implausible) notes.push(`${IMPLAUSIBLE_NOTE}: not judged`);
      const ind = shiftIndicator({
        key: `reactance.${phase}.shiftFromPreviousPercent`,
        value,
        reference: { value: prevValue, label: ownReferenceLabel('previous', c.previous?.takenAt), fromSisters: false },
        bands: scaled,
        method: 'reactance',
        rule,
        source,
        location: phase,
        criteria,
        note: notes.join('; ') || undefined,
      });
      if (prevMismatch || implausible) ind.level = 'ok';
      out.push(ind);
    }
  }

  const phases = Object.keys(postPercent);
  if (unit.phases === 3 && phases.length >= 2) {
    const postSpread = phaseSpreadPercent(phases.map((p) => postPercent[p]));
    out.push(indicator('reactance.phaseSpreadPercent', postSpread, 'ok', 'reactance', 'informative: an absolute spread is built into three-limb cores', rc.spreadSource, { basis: 'state' }));
    if (unit.phases === 3 && phases.length === 3) {
      const tol = rc.phaseAverageTolerancePercent ?? criteriaV2.reactance.phaseAverageTolerancePercent!;
      const mean = phases.reduce((a, p) => a + postPercent[p], 0) / phases.length;
      for (const p of phases) {
        const dev = (100 * (postPercent[p] - mean)) / mean;
        out.push(
          indicator(`reactance.${p}.deviationFromAveragePercent`, dev, levelFromBands(Math.abs(dev), [{ from: tol, level: 'watch' }], digits), 'reactance', `|deviation from the phases' mean| ≥ ${tol} % → watch (a state: single-phase flux paths differ)`, rc.phaseAverageSource ?? criteriaV2.reactance.phaseAverageSource!, {
            basis: 'state',
            location: p,
            reference: `mean of the three phases (${mean.toFixed(3)} %)`,
          }),
        );
      }
    }
    const base = c.baseline?.reactance;
    if (base && phases.every((p) => base[p] !== undefined)) {
      const baseSpread = phaseSpreadPercent(phases.map((p) => reactancePercent(base[p], unit)));
      const change = postSpread - baseSpread;
      let level: Level = levelFromBands(change, rc.spreadChangeBands, digits);
      let note: string | undefined;
      if (baseMismatch) {
        level = 'ok';
        note = mismatchNote(baseTap, 'baseline');
      }
      out.push(
        indicator('reactance.phaseSpreadChangePoints', change, level, 'reactance', `${describeBands(rc.spreadChangeBands, ' points', 'spread change (signed; a fall is ok)')}`, rc.spreadSource, {
          basis: 'change',
          note,
          reference: ownReferenceLabel('baseline', c.baseline?.takenAt),
        }),
      );
    }
  }

  const tpe = c.postFault?.threePhaseEquivalent;
  if (tpe) {
    const z = threePhaseEquivalentPercent(tpe.e12, tpe.e23, tpe.e31, tpe.amps, unit.ratedKVA, unit.hvKV, rc.threePhaseFactor);
    out.push(indicator('reactance.threePhase.percent', z, 'ok', 'reactance', '%Z = (1/60)·((e12 + e23 + e31)/I)·(kVA/kV²)', rc.formulaSource, { basis: 'state' }));
    const dev = (100 * (z - unit.impedancePercent)) / unit.impedancePercent;
    const level = levelFromBands(Math.abs(dev), [{ from: rc.threePhaseTolerancePercent, level: rc.threePhaseLevel }], digits);
    out.push(
      indicator('reactance.threePhase.deviationFromNameplatePercent', dev, level, 'reactance', `|deviation from nameplate| ≥ ${rc.threePhaseTolerancePercent} % → ${rc.threePhaseLevel}`, rc.threePhaseSource, {
        basis: 'state',
        reference: `nameplate ${unit.impedancePercent} %`,
      }),
    );
  }
  return { indicators: out, unreliable };
}
