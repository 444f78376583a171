// Test data for the e-mail and PDF report: ScreeningReportData built from the demo case/result pair on disk.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { GapsightCase } from '../../../shared/schemas/case.js';
import type { Basis, GapsightResult, ThroughFault } from '../../../shared/schemas/result.js';
import type { ScreeningReportData } from '../../../server/reports/report-data.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const readJson = <T>(rel: string): T => JSON.parse(readFileSync(path.join(root, rel), 'utf8')) as T;

/**
 * The demo's recent through-fault on KVP-HX-T2 at Harrow Cross (conditional), as the server would assemble it — from the
 * frozen copy of the demo pair as it was stored under rules revision 1 (fixtures/stored-revision-1.*), so that the
 * numbers the tests check do not move when the demo is re-screened. The live examples are screened afresh in
 * engine-results.test.ts.
 */
export function recentEventReport(): ScreeningReportData {
  const c = readJson<GapsightCase>('tests/server/reports/fixtures/stored-revision-1.case.json');
  const result = readJson<GapsightResult>('tests/server/reports/fixtures/stored-revision-1.result.json');
  return {
    screening: {
      id: 4711,
      computedAt: '2026-11-29T14:05:00.000Z',
      criteriaVersion: 1,
      comparison: false,
      computedBy: { name: 'Priya Natarajan', email: 'priya.natarajan@kestrel-valley.example' },
    },
    event: {
      id: 318,
      occurredAt: c.fault!.occurredAt,
      type: c.fault!.type,
      side: c.fault!.side,
      faultedPhases: 'ABC',
      transformerTripped: true,
      protectionOperated: ['overcurrent'],
      notes: null,
      status: 'screened',
      priorHighDutyCount: 1,
      priorHighDutySince: '2024-12-12T18:40:00.000Z',
    },
    unit: {
      id: 12,
      serial: c.unit.serial,
      position: 'T2',
      ratedKVA: c.unit.ratedKVA,
      hvKV: c.unit.hvKV,
      lvKV: c.unit.lvKV,
      impedancePercent: c.unit.impedancePercent,
      designReference: 'KV-40M-132/33',
    },
    site: { name: 'Harrow Cross', timeZone: 'Europe/London' },
    testers: [
      { name: 'Priya Natarajan', email: 'priya.natarajan@kestrel-valley.example' },
      { name: 'Tom Okafor', email: 'tom.okafor@kestrel-valley.example' },
    ],
    case: c,
    result,
    eventUrl: 'http://localhost:5173/events/318',
  };
}

/** A no-go after a differential and Buchholz trip (examples/cases/no-go-internal), at Quarry Lane. */
export function internalFaultReport(): ScreeningReportData {
  const base = recentEventReport();
  const c = readJson<GapsightCase>('examples/cases/no-go-internal.json');
  const result = readJson<GapsightResult>('examples/cases/no-go-internal.result.json');
  return {
    ...base,
    screening: { ...base.screening, id: 4712 },
    event: {
      ...base.event,
      id: 401,
      occurredAt: c.fault!.occurredAt,
      type: c.fault!.type,
      side: c.fault!.side,
      protectionOperated: c.fault!.protectionOperated ?? [],
      priorHighDutyCount: 0,
      priorHighDutySince: null,
    },
    unit: { ...base.unit, id: 15, serial: c.unit.serial, position: 'T1' },
    site: { name: 'Quarry Lane', timeZone: 'Europe/London' },
    case: c,
    result,
    eventUrl: 'http://localhost:5173/events/401',
  };
}

/** A case with a result, dressed as a stored screening at Millbrook (the fault's facts taken from the case). */
export function caseReport(c: GapsightCase, result: GapsightResult): ScreeningReportData {
  const base = recentEventReport();
  return {
    ...base,
    event: {
      ...base.event,
      occurredAt: c.fault?.occurredAt ?? base.event.occurredAt,
      type: c.fault?.type ?? base.event.type,
      side: c.fault?.side ?? base.event.side,
      transformerTripped: c.fault?.transformerTripped ?? true,
      protectionOperated: c.fault?.protectionOperated ?? [],
      priorHighDutyCount: 0,
      priorHighDutySince: null,
    },
    unit: { ...base.unit, serial: c.unit.serial },
    site: { name: 'Millbrook', timeZone: 'Europe/London' },
    case: c,
    result,
  };
}

/** Any examples/cases/<name>.json with its stored result, dressed as a stored screening at Millbrook. */
export function exampleCaseReport(name: string): ScreeningReportData {
  return caseReport(readJson<GapsightCase>(`examples/cases/${name}.json`), readJson<GapsightResult>(`examples/cases/${name}.result.json`));
}

// ---------------------------------------------------------------------------------------------------------------------
// Stored screenings frozen in tests/server/reports/fixtures (copies of the demo pairs as stored under rules revision 1:
// no engineRevision, three cautions, line currents) and revision-2 results written by hand from them. The revision-2
// through-fault figures were computed once with shared/screening computeThroughFault under criteria set 2 and pasted
// here as data; the words the tests expect are written out in the tests.

const fixture = <T>(name: string): T => readJson<T>(`tests/server/reports/fixtures/${name}`);

const CAUTIONS_REVISION_2 = [
  'The recommendation is decision support for qualified staff.',
  "Re-energising a transformer after a fault is a safety decision governed by the utility's own procedures, local codes and licensed practice; criteria defaults come from published guidance and common practice and must be reviewed by the user's engineers.",
  "High-voltage tests must follow the test equipment's and the utility's safety rules (isolation, earthing, permits).",
  'A go cannot rule out deformation that the tests taken cannot see.',
  'DC tests (winding resistance) leave the core magnetised: take excitation current and sweeps first, or demagnetise before them.',
];

/** The basis of an indicator by its key, as rules revision 2 assigns it (case format, "basis"). */
export function basisForKey(key: string): Basis {
  const p = key.split('.');
  const last = p[p.length - 1];
  if (p[0] === 'duty') return 'duty';
  if (p[0] === 'sisters') return 'state';
  if (/shift|change|rise|ChangePoints|risePPM/i.test(last)) return 'change';
  if (p[0] === 'sweep') return p[2] === 'AC' ? 'phase-comparison' : 'change';
  return 'state';
}

/** A stored revision-1 result, as revision 2 would label it: basis on every indicator, criteria set 2, five cautions. */
function toRevision2(result: GapsightResult, throughFault: ThroughFault | null): GapsightResult {
  return {
    ...result,
    engineRevision: 2,
    criteriaVersion: 2,
    cautions: [...CAUTIONS_REVISION_2],
    throughFault,
    indicators: result.indicators.map((i) => ({ ...i, basis: basisForKey(i.key) })),
  };
}

/** The demo's screening exactly as stored under rules revision 1 (KVP-HX-T2, conditional, three cautions). */
export function storedRevision1Report(): ScreeningReportData {
  const d = recentEventReport();
  if (d.result.engineRevision !== undefined) throw new Error('the stored revision-1 fixture must not carry engineRevision');
  return d;
}

/** An in-service duty-only go stored under rules revision 1 (KVP-MB-T4; follow-ups counted "after re-energising"). */
export function storedRevision1InServiceReport(): ScreeningReportData {
  const base = recentEventReport();
  const c = fixture<GapsightCase>('stored-revision-1-in-service.case.json');
  return {
    ...base,
    screening: { ...base.screening, id: 4720 },
    event: { ...base.event, id: 330, occurredAt: c.fault!.occurredAt, type: c.fault!.type, side: c.fault!.side, transformerTripped: false, faultedPhases: 'BC', priorHighDutyCount: 0, priorHighDutySince: null },
    unit: { ...base.unit, id: 21, serial: c.unit.serial, position: 'T4', ratedKVA: 12000, hvKV: 66, lvKV: 11, impedancePercent: 8.2, designReference: 'KV-12M-66/11' },
    site: { name: 'Millbrook', timeZone: 'Europe/London' },
    case: c,
    result: fixture<GapsightResult>('stored-revision-1-in-service.result.json'),
    eventUrl: 'http://localhost:5173/events/330',
  };
}

/** Revision 2, criteria set 2: the demo unit's readings with a given fault and its through-fault figures. */
function demoRevision2(fault: GapsightCase['fault'], throughFault: ThroughFault, reasons?: string[]): ScreeningReportData {
  const d = storedRevision1Report();
  const result = toRevision2(d.result, throughFault);
  return {
    ...d,
    screening: { ...d.screening, criteriaVersion: 2 },
    event: { ...d.event, type: fault!.type, side: fault!.side },
    case: { ...d.case, fault },
    result: reasons ? { ...result, reasons } : result,
  };
}

/** A ground fault on the delta LV side measured at the LV terminals: the winding current cannot be derived (line-assumed). */
export function lineAssumedReport(): ScreeningReportData {
  const fault: GapsightCase['fault'] = {
    occurredAt: '2026-11-28T03:12:00.000Z',
    type: 'phase-to-ground',
    side: 'lv',
    transformerTripped: true,
    protectionOperated: ['overcurrent'],
    shots: [{ currentKA: 5.8, durationS: 0.1 }],
  };
  // computeThroughFault, criteria set 2: YNd1 40 MVA 132/33 kV 10.5 %, 5.8 kA on the LV (delta) side, phase-to-ground there.
  const tf: ThroughFault = {
    category: 'IV', ratedCurrentA: 699.8185081086374, currentPerUnit: 8.287863114217076, maxCurrentPerUnit: 9.523809523809524,
    forceRatioPercent: 75.72926418749998, segmentStartPerUnit: 4.761904761904762, highDuty: true, i2t: 6.868867499999998,
    thermalLimitI2t: 1250, mechanicalLimitI2t: 181.40589569160997, eventDutyPercent: 3.786463209374999, beyondCurve: false,
    cumulativeI2t: 12.879126562499994, cumulativeDutyPercent: 7.099618517578122, shotsAboveSegment: 1,
    windingCurrentFactor: null, currentBasis: 'line-assumed', thermalDurationPercent: null,
  };
  const d = demoRevision2(fault, tf);
  // Reasons as the engine (shared/screening/verdict.ts, revision 2) words them.
  d.result.reasons = [
    'High-duty fault (8.3 × rated line current (winding current not derived), 76 % of the design force): full post-fault test set required and present',
    'Winding current not derived (the vector group or the fault does not fix it): the line current was used as it is — enter the winding current or attach the relay record',
    ...d.result.reasons.slice(1),
  ];
  return d;
}

/** A ground fault on the grounded-wye LV side of a Dyn11 unit measured at the HV (delta) terminals: factor √3 makes it high duty. */
export function deltaMeasuredReport(): ScreeningReportData {
  const fault: GapsightCase['fault'] = {
    occurredAt: '2026-11-20T22:47:00.000Z',
    type: 'phase-to-ground',
    side: 'hv',
    location: 'lv',
    transformerTripped: true,
    protectionOperated: ['overcurrent'],
    shots: [{ currentKA: 0.35, durationS: 0.2 }, { currentKA: 0.3, durationS: 0.15 }],
  };
  // computeThroughFault, criteria set 2: Dyn11 12 MVA 66/11 kV 8.2 % + 1 % system, 0.35 kA line current on the HV side.
  const tf: ThroughFault = {
    category: 'III', ratedCurrentA: 104.9727762162956, currentPerUnit: 5.774999999999999, maxCurrentPerUnit: 10.869565217391305,
    forceRatioPercent: 28.227968999999987, segmentStartPerUnit: 5.434782608695652, highDuty: true, i2t: 10.345499999999998,
    thermalLimitI2t: 1250, mechanicalLimitI2t: 236.29489603024575, eventDutyPercent: 4.378215599999999, beyondCurve: false,
    cumulativeI2t: 10.345499999999998, cumulativeDutyPercent: 4.378215599999999, shotsAboveSegment: 1,
    windingCurrentFactor: 1.7320508075688772, currentBasis: 'line-converted', thermalDurationPercent: null,
  };
  const d = demoRevision2(fault, tf);
  d.case = { ...d.case, unit: { ...d.case.unit, serial: 'KVP-MB-T5', ratedKVA: 12000, hvKV: 66, lvKV: 11, impedancePercent: 8.2, systemImpedancePercent: 1, vectorGroup: 'Dyn11' }, priorFaults: [] };
  d.unit = { ...d.unit, id: 22, serial: 'KVP-MB-T5', position: 'T5', ratedKVA: 12000, hvKV: 66, lvKV: 11, impedancePercent: 8.2, designReference: 'KV-12M-66/11' };
  d.site = { name: 'Millbrook', timeZone: 'Europe/London' };
  d.event = { ...d.event, id: 340, occurredAt: fault!.occurredAt, faultedPhases: 'C', priorHighDutyCount: 0, priorHighDutySince: null };
  d.result.reasons = ['High-duty fault (5.8 × rated winding current, 28 % of the design force): full post-fault test set required and present', ...d.result.reasons.slice(1)];
  return d;
}

/** A three-phase fault below the high-duty threshold (thermal region) on the demo unit, which tripped. */
export function thermalRegionReport(): ScreeningReportData {
  const fault: GapsightCase['fault'] = {
    occurredAt: '2026-11-28T03:12:00.000Z',
    type: 'three-phase',
    side: 'lv',
    transformerTripped: true,
    protectionOperated: ['overcurrent'],
    shots: [{ currentKA: 3.0, durationS: 0.2 }, { currentKA: 2.8, durationS: 0.15 }],
  };
  // computeThroughFault, criteria set 2: 3.0 kA on the 33 kV side = 4.29 × rated, below the segment start 4.76.
  const tf: ThroughFault = {
    category: 'IV', ratedCurrentA: 699.8185081086374, currentPerUnit: 4.286825748732971, maxCurrentPerUnit: 9.523809523809524,
    forceRatioPercent: 20.2605046875, segmentStartPerUnit: 4.761904761904762, highDuty: false, i2t: 6.07662, thermalLimitI2t: 1250,
    mechanicalLimitI2t: 181.40589569160997, eventDutyPercent: 3.349736775, beyondCurve: false, cumulativeI2t: 12.086879062499998,
    cumulativeDutyPercent: 6.662892083203124, shotsAboveSegment: 0, windingCurrentFactor: 1, currentBasis: 'line-converted',
    thermalDurationPercent: 0.40724930818735444,
  };
  const d = demoRevision2(fault, tf);
  d.result.reasons = ['Fault in the thermal region of the through-fault curve (4.3 × rated winding current, 0.35 s of the 85.9 s the thermal curve allows)', ...d.result.reasons.slice(1)];
  d.result.indicators = [
    ...d.result.indicators,
    { key: 'duty.thermalDurationPercent', value: 0.40724930818735444, level: 'ok', rule: 'beyond the through-fault curve (thermal curve: duration > allowed time) → investigate', source: 'IEEE C57.109 through-fault curves (Patterson & Price on C57.109-1993): K = 2·I_sc², thermal curve points', method: 'duty', basis: 'duty' },
    { key: 'sweep.hv.AC.class', value: 'normal', level: 'ok', rule: 'phases A and C of one winding over the mid and high bands, capped at investigate', source: 'Gapsight rule (DL/T 911 classes)', method: 'sweep', basis: 'phase-comparison', location: 'hv' },
  ];
  return d;
}

/** A unit that stayed in service: CHL capacitance +5.49 % (critical) after a fault below the high-duty threshold → no-go. */
export function inServiceNoGoReport(): ScreeningReportData {
  const d = storedRevision1InServiceReport();
  const c = d.case;
  d.case = {
    ...c,
    postFault: { ...c.postFault, takenAt: '2026-11-13', temperatureC: 24, capacitancePF: { CH: 4502, CL: 12931, CHL: 6440 } },
    fault: { ...c.fault!, shots: [{ currentKA: 2.4, durationS: 0.2 }] },
  };
  // computeThroughFault, criteria set 2: Dyn11 12 MVA, 2.4 kA phase-to-phase on the 11 kV (wye) side: factor 1, 3.81 × rated.
  const tf: ThroughFault = {
    category: 'III', ratedCurrentA: 629.8366572977736, currentPerUnit: 3.8105117766515297, maxCurrentPerUnit: 10.869565217391305,
    forceRatioPercent: 12.289727999999995, segmentStartPerUnit: 5.434782608695652, highDuty: false, i2t: 2.904, thermalLimitI2t: 1250,
    mechanicalLimitI2t: 236.29489603024575, eventDutyPercent: 1.2289728, beyondCurve: false, cumulativeI2t: 2.904, cumulativeDutyPercent: 1.2289728,
    shotsAboveSegment: 0, windingCurrentFactor: 1, currentBasis: 'line-converted', thermalDurationPercent: 0.15405253238962396,
  };
  const capacitance = (cfg: string, value: number, level: 'ok' | 'critical') => ({
    key: `capacitance.${cfg}.shiftPercent`, value, level, rule: '|shift|: watch ≥ 2 %, investigate ≥ 3 %, critical ≥ 5 %',
    source: 'no IEEE/IEC limit for winding capacitance; 3 % warning: utility practice (from memory); 5 % critical: conservative Gapsight default',
    method: 'capacitance' as const, basis: 'change' as const, location: cfg, reference: '2020-03-18 baseline',
  });
  d.screening = { ...d.screening, criteriaVersion: 2 };
  d.result = {
    ...toRevision2(d.result, tf),
    recommendation: 'no-go',
    overallLevel: 'critical',
    reasons: [
      'Unit is still in service: take out of service for tests (CHL capacitance shifted +5.49 % against the 2020-03-18 baseline (critical from 5 %))',
      'Unit stayed in service and the fault was not high duty (3.8 × rated winding current, 0.2 s of the 130 s the thermal curve allows): the recommendation rests on the duty figures and the readings given; dissolved-gas samples now and again at 24 h',
      'CHL capacitance shifted +5.49 % against the 2020-03-18 baseline (critical from 5 %)',
    ],
    followUps: [
      'Dissolved-gas sample now (the unit stayed in service)',
      'Dissolved-gas sample again 24 h after the event',
      'Dissolved-gas sample 1 week after the event',
      'Dissolved-gas sample 1 month after the event',
      'Frequency-response sweep at the next outage',
    ],
    indicators: [
      ...toRevision2(d.result, tf).indicators,
      capacitance('CH', 0.0889284126278346, 'ok'),
      capacitance('CL', 0.0851393188854489, 'ok'),
      capacitance('CHL', 5.487305487305487, 'critical'),
    ],
  };
  return d;
}

/** A duty-only go of a unit that stayed in service, with no post-fault test at all (revision 2). */
export function dutyOnlyGoReport(): ScreeningReportData {
  const d = storedRevision1InServiceReport();
  const { postFault: _dropped, ...rest } = d.case;
  void _dropped;
  d.case = rest;
  // computeThroughFault, criteria set 2: 2.2 kA phase-to-phase on the 11 kV (wye) side: factor 1, 3.49 × rated.
  const tf: ThroughFault = {
    category: 'III', ratedCurrentA: 629.8366572977736, currentPerUnit: 3.4929691285972355, maxCurrentPerUnit: 10.869565217391305,
    forceRatioPercent: 10.32678533333333, segmentStartPerUnit: 5.434782608695652, highDuty: false, i2t: 2.1961499999999994,
    thermalLimitI2t: 1250, mechanicalLimitI2t: 236.29489603024575, eventDutyPercent: 0.9294106799999998, beyondCurve: false,
    cumulativeI2t: 4.926212499999998, cumulativeDutyPercent: 2.084773129999999, shotsAboveSegment: 0, windingCurrentFactor: 1,
    currentBasis: 'line-converted', thermalDurationPercent: 0.10222638608389734,
  };
  d.screening = { ...d.screening, criteriaVersion: 2 };
  const r = toRevision2(d.result, tf);
  d.result = {
    ...r,
    reasons: [
      'Go rests on the duty figures alone, with no post-fault tests: the unit stayed in service through a fault below the high-duty current',
      'Unit stayed in service and the fault was not high duty (3.5 × rated winding current, 0.18 s of the 176 s the thermal curve allows): the recommendation rests on the duty figures alone, with no post-fault tests; dissolved-gas samples now and again at 24 h',
      'No indicator at watch or above',
    ],
    followUps: [
      'Dissolved-gas sample now (the unit stayed in service)',
      'Dissolved-gas sample again 24 h after the event',
      'Dissolved-gas sample 1 week after the event',
      'Dissolved-gas sample 1 month after the event',
      'Frequency-response sweep at the next outage',
    ],
    indicators: r.indicators.filter((i) => i.method === 'duty'),
  };
  return d;
}

/**
 * The demo unit under revision 2 with doubts: a low-confidence power-factor rise (temperatures far apart), a turns ratio
 * off nameplate (state), sister statistics as state, tap mismatch on the reactance and one sweep trace, remanence on the
 * excitation current and an implausible CL capacitance.
 */
export function doubtsReport(): ScreeningReportData {
  const d = storedRevision1Report();
  const c = d.case;
  const tf: ThroughFault = { ...d.result.throughFault!, windingCurrentFactor: 1, currentBasis: 'line-converted', thermalDurationPercent: null };
  d.screening = { ...d.screening, criteriaVersion: 2 };
  d.case = {
    ...c,
    baseline: { ...c.baseline, temperatureC: 12 },
    postFault: { ...c.postFault, tapPosition: '11' },
    sweeps: (c.sweeps ?? []).map((s) => (s.label === 'HV-B-short' ? { ...s, tapPosition: '11', baselineTapPosition: '9b' } : s)),
  };
  const tapNote = 'tap mismatch (baseline at tap 9b, post-fault at 11): repeat at tap 9b; not judged';
  const remanence =
    'all phases moved the same way on a core not demagnetised (residual magnetism likely): demagnetise and repeat; take excitation and sweeps before DC tests; not judged';
  const r = toRevision2(d.result, tf);
  r.indicators = r.indicators.map((i) => {
    if (i.key === 'powerFactor.CHL.riseFromBaselinePercent') return { ...i, value: 62.04, level: 'watch', lowConfidence: true, note: 'temperature correction uncertain (insulation 12 °C and 31 °C)' };
    if (i.key === 'ratio.A.deviationFromNameplatePercent') return { ...i, value: 0.62, level: 'watch' };
    if (i.key === 'sisters.capacitance.CHL.modifiedZ') return { ...i, level: 'watch', rule: '|M| ≥ 3.5 → watch (a state: at most watch, never corroborates)' };
    if (/^reactance\.[ABC]\.shiftPercent$/.test(i.key)) return { ...i, level: 'ok', note: tapNote };
    if (/^excitation\.[ABC]\.changePercent$/.test(i.key)) return { ...i, value: 14.2, level: 'ok', note: remanence };
    if (i.key === 'capacitance.CL.shiftPercent') return { ...i, value: 58.3, level: 'ok', note: 'implausible against the reference — check the unit of measure and the connection: not judged' };
    return i;
  });
  d.result = {
    ...r,
    recommendation: 'no-go',
    overallLevel: 'critical',
    unreliable: ['capacitance.CL', 'reactance.A', 'reactance.B', 'reactance.C', 'excitationCurrentMA', 'sweep.HV-B-short'],
    reasons: [
      'High-duty fault (9.0 × rated winding current, 89 % of the design force): hold pending tests: CL capacitance (unreliable: repeat), reactance phase A (unreliable: repeat), reactance phase B (unreliable: repeat), reactance phase C (unreliable: repeat), excitation current (unreliable: repeat)',
      ...d.result.reasons.slice(1, 3),
      'CHL power factor at 20 °C changed by +62.0 % against the 2009-03-18 baseline (watch from 50 %) — temperature correction uncertain (insulation 12 °C and 31 °C)',
      'Phase A turns ratio deviates from nameplate by +0.62 % (watch from 0.5 %)',
    ],
  };
  return d;
}
