import { loadConfig, type Config } from '../../server/config.js';
import { seedDemo } from '../../server/db/seed/demo-seed.js';
import { serve, type Running } from '../../server/index.js';

/** Starts app + mail sink on free ports with the client built by tests/run.ts (E2E_DIST) and the demo data seeded. */
export async function startTestServer(): Promise<{ running: Running; config: Config }> {
  const staticDir = process.env.E2E_DIST;
  if (!staticDir) throw new Error('Browser tests need the client built by `npm test` (E2E_DIST).');
  const config = loadConfig({ ...process.env, PORT: '0', MAIL_SINK_PORT: '0' });
  const { default: db } = await import('../../server/db/data-source.js');
  if (!db.isInitialized) await db.initialize();
  await seedDemo(db);
  const running = await serve(db, config, { staticDir });
  return { running, config };
}
