// The app as `npm start` serves it, in a process of its own, on the database the environment names (a fault test's
// private MariaDB): prints {"url": …} on one line once it listens. The fault test kills it with SIGKILL.
import { loadConfig } from '../../server/config.js';
import { createDataSource } from '../../server/db/create-data-source.js';
import { serve } from '../../server/index.js';
import { createLogger } from '../../server/logger.js';

const config = loadConfig({ ...process.env, PORT: '0', MAIL_SINK_PORT: '0' }, { requireJwtSecret: true });
const db = createDataSource(config);
await db.initialize();
const running = await serve(db, config, { handleSignals: true, logger: createLogger('silent') });
process.stdout.write(`${JSON.stringify({ url: running.url })}\n`);
