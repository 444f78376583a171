// The local mail sink's outbox (development and demo): what the server's e-mail would have delivered.
import type { OutboxAttachment, OutboxMessage } from '../../shared/schemas/responses';
import { api } from './client';

export type { OutboxAttachment, OutboxMessage };

// GET /api/dev/outbox — newest first; 404 while the local mail sink is not running.
export function listOutbox(signal?: AbortSignal): Promise<OutboxMessage[]> {
  return api.get<OutboxMessage[]>('/dev/outbox', { signal });
}

// GET /api/dev/outbox/:messageId/attachments/:index — one attachment of a received message (the mail's PDF).
export function downloadOutboxAttachment(messageId: number, index: number): Promise<Blob> {
  return api.download(`/dev/outbox/${messageId}/attachments/${index}`);
}
