// The local mail sink's outbox (development and demo): what the server's e-mail would have delivered.
import { api } from './client';

export interface OutboxAttachment {
  filename: string;
  contentType: string;
  size: number;
}

export interface OutboxMessage {
  to: string;
  subject: string;
  text: string;
  receivedAt: string;
  attachments: OutboxAttachment[];
}

// GET /api/dev/outbox — newest first; 404 while the local mail sink is not running.
export function listOutbox(): Promise<OutboxMessage[]> {
  return api.get<OutboxMessage[]>('/dev/outbox');
}
