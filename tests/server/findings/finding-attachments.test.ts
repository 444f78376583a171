// POST /api/findings/:id/attachments and GET …/:attachmentId: photos (JPEG, PNG, WebP) and PDFs judged by their bytes,
// a 10 MB limit, SHA-256 kept, the upload audited, downloads with a safe Content-Disposition.
import { createHash } from 'node:crypto';
import type request from 'supertest';
import { describe, expect, it } from 'vitest';
import { AttachmentContent } from '../../../server/features/attachments/attachment-content.entity.js';
import { Attachment } from '../../../server/features/attachments/attachment.entity.js';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { correctionsFlow } from '../corrections/flow.js';

const f = correctionsFlow();

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from('IHDR-invented-pixels')]);
const JPEG = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.from('JFIF-invented')]);
const WEBP = Buffer.concat([Buffer.from('RIFF'), Buffer.from([0x10, 0, 0, 0]), Buffer.from('WEBPVP8 invented')]);
const PDF = Buffer.from('%PDF-1.7\n% invented inspection report\n');

async function finding() {
  const { eventId } = await f.event();
  const res = await f.api().post(`/api/events/${eventId}/findings`).set(f.as.engineer).send({ classification: 'no-damage', text: 'Core and windings seen through the inspection cover.' }).expect(201);
  return { eventId, findingId: res.body.id as number };
}

const countFiles = (findingId: number) => f.env.db.getRepository(Attachment).countBy({ ownerType: 'finding', ownerId: findingId });

describe('POST /api/findings/:findingId/attachments', () => {
  it('stores a PNG with its SHA-256, audits it and lists it on the finding in the event file', async () => {
    const { eventId, findingId } = await finding();
    const res = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', PNG, 'winding.png');
    expect(res.status).toBe(201);
    const sha256 = createHash('sha256').update(PNG).digest('hex');
    expect(res.body).toMatchObject({ name: 'winding.png', contentType: 'image/png', kind: 'png', size: PNG.length, sha256 });
    const stored = await f.env.db.getRepository(AttachmentContent).findOneByOrFail({ attachmentId: res.body.id });
    expect(Buffer.compare(stored.data, PNG)).toBe(0);
    const row = await f.env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'attachment', entityId: String(res.body.id) });
    expect(row.action).toBe('create');
    expect(row.after).toMatchObject({ findingId, eventId, name: 'winding.png', kind: 'png', sha256 });
    const ev = (await f.api().get(`/api/events/${eventId}`).set(f.as.tester).expect(200)).body;
    expect(ev.findings[0].attachments).toEqual([res.body]);
    expect(ev.audit.some((a: { entity: string; entityId: string }) => a.entity === 'attachment' && a.entityId === String(res.body.id))).toBe(true);
  });

  it('judges the type by content: JPEG, WebP and PDF are taken, and a PNG named .pdf is stored as a PNG', async () => {
    const { findingId } = await finding();
    const kinds: string[] = [];
    for (const [bytes, name] of [[JPEG, 'a.jpg'], [WEBP, 'b.webp'], [PDF, 'c.pdf'], [PNG, 'photo.pdf']] as const) {
      const res = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.admin).attach('file', bytes, name).expect(201);
      kinds.push(`${res.body.kind} ${res.body.contentType}`);
    }
    expect(kinds).toEqual(['jpeg image/jpeg', 'webp image/webp', 'pdf application/pdf', 'png image/png']);
  });

  it('answers 415 naming what was found for a text file named .jpg, and stores nothing', async () => {
    const { findingId } = await finding();
    const res = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', Buffer.from('not a photo\n'), 'photo.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.fields.file).toMatch(/JPEG, PNG, WebP or PDF.*this file is text/);
    const gif = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', Buffer.from('GIF89a-invented'), 'photo.png');
    expect(gif.status).toBe(415);
    expect(gif.body.error.fields.file).toMatch(/a GIF image/);
    expect(await countFiles(findingId)).toBe(0);
  });

  it('answers 413 for a file over 10 MB and stores nothing', async () => {
    const { findingId } = await finding();
    const big = Buffer.concat([PNG, Buffer.alloc(10 * 1024 * 1024)]);
    const res = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', big, 'big.png');
    expect(res.status).toBe(413);
    expect(await countFiles(findingId)).toBe(0);
  });

  it('answers 400 naming the field without a file, 404 for an unknown finding', async () => {
    const { findingId } = await finding();
    const none = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).field('x', '1');
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toEqual({ file: 'required' });
    const unknown = await f.api().post('/api/findings/987654321/attachments').set(f.as.engineer).attach('file', PNG, 'a.png');
    expect(unknown.status).toBe(404);
  });

  it('lets only engineers and admins add one (403 for the other roles, 401 without a token)', async () => {
    const { findingId } = await finding();
    for (const role of ['protection', 'tester', 'manager'] as const) {
      expect((await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as[role]).attach('file', PNG, 'a.png')).status).toBe(403);
    }
    expect((await f.api().post(`/api/findings/${findingId}/attachments`).attach('file', PNG, 'a.png')).status).toBe(401);
    expect(await countFiles(findingId)).toBe(0);
  });
});

describe('GET /api/findings/:findingId/attachments/:attachmentId', () => {
  const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  };

  it('downloads the bytes to any signed-in person, with the stored type, checksum and an RFC 5987 name', async () => {
    const { findingId } = await finding();
    const up = await f.api().post(`/api/findings/${findingId}/attachments`).set(f.as.engineer).attach('file', JPEG, 'Трансформатор "T2".jpg').expect(201);
    const res = await f.api().get(`/api/findings/${findingId}/attachments/${up.body.id}`).set(f.as.protection).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('image/jpeg');
    expect(res.headers['x-content-sha256']).toBe(up.body.sha256);
    expect(res.headers['content-disposition']).toBe(
      `attachment; filename="_____________ _T2_.jpg"; filename*=UTF-8''${encodeURIComponent('Трансформатор "T2".jpg')}`,
    );
    expect(Buffer.compare(res.body as Buffer, JPEG)).toBe(0);
    expect((await f.api().get(`/api/findings/${findingId}/attachments/${up.body.id}`)).status).toBe(401);
  });

  it('answers 404 for an attachment of another finding or of an event', async () => {
    const a = await finding();
    const b = await finding();
    const up = await f.api().post(`/api/findings/${a.findingId}/attachments`).set(f.as.engineer).attach('file', PDF, 'report.pdf').expect(201);
    expect((await f.api().get(`/api/findings/${b.findingId}/attachments/${up.body.id}`).set(f.as.tester)).status).toBe(404);
    const relay = await f.api().post(`/api/events/${a.eventId}/attachments`).set(f.as.protection).attach('file', PDF, 'relay.pdf').expect(201);
    expect((await f.api().get(`/api/findings/${a.findingId}/attachments/${relay.body.id}`).set(f.as.tester)).status).toBe(404);
  });

  it('names a relay record with a non-Latin-1 name the same safe way on the event route', async () => {
    const { eventId } = await finding();
    const up = await f.api().post(`/api/events/${eventId}/attachments`).set(f.as.protection).attach('file', PDF, 'Подстанция.pdf').expect(201);
    expect(up.body.name).toBe('Подстанция.pdf');
    const res = await f.api().get(`/api/events/${eventId}/attachments/${up.body.id}`).set(f.as.tester);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="__________.pdf"; filename*=UTF-8''${encodeURIComponent('Подстанция.pdf')}`);
  });
});
