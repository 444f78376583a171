import { describe, expect, it } from 'vitest';
import { loggedFault, priorFaultsBefore, toPriorFault } from '../../shared/screening/duty-history.js';

const shots = [{ currentKA: 5, durationS: 0.1 }];
const fault = (id: number, occurredAt: string) => ({ id, occurredAt, type: 'three-phase' as const, side: 'lv' as const, shots });

describe('prior faults of an event', () => {
  it('counts only other faults strictly before the event, oldest first', () => {
    const all = [fault(3, '2026-11-28T03:12:00Z'), fault(1, '2024-05-02T10:00:00Z'), fault(2, '2025-02-14T22:40:00Z'), fault(4, '2027-01-01T00:00:00Z')];
    expect(priorFaultsBefore(all, '2026-11-28T03:12:00Z', 3).map((f) => f.id)).toEqual([1, 2]);
    // Another event at the very same instant is not before it.
    expect(priorFaultsBefore([...all, fault(5, '2026-11-28T03:12:00Z')], '2026-11-28T03:12:00Z', 3).map((f) => f.id)).toEqual([1, 2]);
  });

  it('maps a stored event (nulls where not recorded) to a case-format prior fault without the id or nulls', () => {
    const stored = { id: 7, occurredAt: '2025-02-14T22:40:00Z', type: 'phase-to-ground' as const, side: 'hv' as const, location: null, currentIs: 'winding' as const, shots };
    expect(loggedFault(stored)).toEqual({ id: 7, occurredAt: '2025-02-14T22:40:00Z', type: 'phase-to-ground', side: 'hv', currentIs: 'winding', shots });
    expect(toPriorFault(loggedFault(stored))).toEqual({ occurredAt: '2025-02-14T22:40:00Z', type: 'phase-to-ground', side: 'hv', currentIs: 'winding', shots });
  });
});
