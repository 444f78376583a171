// The fault events of the demo story and their post-fault sessions (pure: values from the units' fingerprints, dates
// relative to "now"). Three events:
// - KVP-HX-T2, about two years ago: an LV phase-to-ground fault cleared by the feeder (unit stayed in service, not high
//   duty): a gas sample, screened `go` on the duty-only path, released; it counts in the cumulative duty of the next one.
// - KVP-MB-T1, about 14 months ago: a high-duty LV phase-to-phase fault with a reclose onto it; clear deformation
//   evidence (CL up, CHL down, reactance and sweep of phase B, acetylene) → `no-go` → hold → inspection found the LV
//   winding of phase B buckled → repaired (new LV winding B) → re-test → `go` → released with restrictions, follow-ups.
// - KVP-HX-T2, three days ago: a three-phase LV fault, two shots, tripped on overcurrent; post-fault sessions show CHL
//   +3.4 % against the baseline with every other method quiet → the screening the user runs says `conditional`.
import type { EventBody } from '../../../shared/schemas/fleet.js';
import type { Gas, Phase, ReadingBody, UnitFingerprint } from './demo-fleet.js';
import { DEMO_DESIGNS, INSTRUMENTS, PHASES, agedGas, demoUnit, factoryBushings, monthsBefore, resistanceAt, routineDates, unitFingerprint, yearsBetween } from './demo-fleet.js';
import { DemoRandom, roundTo } from './demo-random.js';
import { deformModel, familySweepModel, logGrid, tracePoints, type SweepKind, type SweepModel, type TraceSpec } from './demo-sweeps.js';

const HOUR = 3600e3;
const DAY = 24 * HOUR;
export const at = (base: Date, ms: number): Date => new Date(base.getTime() + ms);

/** Every instant of the story, computed from "now" (the only thing that changes between runs). */
export interface DemoTimeline {
  now: Date;
  /** When the fleet was set up in Gapsight (sites, designs, units; factory results back-entered). */
  setup: Date;
  priorFault: Date;
  priorGasSample: Date;
  priorScreening: Date;
  priorDecision: Date;
  historyFault: Date;
  historySession: Date;
  historyScreening1: Date;
  historyHold: Date;
  historyFinding: Date;
  repairCommissioning: Date;
  historyRetest: Date;
  historyScreening2: Date;
  historyRelease: Date;
  historyReenergised: Date;
  recentFault: Date;
  recentSession1: Date;
  recentSession2: Date;
}

export function demoTimeline(now: Date): DemoTimeline {
  const day = (daysAgo: number, time: string) => {
    const d = new Date(now.getTime() - daysAgo * DAY);
    return new Date(`${d.toISOString().slice(0, 10)}T${time}Z`);
  };
  const priorFault = monthsBefore(now, 24, '18:40:00');
  const historyFault = monthsBefore(now, 14, '16:47:00');
  const recentFault = day(3, '03:12:00');
  const repairCommissioning = day(46, '10:00:00');
  const historyRetest = day(45, '08:30:00');
  return {
    now,
    setup: monthsBefore(now, 80, '09:00:00'),
    priorFault,
    priorGasSample: at(priorFault, 20 * HOUR),
    priorScreening: at(priorFault, 22 * HOUR),
    priorDecision: at(priorFault, 23 * HOUR),
    historyFault,
    historySession: at(historyFault, 19 * HOUR),
    historyScreening1: at(historyFault, 27 * HOUR),
    historyHold: at(historyFault, 28 * HOUR),
    historyFinding: at(historyFault, 38 * DAY),
    repairCommissioning,
    historyRetest,
    historyScreening2: at(historyRetest, 7 * HOUR),
    historyRelease: at(historyRetest, 8 * HOUR),
    historyReenergised: at(historyRetest, 10 * HOUR),
    recentFault,
    recentSession1: at(recentFault, 9 * HOUR),
    recentSession2: at(recentFault, 33 * HOUR),
  };
}

// ---------- events ----------

export function priorEventBody(unitId: number, t: DemoTimeline): EventBody {
  // A phase-to-ground fault on the delta (33 kV) side: the line currents there do not fix the winding current (case
  // format, "Winding current"), so protection entered the winding current from the transformer differential relay's
  // record: with the zero sequence in the earthing transformer, phase A carried 2/3 of the fault current (the LV
  // recorder's 2.9 kA) and the delta windings half of that, 1.45 kA (3.6 × the winding's rated 404 A).
  return {
    unitId,
    occurredAt: t.priorFault.toISOString(),
    type: 'phase-to-ground',
    side: 'lv',
    location: 'lv',
    currentIs: 'winding',
    faultedPhases: 'A',
    shots: [{ currentKA: 1.45, durationS: 0.35 }],
    transformerTripped: false,
    protectionOperated: [],
    notes: 'Cable fault on 33 kV feeder HX-F4 (phase A to ground), cleared by the feeder breaker; the transformer stayed in service. LV fault recorder of bay HX-T2: 2.9 kA in phase A; the shot entered is the delta winding current from the differential relay\'s disturbance record.',
  };
}

export function historyEventBody(unitId: number, t: DemoTimeline): EventBody {
  return {
    unitId,
    occurredAt: t.historyFault.toISOString(),
    type: 'phase-to-phase',
    side: 'lv',
    location: 'lv',
    currentIs: 'line',
    faultedPhases: 'BC',
    // A phase-to-phase fault gives √3/2 of the three-phase fault current: at most 0.866 × 6.42 kA = 5.56 kA here.
    shots: [
      { currentKA: 5.1, durationS: 0.16 },
      { currentKA: 4.9, durationS: 0.42 },
    ],
    transformerTripped: true,
    protectionOperated: ['overcurrent'],
    notes: 'Phase B–C flashover on the 33 kV busbar of Millbrook (bird contact); the auto-reclose closed onto the fault and the LV overcurrent tripped the transformer. Relay and recorder files of bay MB-T1.',
  };
}

export function recentEventBody(unitId: number, t: DemoTimeline): EventBody {
  return {
    unitId,
    occurredAt: t.recentFault.toISOString(),
    type: 'three-phase',
    side: 'lv',
    location: 'lv',
    currentIs: 'line',
    faultedPhases: 'ABC',
    shots: [
      { currentKA: 6.3, durationS: 0.12 },
      { currentKA: 6.1, durationS: 0.08 },
    ],
    transformerTripped: true,
    protectionOperated: ['overcurrent'],
    notes: 'Three-phase fault on 33 kV feeder HX-F2 (excavator through the cable 1.2 km out); one reclose onto the fault, the transformer tripped on LV overcurrent. Differential and Buchholz did not operate.',
  };
}

// ---------- readings ----------

const per = <T>(f: (p: Phase) => T) => Object.fromEntries(PHASES.map((p) => [p, f(p)])) as Record<Phase, T>;
const scale = (rec: Record<string, number>, factors: Record<string, number>, decimals: number) =>
  Object.fromEntries(Object.entries(rec).map(([k, v]) => [k, roundTo(v * (factors[k] ?? 1), decimals)]));

/** A dissolved-gas sample: a base sample plus rises (ppm). */
const gasPlus = (g: Gas, rise: Partial<Gas>): Gas =>
  Object.fromEntries(Object.entries(g).map(([k, v]) => [k, roundTo(v + (rise[k as keyof Gas] ?? 0), k === 'CO' || k === 'CO2' ? 0 : 1)])) as Gas;

/**
 * DF at several frequencies (a narrow-band dielectric-response test, 15–400 Hz) around a power-frequency DF, as the
 * case format's `dissipationByFrequency`: DF(f) = A/f + B·f + C with, at 50 Hz, 35 % conductive (A/f), 10 % series (B·f)
 * and 55 % constant parts — invented demo shares — the conductive part scaled by `conductive`, and 0.5 % scatter.
 */
function dfCurve(df50: number, rnd: DemoRandom, conductive = 1): [number, number][] {
  const a = 0.35 * df50 * 50 * conductive;
  const b = (0.1 * df50) / 50;
  const c = 0.55 * df50;
  return [15, 30, 50, 100, 200, 400].map((f) => [f, roundTo((a / f + b * f + c) * (1 + rnd.normal(0.005)), 4)]);
}

/** The pre-fault gas sample of a unit: its newest routine set before `before` (as routineBody makes it). */
export function routineGasBefore(serial: string, now: Date, before: Date): Gas {
  const u = demoUnit(serial);
  let found: Gas | undefined;
  routineDates(u, now).forEach((d, k) => {
    if (d < before) found = agedGas(yearsBetween(new Date(u.factoryTest), d), `${u.serial}/routine/${k}`);
  });
  return found ?? agedGas(0, `${u.serial}/factory`);
}

/** The CHL consistency readings (GST, GST-guard, UST) around a CHL value. */
function chlModes(ch: number, chl: number, offsetPF: number): { gstPF: number; gstGuardPF: number; ustPF: number } {
  return { gstPF: roundTo(ch + chl + offsetPF, 1), gstGuardPF: roundTo(ch, 1), ustPF: roundTo(chl, 1) };
}

function fieldConditions(takenAt: Date, top: number, notes: string, hoursDeenergised: number): ReadingBody {
  return {
    takenAt: takenAt.toISOString(),
    topOilC: top,
    bottomOilC: roundTo(top - 4, 1),
    ambientC: roundTo(top - 11, 1),
    humidityPercent: 68,
    ...INSTRUMENTS.field,
    testKV: 10,
    testFrequencyHz: 50,
    hoursDeenergised,
    notes,
  };
}

/** The prior (duty-only) event: one oil sample the day after. */
export function priorGasSession(t: DemoTimeline): ReadingBody {
  const pre = routineGasBefore('KVP-HX-T2', t.now, t.priorFault);
  return {
    takenAt: t.priorGasSample.toISOString(),
    notes: 'Oil sample from the main tank the day after the feeder fault (unit in service).',
    dissolvedGasPPM: gasPlus(pre, { H2: 3.1, CO: 8, CO2: 35 }),
  };
}

/** Recent event, session 1 (the morning after): capacitance and DF with CHL modes and the HV bushings, per-phase reactance. */
export function recentSession1(t: DemoTimeline): ReadingBody {
  const fp = unitFingerprint(demoUnit('KVP-HX-T2'));
  const cap = scale(fp.capacitancePF, { CH: 1.0029, CL: 1.0078, CHL: 1.0342 }, 1);
  const age = yearsBetween(new Date(demoUnit('KVP-HX-T2').factoryTest), t.recentSession1);
  return {
    ...fieldConditions(t.recentSession1, 33, 'Post-fault session 1: capacitance and DF (CHL also GST/GST-guard/UST), HV bushings C1 and C2 through their test taps, per-phase leakage reactance and three-phase equivalent at tap 9b.', 9),
    tapPosition: DEMO_DESIGNS.large.tap,
    capacitancePF: cap,
    // The HV bushings steady: C1 within 0.2 % of the factory value, DF up by the ageing of the paper.
    bushings: Object.fromEntries(
      Object.entries(factoryBushings(demoUnit('KVP-HX-T2'))!).map(([terminal, b], k) => [
        terminal,
        { ...b, c1PF: roundTo(b.c1PF * [1.0012, 1.0009, 1.0015][k], 1), c1DissipationPercent: roundTo(b.c1DissipationPercent + 0.02, 3), c2PF: roundTo(b.c2PF * 1.002, 0), c2DissipationPercent: roundTo(b.c2DissipationPercent + 0.02, 3) },
      ]),
    ),
    capacitanceModes: { CHL: chlModes(cap.CH, cap.CHL, 1.6) },
    dissipationPercent: scale(fp.dissipationPercent, { CH: 1 + 0.012 * age + 0.04, CL: 1 + 0.012 * age + 0.03, CHL: 1 + 0.012 * age + 0.05 }, 3),
    reactance: per((p) => ({ percent: roundTo(fp.reactance[p] * { A: 1.0028, B: 1.0035, C: 1.0021 }[p], 3) })),
    threePhaseEquivalent: { e12: 183.6, e23: 183.2, e31: 183.9, amps: 2 },
  };
}

/** Recent event, session 2 (a day later): excitation, resistance, ratio, oil sample and the sweeps. */
export function recentSession2(t: DemoTimeline): ReadingBody {
  const fp = unitFingerprint(demoUnit('KVP-HX-T2'));
  const resT = 16.5;
  return {
    ...fieldConditions(t.recentSession2, 24, 'Post-fault session 2: excitation current at 10 kV, winding resistance, ratio, oil sample; FRA after demagnetising.', 33),
    tapPosition: DEMO_DESIGNS.large.tap,
    excitationCurrentMA: scale(fp.excitationMA, { A: 1.017, B: 1.012, C: 1.015 }, 1),
    excitationKV: fp.excitationKV,
    windingResistanceOhm: per((p) => roundTo(resistanceAt(fp.resistance20Ohm[p], resT) * 1.0008, 4)),
    resistanceTemperatureC: resT,
    turnsRatio: scale(fp.turnsRatio, { A: 1.00003, B: 1.00002, C: 1.00004 }, 4),
    dissolvedGasPPM: gasPlus(routineGasBefore('KVP-HX-T2', t.now, t.recentFault), { H2: 7.2, CH4: 0.8, C2H6: 0.3, C2H4: 0.4, C2H2: 0.4, CO: 25, CO2: 110 }),
  };
}

/** History event, the full post-fault session: clear evidence of an LV winding (inner) deformation on phase B. */
export function historySession(t: DemoTimeline): ReadingBody {
  const u = demoUnit('KVP-MB-T1');
  const fp = unitFingerprint(u);
  const cap = scale(fp.capacitancePF, { CH: 1.003, CL: 1.0587, CHL: 0.9585 }, 1);
  const age = yearsBetween(new Date(u.factoryTest), t.historySession);
  const resT = 17;
  return {
    ...fieldConditions(t.historySession, 31, 'Post-fault tests after the high-duty fault: full set (capacitance and DF, reactance, excitation, resistance, ratio, oil, FRA).', 19),
    tapPosition: DEMO_DESIGNS.large.tap,
    capacitancePF: cap,
    capacitanceModes: { CHL: chlModes(cap.CH, cap.CHL, -2.1) },
    dissipationPercent: scale(fp.dissipationPercent, { CH: 1 + 0.012 * age + 0.03, CL: 1 + 0.012 * age + 0.09, CHL: 1 + 0.012 * age + 0.06 }, 3),
    reactance: per((p) => ({ percent: roundTo(fp.reactance[p] * { A: 1.0045, B: 1.0372, C: 1.004 }[p], 3) })),
    excitationCurrentMA: scale(fp.excitationMA, { A: 1.03, B: 1.19, C: 1.025 }, 1),
    excitationKV: fp.excitationKV,
    windingResistanceOhm: per((p) => roundTo(resistanceAt(fp.resistance20Ohm[p], resT) * { A: 1.001, B: 1.004, C: 1.0012 }[p], 4)),
    resistanceTemperatureC: resT,
    turnsRatio: scale(fp.turnsRatio, { A: 1.00005, B: 1.0002, C: 1.00004 }, 4),
    dissolvedGasPPM: gasPlus(routineGasBefore('KVP-MB-T1', t.now, t.historyFault), { H2: 68, CH4: 9.5, C2H6: 2.1, C2H4: 6.3, C2H2: 3.8, CO: 41, CO2: 150 }),
    // DF over frequency on CH and CHL: the conductive (A/f) part up by half after the fault's heating and gassing.
    ...dfCurves(fp.dissipationPercent, { CH: 1 + 0.012 * age + 0.03, CHL: 1 + 0.012 * age + 0.06 }, new DemoRandom('history/df'), 1.5),
  };
}

/** DF over frequency on CH and CHL, each around its power-frequency DF (the fingerprint's DF × its factor). */
function dfCurves(df: Record<string, number>, factors: { CH: number; CHL: number }, rnd: DemoRandom, conductive = 1): Pick<ReadingBody, 'dissipationByFrequency'> {
  return { dissipationByFrequency: { CH: dfCurve(df.CH * factors.CH, rnd, conductive), CHL: dfCurve(df.CHL * factors.CHL, rnd, conductive) } };
}

/** The repaired unit's values: LV winding of phase B new, all windings re-clamped, oil processed. */
function repairedFingerprint(fp: UnitFingerprint): UnitFingerprint {
  return {
    ...fp,
    capacitancePF: scale(fp.capacitancePF, { CH: 1.0015, CL: 1.0048, CHL: 0.9948 }, 1),
    dissipationPercent: scale(fp.dissipationPercent, { CH: 1.04, CL: 1.0, CHL: 1.02 }, 3),
    reactance: per((p) => roundTo(fp.reactance[p] * { A: 1.001, B: 1.0019, C: 0.9995 }[p], 3)),
    excitationMA: scale(fp.excitationMA, { A: 1.006, B: 1.015, C: 1.004 }, 1) as Record<Phase, number>,
    resistance20Ohm: per((p) => fp.resistance20Ohm[p] * { A: 1, B: 0.997, C: 1 }[p]),
    turnsRatio: scale(fp.turnsRatio, { B: 1.00003 }, 4) as Record<Phase, number>,
  };
}

/** After repair: the commissioning set at site (marked as the new reference) and the event's re-test a day later. */
export function repairedBody(t: DemoTimeline, which: 'commissioning' | 'retest'): ReadingBody {
  const fp = repairedFingerprint(unitFingerprint(demoUnit('KVP-MB-T1')));
  const rnd = new DemoRandom(`repaired/${which}`);
  const j = (d: number) => (which === 'commissioning' ? 1 : 1 + rnd.normal(d));
  const takenAt = which === 'commissioning' ? t.repairCommissioning : t.historyRetest;
  const resT = which === 'commissioning' ? 14 : 12.5;
  const notes =
    which === 'commissioning'
      ? 'Commissioning tests after repair (LV winding of phase B replaced at the maker\'s works, all windings re-clamped, oil processed): the new reference fingerprint.'
      : 'Re-test after repair for the event: full set before re-energising.';
  const cap = Object.fromEntries(Object.entries(fp.capacitancePF).map(([k, v]) => [k, roundTo(v * j(0.0005), 1)]));
  return {
    ...fieldConditions(takenAt, which === 'commissioning' ? 18 : 16, notes, 2000),
    hoursDeenergised: roundTo((takenAt.getTime() - t.historyFault.getTime()) / HOUR, 0),
    tapPosition: DEMO_DESIGNS.large.tap,
    ...(which === 'commissioning' ? { isReference: true } : {}),
    capacitancePF: cap,
    capacitanceModes: { CHL: chlModes(cap.CH, cap.CHL, 0.8) },
    dissipationPercent: Object.fromEntries(Object.entries(fp.dissipationPercent).map(([k, v]) => [k, roundTo(v * j(0.01), 3)])),
    reactance: per((p) => ({ percent: roundTo(fp.reactance[p] * j(0.0004), 3) })),
    excitationCurrentMA: per((p) => roundTo(fp.excitationMA[p] * j(0.005), 1)),
    excitationKV: fp.excitationKV,
    windingResistanceOhm: per((p) => roundTo(resistanceAt(fp.resistance20Ohm[p], resT) * j(0.0004), 4)),
    resistanceTemperatureC: resT,
    turnsRatio: per((p) => roundTo(fp.turnsRatio[p] * j(0.00002), 4)),
    dissolvedGasPPM: which === 'commissioning' ? { H2: 3.2, CH4: 0.9, C2H6: 0.6, C2H4: 0.3, C2H2: 0, CO: 14, CO2: 170 } : { H2: 4.1, CH4: 1.1, C2H6: 0.7, C2H4: 0.3, C2H2: 0, CO: 17, CO2: 185 },
    // DF over frequency on CH and CHL (processed oil, new LV winding B): the re-test back on the commissioning curve.
    ...dfCurves(fp.dissipationPercent, { CH: 1, CHL: 1 }, new DemoRandom(`repaired/${which}/df`)),
  };
}

// ---------- sweeps ----------

const TRACES: { label: string; kind: SweepKind; phase: Phase; terminals: string }[] = [
  { label: 'HV-A-open', kind: 'open-circuit', phase: 'A', terminals: 'H1–H0, LV open' },
  { label: 'HV-B-open', kind: 'open-circuit', phase: 'B', terminals: 'H2–H0, LV open' },
  { label: 'HV-C-open', kind: 'open-circuit', phase: 'C', terminals: 'H3–H0, LV open' },
  { label: 'HV-B-short', kind: 'short-circuit', phase: 'B', terminals: 'H2–H0, X1-X2-X3 shorted' },
];

export type SweepState = 'factory' | 'deformed' | 'repaired';

function modelFor(serial: string, kind: SweepKind, phase: Phase, state: SweepState): SweepModel {
  const base = familySweepModel(kind, phase, 'large', serial);
  if (state === 'factory' || phase !== 'B') return base;
  if (state === 'deformed') return deformModel(base, { fromHz: 60e3, toHz: 700e3, shift: -0.07, levelFactor: 1.2, l0Factor: kind === 'short-circuit' ? 1.037 : 1 });
  return deformModel(base, { fromHz: 60e3, toHz: 700e3, shift: -0.004, levelFactor: 1.02 });
}

/**
 * The four FRA traces of a session on a 40 MVA unit: open-circuit HV A, B, C and short-circuit HV B.
 * Factory traces on a 240-point grid; field traces on a 231-point grid (another instrument), a little more noise.
 */
export function sessionTraces(serial: string, state: SweepState, session: string, field: boolean): TraceSpec[] {
  const grid = field ? logGrid(231) : logGrid(240);
  return TRACES.map((tr) => ({
    label: tr.label,
    testType: tr.kind,
    winding: 'hv' as const,
    phase: tr.phase,
    terminals: tr.terminals,
    tapPosition: DEMO_DESIGNS.large.tap,
    demagnetised: tr.kind === 'open-circuit' ? field : null,
    points: tracePoints(modelFor(serial, tr.kind, tr.phase, state), grid, field ? 0.03 : 0.02, `${serial}/${session}/${tr.label}`),
    fileName: `${serial}_${session}_${tr.label}.csv`,
  }));
}
