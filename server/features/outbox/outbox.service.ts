import type { EntityManager } from 'typeorm';
import type { OutboxMessage } from '../../../shared/schemas/responses/index.js';
import { notFound } from '../../common/app-error.js';
import { SinkAttachment } from '../../mail/sink-attachment.entity.js';
import { SinkMessage } from '../../mail/sink-message.entity.js';

/** What the local mail sink received, newest first (at most 200). */
export async function listOutbox(m: EntityManager) {
  const rows = await m.getRepository(SinkMessage).find({ order: { id: 'DESC' }, take: 200 });
  return rows.map((s) => ({ id: s.id, to: s.to, subject: s.subject, text: s.text, receivedAt: s.receivedAt.toISOString(), attachments: s.attachments }) satisfies OutboxMessage);
}

/** One attachment of a received message: its bytes, name and type (404 when the message or the index is unknown). */
export async function getOutboxAttachment(m: EntityManager, messageId: number, index: number) {
  const msg = await m.getRepository(SinkMessage).findOneBy({ id: messageId });
  const meta = msg?.attachments[index];
  const part = meta ? await m.getRepository(SinkAttachment).findOneBy({ messageId, position: index }) : null;
  if (!meta || !part) throw notFound('Attachment');
  return { filename: meta.filename, contentType: meta.contentType, data: part.content };
}
