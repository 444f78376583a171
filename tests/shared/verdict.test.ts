// Verdict rules of the case format, each on a case built for it.
import { describe, expect, it } from 'vitest';
import { resultSchema } from '../../shared/schemas/result.js';
import { screenCase } from '../../shared/screening/index.js';
import { cleanCase, edit, highDutyCompleteCase } from './case-builder.js';

const level = (r: ReturnType<typeof screenCase>, key: string) => r.indicators.find((i) => i.key === key)?.level;

// brief.md, "Cautions (shown in the app, the PDF and the e-mail)", sentence by sentence.
const BRIEF_CAUTIONS = [
  'The recommendation is decision support for qualified staff.',
  "Re-energising a transformer after a fault is a safety decision governed by the utility's own procedures, local codes and licensed practice; criteria defaults come from published guidance and common practice and must be reviewed by the user's engineers.",
  "High-voltage tests must follow the test equipment's and the utility's safety rules (isolation, earthing, permits).",
  'A go cannot rule out deformation that the tests taken cannot see.',
  'DC tests (winding resistance) leave the core magnetised: take excitation current and sweeps first, or demagnetise before them.',
];

describe('screenCase verdict', () => {
  it('recommends go for a clean tripped unit with every required quantity present', () => {
    const r = screenCase(cleanCase());
    expect(r.recommendation).toBe('go');
    expect(r.missing).toEqual([]);
    expect(r.cautions).toEqual(BRIEF_CAUTIONS);
    expect(resultSchema.safeParse(r).success).toBe(true);
  });

  it('answers no-go when an internal protection operated, whatever the readings', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.fault!.protectionOperated = ['overcurrent', 'sudden-pressure'])));
    expect(r.recommendation).toBe('no-go');
    expect(r.reasons[0]).toMatch(/investigate as an internal fault/);
  });

  it('does not treat a Buchholz alarm as an internal fault, but never gives go before its gas is analysed (revision 2)', () => {
    // Revision 1 ignored the alarm and answered go; case format revision 2: the alarm adds dissolvedGasPPM and keeps a go conditional.
    const r = screenCase(edit(cleanCase(), (d) => (d.fault!.protectionOperated = ['buchholz-alarm', 'overcurrent'])));
    expect(r.recommendation).toBe('conditional');
    expect(r.missing).toEqual(['dissolvedGasPPM']);
    expect(r.reasons.join('\n')).toMatch(/Buchholz alarm: gas collected in the relay must be analysed/);
    const analysed = screenCase(edit(cleanCase(), (d) => {
      d.fault!.protectionOperated = ['buchholz-alarm'];
      d.baseline!.dissolvedGasPPM = { H2: 10, C2H2: 0 };
      d.postFault!.dissolvedGasPPM = { H2: 12, C2H2: 0 };
    }));
    expect(analysed.missing).toEqual([]);
    expect(analysed.recommendation).toBe('conditional');
  });

  it('takes the duty-only path (go with gas follow-ups) when the unit stayed in service and the fault was not high duty', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.fault!.transformerTripped = false;
      delete d.postFault;
    }));
    expect(r.recommendation).toBe('go');
    expect(r.missing).toEqual([]);
    // Revision 2 wording: the go rests on the duty figures alone; samples count from the event (the unit never stopped).
    expect(r.reasons[0]).toMatch(/rests on the duty figures alone, with no post-fault tests/);
    // case-format.md: follow-ups of a unit that stayed in service count from the event ("oil sample now, again at 24 h").
    expect(r.followUps).toEqual(expect.arrayContaining(['Dissolved-gas sample now (the unit stayed in service)', 'Dissolved-gas sample again 24 h after the event']));
    expect(r.followUps.join('\n')).not.toMatch(/re-energis/);
  });

  it('lets readings that were given overrule the duty-only go', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.fault!.transformerTripped = false;
      d.postFault!.capacitancePF!.CHL = 5175; // +3.5 %
    }));
    expect(r.recommendation).toBe('conditional');
  });

  it('requires the full test set when a unit stayed in service through a high-duty fault', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.fault = { ...d.fault!, transformerTripped: false, shots: [{ currentKA: 6, durationS: 0.1 }] };
    }));
    expect(r.throughFault!.highDuty).toBe(true);
    expect(r.recommendation).toBe('no-go');
    expect(r.missing).toEqual(['sweep.hv.A', 'sweep.hv.B', 'sweep.hv.C', 'dissolvedGasPPM', 'excitationCurrentMA', 'windingResistanceOhm']);
    // A unit in service is never told "do not re-energise": it is to be taken out of service for the tests.
    expect(r.reasons[0]).toMatch(/take out of service for tests: sweeps of HV phases A, B and C, dissolved gases/);
  });

  it('asks to complete missing required quantities (conditional) after a fault that was not high duty', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      delete d.postFault!.capacitancePF!.CHL;
      delete d.postFault!.reactance!.B;
    }));
    expect(r.recommendation).toBe('conditional');
    expect(r.missing).toEqual(['capacitance.CHL', 'reactance.B']);
    expect(r.reasons.join('\n')).toMatch(/Complete: CHL capacitance, reactance phase B/);
  });

  it('holds pending tests (no-go) when required quantities are missing after a high-duty fault', () => {
    const r = screenCase(edit(highDutyCompleteCase(), (d) => delete d.postFault!.windingResistanceOhm));
    expect(r.recommendation).toBe('no-go');
    expect(r.missing).toEqual(['windingResistanceOhm']);
    expect(r.reasons[0]).toMatch(/^High-duty fault \(8\.6 × rated winding current, \d+ % of the design force\): hold pending tests: winding resistance$/);
  });

  it('recommends go after a high-duty fault when the full test set is present and clean', () => {
    const r = screenCase(highDutyCompleteCase());
    expect(r.missing).toEqual([]);
    expect(r.recommendation).toBe('go');
  });

  it('uses unit.requiredCapacitance instead of the windings default', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.unit.requiredCapacitance = ['CH', 'CL', 'CHL', 'CT'])));
    expect(r.missing).toEqual(['capacitance.CT']);
  });

  it('requires CT, CHT and CLT for three-winding units', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.unit.windings = 'three-winding')));
    expect(r.missing).toEqual(['capacitance.CT', 'capacitance.CHT', 'capacitance.CLT']);
  });

  it('counts a quantity as missing when the post-fault value has no reference', () => {
    const r = screenCase(edit(cleanCase(), (d) => delete d.baseline!.capacitancePF!.CL));
    expect(r.missing).toEqual(['capacitance.CL']);
  });

  it('marks a configuration whose GST − GST-guard differs from UST by ≥ 1 % unreliable and treats it as missing', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.postFault!.capacitancePF!.CHL = 5400; // +8 %: would be critical if judged
      d.postFault!.capacitanceModes = { CHL: { gstPF: 8460, gstGuardPF: 3000, ustPF: 5400 } }; // (5460 − 5400)/5400 = 1.11 %
    }));
    expect(r.unreliable).toEqual(['capacitance.CHL']);
    expect(level(r, 'capacitance.CHL.shiftPercent')).toBe('ok');
    expect(r.recommendation).toBe('conditional');
    expect(r.followUps.join('\n')).toMatch(/Repeat the CHL capacitance test/);
  });

  it('makes post-fault reactance unreliable when the tap position differs from the baseline', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.postFault!.tapPosition = '10';
      d.postFault!.reactance!.A = { percent: 12.5 };
    }));
    expect(r.unreliable).toEqual(['reactance.A', 'reactance.B', 'reactance.C']);
    expect(level(r, 'reactance.A.shiftPercent')).toBe('ok');
    expect(r.indicators.find((i) => i.key === 'reactance.A.shiftPercent')!.note).toMatch(/tap mismatch \(baseline at tap 9b, post-fault at 10\): repeat at tap 9b/);
    expect(r.recommendation).toBe('conditional');
  });

  it('maps any critical indicator to no-go', () => {
    const r = screenCase(edit(cleanCase(), (d) => (d.postFault!.capacitancePF!.CH = 3150))); // +5 %
    expect(level(r, 'capacitance.CH.shiftPercent')).toBe('critical');
    expect(r.recommendation).toBe('no-go');
    expect(r.reasons.join('\n')).toContain('CH capacitance shifted +5.00 % against the 2019-05-02 baseline (critical from 5 %)');
  });

  it('raises the level one step when two independent methods flag at watch or above, naming where they agree', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.postFault!.capacitancePF!.CHL = 5110; // +2.2 % watch
      d.postFault!.reactance!.B = { percent: 11.6 * 1.012 }; // +1.2 % watch (L = 2 %)
    }));
    expect(r.overallLevel).toBe('investigate');
    expect(r.recommendation).toBe('conditional');
    expect(r.reasons.join('\n')).toMatch(/Independent methods agree \(capacitance, reactance\).*raised from watch to investigate/);
  });

  it('counts capacitance and its power factor as one method', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.postFault!.capacitancePF!.CHL = 5110; // watch
      d.postFault!.dissipationPercent!.CHL = 0.5; // PF rise ≈ 67 %: watch
    }));
    expect(level(r, 'powerFactor.CHL.riseFromBaselinePercent')).toBe('watch');
    expect(r.overallLevel).toBe('watch');
  });

  it('does not count sisters or duty as corroborating methods', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.postFault!.capacitancePF!.CHL = 5110; // watch
      d.fault!.shots = [{ currentKA: 7.2, durationS: 0.1 }]; // above the design maximum: duty watch
      d.sisters = Array.from({ length: 5 }, (_, k) => ({ serial: `S${k}`, capacitancePF: { CHL: 5000 + k } }));
      d.baseline!.excitationCurrentMA = { A: 40, B: 28, C: 40 };
    }));
    // Revision 2: sister statistics are a state (watch at most) — revision 1 gave investigate and a conditional.
    expect(level(r, 'sisters.capacitance.CHL.modifiedZ')).toBe('watch');
    expect(level(r, 'duty.forceRatioPercent')).toBe('watch');
    expect(r.reasons.join('\n')).not.toMatch(/Independent methods agree/);
    expect(r.overallLevel).toBe('watch');
  });

  it('says that an ok capacitance does not rule out axial movement when capacitance is the only evidence', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      delete d.postFault!.reactance;
      delete d.baseline!.reactance;
      d.fault!.transformerTripped = false;
    }));
    // brief.md: an ok capacitance does not rule out axial movement — say so when capacitance is the only evidence.
    const axial = /an ok capacitance does not rule out axial movement/;
    expect(r.reasons.filter((x) => axial.test(x))).toHaveLength(1);
    expect(screenCase(cleanCase()).reasons.filter((x) => axial.test(x))).toEqual([]);
  });

  it("uses the sisters' median when the unit has no own baseline, capped at investigate", () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      delete d.baseline;
      d.postFault!.capacitancePF!.CHL = 5400; // +8 % against the sisters' median
      d.sisters = Array.from({ length: 3 }, (_, k) => ({ serial: `S${k}`, capacitancePF: { CH: 3000, CL: 10000, CHL: 4990 + 10 * k }, reactance: { A: { percent: 11.6 }, B: { percent: 11.6 }, C: { percent: 11.6 } } }));
    }));
    const ind = r.indicators.find((i) => i.key === 'capacitance.CHL.shiftPercent')!;
    expect(ind.value).toBeCloseTo(8, 9);
    expect(ind.level).toBe('investigate');
    expect(ind.note).toContain("sisters' median as reference");
    expect(r.missing).toEqual([]);
    expect(r.recommendation).toBe('conditional');
  });

  it('judges capacitance against previous separately with the same thresholds', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.previous = { takenAt: '2024-06-20', capacitancePF: { CHL: 4900 } };
      d.postFault!.capacitancePF!.CHL = 5050; // +1 % vs baseline, +3.06 % vs previous
    }));
    expect(level(r, 'capacitance.CHL.shiftPercent')).toBe('ok');
    expect(level(r, 'capacitance.CHL.shiftFromPreviousPercent')).toBe('investigate');
    expect(r.recommendation).toBe('conditional');
  });
});

describe('indicator levels of criteria set 1', () => {
  const withPost = (f: Parameters<typeof edit>[1]) => screenCase(edit(cleanCase(), f));

  it('judges per-phase reactance shifts against 0.5·L, L and 1.5·L with L = 2 % for a 40 MVA unit', () => {
    const at = (pct: number) => level(withPost((d) => (d.postFault!.reactance!.A = { percent: 11.6 * (1 + pct / 100) })), 'reactance.A.shiftPercent');
    expect(at(0.99)).toBe('ok');
    expect(at(1)).toBe('watch');
    expect(at(2)).toBe('investigate');
    expect(at(3)).toBe('critical');
  });

  it('uses L = 1 % above 100 MVA (IEC category III)', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.unit.ratedKVA = 150000;
      d.postFault!.reactance!.A = { percent: 11.6 * 1.01 };
    }));
    expect(level(r, 'reactance.A.shiftPercent')).toBe('investigate');
  });

  it('judges the spread change as signed points (a rise of 1 is watch, 2 investigate, a fall ok)', () => {
    const spread = (a: number, c: number) => withPost((d) => (d.postFault!.reactance = { A: { percent: a }, B: { percent: 11.6 }, C: { percent: c } }));
    expect(level(spread(11.6 + 0.0595, 11.6 - 0.0595), 'reactance.phaseSpreadChangePoints')).toBe('watch');
    expect(level(spread(11.72, 11.48), 'reactance.phaseSpreadChangePoints')).toBe('investigate');
    const fall = screenCase(edit(cleanCase(), (d) => {
      d.baseline!.reactance = { A: { percent: 11.8 }, B: { percent: 11.6 }, C: { percent: 11.4 } };
    }));
    expect(level(fall, 'reactance.phaseSpreadChangePoints')).toBe('ok');
  });

  it('flags a three-phase equivalent more than 3 % from nameplate as watch', () => {
    const e = (pct: number) => (60 * pct * 2 * 132 * 132) / (3 * 40000); // inverse of the IEEE 62 formula at 2 A
    const r = withPost((d) => (d.postFault!.threePhaseEquivalent = { e12: e(10.85), e23: e(10.85), e31: e(10.85), amps: 2 }));
    expect(level(r, 'reactance.threePhase.deviationFromNameplatePercent')).toBe('watch');
  });

  it('judges the PF rise from 50 % watch and 100 % investigate; an absolute PF20 of 1 % is watch at most', () => {
    expect(level(withPost((d) => (d.postFault!.dissipationPercent!.CH = 0.46)), 'powerFactor.CH.riseFromBaselinePercent')).toBe('watch');
    expect(level(withPost((d) => (d.postFault!.dissipationPercent!.CH = 0.61)), 'powerFactor.CH.riseFromBaselinePercent')).toBe('investigate');
    const aged = screenCase(edit(cleanCase(), (d) => {
      d.baseline!.dissipationPercent!.CH = 1.5;
      d.postFault!.dissipationPercent!.CH = 1.5;
    }));
    expect(level(aged, 'powerFactor.CH.pf20Percent')).toBe('watch');
    expect(aged.recommendation).toBe('go');
  });

  it('gives a null PF20 with a note outside the temperature table or without a temperature', () => {
    const hot = withPost((d) => (d.postFault!.temperatureC = 75)).indicators.find((i) => i.key === 'powerFactor.CH.pf20Percent')!;
    expect(hot.value).toBeNull();
    expect(hot.note).toMatch(/outside the correction table/);
    const none = withPost((d) => delete d.postFault!.temperatureC).indicators.find((i) => i.key === 'powerFactor.CH.pf20Percent')!;
    expect(none.value).toBeNull();
    expect(none.note).toMatch(/no insulation temperature/);
  });

  it('judges acetylene from 1 ppm investigate and 5 ppm critical, and hydrogen ≥ 100 ppm with acetylene critical', () => {
    const gas = (c2h2: number, h2: number) => screenCase(edit(highDutyCompleteCase(), (d) => (d.postFault!.dissolvedGasPPM = { H2: h2, CH4: 5, C2H6: 3, C2H4: 2, C2H2: c2h2 })));
    expect(level(gas(0.9, 10), 'gas.C2H2.risePPM')).toBe('ok');
    expect(level(gas(1, 10), 'gas.C2H2.risePPM')).toBe('investigate');
    expect(level(gas(5, 10), 'gas.C2H2.risePPM')).toBe('critical');
    expect(level(gas(0.5, 110), 'gas.H2.risePPM')).toBe('critical');
    expect(level(gas(0, 110), 'gas.H2.risePPM')).toBe('ok');
  });

  it('judges excitation change from 10 % investigate and the outer phases by their size', () => {
    const exc = (a: number, c: number) => screenCase(edit(highDutyCompleteCase(), (d) => (d.postFault!.excitationCurrentMA = { A: a, B: 28, C: c })));
    expect(level(exc(44, 40), 'excitation.A.changePercent')).toBe('investigate');
    expect(level(exc(43.9, 40), 'excitation.A.changePercent')).toBe('ok');
    expect(level(exc(43.9, 40), 'excitation.outerPhaseDifferencePercent')).toBe('ok'); // 9.75 % below 50 mA
    const big = screenCase(edit(highDutyCompleteCase(), (d) => {
      d.baseline!.excitationCurrentMA = { A: 60, B: 40, C: 63 };
      d.postFault!.excitationCurrentMA = { A: 60, B: 40, C: 63 };
    }));
    expect(level(big, 'excitation.outerPhaseDifferencePercent')).toBe('watch'); // 5 % at ≥ 50 mA
  });

  it('judges corrected winding resistance change from 2 % and imbalance from 2 % above 1.6 MVA', () => {
    const res = screenCase(edit(highDutyCompleteCase(), (d) => {
      d.baseline!.resistanceTemperatureC = 20;
      d.postFault!.resistanceTemperatureC = 30;
      d.postFault!.windingResistanceOhm = { A: 0.4 * (264.5 / 254.5) * 1.02, B: 0.4 * (264.5 / 254.5), C: 0.4 * (264.5 / 254.5) };
    }));
    expect(res.indicators.find((i) => i.key === 'resistance.A.changePercent')!.value).toBeCloseTo(2, 9); // computed from IEEE C57.12.90 correction
    expect(level(res, 'resistance.A.changePercent')).toBe('investigate');
    expect(level(res, 'resistance.B.changePercent')).toBe('ok');
    expect(level(res, 'resistance.phaseImbalancePercent')).toBe('ok');
  });

  it('judges turns ratio change from 0.1 % investigate and deviation from nameplate from 0.5 % watch', () => {
    const r = screenCase(edit(cleanCase(), (d) => {
      d.unit.nameplateTurnsRatio = 4;
      d.baseline!.turnsRatio = { A: 4.0, B: 4.0, C: 4.0 };
      d.postFault!.turnsRatio = { A: 4.004, B: 4.0039, C: 4.02 };
    }));
    expect(level(r, 'ratio.A.changePercent')).toBe('investigate');
    expect(level(r, 'ratio.B.changePercent')).toBe('ok');
    expect(level(r, 'ratio.C.deviationFromNameplatePercent')).toBe('watch');
  });

  it('keeps DF(f) at watch at most', () => {
    const pts = (a: number) => [15, 30, 60, 120, 250, 400].map((f) => [f, a / f + 0.0004 * f + 0.2] as [number, number]);
    const r = screenCase(edit(cleanCase(), (d) => {
      d.baseline!.dissipationByFrequency = { CH: pts(1) };
      d.postFault!.dissipationByFrequency = { CH: pts(10) };
    }));
    const ind = r.indicators.find((i) => i.key === 'dfFrequency.CH.conductiveChangePercent')!;
    expect(ind.value).toBeCloseTo(900, 6);
    expect(ind.level).toBe('watch');
  });
});

describe('result shape', () => {
  it('gives every null value a note, validates against the result schema, and carries criteria version 2, engine revision 2 and a basis', () => {
    const r = screenCase(edit(highDutyCompleteCase(), (d) => (d.postFault!.temperatureC = 90)));
    for (const i of r.indicators) if (i.value === null) expect(i.note).toBeTruthy();
    expect(resultSchema.safeParse(r).success).toBe(true);
    expect(r.criteriaVersion).toBe(2);
    expect(r.engineRevision).toBe(2);
    // case-format.md, "basis": change, sisters, phase-comparison, state or duty.
    for (const i of r.indicators) expect(['change', 'sisters', 'phase-comparison', 'state', 'duty']).toContain(i.basis);
  });
});
