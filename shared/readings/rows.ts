// A case-format reading set ↔ the Reading rows the database keeps (quantity, configuration or phase, mode, value, unit).
// One place decides the mapping, so an export of what was stored gives back what was entered.
import type { ReadingSet } from '../schemas/case.js';

export interface ReadingRowData {
  quantity: string;
  configuration: string | null;
  phase: string | null;
  mode: string | null;
  frequencyHz: number | null;
  value: number;
  unit: string;
}

/** The set-level fields kept as columns, not rows. */
export const SET_LEVEL_KEYS = ['takenAt', 'temperatureC', 'tapPosition', 'demagnetised', 'hoursDeEnergised', 'windingTemperatureC'] as const;

/** Case keys that map to rows; anything else a loose set carries goes to the set's `extra`. */
export const ROW_KEYS = [
  'capacitancePF',
  'capacitanceModes',
  'dissipationPercent',
  'reactance',
  'threePhaseEquivalent',
  'excitationCurrentMA',
  'excitationKV',
  'windingResistanceOhm',
  'resistanceTemperatureC',
  'turnsRatio',
  'dissolvedGasPPM',
  'dissipationByFrequency',
  'bushings',
] as const;

/**
 * Bushing readings: one row per terminal and reading, `configuration` = the terminal label (`H1`, `1U`, …), `mode` = the
 * terminal's winding (`hv`, `lv`, `tv`) when given, so the whole entry comes back from its rows.
 */
export const BUSHING_QUANTITIES = {
  c1PF: ['bushing-c1', 'pF'],
  c1DissipationPercent: ['bushing-c1-dissipation', '%'],
  c2PF: ['bushing-c2', 'pF'],
  c2DissipationPercent: ['bushing-c2-dissipation', '%'],
} as const;
const BUSHING_WINDINGS = ['hv', 'lv', 'tv'];

const MODE_KEYS = { gstPF: 'GST', gstGuardPF: 'GST-guard', ustPF: 'UST' } as const;
const REACTANCE_PARTS = { volts: ['volts', 'V'], amps: ['amps', 'A'], watts: ['watts', 'W'], zBaseOhm: ['zBase', 'ohm'] } as const;
const THREE_PHASE_PARTS = { e12: 'V', e23: 'V', e31: 'V', amps: 'A' } as const;

const row = (quantity: string, value: number, unit: string, over: Partial<ReadingRowData> = {}): ReadingRowData => ({
  quantity,
  configuration: null,
  phase: null,
  mode: null,
  frequencyHz: null,
  value,
  unit,
  ...over,
});

/** The rows of a case-format reading set (set-level fields excluded). */
export function readingSetToRows(set: ReadingSet): ReadingRowData[] {
  const out: ReadingRowData[] = [];
  for (const [cfg, v] of Object.entries(set.capacitancePF ?? {})) out.push(row('capacitance', v, 'pF', { configuration: cfg }));
  for (const [cfg, modes] of Object.entries(set.capacitanceModes ?? {})) {
    for (const [key, mode] of Object.entries(MODE_KEYS)) {
      const v = (modes as Record<string, number>)[key];
      if (typeof v === 'number') out.push(row('capacitance', v, 'pF', { configuration: cfg, mode }));
    }
  }
  for (const [cfg, v] of Object.entries(set.dissipationPercent ?? {})) out.push(row('dissipation', v, '%', { configuration: cfg }));
  for (const [phase, r] of Object.entries(set.reactance ?? {})) {
    const rec = r as Record<string, number | undefined>;
    if (typeof rec.percent === 'number') out.push(row('reactance', rec.percent, '%', { phase }));
    for (const [key, [mode, unit]] of Object.entries(REACTANCE_PARTS)) {
      const v = rec[key];
      if (typeof v === 'number') out.push(row('reactance', v, unit, { phase, mode }));
    }
  }
  if (set.threePhaseEquivalent) {
    for (const [key, unit] of Object.entries(THREE_PHASE_PARTS)) {
      out.push(row('reactance-3ph', (set.threePhaseEquivalent as Record<string, number>)[key], unit, { mode: key }));
    }
  }
  for (const [phase, v] of Object.entries(set.excitationCurrentMA ?? {})) out.push(row('excitation-current', v, 'mA', { phase }));
  if (typeof set.excitationKV === 'number') out.push(row('excitation-voltage', set.excitationKV, 'kV'));
  for (const [phase, v] of Object.entries(set.windingResistanceOhm ?? {})) out.push(row('winding-resistance', v, 'ohm', { phase }));
  if (typeof set.resistanceTemperatureC === 'number') out.push(row('resistance-temperature', set.resistanceTemperatureC, '°C'));
  for (const [phase, v] of Object.entries(set.turnsRatio ?? {})) out.push(row('turns-ratio', v, 'ratio', { phase }));
  for (const [gas, v] of Object.entries(set.dissolvedGasPPM ?? {})) {
    if (typeof v === 'number') out.push(row('dissolved-gas', v, 'ppm', { configuration: gas }));
  }
  for (const [cfg, pts] of Object.entries(set.dissipationByFrequency ?? {})) {
    for (const [f, df] of pts) out.push(row('dissipation-frequency', df, '%', { configuration: cfg, frequencyHz: f }));
  }
  for (const [terminal, b] of Object.entries(set.bushings ?? {})) {
    const rec = b as Record<string, unknown>;
    const mode = typeof rec.winding === 'string' ? rec.winding : null;
    for (const [key, [quantity, unit]] of Object.entries(BUSHING_QUANTITIES)) {
      const v = rec[key];
      if (typeof v === 'number') out.push(row(quantity, v, unit, { configuration: terminal, mode }));
    }
  }
  return out;
}

type MutableSet = Record<string, unknown>;

function bucket<T>(set: MutableSet, key: string): Record<string, T> {
  return (set[key] ??= {}) as Record<string, T>;
}

/** Rebuilds the row sections of a case-format reading set from stored rows. */
export function rowsToReadingSet(rows: readonly ReadingRowData[]): ReadingSet {
  const set: MutableSet = {};
  for (const r of rows) {
    const cfg = r.configuration ?? '';
    const phase = r.phase ?? '';
    switch (r.quantity) {
      case 'capacitance':
        if (r.mode) {
          const key = Object.entries(MODE_KEYS).find(([, m]) => m === r.mode)?.[0];
          if (key) bucket<Record<string, number>>(set, 'capacitanceModes')[cfg] = { ...bucket<Record<string, number>>(set, 'capacitanceModes')[cfg], [key]: r.value };
        } else bucket<number>(set, 'capacitancePF')[cfg] = r.value;
        break;
      case 'dissipation':
        bucket<number>(set, 'dissipationPercent')[cfg] = r.value;
        break;
      case 'reactance': {
        const phases = bucket<Record<string, number>>(set, 'reactance');
        const key = r.mode ? (Object.entries(REACTANCE_PARTS).find(([, [m]]) => m === r.mode)?.[0] ?? r.mode) : 'percent';
        phases[phase] = { ...phases[phase], [key]: r.value };
        break;
      }
      case 'reactance-3ph':
        set.threePhaseEquivalent = { ...(set.threePhaseEquivalent as object), [r.mode ?? '']: r.value };
        break;
      case 'excitation-current':
        bucket<number>(set, 'excitationCurrentMA')[phase] = r.value;
        break;
      case 'excitation-voltage':
        set.excitationKV = r.value;
        break;
      case 'winding-resistance':
        bucket<number>(set, 'windingResistanceOhm')[phase] = r.value;
        break;
      case 'resistance-temperature':
        set.resistanceTemperatureC = r.value;
        break;
      case 'turns-ratio':
        bucket<number>(set, 'turnsRatio')[phase] = r.value;
        break;
      case 'dissolved-gas':
        bucket<number>(set, 'dissolvedGasPPM')[cfg] = r.value;
        break;
      case 'dissipation-frequency': {
        const curves = bucket<[number, number][]>(set, 'dissipationByFrequency');
        (curves[cfg] ??= []).push([r.frequencyHz ?? 0, r.value]);
        break;
      }
      case 'bushing-c1':
      case 'bushing-c1-dissipation':
      case 'bushing-c2':
      case 'bushing-c2-dissipation': {
        const key = Object.entries(BUSHING_QUANTITIES).find(([, [q]]) => q === r.quantity)![0];
        const terminals = bucket<Record<string, unknown>>(set, 'bushings');
        terminals[cfg] = { ...terminals[cfg], [key]: r.value, ...(r.mode && BUSHING_WINDINGS.includes(r.mode) ? { winding: r.mode } : {}) };
        break;
      }
      default:
        break;
    }
  }
  for (const curve of Object.values((set.dissipationByFrequency ?? {}) as Record<string, [number, number][]>)) curve.sort((a, b) => a[0] - b[0]);
  // A bushing's readings in the case format's order, its winding last (whatever order the rows came in).
  const terminals = (set.bushings ?? {}) as Record<string, Record<string, unknown>>;
  for (const [terminal, b] of Object.entries(terminals)) {
    const { winding, ...readings } = b;
    const ordered = Object.fromEntries(Object.keys(BUSHING_QUANTITIES).filter((k) => k in readings).map((k) => [k, readings[k]]));
    terminals[terminal] = winding === undefined ? ordered : { ...ordered, winding };
  }
  return set as ReadingSet;
}
