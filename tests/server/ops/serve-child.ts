// Run by signals.test.ts in a child process: the served app with handleSignals, as `npm start` runs it, plus a
// test-only route that answers after 300 ms. Prints "entered" when that route starts.
import { loadConfig } from '../../../server/config.js';
import { serve } from '../../../server/index.js';

const config = loadConfig({ ...process.env, PORT: '0', MAIL_SINK_PORT: '0', LOG_LEVEL: 'info' });
const { default: db } = await import('../../../server/db/data-source.js');
await db.initialize();
await serve(db, config, {
  handleSignals: true,
  routes: [
    {
      method: 'get',
      path: '/slow',
      access: 'public',
      handlers: [
        async (_req, res) => {
          process.stdout.write('entered\n');
          await new Promise((r) => setTimeout(r, 300));
          res.json({ finished: true });
        },
      ],
    },
  ],
});
