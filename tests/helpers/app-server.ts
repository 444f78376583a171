import type { DataSource } from 'typeorm';
import { loadConfig, type Config } from '../../server/config.js';
import { createDataSource } from '../../server/db/create-data-source.js';
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

/**
 * The environment of a utility's first day: the empty database tests/run.ts migrated (TEST_DB_NAME_EMPTY, nothing
 * seeded) with DEMO=off. Scripts such as `npm run user:create` get it as their environment.
 */
export function emptyDeploymentEnv(): NodeJS.ProcessEnv {
  const name = process.env.TEST_DB_NAME_EMPTY;
  if (!name) throw new Error('The onboarding browser test needs the empty database made by `npm test` (TEST_DB_NAME_EMPTY).');
  return { ...process.env, DB_NAME: name, DEMO: 'off' };
}

/** Starts app + mail sink on the empty DEMO=off database, seeding nothing; `db` is that database's data source. */
export async function startEmptyServer(): Promise<{ running: Running; config: Config; db: DataSource }> {
  const staticDir = process.env.E2E_DIST;
  if (!staticDir) throw new Error('Browser tests need the client built by `npm test` (E2E_DIST).');
  const config = loadConfig({ ...emptyDeploymentEnv(), PORT: '0', MAIL_SINK_PORT: '0' });
  const db = createDataSource(config);
  await db.initialize();
  const running = await serve(db, config, { staticDir });
  return { running, config, db };
}
