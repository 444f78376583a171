import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { parseReadingsCsv, readingRowsToSet } from '../../../shared/imports/readings-csv.js';
import { looksLikeCsvText } from '../../../shared/imports/sniff.js';
import { readingSetToRows } from '../../../shared/readings/rows.js';
import type { ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import type { SessionBody } from '../../../shared/schemas/fleet.js';
import type { CreatedSession, ImportAnswer } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { extensionOf, unsupportedType } from '../../common/upload.js';
import { Reading } from '../readings/reading.entity.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { insertReadingSet, loadCaseReadingSets } from '../readings/readings.service.js';
import { insertSweepTrace, sweepMeta, type SweepFields } from '../readings/sweeps.service.js';
import { readingSetConditions } from '../units/units.service.js';
import { moveEvent } from './events.service.js';

/**
 * Opens a post-fault session with its readings; the event moves to testing (409 when released). A `preFaultGas` sample
 * is stored in the same transaction as a routine reading set of the unit dated at its sampling time, which must be
 * before the fault (400 naming `preFaultGas.takenAt`), so the event's case carries it in `previous`.
 */
export async function createSession(m: EntityManager, clock: Clock, userId: number, eventId: number, body: SessionBody) {
  const { preFaultGas, ...session } = body;
  const event = await moveEvent(m, clock, eventId, 'testing', userId, 'A new post-fault session');
  let preFault: ReadingSet | null = null;
  if (preFaultGas) {
    const sampledAt = new Date(preFaultGas.takenAt);
    if (sampledAt.getTime() >= event.occurredAt.getTime()) {
      throw new AppError('invalid_input', 'Some fields are invalid.', 400, {
        'preFaultGas.takenAt': `must be before the fault (${event.occurredAt.toISOString()}): a sample taken after it is a post-fault reading`,
      });
    }
    preFault = await insertReadingSet(m, clock, {
      unitId: event.unitId,
      kind: 'routine',
      body: { takenAt: preFaultGas.takenAt, dissolvedGasPPM: preFaultGas.dissolvedGasPPM, notes: `Pre-fault dissolved-gas sample, entered with a post-fault session of event ${eventId}.` },
      userId,
      auditNote: `pre-fault dissolved-gas sample for event ${eventId}`,
    });
  }
  const set = await insertReadingSet(m, clock, { unitId: event.unitId, kind: 'post-fault', eventId, body: session, userId });
  const values = await loadCaseReadingSets(m, preFault ? [set, preFault] : [set]);
  return {
    ...readingSetConditions(set),
    values: values.get(set.id),
    eventStatus: 'testing' as const,
    ...(preFault ? { preFaultGas: { ...readingSetConditions(preFault), values: values.get(preFault.id) } } : {}),
  } satisfies CreatedSession;
}

/** The session (a post-fault reading set) whose event is still open; adding to it moves the event back to testing. */
async function openSession(m: EntityManager, clock: Clock, sessionId: number, userId: number, what: string): Promise<ReadingSet> {
  const set = await m.getRepository(ReadingSet).findOne({ where: { id: sessionId } });
  if (!set || set.kind !== 'post-fault' || set.eventId === null) throw notFound('Session');
  await moveEvent(m, clock, set.eventId, 'testing', userId, what);
  return set;
}

/** Imports a readings CSV into a session: every row or none, every bad row listed. */
export async function importReadingsCsv(m: EntityManager, clock: Clock, userId: number, sessionId: number, file: { originalname: string; buffer: Buffer }) {
  const ext = extensionOf(file.originalname);
  if (!['.csv', '.txt'].includes(ext)) throw unsupportedType(`A readings import must be a .csv file, not "${ext || 'no extension'}".`);
  if (!looksLikeCsvText(new Uint8Array(file.buffer))) throw unsupportedType('The file is not comma-separated text.');
  // Bushing terminals whose C1 the session already has: the file may give only their other readings.
  const knownBushingTerminals = (await m.getRepository(Reading).find({ where: { readingSetId: sessionId, quantity: 'bushing-c1' } })).map((r) => r.configuration ?? '');
  const parsed = parseReadingsCsv(file.buffer.toString('utf8'), { knownBushingTerminals });
  if (!parsed.ok) throw new AppError('invalid_file', 'The file has errors; nothing was imported.', 400, parsed.fields);
  const set = await openSession(m, clock, sessionId, userId, 'A readings import');
  const { windingTemperatureC, ...values } = readingRowsToSet(parsed.rows);
  // Every bushing terminal has its C1 here or in the session (checked by the parser): the rows make a valid set.
  const rows = readingSetToRows(values as CaseReadingSet);
  if (rows.length) await m.insert(Reading, rows.map((r) => ({ ...r, readingSetId: set.id })));
  // The winding temperature is a condition of the set (a column), not a reading row.
  const before = set.windingTemperatureC;
  if (windingTemperatureC !== undefined) await m.getRepository(ReadingSet).update(set.id, { windingTemperatureC });
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  await audit(m, clock, {
    userId,
    action: 'import',
    entity: 'reading_set',
    entityId: set.id,
    ...(windingTemperatureC !== undefined ? { before: { windingTemperatureC: before } } : {}),
    after: { file: file.originalname, sha256, rows: parsed.rows.length, ...(windingTemperatureC !== undefined ? { windingTemperatureC } : {}) },
  });
  return { imported: parsed.rows.length, rows: parsed.rows } satisfies ImportAnswer;
}

/** Stores a post-fault sweep trace on a session. */
export async function addSessionSweep(
  m: EntityManager,
  clock: Clock,
  userId: number,
  sessionId: number,
  fields: SweepFields,
  parsed: { points: number[][]; minHz: number; maxHz: number },
  fileName: string,
) {
  const set = await openSession(m, clock, sessionId, userId, 'A post-fault sweep');
  return sweepMeta(await insertSweepTrace(m, clock, set.id, fields, parsed, fileName, userId));
}
