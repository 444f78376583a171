// Rules revision 2 (case format, "Rules that decide numbers"): for each rule, a case that revision 1 decided
// differently, with the expected recommendation and the reason. "Revision 1 decided …" was read off the engine as it
// was before revision 2 (git history); the expected values come from the case format's rules and the sources named.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { GapsightCase, Unit } from '../../shared/schemas/case.js';
import type { Recommendation } from '../../shared/schemas/result.js';
import {
  computeThroughFault,
  corroboratingMethods,
  criteriaV1,
  criteriaV2,
  nameplateRatio,
  ratedCurrentA,
  screenCase,
  windingCurrentFactor,
} from '../../shared/screening/index.js';
import { cleanCase, edit, highDutyCompleteCase } from './case-builder.js';
import { describeRequired, lacksBaselineTrace } from '../../shared/screening/verdict.js';

const ind = (r: ReturnType<typeof screenCase>, key: string) => r.indicators.find((i) => i.key === key);
const example = (name: string): GapsightCase => JSON.parse(readFileSync(join(import.meta.dirname, '../../examples/cases', name), 'utf8'));
const RANK: Record<Recommendation, number> = { go: 0, conditional: 1, 'no-go': 2 };
const SQRT3 = Math.sqrt(3);

describe('winding current from the vector group (case format "Winding current"; IEEE C37.91 / C57.109 practice)', () => {
  const dyn11: Unit = { serial: 'T', phases: 3, ratedKVA: 12000, hvKV: 66, lvKV: 11, impedancePercent: 8, vectorGroup: 'Dyn11' };

  it('reproduces the computed example of references.md: Dyn11 LV ground fault, HV relay 424.3 A = 4.042 pu → winding 7.000 pu', () => {
    // references.md: 12 MVA 66/11 kV Dyn11, HV base 104.97 A, 424.3 A = 4.042 pu of line current → 7.000 pu winding current
    expect(ratedCurrentA(12000, 66, 3)).toBeCloseTo(104.97, 2);
    const k = windingCurrentFactor(dyn11, { type: 'phase-to-ground', side: 'hv', location: 'lv' });
    expect(k.factor).toBeCloseTo(SQRT3, 12); // 1/√3 of the winding per-unit current reaches the delta-side lines
    const tf = computeThroughFault(dyn11, { occurredAt: '2026-01-01T00:00:00Z', type: 'phase-to-ground', side: 'hv', location: 'lv', shots: [{ currentKA: 0.4243, durationS: 0.1 }] }, [], criteriaV2)!;
    expect(tf.currentPerUnit).toBeCloseTo(7.0, 2);
    expect(tf.currentBasis).toBe('line-converted');
    // the same fault read on the LV side: 4 409 A = 7.000 pu of 629.84 A (references.md)
    expect(ratedCurrentA(12000, 11, 3)).toBeCloseTo(629.84, 2);
    const lv = computeThroughFault(dyn11, { occurredAt: '2026-01-01T00:00:00Z', type: 'phase-to-ground', side: 'lv', shots: [{ currentKA: 4.409, durationS: 0.1 }] }, [], criteriaV2)!;
    expect(lv.windingCurrentFactor).toBe(1);
    expect(lv.currentPerUnit).toBeCloseTo(7.0, 3);
  });

  it('puts 2/√3 of the line per-unit current in one winding for a phase-to-phase fault at delta terminals (delta relations)', () => {
    // Delta winding, line currents I, −I, 0: winding currents 2I/3, −I/3, −I/3 in amperes; per unit of the winding's
    // rated current (rated line current/√3) the largest is (2/3)·√3 = 2/√3 of the line per-unit current (computed by hand).
    expect(windingCurrentFactor(dyn11, { type: 'phase-to-phase', side: 'hv' }).factor).toBeCloseTo(2 / SQRT3, 12);
    // phase-to-phase on the wye side read on the delta side: a delta line carries 2/√3 of the winding pu, so k = √3/2
    expect(windingCurrentFactor(dyn11, { type: 'phase-to-phase', side: 'hv', location: 'lv' }).factor).toBeCloseTo(SQRT3 / 2, 12);
    expect(windingCurrentFactor(dyn11, { type: 'phase-to-phase', side: 'lv' }).factor).toBe(1);
    expect(windingCurrentFactor(dyn11, { type: 'three-phase', side: 'hv' }).factor).toBe(1);
  });

  it('does not guess: zigzag, no vector group, or a ground fault measured at delta terminals use the line current and say so', () => {
    const zn = windingCurrentFactor({ phases: 3, vectorGroup: 'ZNyn11' }, { type: 'phase-to-ground', side: 'hv' });
    expect(zn).toMatchObject({ factor: null, basis: 'line-assumed' });
    expect(zn.reason).toMatch(/enter the winding current or attach the relay record/);
    expect(windingCurrentFactor({ phases: 3 }, { type: 'phase-to-phase', side: 'lv' }).basis).toBe('line-assumed');
    expect(windingCurrentFactor({ phases: 3 }, { type: 'three-phase', side: 'lv' })).toMatchObject({ factor: 1, basis: 'line-converted' });
    expect(windingCurrentFactor(dyn11, { type: 'phase-to-ground', side: 'hv' }).basis).toBe('line-assumed');
    expect(windingCurrentFactor(dyn11, { type: 'phase-to-ground', side: 'lv', currentIs: 'winding' })).toMatchObject({ factor: 1, basis: 'winding' });
    expect(windingCurrentFactor({ phases: 1, vectorGroup: 'Ii0' }, { type: 'phase-to-ground', side: 'hv' })).toMatchObject({ factor: 1 });
  });

  it('judges the Dyn11 unit that stayed in service at 7.0 × rated: high duty, take out of service for tests (revision 1: go at 4.0 ×)', () => {
    const r = screenCase(example('rev2-winding-current-dyn11.json'));
    expect(r.throughFault!.highDuty).toBe(true); // category III: segment from 0.5·12.5 = 6.25 pu (IEEE C57.109, from memory)
    expect(r.recommendation).toBe('no-go');
    expect(r.reasons[0]).toMatch(/7\.0 × rated winding current.*take out of service for tests/);
    expect(r.reasons.join('\n')).not.toMatch(/do not re-energis/i);
  });

  it('asks for the winding current on the duty-only path when it cannot be derived: go becomes conditional', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.fault = { ...d.fault!, type: 'phase-to-phase', transformerTripped: false };
      delete d.postFault;
    }));
    expect(r.throughFault!.currentBasis).toBe('line-assumed');
    expect(r.recommendation).toBe('conditional');
    expect(r.reasons.join('\n')).toMatch(/enter the winding current or attach the relay record/);
  });
});

describe('basis and confidence', () => {
  it('does not let an aged insulation (PF20 above 1 %, unchanged) corroborate one reactance change (revision 1: no-go)', () => {
    const r = screenCase(example('rev2-aged-insulation.json'));
    expect(ind(r, 'powerFactor.CH.pf20Percent')).toMatchObject({ level: 'watch', basis: 'state' });
    expect(ind(r, 'reactance.B.shiftPercent')).toMatchObject({ level: 'investigate', basis: 'change' });
    expect(r.recommendation).toBe('conditional');
    expect(r.reasons.join('\n')).not.toMatch(/Independent methods agree/);
  });

  it('keeps state items alone at watch: go stays go and nothing corroborates', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.unit.vectorGroup = 'YNd1';
      d.baseline!.dissipationPercent = { CH: 1.4, CL: 1.4, CHL: 1.4 };
      d.postFault!.dissipationPercent = { CH: 1.4, CL: 1.4, CHL: 1.4 };
      d.postFault!.turnsRatio = { A: 2.3094 * 1.008, B: 2.3094 * 1.008, C: 2.3094 * 1.008 };
      d.postFault!.reactance = { A: { percent: 11.2 }, B: { percent: 11.8 }, C: { percent: 11.8 } };
      d.baseline!.reactance = { A: { percent: 11.2 }, B: { percent: 11.8 }, C: { percent: 11.8 } };
    }));
    expect(ind(r, 'ratio.A.deviationFromNameplatePercent')).toMatchObject({ level: 'watch', basis: 'state' });
    expect(ind(r, 'reactance.A.deviationFromAveragePercent')).toMatchObject({ level: 'watch', basis: 'state' });
    expect(corroboratingMethods(r.indicators, criteriaV2)).toEqual([]);
    expect(r.recommendation).toBe('go');
  });

  it('caps sister comparisons after corroboration: two sister findings never give no-go', () => {
    const sisters = Array.from({ length: 5 }, (_, k) => ({ serial: `S${k}`, capacitancePF: { CH: 3000, CL: 10000, CHL: 5000 + k }, reactance: { A: { percent: 11.6 }, B: { percent: 11.6 }, C: { percent: 11.6 } } }));
    const r = screenCase(edit(cleanCase(), (d) => {
      delete d.baseline;
      d.sisters = sisters;
      d.postFault!.capacitancePF!.CHL = 5200; // +4 % against the sisters' median: investigate, capped there
      d.postFault!.reactance!.A = { percent: 11.9 }; // +2.6 %: investigate (L = 2 %)
    }));
    expect(ind(r, 'capacitance.CHL.shiftPercent')).toMatchObject({ level: 'investigate', basis: 'sisters' });
    expect(r.reasons.join('\n')).toMatch(/Independent methods agree \(capacitance, reactance\).*level raised from investigate to critical/);
    expect(r.overallLevel).toBe('investigate');
    expect(r.recommendation).toBe('conditional');
  });

  it('never writes "raised from critical to critical"', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.postFault!.capacitancePF!.CHL = 5300; // +6 %: critical
      d.postFault!.reactance!.B = { percent: 11.95 }; // +3 %: critical
    }));
    expect(r.recommendation).toBe('no-go');
    const text = r.reasons.join('\n');
    expect(text).toMatch(/Independent methods agree \(capacitance, reactance\).*critical stands/);
    expect(text).not.toMatch(/raised from critical to critical/);
  });

  it('carries basis on every indicator and engineRevision 2', () => {
    const r = screenCase(example('no-go-readings.json'));
    expect(r.engineRevision).toBe(2);
    for (const i of r.indicators) expect(['change', 'sisters', 'phase-comparison', 'state', 'duty']).toContain(i.basis);
  });
});

describe('reading doubts', () => {
  it('makes a magnetised core unreliable ("demagnetise and repeat"), not a finding (revision 1: conditional)', () => {
    const r = screenCase(example('rev2-remanence.json'));
    expect(r.unreliable).toEqual(['excitationCurrentMA']);
    expect(r.recommendation).toBe('go');
    expect(r.followUps.join('\n')).toMatch(/Demagnetise the core and repeat the excitation current/);
    const demag = screenCase(edit(example('rev2-remanence.json'), (d) => (d.postFault!.demagnetised = true)));
    expect(demag.unreliable).toEqual([]);
    expect(ind(demag, 'excitation.A.changePercent')!.level).toBe('investigate'); // > 10 % (IEEE C57.152 practice, from memory)
    expect(demag.recommendation).toBe('conditional');
  });

  it('makes turns ratio and winding resistance unreliable on a tap mismatch', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.baseline!.turnsRatio = { A: 4, B: 4, C: 4 };
      d.postFault!.turnsRatio = { A: 4.1, B: 4.1, C: 4.1 };
      d.baseline!.windingResistanceOhm = { A: 0.4, B: 0.4, C: 0.4 };
      d.postFault!.windingResistanceOhm = { A: 0.42, B: 0.42, C: 0.42 };
      d.postFault!.tapPosition = '10';
    }));
    expect(r.unreliable).toEqual(expect.arrayContaining(['turnsRatio', 'windingResistanceOhm', 'reactance.A']));
    expect(ind(r, 'ratio.A.changePercent')!.level).toBe('ok');
    expect(ind(r, 'resistance.A.changePercent')!.note).toMatch(/tap mismatch.*repeat at tap 9b/);
  });

  it('makes a sweep trace taken at another tap than its baseline trace unreliable', () => {
    const r = screenCase(edit(highDutyCompleteCase(), (d) => {
      d.sweeps![1].tapPosition = '12';
      d.sweeps![1].baselineTapPosition = '9b';
    }));
    expect(r.unreliable).toEqual(['sweep.HV-B-open']);
    expect(r.recommendation).toBe('no-go'); // a required sweep cannot be used after a high-duty fault
    expect(r.missing).toEqual([]);
  });

  it('treats a PF20 rise below 0.1 point as within repeatability (revision 1: watch on a 60 % rise of a low PF)', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.baseline!.dissipationPercent!.CH = 0.1;
      d.postFault!.dissipationPercent!.CH = 0.16; // +60 %, +0.06 point
    }));
    expect(ind(r, 'powerFactor.CH.riseFromBaselinePercent')).toMatchObject({ level: 'ok' });
    expect(ind(r, 'powerFactor.CH.riseFromBaselinePercent')!.note).toMatch(/within repeatability/);
    expect(screenCase(edit(cleanCase(), (d) => {
      d.baseline!.dissipationPercent!.CH = 0.1;
      d.postFault!.dissipationPercent!.CH = 0.16;
    }), criteriaV1).indicators.find((i) => i.key === 'powerFactor.CH.riseFromBaselinePercent')!.level).toBe('watch'); // criteria set 1 has no floor
  });

  it('judges a PF rise across more than 10 °C with low confidence, at most watch, never corroborating', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.baseline!.temperatureC = 15;
      d.postFault!.temperatureC = 35;
      d.postFault!.dissipationPercent!.CH = 0.9; // a large rise after correction
      d.postFault!.reactance!.B = { percent: 11.75 }; // +1.3 %: watch
    }));
    const pf = ind(r, 'powerFactor.CH.riseFromBaselinePercent')!;
    expect(pf).toMatchObject({ level: 'watch', lowConfidence: true });
    expect(pf.note).toMatch(/temperature correction uncertain/);
    expect(corroboratingMethods(r.indicators, criteriaV2)).toEqual(['reactance']);
    expect(r.recommendation).toBe('go');
  });

  it('corrects resistance with the oil temperature only after 4 h de-energised; otherwise low confidence, at most watch', () => {
    const base = edit(cleanCase(), (d) => {
      d.baseline!.windingResistanceOhm = { A: 0.4, B: 0.4, C: 0.4 };
      d.postFault!.windingResistanceOhm = { A: 0.42, B: 0.4, C: 0.4 }; // +5 % at equal temperatures
    });
    const early = screenCase(edit(base, (d) => (d.postFault!.hoursDeEnergised = 1)));
    expect(ind(early, 'resistance.A.changePercent')).toMatchObject({ level: 'watch', lowConfidence: true });
    const late = screenCase(edit(base, (d) => (d.postFault!.hoursDeEnergised = 5)));
    expect(ind(late, 'resistance.A.changePercent')!.level).toBe('investigate'); // > 2 % (common practice, from memory)
    const measured = screenCase(edit(base, (d) => (d.postFault!.windingTemperatureC = 20)));
    expect(ind(measured, 'resistance.A.changePercent')!.lowConfidence).toBeUndefined();
  });

  it('calls a capacitance entered in nF implausible, not a critical deformation (revision 1: no-go)', () => {
    const r = screenCase(example('rev2-implausible-nf.json'));
    expect(r.unreliable).toEqual(['capacitance.CL']);
    expect(ind(r, 'capacitance.CL.shiftPercent')!.note).toMatch(/implausible against the reference — check the unit of measure and the connection/);
    expect(r.recommendation).toBe('conditional');
  });

  it('calls a line-voltage ratio entered for a Yd unit implausible (√3 off the expected winding ratio)', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.unit.vectorGroup = 'YNd1';
      d.postFault!.turnsRatio = { A: 4, B: 4, C: 4 };
    }));
    expect(r.unreliable).toEqual(['turnsRatio']);
  });
});

describe('required tests', () => {
  it('needs a sweep of each HV phase after a high-duty fault: one trace on phase A is not enough (revision 1: go)', () => {
    const r = screenCase(edit(highDutyCompleteCase(), (d) => (d.sweeps = d.sweeps!.slice(0, 1))));
    expect(r.missing).toEqual(['sweep.hv.B', 'sweep.hv.C']);
    expect(r.recommendation).toBe('no-go');
    expect(r.reasons[0]).toMatch(/hold pending tests: sweeps of HV phases B and C/);
  });

  it('says a phase whose trace has no baseline trace is not judged for that reason, not that its sweep is missing', () => {
    const r = screenCase(edit(highDutyCompleteCase(), (d) => {
      d.sweeps = d.sweeps!.map((s) => (s.phase === 'A' ? { ...s, baseline: undefined } : s));
    }));
    // Still required (Gapsight rule, revision 2: each HV phase needs a judged trace), but named for what it lacks.
    expect(r.missing).toEqual(['sweep.hv.A.no-baseline']);
    expect(lacksBaselineTrace(r.missing[0])).toBe(true);
    expect(lacksBaselineTrace('sweep.hv.A')).toBe(false);
    expect(describeRequired('sweep.hv.A.no-baseline')).toBe('sweep of HV phase A (no baseline trace to compare with)');
    expect(describeRequired('sweep.hv.no-baseline')).toBe('HV open-circuit sweep (no baseline trace to compare with)');
    expect(r.recommendation).toBe('no-go');
    expect(r.reasons[0]).toMatch(/hold pending tests: sweep of HV phase A \(no baseline trace to compare with\)$/);
  });

  it('says the same of a single-phase unit whose only trace has no baseline trace', () => {
    const r = screenCase(edit(highDutyCompleteCase(), (d) => {
      d.unit.phases = 1;
      d.sweeps = d.sweeps!.slice(0, 1).map((s) => ({ ...s, baseline: undefined }));
    }));
    expect(r.missing).toContain('sweep.hv.no-baseline');
  });

  it('accepts phases A and C compared with each other, and B present, when there is no baseline trace', () => {
    const r = screenCase(example('rev2-phase-comparison.json'));
    expect(r.missing).toEqual([]);
    expect(ind(r, 'sweep.hv.AC.class')).toMatchObject({ value: 'normal', basis: 'phase-comparison' });
    // DL/T 911: class normal needs R_MF ≥ 1.0; R is capped at 10 (references.md).
    const rMF = ind(r, 'sweep.hv.AC.rMF')!;
    expect(rMF).toMatchObject({ basis: 'phase-comparison', method: 'sweep' });
    expect(rMF.value as number).toBeGreaterThanOrEqual(1);
    expect(rMF.value as number).toBeLessThanOrEqual(10);
    expect(ind(r, 'sweep.hv.AC.rLF')).toBeUndefined(); // the core's low band differs between limbs
    expect(r.recommendation).toBe('go');
  });

  it('asks for the sweeps when a change in capacitance reaches investigate (a second method)', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.postFault!.capacitancePF!.CHL = 5175)));
    expect(r.missing).toEqual(['sweep.hv.A', 'sweep.hv.B', 'sweep.hv.C']);
    expect(r.recommendation).toBe('conditional');
  });

  it('requires only CH of an auto-transformer and CH, CT, CHT of an auto with tertiary (revision 1: never complete)', () => {
    const auto = screenCase(example('rev2-auto.json'));
    expect(auto.missing).toEqual([]);
    expect(auto.recommendation).toBe('go');
    expect(criteriaV2.capacitance.requiredByWindings['auto-tertiary']).toEqual(['CH', 'CT', 'CHT']);
    expect(criteriaV1.capacitance.requiredByWindings.auto).toEqual(['CH', 'CL', 'CHL']); // version 1 is published: unchanged
  });
});

describe('bushings, ratio and reactance state items', () => {
  it('judges bushing C1 shifts (IEEE 62-1995 lineage: 5 % investigate, 10 % critical) and notes bushings on CH', () => {
    const r = screenCase(example('rev2-bushings.json'));
    expect(ind(r, 'bushing.H2.c1ShiftPercent')).toMatchObject({ level: 'investigate', basis: 'change', method: 'bushing' });
    expect(ind(r, 'bushing.H2.c1ShiftPercent')!.value).toBeCloseTo((100 * (443.1 - 418)) / 418, 9); // computed by hand
    expect(ind(r, 'capacitance.CH.shiftPercent')!.note).toMatch(/may sit in the HV bushings/);
    expect(r.recommendation).toBe('conditional');
    const worse = screenCase(edit(example('rev2-bushings.json'), (d) => (d.postFault!.bushings!.H2.c1PF = 460)));
    expect(ind(worse, 'bushing.H2.c1ShiftPercent')!.level).toBe('critical');
    expect(worse.recommendation).toBe('no-go');
  });

  it('takes the expected ratio from the vector group (IEEE C57.12.00: 115/13.8 = 8.3333, 8.3650 is +0.38 %)', () => {
    const yy: Unit = { serial: 'T', phases: 3, ratedKVA: 10000, hvKV: 115, lvKV: 13.8, impedancePercent: 8, vectorGroup: 'Yy0' };
    expect(nameplateRatio(yy).ratio).toBeCloseTo(8.3333, 4);
    const r = screenCase(edit(cleanCase(), (d) => {
      d.unit = yy;
      d.postFault!.turnsRatio = { A: 8.365 };
    }));
    expect(ind(r, 'ratio.A.deviationFromNameplatePercent')!.value).toBeCloseTo(0.38, 2); // references.md, computed
    expect(nameplateRatio({ ...yy, vectorGroup: 'YNd1', hvKV: 132, lvKV: 33 }).ratio).toBeCloseTo(132 / (SQRT3 * 33), 12);
    expect(nameplateRatio({ ...yy, vectorGroup: 'Dyn11', hvKV: 66, lvKV: 11 }).ratio).toBeCloseTo((SQRT3 * 66) / 11, 12);
    expect(nameplateRatio({ ...yy, vectorGroup: undefined }).ratio).toBeNull();
  });

  it('flags a per-phase reactance more than 3 % from the phases’ mean at watch, a state (IEEE C57.152 practice, from memory)', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.postFault!.reactance = { A: { percent: 11.0 }, B: { percent: 11.6 }, C: { percent: 11.6 } })));
    const a = ind(r, 'reactance.A.deviationFromAveragePercent')!;
    expect(a.value).toBeCloseTo((100 * (11.0 - 11.4)) / 11.4, 9); // computed by hand: mean 11.4 %
    expect(a).toMatchObject({ level: 'watch', basis: 'state' });
  });

  it('tells a thermal-region event as time against the allowed time (IEEE C57.109 thermal curve: 300 s at 3 × rated)', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.fault!.shots = [{ currentKA: (3 * 40000) / (SQRT3 * 33) / 1000, durationS: 360 }])));
    expect(r.throughFault!.highDuty).toBe(false);
    expect(r.throughFault!.thermalDurationPercent).toBeCloseTo(120, 6); // 360 s of the 300 s the curve allows (references.md)
    expect(ind(r, 'duty.thermalDurationPercent')!.level).toBe('investigate');
    expect(ind(r, 'duty.eventDutyPercent')!.level).toBe('ok');
    expect(r.reasons.join('\n')).toMatch(/360 s of the 300 s the thermal curve allows/);
  });
});

describe('properties', () => {
  const capCase = (shift: number) => edit(cleanCase(), (d) => (d.postFault!.capacitancePF!.CHL = 5000 * (1 + shift / 100)));
  const xCase = (shift: number) => edit(cleanCase(), (d) => (d.postFault!.reactance!.B = { percent: 11.6 * (1 + shift / 100) }));

  it('never improves the recommendation when one capacitance or reactance reading moves further from its reference', () => {
    // Within the plausible range (a reading 1.5 × off its reference is an entry error, judged unreliable instead).
    fc.assert(
      fc.property(fc.double({ min: -30, max: 30, noNaN: true }), fc.double({ min: 0, max: 3, noNaN: true }), (s, extra) => {
        const further = s >= 0 ? s + extra : s - extra;
        for (const build of [capCase, xCase]) {
          expect(RANK[screenCase(build(further)).recommendation]).toBeGreaterThanOrEqual(RANK[screenCase(build(s)).recommendation]);
        }
      }),
      { numRuns: 150 },
    );
  });

  it('never takes a go below go, nor corroborates, by adding or worsening a state item alone', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.3, max: 3, noNaN: true }),
        fc.double({ min: 0, max: 9, noNaN: true }),
        fc.double({ min: -8, max: 8, noNaN: true }),
        (df, ratioOff, xOff) => {
          const r = screenCase(edit(cleanCase(), (d) => {
            d.unit.vectorGroup = 'YNd1';
            d.baseline!.dissipationPercent = { CH: df, CL: df, CHL: df };
            d.postFault!.dissipationPercent = { CH: df, CL: df, CHL: df };
            d.postFault!.turnsRatio = { A: 2.3094 * (1 + ratioOff / 100) };
            const x = { percent: 11.6 * (1 + xOff / 100) };
            d.baseline!.reactance!.A = x;
            d.postFault!.reactance!.A = x;
          }));
          expect(corroboratingMethods(r.indicators, criteriaV2)).toEqual([]);
          expect(r.recommendation).toBe('go');
        },
      ),
      { numRuns: 150 },
    );
  });
});
