import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { looksLikeCsvText } from '../../../shared/imports/sniff.js';
import { parseSweepCsv } from '../../../shared/imports/sweep-csv.js';
import type { SweepMeta } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { refuseOtherTypes, unsupportedType, utf8Name } from '../../common/upload.js';
import { fileProblemList, SWEEP_FILE_COLUMNS, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';
import { SweepTrace } from './sweep-trace.entity.js';

export interface SweepFields {
  label: string;
  testType: SweepTrace['testType'];
  terminals?: string;
  tapPosition?: string;
  demagnetised?: boolean;
  winding?: 'hv' | 'lv' | 'tv';
  phase?: 'A' | 'B' | 'C';
  /** Post-fault traces only: the tap of the baseline trace compared with (default: that trace's own tap). */
  baselineTapPosition?: string;
}

/**
 * Checks an uploaded sweep file (type by name, then text content) and parses its points; 415 / 400 naming the field
 * `file` (or the line) and what is expected.
 */
export function parseSweepUpload(file: { originalname: string; mimetype?: string; buffer: Buffer }): { points: number[][]; minHz: number; maxHz: number } {
  refuseOtherTypes(UPLOAD_TYPES.sweep, file);
  if (!looksLikeCsvText(new Uint8Array(file.buffer))) {
    throw unsupportedType(`${utf8Name(file.originalname)} is not comma-separated text: a sweep file has one point a line, frequencyHz,magnitudeDb[,phaseDeg].`);
  }
  const parsed = parseSweepCsv(file.buffer.toString('utf8'));
  if (!parsed.ok) throw fileProblems('The sweep file', parsed.fields);
  return parsed;
}

/** 400 for a sweep file whose content is wrong: every problem in `fields`, the first (and how many more) in the message. */
function fileProblems(what: string, fields: Record<string, string>): AppError {
  const list = fileProblemList(fields, SWEEP_FILE_COLUMNS, 'line');
  const first = list[0] ?? { key: 'file', place: 'File', message: 'it cannot be read' };
  const more = list.length > 1 ? ` (and ${list.length - 1} more problem${list.length > 2 ? 's' : ''})` : '';
  const where = first.key === 'file' ? '' : `${first.place.charAt(0).toLowerCase()}${first.place.slice(1)}: `;
  return new AppError('invalid_file', `${what} was not saved: ${where}${first.message}${more}.`, 400, fields);
}

/** Stores one trace on a reading set (inside the caller's transaction), audited. */
export async function insertSweepTrace(
  m: EntityManager,
  clock: Clock,
  readingSetId: number,
  fields: SweepFields,
  parsed: { points: number[][]; minHz: number; maxHz: number },
  fileName: string | null,
  userId: number | null,
): Promise<SweepTrace> {
  // The multipart parser reads a file name as Latin-1: store the name as the browser sent it (UTF-8), and refuse one
  // longer than its column (255 characters) by name rather than fail in the database.
  if (fileName !== null) fileName = utf8Name(fileName);
  if (fileName !== null && [...fileName].length > 255) throw new AppError('invalid_input', 'The file name is longer than 255 characters: rename the file.', 400, { file: 'file name longer than 255 characters' });
  const repo = m.getRepository(SweepTrace);
  const trace = await repo.save(
    repo.create({
      readingSetId,
      label: fields.label,
      testType: fields.testType,
      terminals: fields.terminals || null,
      tapPosition: fields.tapPosition || null,
      demagnetised: fields.demagnetised ?? null,
      winding: fields.winding ?? null,
      phase: fields.phase ?? null,
      baselineTapPosition: fields.baselineTapPosition || null,
      points: parsed.points,
      pointCount: parsed.points.length,
      minHz: parsed.minHz,
      maxHz: parsed.maxHz,
      sha256: createHash('sha256').update(JSON.stringify(parsed.points)).digest('hex'),
      fileName,
      createdById: userId,
      createdAt: clock.now(),
    }),
  );
  await audit(m, clock, { userId, action: 'create', entity: 'sweep_trace', entityId: trace.id, after: { readingSetId, label: trace.label, testType: trace.testType, winding: trace.winding, phase: trace.phase, tapPosition: trace.tapPosition, baselineTapPosition: trace.baselineTapPosition, demagnetised: trace.demagnetised, pointCount: trace.pointCount, sha256: trace.sha256, fileName } });
  return trace;
}

/** One trace with its points (overlay charts). */
export async function getSweep(m: EntityManager, sweepId: number) {
  const t = await m.getRepository(SweepTrace).findOne({ where: { id: sweepId } });
  if (!t) throw notFound('Sweep trace');
  return { ...sweepMeta(t), points: t.points };
}

/** A trace without its points (lists). */
export function sweepMeta(t: SweepTrace) {
  return {
    id: t.id,
    readingSetId: t.readingSetId,
    label: t.label,
    testType: t.testType,
    terminals: t.terminals,
    winding: t.winding,
    phase: t.phase,
    tapPosition: t.tapPosition,
    baselineTapPosition: t.baselineTapPosition,
    demagnetised: t.demagnetised,
    pointCount: t.pointCount,
    minHz: t.minHz,
    maxHz: t.maxHz,
    sha256: t.sha256,
    fileName: t.fileName,
    createdAt: t.createdAt.toISOString(),
  } satisfies SweepMeta;
}
