// Words for the engine's and the API's codes (fault types, sides, protections, statuses, reading-set kinds).
import type { CurrentIs, FaultType, Protection } from '../shared/schemas/case';
import type { Basis, Indicator, Method, Recommendation } from '../shared/schemas/result';
import type { CurrentBasis } from '../shared/screening/through-fault';
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

/** A manager's decision outcome as icon + word. */
export const OUTCOME_LABELS: Record<'release' | 'release-with-restrictions' | 'hold', { word: string; icon: string }> = {
  release: { word: 'Release', icon: 'power' },
  'release-with-restrictions': { word: 'Release with restrictions', icon: 'tune' },
  hold: { word: 'Hold', icon: 'pan_tool' },
};

/** An inspection finding's classification as icon + word. */
export const FINDING_LABELS: Record<string, { word: string; icon: string }> = {
  'no-damage': { word: 'No damage', icon: 'verified' },
  'deformation-confirmed': { word: 'Deformation confirmed', icon: 'report' },
  other: { word: 'Other', icon: 'notes' },
};

/** An e-mail's delivery state as icon + word. */
export const NOTIFICATION_STATUS_LABELS: Record<'queued' | 'sent' | 'failed', { word: string; icon: string }> = {
  queued: { word: 'Queued', icon: 'schedule_send' },
  sent: { word: 'Sent', icon: 'mark_email_read' },
  failed: { word: 'Failed', icon: 'error' },
};

/** The engine's indicator methods in words. */
export const METHOD_LABELS: Record<Method, string> = {
  capacitance: 'Capacitance',
  'power-factor': 'Power factor',
  reactance: 'Leakage reactance',
  sweep: 'Frequency response',
  excitation: 'Excitation current',
  resistance: 'Winding resistance',
  ratio: 'Turns ratio',
  gas: 'Dissolved gases',
  bushing: 'Bushings',
  sisters: 'Sister units',
  duty: 'Through-fault duty',
};

/** What an indicator compares (rules revision 2), in words. `phase-comparison` names its phases from the key. */
export const BASIS_LABELS: Record<Basis, string> = {
  change: 'against own baseline',
  sisters: 'against sister units',
  'phase-comparison': 'phase comparison',
  state: 'state (absolute value)',
  duty: 'duty',
};

/** An indicator's basis in words: a change against `previous` says so; a phase comparison names its phases. */
export function basisText(i: Pick<Indicator, 'key' | 'basis' | 'reference'>): string {
  if (!i.basis) return '—';
  if (i.basis === 'change' && /previous/i.test(`${i.key} ${i.reference ?? ''}`)) return 'against own previous test';
  if (i.basis === 'phase-comparison') {
    const m = /\.([ABC])([ABC])\./.exec(i.key);
    return m ? `phase ${m[1]} vs ${m[2]}` : BASIS_LABELS['phase-comparison'];
  }
  return BASIS_LABELS[i.basis];
}

/** How the duty's per-unit current was obtained (result `throughFault.currentBasis`). */
export const CURRENT_BASIS_LABELS: Record<CurrentBasis, string> = {
  winding: 'entered as winding current',
  'line-converted': 'converted from the line current by the vector group',
  'line-assumed': 'line current used as the winding current (factor unknown)',
};

/** What the shots' currents are (fault field `currentIs`). */
export const CURRENT_IS_LABELS: Record<CurrentIs, string> = {
  line: 'Line currents (relay or recorder on the line CTs)',
  winding: 'Winding currents',
};

/** Sweep windings and phases (sweep fields `winding`, `phase`). */
export const WINDING_LABELS: Record<'hv' | 'lv' | 'tv', string> = { hv: 'HV', lv: 'LV', tv: 'TV (tertiary)' };

/** "criteria set 2 · rules revision 2" of a stored screening (a result without `engineRevision` is revision 1). */
export function rulesText(s: { criteriaVersion: number; result?: { engineRevision?: number } | null }): string {
  return `criteria set ${s.criteriaVersion} · rules revision ${s.result?.engineRevision ?? 1}`;
}
