import { readFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import { sweepCsv } from '../sweep-csv.js';

// Known-good input of every route that takes params, a query, a body or a file: the corpus mutates one field of it at a
// time. Ids are real rows made for the purpose (see `CorpusIds`); names that must be unique are fresh on every call.
// Invented values (a 40 MVA 132/33 kV unit as in the other API tests; the readings CSV and the case are the examples/).

export interface CorpusIds {
  siteId: number;
  designId: number;
  unitId: number;
  userId: number;
  /** An event under test with a session and an undecided screening. */
  eventId: number;
  sessionId: number;
  screeningId: number;
  /** A unit's factory set (not used by a decided screening). */
  readingSetId: number;
  /** A baseline sweep trace of that set. */
  sweepId: number;
  eventAttachmentId: number;
  findingId: number;
  findingAttachmentId: number;
  /** An event released with restrictions, its open follow-up. */
  releasedEventId: number;
  followUpId: number;
  notificationId: number;
  /** A criteria draft. */
  criteriaVersion: number;
}

export interface UploadFile {
  name: string;
  type: string;
  bytes: Buffer;
}

export interface Base {
  params?: Record<string, unknown>;
  query?: Record<string, unknown>;
  body?: Record<string, unknown>;
  file?: UploadFile;
}

const uniq = () => randomUUID().slice(0, 8);
const root = new URL('../../../', import.meta.url);
const example = (p: string) => readFileSync(new URL(p, root));

export const READINGS_CSV: UploadFile = { name: 'readings.csv', type: 'text/csv', bytes: example('examples/imports/post-fault-readings.csv') };
export const UNITS_CSV: UploadFile = { name: 'units.csv', type: 'text/csv', bytes: example('examples/demo/units.csv') };
export const SWEEP_CSV: UploadFile = { name: 'sweep.csv', type: 'text/csv', bytes: Buffer.from(sweepCsv()) };
export const RELAY_TXT: UploadFile = { name: 'relay-record.txt', type: 'text/plain', bytes: Buffer.from('Relay record (invented)\r\nTrip 03:12:00.120 differential\r\n') };
/** The smallest PNG: signature, IHDR (1×1 grey), IDAT, IEND. */
export const PNG_BYTES = Buffer.from(
  '89504e470d0a1a0a0000000d4948445200000001000000010800000000' + '3a7e9b550000000a49444154789c63600000000200015c3d0a2b0000000049454e44ae426082',
  'hex',
);
export const PHOTO_PNG: UploadFile = { name: 'photo.png', type: 'image/png', bytes: PNG_BYTES };

/** A reading set with every section and condition (the session, unit set and correction bodies share it). */
export const fullReadings = () => ({
  takenAt: '2026-11-29T08:00:00Z',
  temperatureC: 28,
  tapPosition: '9b',
  topOilC: 31,
  bottomOilC: 27,
  ambientC: 12,
  humidityPercent: 40,
  instrument: 'M4100',
  instrumentSerial: 'SN-1',
  testKV: 10,
  testFrequencyHz: 50,
  hoursDeEnergised: 6,
  demagnetised: true,
  windingTemperatureC: 30,
  notes: 'Corpus set',
  capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 },
  capacitanceModes: { CH: { gstPF: 8330, gstGuardPF: 3120, ustPF: 5210 } },
  dissipationPercent: { CH: 0.27, CL: 0.3, CHL: 0.24 },
  reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } },
  excitationCurrentMA: { A: 21.5, B: 15.2, C: 21.9 },
  excitationKV: 10,
  windingResistanceOhm: { A: 0.412, B: 0.414, C: 0.413 },
  resistanceTemperatureC: 30,
  turnsRatio: { A: 4.001, B: 4.002, C: 4.0 },
  dissolvedGasPPM: { H2: 12, CH4: 4, C2H6: 2, C2H4: 1, C2H2: 0, CO: 210, CO2: 1900 },
  dissipationByFrequency: { CH: [[50, 0.27], [400, 0.31]] },
  bushings: { H1: { c1PF: 420, c1DissipationPercent: 0.31, c2PF: 3100, c2DissipationPercent: 0.4, winding: 'hv' } },
});

const fault = () => ({
  occurredAt: '2026-11-28T03:12:00Z',
  type: 'phase-to-ground',
  side: 'hv',
  location: 'lv',
  currentIs: 'winding',
  faultedPhases: 'AN',
  shots: [{ currentKA: 1.2, durationS: 0.1 }],
  transformerTripped: false,
  protectionOperated: ['differential'],
  notes: 'Corpus fault',
});

const design = () => ({
  reference: `D-C-${uniq()}`,
  maker: 'Invented Transformer Works',
  windings: 'two-winding',
  vectorGroup: 'YNd1',
  phases: 3,
  hvKV: 132,
  lvKV: 33,
  coolingStages: [{ stage: 'ONAN', kVA: 40000 }],
  impedancePercent: 10.5,
  impedanceBaseKVA: 40000,
  conductor: 'Cu',
  requiredCapacitance: ['CH', 'CL', 'CHL'],
  notes: 'Corpus design',
});

const unit = (ids: CorpusIds) => ({
  serial: `T-C-${uniq()}`,
  position: 'T1',
  siteId: ids.siteId,
  designId: ids.designId,
  year: 2010,
  phases: 3,
  hvKV: 132,
  lvKV: 33,
  ratedKVA: 40000,
  impedancePercent: 10.5,
  systemImpedancePercent: 0.5,
  conductor: 'Cu',
});

const sweepFields = { label: 'HV open circuit A', testType: 'open-circuit', terminals: 'H1-H0', tapPosition: '9b', demagnetised: 'true', winding: 'hv', phase: 'A' };
const site = () => ({ name: `Corpus site ${uniq()}`, timeZone: 'Europe/London', locale: 'en-GB', controlRoomEmail: 'room@example.com' });
const formatQuery = { format: 'csv' };

/** Each route's id parameters, by name. */
export function idParams(ids: CorpusIds): Record<string, number> {
  return {
    eventId: ids.eventId,
    sessionId: ids.sessionId,
    screeningId: ids.screeningId,
    followUpId: ids.followUpId,
    unitId: ids.unitId,
    designId: ids.designId,
    siteId: ids.siteId,
    userId: ids.userId,
    sweepId: ids.sweepId,
    readingSetId: ids.readingSetId,
    attachmentId: ids.eventAttachmentId,
    findingId: ids.findingId,
    notificationId: ids.notificationId,
    version: ids.criteriaVersion,
    messageId: 1,
    index: 0,
  };
}

/** Known-good query, body and file per route (params come from `idParams`, overridden here where the route needs another row). */
export const BASES: Record<string, (ids: CorpusIds) => Base> = {
  'POST /auth/login': () => ({ body: { email: 'nobody-corpus@test.example', password: 'not a password of anyone' } }),
  'POST /auth/password': () => ({ body: { currentPassword: 'correct horse battery', newPassword: 'a corpus passphrase 2026' } }),
  'GET /users': () => ({ query: { q: 'Test', role: 'tester', active: 'true', page: '1', pageSize: '25' } }),
  'POST /users': (ids) => ({ body: { email: `c-${uniq()}@test.example`, name: 'Corpus Person', roles: ['tester'], siteIds: [ids.siteId], allSites: false } }),
  'PATCH /users/:userId': (ids) => ({ body: { name: 'Corpus Renamed', roles: ['tester'], siteIds: [ids.siteId], allSites: false, active: true } }),
  'POST /sites': () => ({ body: site() }),
  'PATCH /sites/:siteId': () => ({ body: site() }),
  'GET /designs/:designId/sisters': () => ({ query: { quantity: 'capacitance.CHL' } }),
  'POST /designs': () => ({ body: design() }),
  'PATCH /designs/:designId': () => ({ body: design() }),
  'GET /units/export': (ids) => ({ query: { q: 'T-', siteId: String(ids.siteId), designId: String(ids.designId), recommendation: 'go', sort: 'serial', format: 'csv' } }),
  'POST /units/import': () => ({ body: { mapping: '{"serial":"serial"}', dryRun: 'true' }, file: UNITS_CSV }),
  'POST /units/reading-sets/import': () => ({ body: { mapping: '{"serial":"serial"}', dryRun: 'true' }, file: UNITS_CSV }),
  'POST /units/:unitId/reading-sets/import': () => ({
    body: { kind: 'routine', takenAt: '2025-06-01T08:00:00Z', isReference: 'false', tapPosition: '9b', instrument: 'M4100', notes: 'Corpus import' },
    file: READINGS_CSV,
  }),
  'GET /units': (ids) => ({ query: { q: 'T-', siteId: String(ids.siteId), designId: String(ids.designId), recommendation: 'go', sort: 'serial', page: '1', pageSize: '50' } }),
  'POST /units': (ids) => ({ body: unit(ids) }),
  'PATCH /units/:unitId': (ids) => ({ body: unit(ids) }),
  'POST /units/:unitId/reading-sets': () => ({ body: { kind: 'routine', isReference: false, ...fullReadings(), takenAt: '2025-06-01T08:00:00Z' } }),
  'POST /units/:unitId/sweeps': (ids) => ({ body: { ...sweepFields, readingSetId: String(ids.readingSetId) }, file: SWEEP_CSV }),
  'POST /events': (ids) => ({ body: { unitId: ids.unitId, ...fault() } }),
  'GET /events': (ids) => ({
    query: { q: 'T-', status: 'testing', type: 'three-phase', unitId: String(ids.unitId), siteId: String(ids.siteId), from: '2026-01-01', to: '2026-12-31', withoutAttachments: 'false', sort: '-occurredAt', page: '1', pageSize: '50' },
  }),
  'PATCH /events/:eventId': () => ({ body: fault() }),
  'POST /events/:eventId/attachments': () => ({ file: RELAY_TXT }),
  'POST /events/:eventId/sessions': () => ({ body: { ...fullReadings(), preFaultGas: { takenAt: '2026-11-20T08:00:00Z', dissolvedGasPPM: { H2: 10, C2H2: 0 } } } }),
  'PATCH /sessions/:sessionId': () => ({ body: fullReadings() }),
  'POST /sessions/:sessionId/imports': () => ({ file: READINGS_CSV }),
  'POST /sessions/:sessionId/sweeps': () => ({ body: { ...sweepFields, baselineTapPosition: '9b' }, file: SWEEP_CSV }),
  'PATCH /reading-sets/:readingSetId': () => ({ body: { ...fullReadings(), takenAt: '2019-05-02T08:00:00Z' } }),
  'POST /screenings/preview': () => ({ body: JSON.parse(example('examples/cases/clean-go.json').toString('utf8')) as Record<string, unknown> }),
  'POST /events/:eventId/screenings': () => ({ body: { criteriaVersion: 2, comparison: false } }),
  'POST /screenings/:screeningId/decision': () => ({
    body: { outcome: 'release-with-restrictions', reason: 'Readings within limits after the fault', restrictions: 'Load below 80 % until the oil sample', followUps: [{ task: 'Oil sample', dueAt: '2026-12-10T00:00:00Z' }] },
  }),
  'POST /follow-ups/:followUpId/close': () => ({ body: { result: 'Oil sample taken, gases unchanged' } }),
  'POST /events/:eventId/findings': () => ({ body: { classification: 'no-damage', text: 'Corpus finding' } }),
  'POST /events/:eventId/energised': (ids) => ({ params: { eventId: ids.releasedEventId }, body: { at: '2026-12-01T10:30:00Z' } }),
  'POST /events/:eventId/restrictions/lift': (ids) => ({ params: { eventId: ids.releasedEventId }, body: { reason: 'Oil sample clean' } }),
  'POST /findings/:findingId/attachments': () => ({ file: PHOTO_PNG }),
  'GET /findings/:findingId/attachments/:attachmentId': (ids) => ({ params: { findingId: ids.findingId, attachmentId: ids.findingAttachmentId } }),
  'GET /units/:unitId/readings/export': () => ({ query: formatQuery }),
  'GET /screenings/:screeningId/indicators/export': () => ({ query: formatQuery }),
  'GET /events/:eventId/audit/export': () => ({ query: formatQuery }),
  'GET /follow-ups': (ids) => ({ query: { due: 'open', siteId: String(ids.siteId), page: '1', pageSize: '50' } }),
  'POST /criteria': () => ({ body: { fromVersion: 2, name: 'Corpus draft', notes: 'Corpus notes' } }),
  'PATCH /criteria/:version': () => ({ body: { name: 'Corpus draft renamed', notes: 'Corpus notes' } }),
  'GET /security-events': () => ({ query: { page: '1', pageSize: '25' } }),
};
