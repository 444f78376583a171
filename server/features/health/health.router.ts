import { Reply, route, type RouteDef } from '../../route-def.js';
import type { HealthAnswer } from '../../../shared/schemas/responses/index.js';
import { requestId } from '../../logger.js';
import { databaseAnswers } from './health.service.js';
import { DB_RETRY_AFTER_SECONDS } from '../../common/error-handler.js';

export const healthRoutes: RouteDef[] = [
  // GET /api/health — liveness with a database ping (503 with Retry-After when the database is unreachable or slow)
  route({
    method: 'get',
    path: '/health',
    access: 'public',
    handler: async ({ m, ctx, req }) => {
      const dbOk = await databaseAnswers(m);
      return new Reply({
        status: dbOk ? 200 : 503,
        headers: dbOk ? {} : { 'Retry-After': String(DB_RETRY_AFTER_SECONDS) },
        json: { status: dbOk ? 'ok' : 'degraded', db: dbOk ? 'ok' : 'down', demo: ctx.config.DEMO === 'on', mailSink: ctx.mailSinkRunning, ...(dbOk ? {} : { requestId: requestId(req) }) } satisfies HealthAnswer,
      });
    },
  }),
];
