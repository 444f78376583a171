import type { RouteDef } from '../../route-def.js';
import { ctx } from '../../context.js';
import { notFound } from '../../common/app-error.js';
import { SinkMessage } from '../../mail/sink-message.entity.js';

export const outboxRoutes: RouteDef[] = [
  {
    // GET /api/dev/outbox — what the local mail sink received, newest first (only while the sink runs)
    method: 'get',
    path: '/dev/outbox',
    access: ['admin', 'manager'],
    handlers: [
      async (req, res) => {
        const { db, mailSinkRunning } = ctx(req);
        if (!mailSinkRunning) throw notFound('The outbox (the local mail sink is not running; real SMTP is configured)');
        const rows = await db.getRepository(SinkMessage).find({ order: { id: 'DESC' }, take: 200 });
        res.json(rows.map((m) => ({ to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt.toISOString(), attachments: m.attachments })));
      },
    ],
  },
];
