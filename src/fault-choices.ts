// The choices of the fault forms (log a fault, correct the fault): value and words for each radio or checkbox.
import { faultTypeSchema, type CurrentIs, type FaultType, type Protection } from '../shared/schemas/case';
import { CURRENT_IS_LABELS, FAULT_TYPE_LABELS, SIDE_LABELS } from './labels';

/** Phases a fault can involve, in the order `faultedPhases` writes them. */
export const PHASES = ['A', 'B', 'C', 'N'] as const;

export const FAULT_TYPE_OPTIONS = faultTypeSchema.options.map((t) => ({ value: t, label: FAULT_TYPE_LABELS[t] }));
export const CURRENT_IS_OPTIONS = (['line', 'winding'] as const).map((c) => ({ value: c, label: CURRENT_IS_LABELS[c] }));
export const PHASE_OPTIONS = PHASES.map((p) => ({ value: p, label: p === 'N' ? 'N (ground)' : p }));

/** HV and LV (with `suffix` after the word), with the unit's voltage once the unit is known. */
export function faultSideOptions(suffix: string, unit: { hvKV: number; lvKV: number } | null) {
  return (['hv', 'lv'] as const).map((s) => {
    const kV = unit ? ` (${s === 'hv' ? unit.hvKV : unit.lvKV} kV)` : '';
    return { value: s, label: `${SIDE_LABELS[s]}${suffix}${kV}` };
  });
}

/**
 * The values of a fault form. Logging a fault starts with nothing picked (`Unpicked` = null) and keys its shot rows;
 * correcting one starts from the stored facts.
 */
export interface FaultFormValues<Unpicked extends null = never, Shot extends { currentKA: string; durationS: string } = { currentKA: string; durationS: string }> {
  occurredLocal: string;
  type: FaultType | Unpicked;
  side: 'hv' | 'lv' | Unpicked;
  location: 'hv' | 'lv' | Unpicked;
  currentIs: CurrentIs;
  phases: string[];
  shots: Shot[];
  transformerTripped: boolean;
  protections: Protection[];
  notes: string;
}
