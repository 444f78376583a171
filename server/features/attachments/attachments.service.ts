import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { detectRelayRecord } from '../../../shared/imports/sniff.js';
import type { AttachmentView } from '../../../shared/schemas/responses/index.js';
import { notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { unsupportedType } from '../../common/upload.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { AttachmentContent } from './attachment-content.entity.js';
import { Attachment } from './attachment.entity.js';

const CONTENT_TYPES: Record<string, string> = {
  'comtrade-cfg': 'text/plain',
  'comtrade-dat': 'application/octet-stream',
  'comtrade-cff': 'text/plain',
  csv: 'text/csv',
  pdf: 'application/pdf',
  text: 'text/plain',
};

/** Stores a relay record on an event after checking its extension against its content (415 otherwise); checksum kept. */
export async function addEventAttachment(m: EntityManager, clock: Clock, userId: number, eventId: number, file: { originalname: string; buffer: Buffer }) {
  const check = detectRelayRecord(file.originalname, new Uint8Array(file.buffer));
  if ('error' in check) throw unsupportedType(check.error);
  if (!(await m.getRepository(FaultEvent).exists({ where: { id: eventId } }))) throw notFound('Event');
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  const name = file.originalname.replace(/[\\/]/g, '_').slice(0, 255);
  const a = await m.getRepository(Attachment).save(
    m.getRepository(Attachment).create({
      ownerType: 'event',
      ownerId: eventId,
      name,
      contentType: CONTENT_TYPES[check.kind],
      kind: check.kind,
      size: file.buffer.length,
      sha256,
      createdById: userId,
      createdAt: clock.now(),
    }),
  );
  await m.getRepository(AttachmentContent).insert({ attachmentId: a.id, data: file.buffer });
  await audit(m, clock, { userId, action: 'create', entity: 'attachment', entityId: a.id, after: { eventId, name, kind: a.kind, size: a.size, sha256 } });
  return { id: a.id, name: a.name, contentType: a.contentType, kind: a.kind, size: a.size, sha256: a.sha256, createdAt: a.createdAt.toISOString() } satisfies AttachmentView;
}

/** An attachment's bytes with its name and type (404 when it is not this event's). */
export async function getEventAttachment(m: EntityManager, eventId: number, attachmentId: number) {
  const a = await m.getRepository(Attachment).findOne({ where: { id: attachmentId, ownerType: 'event', ownerId: eventId } });
  if (!a) throw notFound('Attachment');
  const c = await m.getRepository(AttachmentContent).findOneOrFail({ where: { attachmentId } });
  return { name: a.name, contentType: a.contentType, sha256: a.sha256, data: c.data };
}
