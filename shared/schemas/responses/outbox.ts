import { z } from 'zod';
import { isoDateTime } from './common.js';

// GET /api/dev/outbox — what the local mail sink received, newest first.

export const outboxAttachmentSchema = z.strictObject({ filename: z.string(), contentType: z.string(), size: z.number().int().nonnegative() });
export type OutboxAttachment = z.infer<typeof outboxAttachmentSchema>;

export const outboxMessageSchema = z.strictObject({
  /** The sink's message id (GET /api/dev/outbox/:messageId/attachments/:index opens an attachment). */
  id: z.number().int().positive(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  receivedAt: isoDateTime,
  attachments: z.array(outboxAttachmentSchema),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
