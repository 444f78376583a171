import { route, type RouteDef } from '../../route-def.js';
import { notFound } from '../../common/app-error.js';
import { outboxAttachmentParams } from '../../common/params.js';
import { disposition } from '../../common/disposition.js';
import { fileReply } from '../../route-def.js';
import { getOutboxAttachment, listOutbox } from './outbox.service.js';

const OUTBOX_OFF = 'The outbox (the local mail sink is not running; real SMTP is configured)';

export const outboxRoutes: RouteDef[] = [
  // GET /api/dev/outbox — what the local mail sink received, newest first (only while the sink runs)
  route({
    method: 'get',
    path: '/dev/outbox',
    access: ['admin', 'manager'],
    handler: ({ m, ctx }) => {
      if (!ctx.mailSinkRunning) throw notFound(OUTBOX_OFF);
      return listOutbox(m);
    },
  }),
  // GET /api/dev/outbox/:messageId/attachments/:index — one attachment of a received message (the mail's PDF)
  route({
    method: 'get',
    path: '/dev/outbox/:messageId/attachments/:index',
    access: ['admin', 'manager'],
    params: outboxAttachmentParams,
    handler: async ({ m, ctx, params }) => {
      if (!ctx.mailSinkRunning) throw notFound(OUTBOX_OFF);
      const a = await getOutboxAttachment(m, params.messageId, params.index);
      return fileReply(a.data, a.contentType.split(';')[0]?.trim() || 'application/octet-stream', { 'Content-Disposition': disposition(a.filename, { utf8: 'always' }), 'X-Content-Type-Options': 'nosniff' });
    },
  }),
];
