// Through-fault duty (IEEE C57.12.00 categories, IEEE C57.109 curves) and the Gapsight cumulative I²t tally.
import type { CurrentIs, Fault, FaultType, PriorFault, Shot, Unit } from '../schemas/case.js';
import type { IeeeCategory, Indicator, ThroughFault } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { criteriaV1 } from './criteria-sets.js';
import { indicator, roundSignificant } from './levels.js';

/** IEEE C57.12.00 category by kVA and phases (upper-inclusive bounds; below the lowest bound counts as I). */
export function ieeeCategory(ratedKVA: number, phases: 1 | 3, criteria: Criteria = criteriaV1): IeeeCategory {
  const table = phases === 1 ? criteria.throughFault.categoriesSinglePhase : criteria.throughFault.categoriesThreePhase;
  for (const row of table) if (row.maxKVA === null || ratedKVA <= row.maxKVA) return row.category;
  return table[table.length - 1].category;
}

/** Rated line current of a side in amperes: kVA/(√3·kV) for three-phase units, kVA/kV for single-phase units. */
export function ratedCurrentA(ratedKVA: number, kV: number, phases: 1 | 3): number {
  return phases === 3 ? ratedKVA / (Math.sqrt(3) * kV) : ratedKVA / kV;
}

/** Largest symmetrical through-fault current in per unit: 100/Z% (I, II), 100/(Z% + Zs%) (III, IV); category I capped. */
export function maxCurrentPerUnit(unit: Unit, category: IeeeCategory, criteria: Criteria = criteriaV1): number {
  const tf = criteria.throughFault;
  const z = tf.systemImpedanceCategories.includes(category)
    ? unit.impedancePercent + (unit.systemImpedancePercent ?? 0)
    : unit.impedancePercent;
  const max = 100 / z;
  return category === 'I' ? Math.min(max, tf.categoryIMaxPerUnit) : max;
}

/** Mechanical-segment constant K = 2·I_sc² (categories II–IV) or 1250 (category I). */
export function mechanicalLimitI2t(maxPerUnit: number, category: IeeeCategory, criteria: Criteria = criteriaV1): number {
  const tf = criteria.throughFault;
  return category === 'I' ? tf.categoryIMechanicalI2t : tf.mechanicalFactor * maxPerUnit * maxPerUnit;
}

/** Start of the mechanical segment in per unit: 0.7·I_sc (II), 0.5·I_sc (III, IV), I_sc for category I (no segment). */
export function segmentStartPerUnit(maxPerUnit: number, category: IeeeCategory, criteria: Criteria = criteriaV1): number {
  if (category === 'I') return maxPerUnit;
  return criteria.throughFault.segmentStartFraction[category] * maxPerUnit;
}

/** Allowed time (s) on the thermal curve at a current (per unit), log–log interpolation; above the top point I²t is
 * held at the top point's value; below the lowest point there is no through-fault limit (Infinity). */
export function thermalCurveTimeS(currentPerUnit: number, criteria: Criteria = criteriaV1): number {
  const pts = [...criteria.throughFault.thermalCurve].sort((a, b) => a[0] - b[0]);
  const [iLow] = pts[0];
  const [iTop, tTop] = pts[pts.length - 1];
  if (currentPerUnit < iLow) return Infinity;
  if (currentPerUnit >= iTop) return (iTop * iTop * tTop) / (currentPerUnit * currentPerUnit);
  for (let k = 0; k < pts.length - 1; k++) {
    const [i0, t0] = pts[k];
    const [i1, t1] = pts[k + 1];
    if (currentPerUnit >= i0 && currentPerUnit <= i1) {
      const f = (Math.log10(currentPerUnit) - Math.log10(i0)) / (Math.log10(i1) - Math.log10(i0));
      return 10 ** (Math.log10(t0) + f * (Math.log10(t1) - Math.log10(t0)));
    }
  }
  return Infinity;
}

/** Whether a per-unit current is above the design maximum (compared after rounding, as every threshold). */
export function aboveDesignMaximum(perUnit: number, maxPerUnit: number, criteria: Criteria = criteriaV1): boolean {
  const d = criteria.rounding.significantDigits;
  return roundSignificant(perUnit, d) > roundSignificant(maxPerUnit, d);
}

/** Allowed time (s) on the mechanical segment: K/I². */
export function mechanicalTimeS(currentPerUnit: number, k: number): number {
  return k / (currentPerUnit * currentPerUnit);
}

export type Connection = { kind: 'wye' | 'delta' | 'zigzag'; grounded: boolean; auto: boolean };
export type VectorGroupParts = { hv: Connection; lv: Connection | null };

/**
 * The HV and LV connections of a vector group: the leading capitals (`D`, `Y`/`YN`, `Z`/`ZN`) are the HV winding, the
 * small letters after them the LV winding (`a` = auto, treated as wye–wye). Null when it cannot be read.
 */
export function parseVectorGroup(vectorGroup: string | undefined | null): VectorGroupParts | null {
  if (!vectorGroup) return null;
  const m = /^\s*(YN|Y|D|ZN|Z)\s*(yn|y|d|zn|z|an|a)?/.exec(vectorGroup.trim());
  if (!m) return null;
  const conn = (code: string): Connection => {
    const c = code.toLowerCase();
    if (c.startsWith('a')) return { kind: 'wye', grounded: c.endsWith('n'), auto: true };
    return { kind: c.startsWith('d') ? 'delta' : c.startsWith('z') ? 'zigzag' : 'wye', grounded: c.length > 1 && c.endsWith('n'), auto: false };
  };
  const hv = conn(m[1]);
  const lv = m[2] ? conn(m[2]) : null;
  // An auto-transformer's common winding is grounded when its HV neutral is.
  if (lv?.auto && hv.grounded) lv.grounded = true;
  return { hv, lv };
}

export type CurrentBasis = 'winding' | 'line-converted' | 'line-assumed';
export type WindingCurrent = { factor: number | null; basis: CurrentBasis; reason?: string };

type FaultLike = { type: FaultType; side: 'hv' | 'lv'; location?: 'hv' | 'lv'; currentIs?: CurrentIs };

const SQRT3 = Math.sqrt(3);

/**
 * Winding-current factor k (winding per-unit = k × line per-unit) of a fault: the table of the case format, "Winding
 * current" (IEEE C37.91 / C57.109 practice; delta relations). `factor` null = unknown: the line current is used as it is.
 */
export function windingCurrentFactor(unit: Pick<Unit, 'phases' | 'vectorGroup'>, fault: FaultLike): WindingCurrent {
  const vg = parseVectorGroup(unit.vectorGroup);
  if (fault.currentIs === 'winding') {
    // A delta winding's rated current is the rated line current over √3: its per-unit current is √3 × I/I_line-rated
    // (a deliberate reading of the contract's "factor 1", which holds for wye and single-phase windings).
    const delta = unit.phases === 3 && (fault.side === 'hv' ? vg?.hv : vg?.lv)?.kind === 'delta';
    return { factor: delta ? SQRT3 : 1, basis: 'winding' };
  }
  if (unit.phases === 1) return { factor: 1, basis: 'line-converted' };
  if (fault.type === 'three-phase') return { factor: 1, basis: 'line-converted' };
  const assumed = (why: string): WindingCurrent => ({
    factor: null,
    basis: 'line-assumed',
    reason: `${why}: the line current is used as the winding current — enter the winding current or attach the relay record`,
  });
  if (!vg || !vg.lv) return assumed('no vector group on the unit, so the winding current cannot be derived');
  if (vg.hv.kind === 'zigzag' || vg.lv.kind === 'zigzag') return assumed('zigzag winding: the winding current cannot be derived from the line current');
  const measured = fault.side === 'hv' ? vg.hv : vg.lv;
  const location = fault.location ?? fault.side;
  const faulted = location === 'hv' ? vg.hv : vg.lv;
  const sameSide = location === fault.side;
  if (fault.type === 'phase-to-phase' || fault.type === 'phase-to-phase-to-ground') {
    if (sameSide) return { factor: measured.kind === 'delta' ? 2 / SQRT3 : 1, basis: 'line-converted' };
    if (measured.kind === 'delta' && faulted.kind === 'wye') return { factor: SQRT3 / 2, basis: 'line-converted' };
    return { factor: 1, basis: 'line-converted' };
  }
  // phase-to-ground
  if (sameSide) {
    if (measured.kind === 'wye') return { factor: 1, basis: 'line-converted' };
    return assumed('ground fault measured at delta terminals: the winding current is not fixed by the line current');
  }
  if (measured.kind === 'delta' && faulted.kind === 'wye' && faulted.grounded) return { factor: SQRT3, basis: 'line-converted' };
  if (measured.kind === 'wye') return { factor: 1, basis: 'line-converted' };
  return assumed('ground fault on an ungrounded or delta side, measured on the other side');
}

/**
 * Rated current (A) of the winding on a side: the rated line current, over √3 for a delta winding of a three-phase unit
 * (its phase current is the line current over √3).
 */
export function ratedWindingCurrentA(unit: Pick<Unit, 'phases' | 'ratedKVA' | 'hvKV' | 'lvKV' | 'vectorGroup'>, side: 'hv' | 'lv'): number {
  const line = ratedCurrentA(unit.ratedKVA, side === 'hv' ? unit.hvKV : unit.lvKV, unit.phases);
  if (unit.phases !== 3) return line;
  const vg = parseVectorGroup(unit.vectorGroup);
  return (side === 'hv' ? vg?.hv : vg?.lv)?.kind === 'delta' ? line / SQRT3 : line;
}

/** Line per-unit currents of a fault's shots (each fault on its own measured side). */
export function linePerUnit(unit: Unit, fault: { side: 'hv' | 'lv'; shots: readonly Shot[] }): number[] {
  const kV = fault.side === 'hv' ? unit.hvKV : unit.lvKV;
  const base = ratedCurrentA(unit.ratedKVA, kV, unit.phases);
  return fault.shots.map((s) => (s.currentKA * 1000) / base);
}

/** Winding per-unit currents of a fault's shots: k × line per-unit (k = 1 when unknown, line-assumed). */
export function shotsPerUnit(unit: Unit, fault: FaultLike & { shots: readonly Shot[] }): number[] {
  const k = windingCurrentFactor(unit, fault).factor ?? 1;
  return linePerUnit(unit, fault).map((x) => x * k);
}

/** I²t of a fault: Σ over its shots of (winding per-unit current)²·duration. */
export function faultI2t(unit: Unit, fault: FaultLike & { shots: readonly Shot[] }): number {
  const pu = shotsPerUnit(unit, fault);
  return fault.shots.reduce((sum, s, k) => sum + pu[k] * pu[k] * s.durationS, 0);
}

/** The `throughFault` block of a result: null when there is no fault or it has no shots. */
export function computeThroughFault(
  unit: Unit,
  fault: Fault | undefined | null,
  priorFaults: readonly PriorFault[] = [],
  criteria: Criteria = criteriaV1,
): ThroughFault | null {
  if (!fault || fault.shots.length === 0) return null;
  const digits = criteria.rounding.significantDigits;
  const category = ieeeCategory(unit.ratedKVA, unit.phases, criteria);
  const kV = fault.side === 'hv' ? unit.hvKV : unit.lvKV;
  const rated = ratedCurrentA(unit.ratedKVA, kV, unit.phases);
  const pu = shotsPerUnit(unit, fault);
  const currentPerUnit = Math.max(...pu);
  const maxPu = maxCurrentPerUnit(unit, category, criteria);
  const segment = segmentStartPerUnit(maxPu, category, criteria);
  const mech = mechanicalLimitI2t(maxPu, category, criteria);
  const winding = windingCurrentFactor(unit, fault);
  const i2t = faultI2t(unit, fault);
  const highDuty = roundSignificant(currentPerUnit, digits) >= roundSignificant(segment, digits);
  const totalDurationS = fault.shots.reduce((s, x) => s + x.durationS, 0);
  const beyondCurve = highDuty
    ? roundSignificant(i2t, digits) > roundSignificant(mech, digits)
    : roundSignificant(totalDurationS, digits) > roundSignificant(thermalCurveTimeS(currentPerUnit, criteria), digits);
  const priorI2t = priorFaults.reduce((s, f) => s + faultI2t(unit, f), 0);
  const cumulativeI2t = i2t + priorI2t;
  const allPu = [...pu, ...priorFaults.flatMap((f) => shotsPerUnit(unit, f))];
  const shotsAboveSegment = allPu.filter((x) => roundSignificant(x, digits) >= roundSignificant(segment, digits)).length;
  return {
    category,
    ratedCurrentA: rated,
    currentPerUnit,
    maxCurrentPerUnit: maxPu,
    forceRatioPercent: 100 * (currentPerUnit / maxPu) ** 2,
    segmentStartPerUnit: segment,
    highDuty,
    i2t,
    thermalLimitI2t: criteria.throughFault.thermalLimitI2t,
    mechanicalLimitI2t: mech,
    eventDutyPercent: (100 * i2t) / mech,
    beyondCurve,
    cumulativeI2t,
    cumulativeDutyPercent: (100 * cumulativeI2t) / mech,
    shotsAboveSegment,
    windingCurrentFactor: winding.factor,
    currentBasis: winding.basis,
    thermalDurationPercent: highDuty ? null : (100 * totalDurationS) / thermalCurveTimeS(currentPerUnit, criteria),
  };
}

/** Whether the frequent-fault count of the category is exceeded (categories II and III; IV has no count rule). */
export function frequentFaultExceeded(tf: ThroughFault, criteria: Criteria = criteriaV1): boolean {
  if (tf.category === 'I') return false;
  const limit = criteria.throughFault.frequentFaultCounts[tf.category];
  return limit !== null && tf.shotsAboveSegment > limit;
}

/** Duty indicators (method `duty`, basis `duty`: they frame other evidence and never count for corroboration). */
export function dutyIndicators(tf: ThroughFault | null, criteria: Criteria = criteriaV1): Indicator[] {
  if (!tf) return [];
  const c = criteria.throughFault;
  const out: Indicator[] = [];
  const duty = { basis: 'duty' as const };
  // The beyond-curve level sits on the event's I²t for a high-duty event, on the time against the thermal curve otherwise.
  out.push(
    indicator(
      'duty.eventDutyPercent',
      tf.eventDutyPercent,
      tf.beyondCurve && tf.highDuty ? c.beyondCurveLevel : 'ok',
      'duty',
      tf.highDuty ? `beyond the mechanical segment (I²t of the event's shots > K) → ${c.beyondCurveLevel}` : 'informative for a thermal-region event (judged on its duration: duty.thermalDurationPercent)',
      c.curveSource,
      { ...duty, note: tf.beyondCurve && tf.highDuty ? 'the fault lasted longer than the curve allows' : undefined },
    ),
  );
  if (!tf.highDuty) {
    const pct = tf.thermalDurationPercent ?? null;
    out.push(
      indicator(
        'duty.thermalDurationPercent',
        pct,
        tf.beyondCurve ? c.beyondCurveLevel : 'ok',
        'duty',
        `total duration of the shots > the thermal curve's time at the largest shot's current (> 100 %) → ${c.beyondCurveLevel}`,
        c.curveSource,
        { ...duty, note: pct === null ? 'no thermal-curve time at this current' : tf.beyondCurve ? 'the fault lasted longer than the curve allows' : undefined },
      ),
    );
  }
  const over = aboveDesignMaximum(tf.currentPerUnit, tf.maxCurrentPerUnit, criteria);
  out.push(
    indicator(
      'duty.forceRatioPercent',
      tf.forceRatioPercent,
      over ? c.overMaxCurrentLevel : 'ok',
      'duty',
      `current above the largest through-fault current (force ratio above 100 %) → ${c.overMaxCurrentLevel}`,
      c.curveSource,
      { ...duty, note: over ? 'current above the design maximum: check the impedances and the current entered' : undefined },
    ),
  );
  const frequent = frequentFaultExceeded(tf, criteria);
  const limit = tf.category === 'I' ? null : c.frequentFaultCounts[tf.category];
  out.push(
    indicator(
      'duty.shotsAboveSegment',
      tf.shotsAboveSegment,
      frequent ? c.frequentFaultLevel : 'ok',
      'duty',
      limit === null
        ? `category ${tf.category}: no frequent-fault count rule`
        : `more than ${limit} shots at or above the segment start → ${c.frequentFaultLevel} (the segment is applied to every fault of categories II and III: a conservative choice)`,
      c.frequentFaultSource,
      { ...duty, note: frequent ? 'frequent-fault duty' : undefined },
    ),
  );
  out.push(indicator('duty.cumulativeDutyPercent', tf.cumulativeDutyPercent, 'ok', 'duty', 'informative: Gapsight tally of I²t against K', c.tallySource, duty));
  return out;
}
