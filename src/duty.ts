// Through-fault figures for display: the winding current of a shot beside its line current, and the thermal-curve time
// a fault was allowed. Every number comes from the engine's own functions (shared/screening/through-fault); this file
// only puts them side by side.
import type { CurrentIs, FaultType } from '../shared/schemas/case';
import type { ThroughFault } from '../shared/schemas/result';
import type { Criteria } from '../shared/screening/criteria';
import { BUILT_IN_CRITERIA, criteriaV1 } from '../shared/screening/criteria-sets';
import { aboveDesignMaximum, ratedCurrentA, ratedWindingCurrentA, thermalCurveTimeS, windingCurrentFactor, type WindingCurrent } from '../shared/screening/through-fault';

export { aboveDesignMaximum, ratedWindingCurrentA };

export interface DutyUnit {
  phases: 1 | 3;
  ratedKVA: number;
  hvKV: number;
  lvKV: number;
  vectorGroup?: string | null;
}

export interface DutyFault {
  type: FaultType;
  side: 'hv' | 'lv';
  location?: 'hv' | 'lv';
  currentIs?: CurrentIs;
}

/** The criteria set a stored result was computed with (built-in copy), else the engine's default. */
export function criteriaFor(version: number | null | undefined): Criteria {
  return BUILT_IN_CRITERIA.find((c) => c.version === version) ?? criteriaV1;
}

/** The winding-current factor of a fault on a unit, as the engine derives it. */
export function windingFactorOf(unit: DutyUnit, fault: DutyFault): WindingCurrent {
  return windingCurrentFactor({ phases: unit.phases, vectorGroup: unit.vectorGroup ?? undefined }, fault);
}

export interface ShotCurrents {
  /** Per unit of the rated line current of the measured side (null when the currents are winding currents). */
  linePerUnit: number | null;
  /** Winding current in per unit; null when the factor cannot be derived (the engine then uses the line current). */
  windingPerUnit: number | null;
  /** Winding current in amperes in the measured side's winding; null with `windingPerUnit`. */
  windingA: number | null;
  /** What the duty uses: the winding per unit, or the line per unit when the factor is unknown. */
  dutyPerUnit: number;
}

/** Line and winding current of one shot (current in kA, as typed). */
export function shotCurrents(unit: DutyUnit, fault: DutyFault, currentKA: number, winding: WindingCurrent = windingFactorOf(unit, fault)): ShotCurrents {
  const lineRated = ratedCurrentA(unit.ratedKVA, fault.side === 'hv' ? unit.hvKV : unit.lvKV, unit.phases);
  const typedPerUnit = (currentKA * 1000) / lineRated;
  const windingPerUnit = winding.factor === null ? null : winding.factor * typedPerUnit;
  return {
    linePerUnit: fault.currentIs === 'winding' ? null : typedPerUnit,
    windingPerUnit,
    windingA: windingPerUnit === null ? null : windingPerUnit * ratedWindingCurrentA({ ...unit, vectorGroup: unit.vectorGroup ?? undefined }, fault.side),
    dutyPerUnit: windingPerUnit ?? typedPerUnit,
  };
}

export interface ThermalTime {
  /** Allowed time on the thermal curve at the largest shot's current (Infinity below the curve). */
  allowedS: number;
  /** Total duration of the event's shots (null when it cannot be read back: no limit at this current). */
  totalS: number | null;
  percent: number;
}

/**
 * Time against allowed time for a fault below the mechanical segment: the allowed time from the engine's thermal curve,
 * the total duration read back from `thermalDurationPercent`. Null for a high-duty fault or a result without it.
 */
export function thermalTime(tf: ThroughFault, criteria: Criteria = criteriaV1): ThermalTime | null {
  if (tf.highDuty || tf.thermalDurationPercent === null || tf.thermalDurationPercent === undefined) return null;
  const allowedS = thermalCurveTimeS(tf.currentPerUnit, criteria);
  const totalS = Number.isFinite(allowedS) ? (tf.thermalDurationPercent * allowedS) / 100 : null;
  return { allowedS, totalS, percent: tf.thermalDurationPercent };
}
