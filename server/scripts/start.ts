import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadConfig } from '../config.js';
import { DEMO_PASSWORD, DEMO_USERS } from '../db/seed/demo-users.js';
import { buildClient, clientIsStale } from './build-client.js';
import { ensureDatabaseAndUser, ensureSecretFile, mariaDbPaths, ProvisionError, startMariaDb } from './mariadb.js';

// npm start: private MariaDB, migrations, demo seed, mail sink, client build, one server for app + API.
// npm run dev (DEV=1): the same without the client build, plus Vite's dev server with /api proxied.

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

async function main(): Promise<void> {
  process.chdir(root);
  // Every variable is checked here, before anything starts; the secrets the data folder provides are checked once
  // they are provisioned (a missing JWT_SECRET gets a generated one kept in DATA_DIR/jwt-secret).
  const settings = loadConfig(process.env);
  const p = mariaDbPaths(settings.dataDir, settings.DB_PORT);
  console.log(`Data folder: ${settings.dataDir}`);
  const db0 = await startMariaDb(p);
  console.log(db0.alreadyRunning ? `MariaDB: already running on 127.0.0.1:${p.port} (reused)` : `MariaDB: started on 127.0.0.1:${p.port}`);
  ensureDatabaseAndUser(p, settings.DB_NAME, settings.DB_USER, settings.DB_PASSWORD, { user: settings.DB_OWNER_USER, password: settings.DB_OWNER_PASSWORD });
  if (settings.JWT_SECRET === undefined) ensureSecretFile(settings.dataDir, 'jwt-secret', 48);
  const config = loadConfig(process.env, { requireJwtSecret: true });

  const dev = process.env.GAPSIGHT_DEV === '1';
  if (dev) {
    console.log('Development: the client is served by Vite (hot reload).');
  } else if (clientIsStale(root)) {
    console.log('Building the client …');
    if (!buildClient(root)) throw new Error('The client build failed (see above).');
  } else {
    console.log('Client: up to date (dist/).');
  }

  // Migrations as the migrator account (which then gives the app account its table rights); the seed as the app.
  const { migrateAsOwner, seedOn } = await import('./prepare.js');
  await migrateAsOwner(config, (l) => console.log(l));
  const { createDataSource } = await import('../db/create-data-source.js');
  const db = createDataSource(config);
  await db.initialize();
  await seedOn(db, { seed: config.DEMO === 'on', log: (l) => console.log(l) });

  const { serve } = await import('../index.js');
  const running = await serve(db, config, { staticDir: dev ? undefined : path.join(root, 'dist'), handleSignals: !dev });
  if (dev) {
    const { spawn } = await import('node:child_process');
    const vite = spawn(process.execPath, [path.join(root, 'node_modules', 'vite', 'bin', 'vite.js')], { stdio: 'inherit', env: { ...process.env, PORT: String(running.port) } });
    for (const sig of ['SIGINT', 'SIGTERM'] as const) {
      process.once(sig, () => {
        vite.kill('SIGTERM');
        running.stop().finally(() => process.exit(0));
      });
    }
    console.log(`API on ${running.url}; open the Vite URL printed below.`);
  }
  console.log('');
  console.log(`Gapsight is running at ${running.url}`);
  if (running.sink) console.log(`Mail: local sink on 127.0.0.1:${running.sink.port}; see the Outbox (admin, manager) in the app.`);
  else console.log(`Mail: SMTP ${config.SMTP_HOST}:${config.SMTP_PORT ?? 587}`);
  if (config.DEMO === 'on') {
    console.log(`Demo sign-ins (invented data; password "${DEMO_PASSWORD}"):`);
    for (const u of DEMO_USERS) console.log(`  ${u.roles.join(', ').padEnd(11)} ${u.email}`);
  }
  console.log('Ctrl-C stops the app; `npm run db:stop` stops the private MariaDB.');
}

main().catch((err) => {
  console.error(`\nGapsight could not start: ${err instanceof ProvisionError || err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
