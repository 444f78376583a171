import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import { parseReadingsCsv, readingRowsToSet } from '../../../shared/imports/readings-csv.js';
import { looksLikeCsvText } from '../../../shared/imports/sniff.js';
import { readingSetToRows } from '../../../shared/readings/rows.js';
import { readingSetSchema, type ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import type { SessionBody, SessionPatch } from '../../../shared/schemas/fleet.js';
import type { CorrectedSession, CreatedSession, ImportAnswer } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import { zodFields } from '../../common/validate.js';
import type { Clock } from '../../common/clock.js';
import { refuseOtherTypes, unsupportedType, utf8Name } from '../../common/upload.js';
import { fileProblemList, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';
import { insertReadingRows } from '../imports/insert-readings.js';
import { Reading } from '../readings/reading.entity.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { applyReadingSetPatch } from '../readings/reading-set-correction.js';
import { insertReadingSet, loadCaseReadingSets } from '../readings/readings.service.js';
import { insertSweepTrace, sweepMeta, type SweepFields } from '../readings/sweeps.service.js';
import { readingSetConditions } from '../units/units.service.js';
import { assertCorrectable, caseText, moveEvent, staleScreening } from './events.service.js';
import { FaultEvent } from './fault-event.entity.js';

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
/** The readings file's columns in words (the parser's keys name them: "row 4.value"). */
const READINGS_FILE_COLUMNS: Record<string, string> = {
  quantity: 'quantity',
  configuration: 'configuration (terminal or winding pair)',
  phase: 'phase',
  value: 'value',
  unit: 'unit',
};

/**
 * 400 for a readings file whose content is wrong, as the sweep upload words it: every problem in `fields`, the first in
 * the message with its line and column in words, and how many more ("(and 3 more problems)", counting the bad rows the
 * parser did not list).
 */
export function readingsFileProblems(fields: Record<string, string>): AppError {
  const all = fileProblemList(fields, READINGS_FILE_COLUMNS, 'line');
  const listed = all.filter((p) => p.key !== 'more');
  const unlisted = Number(/^(\d+) more/.exec(fields.more ?? '')?.[1] ?? 0);
  const first = listed[0] ?? { key: 'file', place: 'File', message: 'it cannot be read' };
  const others = listed.length - 1 + unlisted;
  const more = others > 0 ? ` (and ${others} more problem${others === 1 ? '' : 's'})` : '';
  const where = first.key === 'file' ? '' : `${first.place.charAt(0).toLowerCase()}${first.place.slice(1)}: `;
  return new AppError('invalid_file', `The file has errors; nothing was imported: ${where}${first.message}${more}.`, 400, fields);
}

export async function importReadingsCsv(m: EntityManager, clock: Clock, userId: number, sessionId: number, file: { originalname: string; mimetype?: string; buffer: Buffer }) {
  refuseOtherTypes(UPLOAD_TYPES.sessionReadings, file);
  if (!looksLikeCsvText(new Uint8Array(file.buffer))) {
    throw unsupportedType(`${utf8Name(file.originalname)} is not comma-separated text: a readings file has a header quantity,configuration,phase,value,unit and one reading a line.`);
  }
  // Bushing terminals whose C1 the session already has: the file may give only their other readings.
  const knownBushingTerminals = (await m.getRepository(Reading).find({ where: { readingSetId: sessionId, quantity: 'bushing-c1' } })).map((r) => r.configuration ?? '');
  const parsed = parseReadingsCsv(file.buffer.toString('utf8'), { knownBushingTerminals });
  if (!parsed.ok) throw readingsFileProblems(parsed.fields);
  const { windingTemperatureC, ...values } = readingRowsToSet(parsed.rows);
  // The file's values within the case format's ranges, as a typed set would be (a value in the wrong unit is refused
  // here, before anything is written, rather than stored and failing the report later).
  // Only values are checked here: a part the file may leave to the session (a bushing's C1 already there) is not missing.
  const inRange = readingSetSchema.safeParse({ ...values, ...(windingTemperatureC !== undefined ? { windingTemperatureC } : {}) }, { reportInput: true });
  const valueIssues = inRange.success ? [] : inRange.error.issues.filter((i) => !(i.code === 'invalid_type' && i.input === undefined));
  if (!inRange.success && valueIssues.length > 0) {
    const fields = zodFields(new z.ZodError(valueIssues));
    const [path, message] = Object.entries(fields)[0] ?? ['file', 'a value is out of range'];
    throw new AppError('invalid_file', `The file has a value out of range; nothing was imported: ${path}: ${message}.`, 400, fields);
  }
  const set = await openSession(m, clock, sessionId, userId, 'A readings import');
  // Every bushing terminal has its C1 here or in the session (checked by the parser): the rows make a valid set.
  const rows = readingSetToRows(values as CaseReadingSet);
  await insertReadingRows(m, set.id, rows);
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

/**
 * Corrects a session's conditions and readings (PATCH /api/sessions/:sessionId) before the screening that used it is
 * decided (409 then: a new session instead). Only the fields named change; a reading section named replaces the
 * session's rows of that section. Audited with the changed fields before and after. A screened event whose case
 * changed moves back to testing (a new screening is needed).
 */
export async function correctSession(m: EntityManager, clock: Clock, userId: number, sessionId: number, patch: SessionPatch) {
  const repo = m.getRepository(ReadingSet);
  const set = await repo.findOne({ where: { id: sessionId } });
  if (!set || set.kind !== 'post-fault' || set.eventId === null) throw notFound('Session');
  const event = await m.getRepository(FaultEvent).findOneOrFail({ where: { id: set.eventId }, lock: { mode: 'pessimistic_write' } });
  await assertCorrectable(m, event, 'The session cannot be corrected: record a new session instead', set.createdAt).catch((e: AppError) => {
    throw new AppError(e.code, 'The screening that used this session is decided: its readings never change. Record a new session instead.', e.status);
  });
  const caseBefore = await caseText(m, event.id);
  const { after, values: valuesAfter, changed } = await applyReadingSetPatch(m, clock, userId, set, patch, 'Session corrected');
  let stale: { screeningStale: boolean; note: string | null; status: FaultEvent['status'] } = { screeningStale: false, note: null, status: event.status };
  if (changed) {
    stale = await staleScreening(m, clock, event.id, caseBefore, userId, 'A correction of a session');
  }
  return { ...readingSetConditions(after), values: valuesAfter, eventStatus: stale.status, screeningStale: stale.screeningStale, note: stale.note } satisfies CorrectedSession;
}
