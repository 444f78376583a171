// Words for the engine's and the API's codes (fault types, sides, protections, statuses, reading-set kinds).
import type { FaultType, Protection } from '../shared/schemas/case';
import type { Recommendation } from '../shared/schemas/result';
import type { EventStatus, ReadingSetKind } from './api/units';

export const FAULT_TYPE_LABELS: Record<FaultType, string> = {
  'three-phase': 'Three-phase',
  'phase-to-phase': 'Phase to phase',
  'phase-to-phase-to-ground': 'Phase to phase to ground',
  'phase-to-ground': 'Phase to ground',
};

export const SIDE_LABELS: Record<'hv' | 'lv', string> = { hv: 'HV', lv: 'LV' };

export const PROTECTION_LABELS: Record<Protection, string> = {
  differential: 'Differential',
  'restricted-earth-fault': 'Restricted earth fault',
  'buchholz-alarm': 'Buchholz alarm',
  'buchholz-trip': 'Buchholz trip',
  'sudden-pressure': 'Sudden pressure',
  'pressure-relief': 'Pressure relief',
  overcurrent: 'Overcurrent',
};

/** The transformer's own (internal) protections: any of them operating makes the recommendation no-go (brief, Verdict 1). */
export const INTERNAL_PROTECTIONS: readonly Protection[] = [
  'differential',
  'restricted-earth-fault',
  'buchholz-trip',
  'sudden-pressure',
  'pressure-relief',
];

export const STATUS_LABELS: Record<EventStatus, { word: string; icon: string }> = {
  logged: { word: 'Logged', icon: 'edit_note' },
  testing: { word: 'Testing', icon: 'science' },
  screened: { word: 'Screened', icon: 'fact_check' },
  held: { word: 'Held', icon: 'pan_tool' },
  released: { word: 'Released', icon: 'power' },
};

export const RECOMMENDATION_LABELS: Record<Recommendation, { word: string; icon: string }> = {
  go: { word: 'Go', icon: 'check_circle' },
  conditional: { word: 'Conditional', icon: 'warning' },
  'no-go': { word: 'No-go', icon: 'block' },
};

export const KIND_LABELS: Record<ReadingSetKind, string> = {
  factory: 'Factory',
  commissioning: 'Commissioning',
  routine: 'Routine',
  'post-fault': 'Post-fault',
};
