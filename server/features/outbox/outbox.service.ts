import type { EntityManager } from 'typeorm';
import type { OutboxMessage } from '../../../shared/schemas/responses/index.js';
import { SinkMessage } from '../../mail/sink-message.entity.js';

/** What the local mail sink received, newest first (at most 200). */
export async function listOutbox(m: EntityManager) {
  const rows = await m.getRepository(SinkMessage).find({ order: { id: 'DESC' }, take: 200 });
  return rows.map((s) => ({ to: s.to, subject: s.subject, text: s.text, receivedAt: s.receivedAt.toISOString(), attachments: s.attachments }) satisfies OutboxMessage);
}
