import { randomBytes } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { adminSql, ensureDatabaseAndUser, mariaDbPaths, startMariaDb, stopMariaDb, type MariaDbPaths } from '../../server/scripts/mariadb.js';
import { loadConfig } from '../../server/config.js';
import { migrateAsOwner } from '../../server/scripts/prepare.js';
import { closedPort } from './fault-proxy.js';

// A private MariaDB of its own for a fault test (a temporary folder, a free port, a migrated database): it can be
// killed with SIGKILL and started again without touching the shared server of `npm test`.

export interface PrivateDb {
  paths: MariaDbPaths;
  /** The variables that point the app at this database (DB_HOST, DB_PORT, DB_NAME, DB_USER, DB_PASSWORD, the migrator's, DATA_DIR). */
  env: Record<string, string>;
  /** The mariadbd process id, read from its pid file. */
  pid(): number;
  /** SIGKILL to mariadbd, and wait until the process is gone. */
  kill9(): Promise<void>;
  /** Starts the server again on the same folder and port (InnoDB recovers what was committed). */
  restart(): Promise<void>;
  /** SQL as the server's admin account (over the socket): sees every session's transactions. */
  sql(query: string): string;
  /** Stops the server and removes its folder. */
  remove(): Promise<void>;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export async function startPrivateDb(name = 'gapsight_fault'): Promise<PrivateDb> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'gapsight-fault-'));
  const paths = mariaDbPaths(path.join(dir, 'db'), await closedPort());
  const start = () => startMariaDb(paths, { bufferPoolMB: 32, timeoutMs: 90_000 });
  try {
    await start();
    // The two accounts of `npm start`: the migrator (the schema) and the app (rows only), migrated as npm start does.
    const password = randomBytes(12).toString('hex');
    const owner = { user: 'gapsight_owner', password: randomBytes(12).toString('hex') };
    ensureDatabaseAndUser(paths, name, 'gapsight', password, owner);
    const env = {
      DB_HOST: '127.0.0.1',
      DB_PORT: String(paths.port),
      DB_NAME: name,
      DB_USER: 'gapsight',
      DB_PASSWORD: password,
      DB_OWNER_USER: owner.user,
      DB_OWNER_PASSWORD: owner.password,
      DATA_DIR: path.join(dir, 'data'),
    };
    await migrateAsOwner(loadConfig({ ...process.env, ...env }));
    const pid = () => Number(readFileSync(paths.pidFile, 'utf8').trim());
    return {
      paths,
      env,
      pid,
      kill9: async () => {
        const p = pid();
        process.kill(p, 'SIGKILL');
        while (alive(p)) await sleep(50);
      },
      restart: async () => {
        await start();
      },
      sql: (query) => adminSql(paths, query),
      remove: async () => {
        await stopMariaDb(paths).catch(() => undefined);
        rmSync(dir, { recursive: true, force: true });
      },
    };
  } catch (err) {
    await stopMariaDb(paths).catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
    throw err;
  }
}
