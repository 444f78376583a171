import { createHash } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { parseReadingsCsv, readingRowsToSet } from '../../../shared/imports/readings-csv.js';
import { looksLikeCsvText } from '../../../shared/imports/sniff.js';
import { readingSetToRows } from '../../../shared/readings/rows.js';
import type { SessionBody } from '../../../shared/schemas/fleet.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import { extensionOf, unsupportedType } from '../../common/upload.js';
import { Reading } from '../readings/reading.entity.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { insertReadingSet, loadCaseReadingSets } from '../readings/readings.service.js';
import { insertSweepTrace, sweepMeta, type SweepFields } from '../readings/sweeps.service.js';
import { readingSetConditions } from '../units/units.service.js';
import { moveEvent } from './events.service.js';

/** Opens a post-fault session with its readings; the event moves to testing (409 when released). */
export async function createSession(db: DataSource, userId: number, eventId: number, body: SessionBody) {
  return db.transaction(async (m) => {
    const event = await moveEvent(m, eventId, 'testing', userId, 'A new post-fault session');
    const set = await insertReadingSet(m, { unitId: event.unitId, kind: 'post-fault', eventId, body, userId });
    const values = await loadCaseReadingSets(m, [set]);
    return { ...readingSetConditions(set), values: values.get(set.id), eventStatus: 'testing' as const };
  });
}

/** The session (a post-fault reading set) whose event is still open; adding to it moves the event back to testing. */
async function openSession(m: EntityManager, sessionId: number, userId: number, what: string): Promise<ReadingSet> {
  const set = await m.getRepository(ReadingSet).findOne({ where: { id: sessionId } });
  if (!set || set.kind !== 'post-fault' || set.eventId === null) throw notFound('Session');
  await moveEvent(m, set.eventId, 'testing', userId, what);
  return set;
}

/** Imports a readings CSV into a session: every row or none, every bad row listed. */
export async function importReadingsCsv(db: DataSource, userId: number, sessionId: number, file: { originalname: string; buffer: Buffer }) {
  const ext = extensionOf(file.originalname);
  if (!['.csv', '.txt'].includes(ext)) throw unsupportedType(`A readings import must be a .csv file, not "${ext || 'no extension'}".`);
  if (!looksLikeCsvText(new Uint8Array(file.buffer))) throw unsupportedType('The file is not comma-separated text.');
  const parsed = parseReadingsCsv(file.buffer.toString('utf8'));
  if (!parsed.ok) throw new AppError('invalid_file', 'The file has errors; nothing was imported.', 400, parsed.fields);
  return db.transaction(async (m) => {
    const set = await openSession(m, sessionId, userId, 'A readings import');
    const rows = readingSetToRows(readingRowsToSet(parsed.rows));
    await m.insert(Reading, rows.map((r) => ({ ...r, readingSetId: set.id })));
    const sha256 = createHash('sha256').update(file.buffer).digest('hex');
    await audit(m, { userId, action: 'import', entity: 'reading_set', entityId: set.id, after: { file: file.originalname, sha256, rows: parsed.rows.length } });
    return { imported: parsed.rows.length, rows: parsed.rows };
  });
}

/** Stores a post-fault sweep trace on a session. */
export async function addSessionSweep(
  db: DataSource,
  userId: number,
  sessionId: number,
  fields: SweepFields,
  parsed: { points: number[][]; minHz: number; maxHz: number },
  fileName: string,
) {
  return db.transaction(async (m) => {
    const set = await openSession(m, sessionId, userId, 'A post-fault sweep');
    return sweepMeta(await insertSweepTrace(m, set.id, fields, parsed, fileName, userId));
  });
}
