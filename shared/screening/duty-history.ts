// A unit's through-fault duty with its earlier faults counted: the one rule for which faults count as "prior" to an
// event, used by the unit file's event list, the event file and the case export, so each shows the same cumulative tally.
import type { CurrentIs, Fault, FaultType, PriorFault, Shot, Unit } from '../schemas/case.js';
import type { ThroughFault } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { computeThroughFault } from './through-fault.js';

/** A logged fault of the unit: the case-format fault fields, with the event id when there is one. */
export type LoggedFault = PriorFault & { id?: number };

/** A stored event's fault fields as the API sends them (null where not recorded). */
export interface FaultRecord {
  id?: number;
  occurredAt: string;
  type: FaultType;
  side: 'hv' | 'lv';
  location?: 'hv' | 'lv' | null;
  currentIs?: CurrentIs | null;
  shots: Shot[];
}

/** A stored event as a logged fault: location and current basis only when recorded. */
export function loggedFault(r: FaultRecord): LoggedFault {
  return {
    ...(r.id !== undefined ? { id: r.id } : {}),
    occurredAt: r.occurredAt,
    type: r.type,
    side: r.side,
    ...(r.location ? { location: r.location } : {}),
    ...(r.currentIs ? { currentIs: r.currentIs } : {}),
    shots: r.shots,
  };
}

/** A fault as the case format's prior fault: its time, type, side, location and current basis when recorded, and shots. */
export function toPriorFault(f: PriorFault | Fault): PriorFault {
  return {
    occurredAt: f.occurredAt,
    type: f.type,
    side: f.side,
    ...(f.location !== undefined ? { location: f.location } : {}),
    ...(f.currentIs !== undefined ? { currentIs: f.currentIs } : {}),
    shots: f.shots,
  };
}

/**
 * The faults that count as prior to one at `at`: every other logged fault of the unit that occurred strictly earlier
 * (the event itself, by id, never counts), in time order.
 */
export function priorFaultsBefore<F extends LoggedFault>(faults: readonly F[], at: string, exceptId?: number): F[] {
  const t = Date.parse(at);
  return faults
    .filter((f) => (exceptId === undefined || f.id !== exceptId) && Date.parse(f.occurredAt) < t)
    .sort((a, b) => Date.parse(a.occurredAt) - Date.parse(b.occurredAt));
}

/**
 * The duty of a fault on a unit with the unit's earlier faults counted: `unitFaults` may hold every logged fault of the
 * unit (the fault itself and later ones included); only those before it count.
 */
export function dutyWithPriorFaults(
  unit: Unit,
  fault: Fault,
  unitFaults: readonly LoggedFault[],
  faultId?: number,
  criteria?: Criteria,
): ThroughFault | null {
  const prior = priorFaultsBefore(unitFaults, fault.occurredAt, faultId).map(toPriorFault);
  return criteria ? computeThroughFault(unit, fault, prior, criteria) : computeThroughFault(unit, fault, prior);
}
