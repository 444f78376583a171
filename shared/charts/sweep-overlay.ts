// Series for the frequency-response overlay of one sweep (or of the A–C phase pair of a winding without baseline
// traces): both magnitude traces, their difference on the engine's common grid, and per band the correlation ρ, the
// relative factor R and the DL/T 911 class. Every number comes from the engine's own functions in
// shared/screening/sweep.ts (commonGrid, compareTraces, pearsonCorrelation, relativeFactor, dlt911Class): this file only
// arranges them for a chart, a table and the PDF. Pure; no Vue, no I/O.
import type { GapsightCase, Sweep, SweepPoint } from '../schemas/case.js';
import type { Criteria } from '../screening/criteria.js';
import {
  analyseSweep,
  commonGrid,
  compareTraces,
  CORE_REGION_NOTE,
  dlt911Class,
  NO_BASELINE_TRACE_NOTE,
  pearsonCorrelation,
  phaseComparisons,
  sweepGridOf,
  sweepTapMismatch,
  sweepWinding,
  type Dlt911Class,
  type SweepAnalysis,
} from '../screening/sweep.js';
import { SWEEP_TEST_LABELS, WINDING_LABELS } from '../vocabulary.js';

export type SweepBandName = 'low' | 'mid' | 'high';
/** A point of a chart: x in Hz, y in dB. */
export type XY = { x: number; y: number };

export const SWEEP_AXIS_TITLES = { frequency: 'Frequency (Hz)', magnitude: 'Magnitude (dB)', difference: 'Difference (dB)' } as const;

export const DLT911_CLASS_WORDS: Record<Dlt911Class, string> = {
  normal: 'Normal',
  slight: 'Slight deformation',
  obvious: 'Obvious deformation',
  severe: 'Severe deformation',
};

export interface SweepBandRow {
  band: SweepBandName;
  /** "Low band (1 kHz – 100 kHz)". */
  label: string;
  fromHz: number;
  toHz: number;
  /** Whether this comparison judges the band at all (the A–C comparison leaves the low band out). */
  judged: boolean;
  /** Pearson ρ of the dB magnitudes over the band's common grid points (null where the engine gives no R). */
  rho: number | null;
  /** The engine's relative factor R for the band (compareTraces). */
  r: number | null;
  /** The DL/T 911 class this band alone gives (dlt911Class with the other bands left out). */
  bandClass: Dlt911Class | null;
  /** Why the band has no R (the engine's note). */
  note?: string;
  rhoText: string;
  rText: string;
  classText: string;
}

export interface SweepOverlay {
  /** Stable id: the sweep's label, or `<winding>.AC` for a phase pair. */
  id: string;
  kind: 'baseline' | 'phase-pair' | 'single';
  /** The pair in words: "HV winding, phase B, open circuit: post-fault against baseline". */
  title: string;
  referenceName: string;
  traceName: string;
  /** Measured points, sorted by frequency. `reference` is empty for a trace without anything to compare with. */
  reference: XY[];
  trace: XY[];
  /** trace − reference (dB) on the engine's common grid (1 kHz steps inside the range both traces cover). */
  difference: XY[];
  differenceName: string;
  bands: SweepBandRow[];
  /** The engine's class over all judged bands (null when no band has enough points or nothing to compare). */
  overallClass: Dlt911Class | null;
  overallClassText: string;
  /** Pearson ρ over all common grid points and ASLE (dB), as the engine reports them. */
  correlation: number | null;
  asleDb: number | null;
  gridPoints: number;
  notes: string[];
  axes: typeof SWEEP_AXIS_TITLES;
}

const sorted = (pts: readonly SweepPoint[] | undefined): XY[] => [...(pts ?? [])].sort((p, q) => p[0] - q[0]).map((p) => ({ x: p[0], y: p[1] }));

/** Hz for reading: "1 kHz", "100 kHz", "1 MHz", "600 Hz". */
export function frequencyText(hz: number): string {
  if (hz >= 1e6) return `${Number((hz / 1e6).toPrecision(4))} MHz`;
  if (hz >= 1e3) return `${Number((hz / 1e3).toPrecision(4))} kHz`;
  return `${Number(hz.toPrecision(4))} Hz`;
}

/** ρ with 4 decimals ("0.9987"), so a value below 1 never reads as 1. */
export const rhoText = (rho: number | null): string => (rho === null ? '—' : rho.toFixed(4));
/** R with 3 decimals ("1.850"); the capped value is said so. */
export function rText(r: number | null, criteria: Criteria): string {
  if (r === null) return '—';
  return r >= criteria.sweep.maxRelativeFactor ? `${r.toFixed(3)} (cap)` : r.toFixed(3);
}
export const classText = (c: Dlt911Class | null): string => (c === null ? 'not judged' : DLT911_CLASS_WORDS[c]);

const BAND_WORDS: Record<SweepBandName, string> = { low: 'Low band', mid: 'Mid band', high: 'High band' };

/** One sweep in words: "HV winding, phase B, open circuit (HV-B-open)". */
export function sweepInWords(s: Sweep): string {
  const parts = [`${WINDING_LABELS[sweepWinding(s) as 'hv' | 'lv' | 'tv'] ?? sweepWinding(s).toUpperCase()} winding`];
  if (s.phase) parts.push(`phase ${s.phase}`);
  parts.push((SWEEP_TEST_LABELS[s.testType] ?? s.testType).toLowerCase());
  return `${parts.join(', ')} (${s.label})`;
}

/**
 * Per band: the engine's R (compareTraces), ρ from pearsonCorrelation over the same grid points compareTraces uses for
 * the band, and the class that band alone gives.
 */
function bandRows(reference: readonly SweepPoint[], trace: readonly SweepPoint[], a: SweepAnalysis, criteria: Criteria, judged: readonly SweepBandName[]): SweepBandRow[] {
  const grid = commonGrid(reference, trace, sweepGridOf(criteria));
  const rOf: Record<SweepBandName, number | null> = { low: a.rLF, mid: a.rMF, high: a.rHF };
  return (['low', 'mid', 'high'] as const).map((band) => {
    const [lo, hi] = criteria.sweep.bandsHz[band];
    const top = band === 'high';
    const r = rOf[band];
    let rho: number | null = null;
    if (r !== null) {
      const inBand = grid.filter((g) => g.frequencyHz >= lo && (top ? g.frequencyHz <= hi : g.frequencyHz < hi));
      rho = pearsonCorrelation(inBand.map((g) => g.baselineDb), inBand.map((g) => g.postFaultDb));
    }
    const bandClass = dlt911Class(band === 'low' ? r : null, band === 'mid' ? r : null, band === 'high' ? r : null, criteria);
    return {
      band,
      label: `${BAND_WORDS[band]} (${frequencyText(lo)} – ${frequencyText(hi)})`,
      fromHz: lo,
      toHz: hi,
      judged: judged.includes(band),
      rho,
      r,
      bandClass,
      note: a.bandNotes[band],
      rhoText: rhoText(rho),
      rText: rText(r, criteria),
      classText: classText(bandClass),
    };
  });
}

function differenceOf(reference: readonly SweepPoint[], trace: readonly SweepPoint[], criteria: Criteria): XY[] {
  return commonGrid(reference, trace, sweepGridOf(criteria)).map((g) => ({ x: g.frequencyHz, y: g.postFaultDb - g.baselineDb }));
}

/** The overlay of one sweep against its baseline trace (or, without one, the post-fault trace alone). */
export function sweepOverlay(s: Sweep, criteria: Criteria): SweepOverlay {
  const a = analyseSweep(s, criteria);
  const words = sweepInWords(s);
  if (!a || !s.baseline) {
    return {
      id: s.label,
      kind: 'single',
      title: `${words}: post-fault trace alone`,
      referenceName: 'Baseline (none)',
      traceName: 'Post-fault',
      reference: [],
      trace: sorted(s.postFault),
      difference: [],
      differenceName: 'Post-fault − baseline',
      bands: (['low', 'mid', 'high'] as const).map((band) => {
        const [lo, hi] = criteria.sweep.bandsHz[band];
        return { band, label: `${BAND_WORDS[band]} (${frequencyText(lo)} – ${frequencyText(hi)})`, fromHz: lo, toHz: hi, judged: false, rho: null, r: null, bandClass: null, note: NO_BASELINE_TRACE_NOTE, rhoText: '—', rText: '—', classText: classText(null) };
      }),
      overallClass: null,
      overallClassText: classText(null),
      correlation: null,
      asleDb: null,
      gridPoints: 0,
      notes: [NO_BASELINE_TRACE_NOTE],
      axes: SWEEP_AXIS_TITLES,
    };
  }
  const notes: string[] = [];
  if (a.coreRegion) notes.push(CORE_REGION_NOTE);
  if (a.beyondRange) notes.push('points outside 1 kHz–1 MHz are not judged');
  if (sweepTapMismatch(s)) notes.push('tap mismatch between the traces: not judged, repeat at the baseline tap');
  return {
    id: s.label,
    kind: 'baseline',
    title: `${words}: post-fault against baseline`,
    referenceName: 'Baseline',
    traceName: 'Post-fault',
    reference: sorted(s.baseline),
    trace: sorted(s.postFault),
    difference: differenceOf(s.baseline, s.postFault, criteria),
    differenceName: 'Post-fault − baseline',
    bands: bandRows(s.baseline, s.postFault, a, criteria, ['low', 'mid', 'high']),
    overallClass: a.class,
    overallClassText: classText(a.class),
    correlation: a.correlation,
    asleDb: a.asleDb,
    gridPoints: a.points,
    notes,
    axes: SWEEP_AXIS_TITLES,
  };
}

/** The A–C overlay of one winding's open-circuit traces without baseline traces (as the engine compares them). */
export function phasePairOverlay(winding: string, a: Sweep, c: Sweep, criteria: Criteria): SweepOverlay {
  const judged = ['mid', 'high'] as const;
  // The engine's call (sweepIndicators): phase A's trace as the reference, phase C's as the trace.
  const an = compareTraces(a.postFault, c.postFault, criteria, { bands: judged });
  const w = WINDING_LABELS[winding as 'hv' | 'lv' | 'tv'] ?? winding.toUpperCase();
  return {
    id: `${winding}.AC`,
    kind: 'phase-pair',
    title: `${w} winding, open circuit: phase A against phase C (no baseline trace)`,
    referenceName: `Phase A (${a.label})`,
    traceName: `Phase C (${c.label})`,
    reference: sorted(a.postFault),
    trace: sorted(c.postFault),
    difference: differenceOf(a.postFault, c.postFault, criteria),
    differenceName: 'Phase C − phase A',
    bands: bandRows(a.postFault, c.postFault, an, criteria, judged),
    overallClass: an.class,
    overallClassText: classText(an.class),
    correlation: an.correlation,
    asleDb: an.asleDb,
    gridPoints: an.points,
    notes: ['phase A against phase C of one winding over the mid and high bands (no baseline trace)'],
    axes: SWEEP_AXIS_TITLES,
  };
}

/**
 * Every overlay of a case: one per sweep with a baseline trace, one per A–C pair the engine compares, and one per
 * remaining trace without a baseline (shown alone, not judged).
 */
export function sweepOverlays(c: GapsightCase, criteria: Criteria): SweepOverlay[] {
  const sweeps = c.sweeps ?? [];
  const pairs = phaseComparisons(sweeps);
  const inPair = new Set(pairs.flatMap((p) => [p.a.label, p.c.label]));
  const out: SweepOverlay[] = [];
  for (const s of sweeps) {
    if (s.baseline && s.baseline.length) out.push(sweepOverlay(s, criteria));
    else if (!inPair.has(s.label)) out.push(sweepOverlay(s, criteria));
  }
  for (const p of pairs) out.push(phasePairOverlay(p.winding, p.a, p.c, criteria));
  return out;
}

/** log10 of a frequency (the chart's x when the library has no logarithmic x axis). */
export const log10Hz = (hz: number): number => Math.log10(hz);

/** Decade ticks covering [minHz, maxHz]: 10^k for k = floor(log10 min) … ceil(log10 max). */
export function decadeTicks(minHz: number, maxHz: number): number[] {
  if (!(minHz > 0) || !(maxHz > 0)) return [];
  const out: number[] = [];
  for (let k = Math.floor(Math.log10(minHz) + 1e-9); k <= Math.ceil(Math.log10(maxHz) - 1e-9); k++) out.push(10 ** k);
  return out;
}

/** A tick label for a frequency axis titled in Hz: "100", "1k", "10k", "1M". */
export function frequencyTick(hz: number): string {
  if (hz >= 1e6) return `${Number((hz / 1e6).toPrecision(3))}M`;
  if (hz >= 1e3) return `${Number((hz / 1e3).toPrecision(3))}k`;
  return `${Number(hz.toPrecision(3))}`;
}

/**
 * Whether an overlay's R per band and class are the ones a stored result carries (`sweep.<label>.rLF|rMF|rHF|class`,
 * `sweep.<winding>.AC.rMF|rHF|class`): false when the overlay was computed under another criteria set than the result.
 * A trace shown alone (nothing compared) always agrees.
 */
export function overlayAgreesWithResult(o: SweepOverlay, indicators: ReadonlyArray<{ key: string; value: unknown }>): boolean {
  if (o.kind === 'single') return true;
  const value = (k: string) => indicators.find((i) => i.key === `sweep.${o.id}.${k}`)?.value ?? null;
  const same = (a: unknown, b: number | string | null) =>
    typeof a === 'number' && typeof b === 'number' ? Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b)) : (a ?? null) === b;
  const r = Object.fromEntries(o.bands.map((b) => [b.band, b.r]));
  const keys: [string, number | string | null][] =
    o.kind === 'phase-pair'
      ? [['rMF', r.mid], ['rHF', r.high], ['class', o.overallClass]]
      : [['rLF', r.low], ['rMF', r.mid], ['rHF', r.high], ['class', o.overallClass]];
  return keys.every(([k, v]) => same(value(k), v));
}
