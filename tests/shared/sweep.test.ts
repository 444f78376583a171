// Frequency-response sweeps: DL/T 911 relative factor and classes, common grid, the open-circuit core-region rule.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Sweep, SweepPoint } from '../../shared/schemas/case.js';
import { analyseSweep, asleDb, commonGrid, criteriaV1, dlt911Class, pearsonCorrelation, relativeFactor, sweepIndicators } from '../../shared/screening/index.js';

// Worked example: computed from the DL/T 911 appendix formulas (references.md)
const X = [-40, -35, -30, -38, -45, -50, -42, -36];
const Y = [-40.5, -34, -31, -37, -46, -49, -43.5, -35.5];

describe('DL/T 911 relative factor', () => {
  it('gives ρ 0.985877, R 1.8501 and ASLE 0.9375 dB for the worked example (ρ is the centred Pearson correlation)', () => {
    const rho = pearsonCorrelation(X, Y)!;
    expect(rho).toBeCloseTo(0.985877, 6); // computed from DL/T 911 appendix LR = Pearson correlation (references.md)
    expect(relativeFactor(rho, criteriaV1)).toBeCloseTo(1.8501, 4); // computed from DL/T 911 R = −log10(1 − LR) (references.md)
    expect(asleDb(X, Y)).toBeCloseTo(0.9375, 12); // computed: mean |difference| (references.md)
  });

  it('gives the same numbers through a whole trace in the low band', () => {
    const freqs = [1000, 2000, 3000, 4000, 5000, 6000, 7000, 8000];
    const sweep: Sweep = {
      label: 'T',
      testType: 'short-circuit',
      baseline: freqs.map((f, k) => [f, X[k]] as SweepPoint),
      postFault: freqs.map((f, k) => [f, Y[k]] as SweepPoint),
    };
    const a = analyseSweep(sweep, criteriaV1)!;
    expect(a.correlation).toBeCloseTo(0.985877, 6); // computed (references.md)
    expect(a.rLF).toBeCloseTo(1.8501, 4); // computed (references.md)
    expect(a.asleDb).toBeCloseTo(0.9375, 12); // computed (references.md)
    expect(a.rMF).toBeNull();
    expect(a.bandNotes.mid).toMatch(/fewer than 5/);
    expect(a.class).toBe('slight'); // DL/T 911: 1.0 ≤ R_LF < 2.0
  });

  it('caps R at 10 when 1 − ρ < 1e-10', () => {
    expect(relativeFactor(1, criteriaV1)).toBe(10); // DL/T 911 appendix: R = 10 when 1 − LR < 1e-10 (references.md)
    expect(relativeFactor(1 - 1e-11, criteriaV1)).toBe(10);
    expect(relativeFactor(1 - 1e-9, criteriaV1)).toBeCloseTo(9, 6);
  });
});

describe('DL/T 911 classes at and around every boundary', () => {
  const cls = (lf: number | null, mf: number | null, hf: number | null) => dlt911Class(lf, mf, hf, criteriaV1);
  // thresholds from DL/T 911 (references.md / case-format.md)
  it('is severe below R_LF 0.6 and obvious from 0.6', () => {
    expect(cls(0.5999, 3, 3)).toBe('severe');
    expect(cls(0.6, 3, 3)).toBe('obvious');
  });
  it('is obvious below R_LF 1.0 and slight from 1.0', () => {
    expect(cls(0.9999, 3, 3)).toBe('obvious');
    expect(cls(1.0, 3, 3)).toBe('slight');
  });
  it('is slight below R_LF 2.0 and normal from 2.0', () => {
    expect(cls(1.9999, 3, 3)).toBe('slight');
    expect(cls(2.0, 3, 3)).toBe('normal');
  });
  it('is obvious below R_MF 0.6, slight from 0.6 and normal from 1.0', () => {
    expect(cls(3, 0.5999, 3)).toBe('obvious');
    expect(cls(3, 0.6, 3)).toBe('slight');
    expect(cls(3, 0.9999, 3)).toBe('slight');
    expect(cls(3, 1.0, 3)).toBe('normal');
  });
  it('calls the case DL/T 911 leaves open (R_LF ≥ 2, R_MF ≥ 1, R_HF < 0.6) slight', () => {
    expect(cls(2, 1, 0.5999)).toBe('slight');
    expect(cls(2, 1, 0.6)).toBe('normal');
  });
  it('judges only the bands that have a factor, and has no class without any band', () => {
    expect(cls(null, 3, 3)).toBe('normal');
    expect(cls(null, 0.5, null)).toBe('obvious');
    expect(cls(null, null, null)).toBeNull();
  });
  it('compares after rounding to 9 significant digits', () => {
    expect(cls(1.9999999999999998, 3, 3)).toBe('normal');
  });
});

describe('common grid', () => {
  it('interpolates the post-fault trace linearly in log10(frequency) onto the baseline grid', () => {
    const grid = commonGrid([[2000, -44]], [[1000, -40], [4000, -50]]);
    expect(grid).toEqual([{ frequencyHz: 2000, baselineDb: -44, postFaultDb: -45 }]); // computed: 2 kHz is midway in log10 f
  });
  it('uses the fixed linear 1 kHz grid inside the range both traces cover, without extrapolating', () => {
    // Case format, "Sweeps", revision 2: f = 1, 2, … 1000 kHz, only grid points both traces cover.
    const grid = commonGrid([[500, -1], [1000, -2], [5000, -3], [20000, -4]], [[900, -2], [6000, -3]]);
    expect(grid.map((g) => g.frequencyHz)).toEqual([1000, 2000, 3000, 4000, 5000, 6000]);
    // 2 kHz on the baseline lies between 1 kHz (−2 dB) and 5 kHz (−3 dB): −2 − log10(2)/log10(5) dB (computed by hand)
    expect(grid[1].baselineDb).toBeCloseTo(-2 - Math.log10(2) / Math.log10(5), 12);
  });
});

/** A trace with structure in every band; `lfChange` distorts the low band only. */
function trace(lfChange = 0): SweepPoint[] {
  return Array.from({ length: 80 }, (_, k) => {
    const f = 1000 * 10 ** ((3 * k) / 79);
    const lg = Math.log10(f);
    const db = -38 - 6 * (lg - 3) + 9 * Math.sin(2 * Math.PI * (lg - 3) * 1.7 + (f < 1e5 ? lfChange : 0)) + 4 * Math.sin(2 * Math.PI * (lg - 3) * 4.1);
    return [f, db] as SweepPoint;
  });
}

describe('open-circuit core region', () => {
  it('caps an open-circuit trace changed only in the low band at investigate with "demagnetise and repeat"', () => {
    const sweep: Sweep = { label: 'HV-A-open', testType: 'open-circuit', baseline: trace(), postFault: trace(1.5) };
    const a = analyseSweep(sweep, criteriaV1)!;
    expect(a.class).toBe('severe');
    expect(a.level).toBe('investigate');
    const ind = sweepIndicators([sweep], criteriaV1).indicators.find((i) => i.key === 'sweep.HV-A-open.class')!;
    expect(ind.level).toBe('investigate');
    expect(ind.note).toContain('core region: demagnetise and repeat');
    expect(ind.lowConfidence).toBe(true);
  });

  it('lifts the core-region cap for a trace taken after demagnetising (rules revision 2)', () => {
    const sweep: Sweep = { label: 'HV-A-open', testType: 'open-circuit', demagnetised: true, baseline: trace(), postFault: trace(1.5) };
    const a = analyseSweep(sweep, criteriaV1)!;
    expect(a.coreRegion).toBe(false);
    expect(a.level).toBe('critical'); // DL/T 911 severe → critical, judged on all bands
  });

  it('keeps the full level for a short-circuit trace with the same change', () => {
    const sweep: Sweep = { label: 'HV-A-short', testType: 'short-circuit', baseline: trace(), postFault: trace(1.5) };
    expect(analyseSweep(sweep, criteriaV1)!.level).toBe('critical');
  });

  it('gives watch for an open-circuit trace whose low-band change is only slight', () => {
    const sweep: Sweep = { label: 'o', testType: 'open-circuit', baseline: trace(), postFault: trace(0.25) };
    const a = analyseSweep(sweep, criteriaV1)!;
    expect(a.class).toBe('slight');
    expect(a.level).toBe('watch');
    expect(a.coreRegion).toBe(true);
  });

  it('does not cap an open-circuit trace whose mid band changed too', () => {
    const changed = trace().map(([f, db]) => [f, f >= 1e5 && f < 6e5 ? db + 10 * Math.sin(f / 20000) : db] as SweepPoint);
    const sweep: Sweep = { label: 'o', testType: 'open-circuit', baseline: trace(), postFault: changed.map(([f, db], k) => [f, k < 53 ? trace(1.5)[k][1] : db] as SweepPoint) };
    const a = analyseSweep(sweep, criteriaV1)!;
    expect(a.coreRegion).toBe(false);
    expect(a.level).toBe('critical');
  });
});

describe('sweep properties', () => {
  const tracesArb = fc.array(fc.double({ min: -80, max: 0, noNaN: true }), { minLength: 6, maxLength: 40 }).filter((v) => Math.max(...v) - Math.min(...v) > 1e-3);
  it('gives R = 10 and correlation 1 for identical traces', () => {
    fc.assert(
      fc.property(tracesArb, (dbs) => {
        const pts = dbs.map((db, k) => [1000 + 1000 * k, db] as SweepPoint);
        const a = analyseSweep({ label: 'x', testType: 'short-circuit', baseline: pts, postFault: pts }, criteriaV1)!;
        expect(a.rLF).toBe(10);
        expect(a.correlation).toBeCloseTo(1, 12);
        expect(a.asleDb).toBe(0);
        expect(a.class).toBe('normal');
      }),
    );
  });
});
