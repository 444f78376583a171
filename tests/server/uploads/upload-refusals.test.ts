// Wrong files on every uploader: 415 naming the field `file`, the file and the types taken (the words of
// shared/uploads/file-types.ts, the same the client shows before uploading), and 400s whose message says the first
// problem with the file (where, what is wrong, what is expected) with every problem in `fields`.
import { describe, expect, it } from 'vitest';
import { Attachment } from '../../../server/features/attachments/attachment.entity.js';
import { SweepTrace } from '../../../server/features/readings/sweep-trace.entity.js';
import { fileTypeProblem, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';
import { sweepCsv } from '../../helpers/sweep-csv.js';
import { correctionsFlow } from '../corrections/flow.js';

const f = correctionsFlow();

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from('IHDR-invented-pixels')]);
const DOCX = Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0]);

const sweepsOf = (sessionId: number) => f.env.db.getRepository(SweepTrace).countBy({ readingSetId: sessionId });
const sweepUpload = (sessionId: number, bytes: Buffer | string, name: string) =>
  f.api().post(`/api/sessions/${sessionId}/sweeps`).set(f.as.tester).field('label', 'HV-A-open').field('testType', 'open-circuit').attach('file', Buffer.from(bytes), name);

describe('sweep uploads (POST /api/sessions/:id/sweeps)', () => {
  it('answers 415 for a workbook, naming the file and the CSV and text types, and stores nothing', async () => {
    const { sessionId } = await f.event();
    const res = await sweepUpload(sessionId, DOCX, 'HV-A.xlsx');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_file_type');
    expect(res.body.error.message).toBe('HV-A.xlsx is not a sweep file: pick a CSV (.csv) or text (.txt) file.');
    expect(res.body.error.fields).toEqual({ file: res.body.error.message });
    expect(res.body.error.message).toBe(fileTypeProblem(UPLOAD_TYPES.sweep, 'HV-A.xlsx'));
    expect(await sweepsOf(sessionId)).toBe(0);
  });

  it('answers 415 for a .csv that is not text, saying what a sweep file holds', async () => {
    const { sessionId } = await f.event();
    const res = await sweepUpload(sessionId, Buffer.from([0, 1, 2, 3, 0xff]), 'trace.csv');
    expect(res.status).toBe(415);
    expect(res.body.error.fields.file).toBe('trace.csv is not comma-separated text: a sweep file has one point a line, frequencyHz,magnitudeDb[,phaseDeg].');
  });

  it('answers 400 with the header problem in the message itself, not only in the fields', async () => {
    const { sessionId } = await f.event();
    const res = await sweepUpload(sessionId, sweepCsv().replace('frequencyHz,magnitudeDb', 'freq,level'), 'trace.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_file');
    expect(res.body.error.fields.header).toMatch(/^unknown column 'level': expected frequency \(Hz\), magnitude \(dB\)/);
    expect(res.body.error.message).toBe(`The sweep file was not saved: header: ${res.body.error.fields.header}.`);
    expect(await sweepsOf(sessionId)).toBe(0);
  });

  it('counts the further problems in the message when there are several', async () => {
    const { sessionId } = await f.event();
    const bad = sweepCsv().split('\n');
    bad[3] = '100,abc';
    bad[5] = '200,-40,xyz';
    const res = await sweepUpload(sessionId, bad.join('\n'), 'trace.csv');
    expect(res.status).toBe(400);
    const keys = Object.keys(res.body.error.fields);
    expect(keys.length).toBeGreaterThanOrEqual(2);
    expect(res.body.error.message).toMatch(new RegExp(`^The sweep file was not saved: line 4, (magnitude \\(dB\\)|phase \\(deg\\)): .+ \\(and ${keys.length - 1} more problems?\\)\\.$`));
  });
});

describe('relay records (POST /api/events/:id/attachments)', () => {
  it('answers 415 for a Word document, listing the relay-record types once, and stores nothing', async () => {
    const { eventId } = await f.event({ session: false });
    const res = await f.api().post(`/api/events/${eventId}/attachments`).set(f.as.protection).attach('file', DOCX, 'notes.docx');
    expect(res.status).toBe(415);
    expect(res.body.error.fields.file).toBe('notes.docx is not a relay record: pick a COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) file.');
    expect(await f.env.db.getRepository(Attachment).countBy({ ownerType: 'event', ownerId: eventId })).toBe(0);
  });
});

describe('photos and PDFs on findings (POST /api/findings/:id/attachments)', () => {
  async function finding() {
    const { eventId } = await f.event({ session: false });
    const res = await f.api().post(`/api/events/${eventId}/findings`).set(f.as.engineer).send({ classification: 'no-damage', text: 'Seen through the cover.' }).expect(201);
    return res.body.id as number;
  }

  it('answers 415 for a .heic photo naming the types taken, and takes a PNG without an extension by its MIME type', async () => {
    const findingId = await finding();
    const heic = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', PNG, 'bushing.heic');
    expect(heic.status).toBe(415);
    expect(heic.body.error.fields.file).toBe('bushing.heic is not a photo or PDF: pick a JPEG (.jpg, .jpeg), PNG (.png), WebP (.webp) or PDF (.pdf) file.');
    const pasted = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', PNG, { filename: 'image', contentType: 'image/png' });
    expect(pasted.status).toBe(201);
    expect(pasted.body.kind).toBe('png');
  });
});
