import { route, type RouteDef } from '../../route-def.js';
import { notificationParams } from '../../common/params.js';
import { resendNotification } from './notifications.service.js';

export const notificationRoutes: RouteDef[] = [
  // POST /api/notifications/:notificationId/resend — queue a fresh copy of a mail from the event's e-mail log
  route({
    method: 'post',
    path: '/notifications/:notificationId/resend',
    access: ['manager', 'admin'],
    params: notificationParams,
    status: 201,
    handler: async ({ m, clock, user, params, ctx, afterCommit }) => {
      const out = await resendNotification(m, clock, user.id, params.notificationId);
      afterCommit(() => ctx.kickMail?.());
      return out;
    },
  }),
];
