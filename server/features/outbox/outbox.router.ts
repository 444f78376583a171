import { route, type RouteDef } from '../../route-def.js';
import { notFound } from '../../common/app-error.js';
import { listOutbox } from './outbox.service.js';

export const outboxRoutes: RouteDef[] = [
  // GET /api/dev/outbox — what the local mail sink received, newest first (only while the sink runs)
  route({
    method: 'get',
    path: '/dev/outbox',
    access: ['admin', 'manager'],
    handler: ({ m, ctx }) => {
      if (!ctx.mailSinkRunning) throw notFound('The outbox (the local mail sink is not running; real SMTP is configured)');
      return listOutbox(m);
    },
  }),
];
