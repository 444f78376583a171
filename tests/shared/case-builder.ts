// Builders of small screening cases for the engine tests (invented numbers).
import type { GapsightCase } from '../../shared/schemas/case.js';

/** A clean 40 MVA 132/33 kV unit screened after a modest tripped fault: every required quantity present, all ok. */
export function cleanCase(overrides: Partial<GapsightCase> = {}): GapsightCase {
  const base: GapsightCase = {
    format: 'gapsight-case/1',
    unit: { serial: 'TEST-T1', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5, systemImpedancePercent: 0 },
    fault: { occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 2.0, durationS: 0.1 }] },
    baseline: {
      takenAt: '2019-05-02',
      temperatureC: 20,
      tapPosition: '9b',
      capacitancePF: { CH: 3000, CL: 10000, CHL: 5000 },
      dissipationPercent: { CH: 0.3, CL: 0.3, CHL: 0.3 },
      reactance: { A: { percent: 11.6 }, B: { percent: 11.6 }, C: { percent: 11.6 } },
    },
    postFault: {
      takenAt: '2026-11-29',
      temperatureC: 20,
      tapPosition: '9b',
      capacitancePF: { CH: 3000, CL: 10000, CHL: 5000 },
      dissipationPercent: { CH: 0.3, CL: 0.3, CHL: 0.3 },
      reactance: { A: { percent: 11.6 }, B: { percent: 11.6 }, C: { percent: 11.6 } },
    },
  };
  return { ...base, ...overrides };
}

/** Deep copy then edit (keeps tests independent). */
export function edit(c: GapsightCase, f: (draft: GapsightCase) => void): GapsightCase {
  const copy = structuredClone(c);
  f(copy);
  return copy;
}

/** A full high-duty test set on top of the clean case: sweep, gases, excitation, resistance. */
export function highDutyCompleteCase(): GapsightCase {
  const freqs = Array.from({ length: 40 }, (_, k) => 1000 * 10 ** ((3 * k) / 39));
  const trace = freqs.map((f) => [f, -30 - 5 * Math.log10(f) + 4 * Math.sin(3 * Math.log10(f))] as [number, number]);
  return edit(cleanCase(), (d) => {
    d.fault = { occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 6.0, durationS: 0.1 }] };
    d.baseline!.dissolvedGasPPM = { H2: 10, CH4: 5, C2H6: 3, C2H4: 2, C2H2: 0 };
    d.baseline!.excitationCurrentMA = { A: 40, B: 28, C: 40 };
    d.baseline!.windingResistanceOhm = { A: 0.4, B: 0.4, C: 0.4 };
    d.postFault!.dissolvedGasPPM = { H2: 12, CH4: 5, C2H6: 3, C2H4: 2, C2H2: 0 };
    d.postFault!.excitationCurrentMA = { A: 40, B: 28, C: 40 };
    d.postFault!.windingResistanceOhm = { A: 0.4, B: 0.4, C: 0.4 };
    // Revision 2: an open-circuit trace of the HV winding for each phase, each with its baseline trace.
    d.sweeps = (['A', 'B', 'C'] as const).map((phase) => ({ label: `HV-${phase}-open`, testType: 'open-circuit' as const, winding: 'hv' as const, phase, baseline: trace, postFault: trace }));
  });
}
