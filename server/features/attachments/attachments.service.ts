import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { detectFindingFile, detectRelayRecord } from '../../../shared/imports/sniff.js';
import type { AttachmentView } from '../../../shared/schemas/responses/index.js';
import { notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { refuseOtherTypes, unsupportedType, utf8Name } from '../../common/upload.js';
import { UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { Finding } from '../screenings/finding.entity.js';
import { AttachmentContent } from './attachment-content.entity.js';
import { Attachment } from './attachment.entity.js';

/** An upload as the routes give it: its name, the browser's MIME type (a file without an extension), its bytes. */
type UploadedFile = { originalname: string; mimetype?: string; buffer: Buffer };

const CONTENT_TYPES: Record<string, string> = {
  'comtrade-cfg': 'text/plain',
  'comtrade-dat': 'application/octet-stream',
  'comtrade-cff': 'text/plain',
  csv: 'text/csv',
  pdf: 'application/pdf',
  text: 'text/plain',
};

/** Stores a relay record on an event after checking its extension against its content (415 otherwise); checksum kept. */
export async function addEventAttachment(m: EntityManager, clock: Clock, userId: number, eventId: number, file: UploadedFile) {
  refuseOtherTypes(UPLOAD_TYPES.relayRecord, file);
  const check = detectRelayRecord(file.originalname, new Uint8Array(file.buffer));
  if ('error' in check) throw unsupportedType(check.error);
  if (!(await m.getRepository(FaultEvent).exists({ where: { id: eventId } }))) throw notFound('Event');
  return storeAttachment(m, clock, userId, { ownerType: 'event', ownerId: eventId }, { eventId }, file, check.kind, CONTENT_TYPES[check.kind]);
}

/** Saves a checked upload with its SHA-256 and bytes, audited with `auditAfter` (the owner's ids) added. */
async function storeAttachment(
  m: EntityManager,
  clock: Clock,
  userId: number,
  owner: Pick<Attachment, 'ownerType' | 'ownerId'>,
  auditAfter: Record<string, number>,
  file: { originalname: string; buffer: Buffer },
  kind: string,
  contentType: string,
) {
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  // Cut by characters, not UTF-16 units: half an emoji would be a lone surrogate the database refuses.
  const name = Array.from(utf8Name(file.originalname).replace(/[\\/]/g, '_')).slice(0, 255).join('');
  const a = await m.getRepository(Attachment).save(
    m.getRepository(Attachment).create({ ...owner, name, contentType, kind, size: file.buffer.length, sha256, createdById: userId, createdAt: clock.now() }),
  );
  await m.getRepository(AttachmentContent).insert({ attachmentId: a.id, data: file.buffer });
  await audit(m, clock, { userId, action: 'create', entity: 'attachment', entityId: a.id, after: { ...auditAfter, name, kind, contentType, size: a.size, sha256 } });
  return attachmentView(a);
}

export function attachmentView(a: Attachment) {
  return { id: a.id, name: a.name, contentType: a.contentType, kind: a.kind, size: a.size, sha256: a.sha256, createdAt: a.createdAt.toISOString() } satisfies AttachmentView;
}

/** Stores a photo (JPEG, PNG, WebP) or PDF on an inspection finding, its type judged by its bytes (415 otherwise). */
export async function addFindingAttachment(m: EntityManager, clock: Clock, userId: number, findingId: number, file: UploadedFile) {
  const finding = await m.getRepository(Finding).findOne({ where: { id: findingId } });
  if (!finding) throw notFound('Finding');
  refuseOtherTypes(UPLOAD_TYPES.findingFile, file);
  const check = detectFindingFile(new Uint8Array(file.buffer));
  if ('error' in check) throw unsupportedType(check.error);
  return storeAttachment(m, clock, userId, { ownerType: 'finding', ownerId: findingId }, { findingId, eventId: finding.eventId }, file, check.kind, check.contentType);
}

/** A finding's photo or document with its bytes (404 when it is not this finding's). */
export async function getFindingAttachment(m: EntityManager, findingId: number, attachmentId: number) {
  return attachmentWithBytes(m, { id: attachmentId, ownerType: 'finding', ownerId: findingId });
}

async function attachmentWithBytes(m: EntityManager, where: Pick<Attachment, 'id' | 'ownerType' | 'ownerId'>) {
  const a = await m.getRepository(Attachment).findOne({ where });
  if (!a) throw notFound('Attachment');
  const c = await m.getRepository(AttachmentContent).findOneOrFail({ where: { attachmentId: a.id } });
  return { name: a.name, contentType: a.contentType, sha256: a.sha256, data: c.data };
}

/** An attachment's bytes with its name and type (404 when it is not this event's). */
export async function getEventAttachment(m: EntityManager, eventId: number, attachmentId: number) {
  return attachmentWithBytes(m, { id: attachmentId, ownerType: 'event', ownerId: eventId });
}
