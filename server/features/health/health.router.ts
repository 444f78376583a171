import type { RouteDef } from '../../route-def.js';
import { ctx } from '../../context.js';

export const healthRoutes: RouteDef[] = [
  {
    // GET /api/health — liveness with a database ping (503 when the database is unreachable)
    method: 'get',
    path: '/health',
    access: 'public',
    handlers: [
      async (req, res) => {
        const { db, config, mailSinkRunning } = ctx(req);
        let dbOk = false;
        try {
          await db.query('SELECT 1');
          dbOk = true;
        } catch {
          dbOk = false;
        }
        res.status(dbOk ? 200 : 503).json({
          status: dbOk ? 'ok' : 'degraded',
          db: dbOk ? 'ok' : 'down',
          demo: config.DEMO === 'on',
          mailSink: mailSinkRunning,
        });
      },
    ],
  },
];
