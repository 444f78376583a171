// The sweep overlay's series: the same R per band as the engine, ρ per band, the difference trace on the common grid,
// the pair in words, and the log-axis ticks.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import type { GapsightCase, Sweep, SweepPoint } from '../../../shared/schemas/case.js';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import { criteriaV2 } from '../../../shared/screening/criteria-sets.js';
import { compareTraces, phaseComparisons, relativeFactor } from '../../../shared/screening/sweep.js';
import {
  decadeTicks,
  frequencyTick,
  overlayAgreesWithResult,
  phasePairOverlay,
  rhoText,
  rText,
  SWEEP_AXIS_TITLES,
  sweepOverlay,
  sweepOverlays,
} from '../../../shared/charts/sweep-overlay.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const readJson = <T>(rel: string): T => JSON.parse(readFileSync(path.join(root, rel), 'utf8')) as T;

// Worked example (references.md, "Frequency response"): ρ 0.985877, R 1.8501.
const X = [-40, -35, -30, -38, -45, -50, -42, -36];
const Y = [-40.5, -34, -31, -37, -46, -49, -43.5, -35.5];
// Eight points on consecutive grid frequencies of the mid band (100 … 107 kHz): the common grid is exactly these points.
const MID = [100000, 101000, 102000, 103000, 104000, 105000, 106000, 107000];
const workedSweep: Sweep = {
  label: 'HV-B-open',
  testType: 'open-circuit',
  winding: 'hv',
  phase: 'B',
  demagnetised: true,
  baseline: MID.map((f, k) => [f, X[k]] as SweepPoint),
  postFault: MID.map((f, k) => [f, Y[k]] as SweepPoint),
};

describe('sweep overlay of one sweep', () => {
  const o = sweepOverlay(workedSweep, criteriaV2);
  const mid = o.bands.find((b) => b.band === 'mid')!;

  it('gives the worked example’s ρ and R in the mid band', () => {
    expect(mid.rho).toBeCloseTo(0.985877, 6); // references.md "Frequency response": ρ 0.985877
    expect(mid.r).toBeCloseTo(1.8501, 4); // references.md: R = −log10(1 − ρ) = 1.8501
    expect(mid.rhoText).toBe('0.9859'); // 0.985877 to 4 decimals
    expect(mid.rText).toBe('1.850'); // 1.8501 to 3 decimals
    expect(mid.bandClass).toBe('normal'); // DL/T 911 (references.md): R_MF ≥ 1.0 is not slight or worse
  });

  it('leaves the low and high bands without R when they hold no points, with the engine’s note', () => {
    for (const b of o.bands.filter((x) => x.band !== 'mid')) {
      expect(b.r).toBeNull();
      expect(b.rho).toBeNull();
      expect(b.note).toMatch(/fewer than 5 measured points/);
    }
    expect(o.overallClass).toBe('normal');
    expect(o.overallClassText).toBe('Normal');
  });

  it('draws the difference post-fault − baseline on the common grid (hand computed: Y − X)', () => {
    expect(o.difference.map((p) => p.x)).toEqual(MID);
    // Y − X = −0.5, +1, −1, +1, −1, +1, −1.5, +0.5 (hand computed from the worked sequences)
    expect(o.difference.map((p) => p.y)).toEqual([-0.5, 1, -1, 1, -1, 1, -1.5, 0.5]);
  });

  it('names the pair and the axes in words', () => {
    expect(o.title).toBe('HV winding, phase B, open circuit (HV-B-open): post-fault against baseline');
    expect(o.axes).toEqual({ frequency: 'Frequency (Hz)', magnitude: 'Magnitude (dB)', difference: 'Difference (dB)' });
    expect(SWEEP_AXIS_TITLES.frequency).toBe('Frequency (Hz)');
    expect(o.bands.map((b) => b.label)).toEqual(['Low band (1 kHz – 100 kHz)', 'Mid band (100 kHz – 600 kHz)', 'High band (600 kHz – 1 MHz)']);
  });

  it('sorts the measured traces by frequency', () => {
    const shuffled = { ...workedSweep, postFault: [...workedSweep.postFault].reverse() };
    expect(sweepOverlay(shuffled, criteriaV2).trace.map((p) => p.x)).toEqual(MID);
  });
});

describe('the overlays of the example cases equal the engine', () => {
  it('sweeps.json: R per band equals compareTraces and the stored result', () => {
    const c = readJson<GapsightCase>('examples/cases/sweeps.json');
    const r = readJson<GapsightResult>('examples/cases/sweeps.result.json');
    const overlays = sweepOverlays(c, criteriaV2);
    expect(overlays.map((o) => o.id)).toEqual(c.sweeps!.map((s) => s.label));
    for (const s of c.sweeps!) {
      const o = overlays.find((x) => x.id === s.label)!;
      const engine = compareTraces(s.baseline!, s.postFault, criteriaV2);
      const byBand = Object.fromEntries(o.bands.map((b) => [b.band, b.r]));
      expect(byBand).toEqual({ low: engine.rLF, mid: engine.rMF, high: engine.rHF });
      const stored = (k: string) => r.indicators.find((i) => i.key === `sweep.${s.label}.${k}`)?.value;
      expect(byBand.low).toBe(stored('rLF'));
      expect(byBand.mid).toBe(stored('rMF'));
      expect(byBand.high).toBe(stored('rHF'));
      expect(o.overallClass).toBe(stored('class'));
      expect(o.correlation).toBe(stored('correlation'));
      // ρ per band is the one behind R: R = −log10(1 − ρ) (DL/T 911, references.md)
      for (const b of o.bands) if (b.r !== null && b.r < criteriaV2.sweep.maxRelativeFactor) expect(relativeFactor(b.rho!, criteriaV2)).toBeCloseTo(b.r, 9);
      expect(o.difference.length).toBe(engine.points);
      expect(overlayAgreesWithResult(o, r.indicators)).toBe(true);
    }
    // A result computed with other figures (R_LF changed) does not agree.
    const o = overlays.find((x) => x.id === 'HV-A-open')!;
    const other = r.indicators.map((i) => (i.key === 'sweep.HV-A-open.rLF' ? { ...i, value: 0.5 } : i));
    expect(overlayAgreesWithResult(o, other)).toBe(false);
  });

  it('rev2-phase-comparison.json: one A–C overlay with the engine’s mid and high R, low band not judged', () => {
    const c = readJson<GapsightCase>('examples/cases/rev2-phase-comparison.json');
    const r = readJson<GapsightResult>('examples/cases/rev2-phase-comparison.result.json');
    const overlays = sweepOverlays(c, criteriaV2);
    const pair = overlays.find((o) => o.kind === 'phase-pair')!;
    expect(pair.id).toBe('hv.AC');
    expect(pair.title).toBe('HV winding, open circuit: phase A against phase C (no baseline trace)');
    const [pc] = phaseComparisons(c.sweeps!);
    const engine = compareTraces(pc.a.postFault, pc.c.postFault, criteriaV2, { bands: ['mid', 'high'] });
    expect(pair.bands.find((b) => b.band === 'mid')!.r).toBe(engine.rMF);
    expect(pair.bands.find((b) => b.band === 'high')!.r).toBe(engine.rHF);
    expect(pair.bands.find((b) => b.band === 'mid')!.r).toBe(r.indicators.find((i) => i.key === 'sweep.hv.AC.rMF')!.value);
    const low = pair.bands.find((b) => b.band === 'low')!;
    expect(low.judged).toBe(false);
    expect(low.r).toBeNull();
    expect(pair.overallClass).toBe(r.indicators.find((i) => i.key === 'sweep.hv.AC.class')!.value);
    // Phase B has no baseline and no partner: shown alone, not judged; A and C appear only in the pair.
    expect(overlays.filter((o) => o.kind === 'single').map((o) => o.id)).toEqual(['HV-B-open']);
    expect(phasePairOverlay('hv', pc.a, pc.c, criteriaV2).differenceName).toBe('Phase C − phase A');
    for (const o of overlays) expect(overlayAgreesWithResult(o, r.indicators)).toBe(true);
  });
});

describe('figures and ticks', () => {
  it('shows ρ with 4 decimals and R with 3, so 0.9987 never reads as 1', () => {
    expect(rhoText(0.99874)).toBe('0.9987');
    expect(rhoText(null)).toBe('—');
    expect(rText(2.89279, criteriaV2)).toBe('2.893');
    expect(rText(10, criteriaV2)).toBe('10.000 (cap)'); // DL/T 911: R = 10 when 1 − ρ < 1e-10 (references.md)
  });

  it('gives decade ticks for a log frequency axis', () => {
    expect(decadeTicks(1000, 1e6)).toEqual([1e3, 1e4, 1e5, 1e6]);
    expect(decadeTicks(1500, 900000)).toEqual([1e3, 1e4, 1e5, 1e6]);
    expect(['100', '1k', '10k', '1M'].join()).toBe([100, 1000, 10000, 1e6].map(frequencyTick).join());
  });
});
