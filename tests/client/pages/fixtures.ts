// Invented Kestrel Valley records shaped like the API's answers, for the page tests.
import type { EventDetail, EventListItem, StoredScreening } from '../../../src/api/events';
import type { GapsightResult } from '../../../shared/schemas/result';
import type { UnitDetail, UnitListItem } from '../../../src/api/units';
import type { Design } from '../../../src/api/designs';

export const design40: Design = {
  id: 2,
  reference: 'KV-40-132',
  maker: 'Invented Transformer Works',
  windings: 'two-winding',
  vectorGroup: 'YNd1',
  phases: 3,
  hvKV: 132,
  lvKV: 33,
  tvKV: null,
  coolingStages: [
    { stage: 'ONAN', kVA: 24000 },
    { stage: 'ONAF', kVA: 40000 },
  ],
  impedancePercent: 10.5,
  impedanceBaseKVA: 40000,
  conductor: 'Cu',
  requiredCapacitance: ['CH', 'CL', 'CHL'],
  notes: null,
};

export function unitItem(overrides: Partial<UnitListItem> = {}): UnitListItem {
  return {
    id: 3,
    serial: 'KVP-HX-T2',
    position: 'Bay 2',
    siteId: 1,
    designId: 2,
    year: 2019,
    phases: 3,
    hvKV: 132,
    lvKV: 33,
    ratedKVA: 40000,
    impedancePercent: 10.5,
    systemImpedancePercent: 0,
    conductor: 'Cu',
    lastEventId: 11,
    lastEventAt: '2026-07-01T03:12:00.000Z',
    lastEventStatus: 'screened',
    lastRecommendation: 'conditional',
    siteName: 'Harrow Cross',
    siteTimeZone: 'Europe/London',
    designReference: 'KV-40-132',
    activeRestrictions: null,
    ...overrides,
  };
}

/** The case-format worked example's fault on unit 3 (40 MVA, 10.5 %, 6.3 kA on the LV side): category IV, high duty. */
const workedExampleLevel = {
  category: 'IV',
  ratedCurrentA: 699.819,
  currentPerUnit: 9.0023,
  maxCurrentPerUnit: 9.5238,
  forceRatioPercent: 89.35,
  segmentStartPerUnit: 4.7619,
  highDuty: true,
  thermalLimitI2t: 1250,
  mechanicalLimitI2t: 181.41,
} as const;

type ReadingSet = UnitDetail['readingSets'][number];

/** A reading set of unit 3 as the API gives it: tap 9b, entered by user 7, no other conditions unless given. */
function readingSet(set: Pick<ReadingSet, 'id' | 'kind' | 'takenAt' | 'createdAt' | 'values'> & Partial<ReadingSet>): ReadingSet {
  return {
    unitId: 3,
    eventId: null,
    isReference: false,
    temperatureC: null,
    topOilC: null,
    bottomOilC: null,
    ambientC: null,
    humidityPercent: null,
    tapPosition: '9b',
    instrument: null,
    instrumentSerial: null,
    testKV: null,
    testFrequencyHz: null,
    hoursDeenergised: null,
    demagnetised: null,
    windingTemperatureC: null,
    notes: null,
    createdById: 7,
    sweeps: [],
    ...set,
  };
}

export function unitDetail(overrides: Partial<UnitDetail> = {}): UnitDetail {
  const { siteName: _s, siteTimeZone: _t, designReference: _d, ...unit } = unitItem();
  return {
    ...unit,
    site: { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London', locale: null },
    design: design40,
    readingSets: [
      readingSet({
        id: 21,
        kind: 'routine',
        takenAt: '2024-06-20T09:00:00.000Z',
        temperatureC: 24,
        instrument: 'Invented CP-100',
        instrumentSerial: 'S-118',
        createdAt: '2024-06-20T12:00:00.000Z',
        values: { takenAt: '2024-06-20', capacitancePF: { CH: 3124, CL: 9881, CHL: 5222 } },
      }),
      readingSet({
        id: 20,
        kind: 'factory',
        takenAt: '2019-05-02T08:00:00.000Z',
        temperatureC: 28,
        createdAt: '2019-05-02T12:00:00.000Z',
        values: {
          takenAt: '2019-05-02',
          capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 },
          dissipationPercent: { CH: 0.28, CL: 0.31, CHL: 0.25 },
          reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } },
        },
      }),
    ],
    events: [
      {
        id: 11,
        occurredAt: '2026-07-01T03:12:00.000Z',
        type: 'three-phase',
        side: 'lv',
        location: null,
        currentIs: null,
        status: 'screened',
        transformerTripped: true,
        protectionOperated: ['overcurrent'],
        shots: [{ currentKA: 6.3, durationS: 0.12 }],
        throughFault: {
          ...workedExampleLevel,
          i2t: 9.725,
          eventDutyPercent: 5.36,
          beyondCurve: false,
          cumulativeI2t: 9.725,
          cumulativeDutyPercent: 5.36,
          shotsAboveSegment: 1,
        },
      },
      {
        id: 4,
        occurredAt: '2024-02-11T18:40:00.000Z',
        type: 'phase-to-ground',
        side: 'lv',
        location: null,
        currentIs: null,
        status: 'released',
        transformerTripped: true,
        protectionOperated: [],
        shots: [{ currentKA: 3.9, durationS: 0.25 }],
        throughFault: {
          category: 'IV',
          ratedCurrentA: 699.819,
          currentPerUnit: 5.5729,
          maxCurrentPerUnit: 9.5238,
          forceRatioPercent: 34.24,
          segmentStartPerUnit: 4.7619,
          highDuty: true,
          i2t: 7.764,
          thermalLimitI2t: 1250,
          mechanicalLimitI2t: 181.41,
          eventDutyPercent: 4.28,
          beyondCurve: false,
          cumulativeI2t: 7.764,
          cumulativeDutyPercent: 4.28,
          shotsAboveSegment: 1,
        },
      },
    ],
    ...overrides,
  };
}

/** Event 11 on unit 3 as stored: the fields the event list and the event file share. */
const event11 = {
  id: 11,
  unitId: 3,
  occurredAt: '2026-07-01T03:12:00.000Z',
  type: 'three-phase',
  faultedPhases: 'ABC',
  side: 'lv',
  location: null,
  currentIs: null,
  shots: [
    { currentKA: 6.3, durationS: 0.12 },
    { currentKA: 6.1, durationS: 0.08 },
  ],
  transformerTripped: true,
  protectionOperated: ['overcurrent'],
  notes: 'Cable fault on the 33 kV feeder 4.',
  status: 'testing',
  createdById: 5,
  createdAt: '2026-07-01T04:00:00.000Z',
} satisfies Partial<EventListItem & EventDetail>;

/** Event 11 as a row of the event list (desk), at Harrow Cross, not screened yet. */
export function eventListItem(overrides: Partial<EventListItem> = {}): EventListItem {
  return {
    ...event11,
    unitSerial: 'KVP-HX-T2',
    siteId: 1,
    siteName: 'Harrow Cross',
    siteTimeZone: 'Europe/London',
    recommendation: null,
    ...overrides,
  };
}

export function eventDetail(overrides: Partial<EventDetail> = {}): EventDetail {
  const u = unitDetail();
  const { readingSets: _r, events: _e, activeRestrictions: _a, ...unit } = u;
  return {
    ...event11,
    unit,
    throughFault: u.events[0].throughFault,
    // The duty curve's inputs as the server gives them (the case format's unit, this fault, no earlier fault).
    dutyCase: {
      unit: { serial: 'KVP-HX-T2', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5, vectorGroup: 'YNd1' },
      fault: { occurredAt: event11.occurredAt, type: 'three-phase', side: 'lv', transformerTripped: true, protectionOperated: ['overcurrent'], shots: event11.shots },
      priorFaults: [],
    },
    sessions: [
      readingSet({
        id: 31,
        kind: 'post-fault',
        eventId: 11,
        takenAt: '2026-07-02T08:30:00.000Z',
        temperatureC: 31,
        topOilC: 33,
        bottomOilC: 29,
        ambientC: 18,
        humidityPercent: 60,
        instrument: 'Invented CP-100',
        instrumentSerial: 'S-118',
        createdAt: '2026-07-02T09:00:00.000Z',
        values: { takenAt: '2026-07-02', capacitancePF: { CH: 3131, CL: 9990, CHL: 5405 }, dissipationPercent: { CH: 0.3 } },
      }),
    ],
    screenings: [],
    decision: null,
    decisions: [],
    followUps: [],
    findings: [],
    notifications: [],
    attachments: [
      { id: 51, name: 'HX-T2-feeder4.cfg', contentType: 'text/plain', kind: 'comtrade-cfg', size: 2048, sha256: 'ab'.repeat(32), createdAt: '2026-07-01T05:00:00.000Z' },
    ],
    audit: [
      {
        id: 91,
        at: '2026-07-01T04:00:00.000Z',
        userId: 5,
        action: 'create',
        entity: 'fault_event',
        entityId: '11',
        before: null,
        after: {},
        highlighted: false,
        note: null,
        summary: 'Dara Whitcombe logged the fault of 1 Jul 2026 05:00.',
      },
    ],
    people: {
      '5': { id: 5, name: 'Dara Whitcombe', email: 'd.whitcombe@kestrel-valley.example' },
      '7': { id: 7, name: 'Ruth Okafor', email: 'r.okafor@kestrel-valley.example' },
    },
    energisedAt: null,
    activeRestrictions: null,
    restrictionsLifted: null,
    ...overrides,
  };
}

/** A stored result shaped like the engine's: conditional on a CHL shift, with flagged and ok indicators. */
export function screeningResult(overrides: Partial<GapsightResult> = {}): GapsightResult {
  return {
    format: 'gapsight-result/1',
    recommendation: 'conditional',
    reasons: [
      'CHL capacitance shifted +3.74 % against the 2019-05-02 baseline (investigate from 3 %)',
      'CL capacitance shifted +1.22 % against the 2019-05-02 baseline',
    ],
    missing: ['reactance.B'],
    unreliable: ['capacitance.CL'],
    followUps: [
      'Dissolved-gas sample 24 h after re-energising',
      'Dissolved-gas sample 1 week after re-energising',
      'Dissolved-gas sample 1 month after re-energising',
      'Frequency-response sweep at the next outage',
    ],
    cautions: ['The recommendation is decision support for qualified staff.'],
    throughFault: {
      ...workedExampleLevel,
      i2t: 15.803,
      eventDutyPercent: 8.71,
      beyondCurve: false,
      cumulativeI2t: 23.568,
      cumulativeDutyPercent: 12.99,
      shotsAboveSegment: 3,
    },
    indicators: [
      { key: 'capacitance.CH.shiftPercent', value: 0.3525641025, level: 'ok', rule: '|shift| < 2 %', source: 'utility practice (from memory)', method: 'capacitance' },
      { key: 'powerFactor.CH.pf20Percent', value: null, level: 'ok', rule: 'PF20 > 1 % watch', source: 'common practice (from memory)', method: 'power-factor', note: 'temperature outside the 10–70 °C table' },
      { key: 'capacitance.CHL.shiftPercent', value: 3.7428023, level: 'investigate', rule: '|shift| ≥ 3 %', source: 'utility practice (from memory)', method: 'capacitance' },
      { key: 'sweep.HV-A-open.class', value: 'slight', level: 'watch', rule: 'DL/T 911 slight', source: 'DL/T 911-2004', method: 'sweep' },
    ],
    ...overrides,
  };
}

export function storedScreening(overrides: Partial<StoredScreening> = {}): StoredScreening {
  const result = overrides.result ?? screeningResult();
  return {
    id: 61,
    recommendation: result.recommendation,
    criteriaVersion: 1,
    comparison: false,
    computedById: 7,
    computedAt: '2026-07-03T09:00:00.000Z',
    result,
    ...overrides,
  };
}

/** The event after its screening: status `screened`, one decisive screening. */
export function screenedEvent(overrides: Partial<EventDetail> = {}): EventDetail {
  return eventDetail({ status: 'screened', screenings: [storedScreening()], ...overrides });
}
