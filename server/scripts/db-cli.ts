import { loadConfig } from '../config.js';
import { ensureDatabaseAndUser, mariaDbPaths, ProvisionError, startMariaDb, stopMariaDb } from './mariadb.js';

// npm run db:start | db:stop | db:migrate — the private MariaDB under DATA_DIR (db:start also creates the database, the
// migrator and the app account; db:migrate runs the migrations as the migrator and gives the app its table rights).

async function main(cmd: string | undefined): Promise<void> {
  const config = loadConfig();
  const p = mariaDbPaths(config.dataDir, config.DB_PORT);
  if (cmd === 'start') {
    const r = await startMariaDb(p);
    ensureDatabaseAndUser(p, config.DB_NAME, config.DB_USER, config.DB_PASSWORD, { user: config.DB_OWNER_USER, password: config.DB_OWNER_PASSWORD });
    console.log(r.alreadyRunning ? `MariaDB already running on 127.0.0.1:${p.port}` : `MariaDB started on 127.0.0.1:${p.port}`);
  } else if (cmd === 'stop') {
    console.log((await stopMariaDb(p)) ? 'MariaDB stopped.' : 'MariaDB was not running.');
  } else if (cmd === 'migrate') {
    const { migrateAndSeed } = await import('./prepare.js');
    await migrateAndSeed({ seed: false });
  } else {
    console.error('usage: db-cli start|stop|migrate');
    process.exit(2);
  }
}

main(process.argv[2]).catch((err) => {
  console.error(err instanceof ProvisionError ? err.message : err);
  process.exit(1);
});
