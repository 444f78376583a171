import 'reflect-metadata';
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream, existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { fileURLToPath } from 'node:url';
import { createGunzip } from 'node:zlib';
import { DataSource } from 'typeorm';
import { loadConfig, type Config } from '../config.js';
import { createDataSource } from '../db/create-data-source.js';
import { CHECKSUM_SUFFIX, checksumProblem, databaseNameProblem, parseChecksumFile, parseRestoreArgs, restoreDatabaseName } from './backup-files.js';
import { clientErrors, clientInvocation, querySql, targetFor, type DbTarget } from './db-backup.js';
import { applyAppGrants, clientBinary } from './mariadb.js';
import { migrateAsOwner, migrateOn } from './prepare.js';

// npm run db:restore -- FILE [--into NAME] — checks the backup's checksum, loads it into a FRESH database (default
// <DB_NAME>_restore_<UTC time>; an existing database with tables is refused), runs the migrations on it, and says how to
// switch the app to it. The database in use is never touched.

/** A restore refused or failed; the message says why (and names the file). */
export class RestoreError extends Error {}

export async function sha256OfFile(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** Refuses a backup without its checksum file or whose bytes do not match it. */
export async function verifyBackupChecksum(file: string): Promise<string> {
  if (!existsSync(file)) throw new RestoreError(`${file}: no such file`);
  const sumFile = file + CHECKSUM_SUFFIX;
  if (!existsSync(sumFile)) throw new RestoreError(`${file}: its checksum file ${path.basename(sumFile)} is missing beside it — not restored`);
  let expected: string;
  try {
    expected = parseChecksumFile(readFileSync(sumFile, 'utf8'), sumFile);
  } catch (err) {
    throw new RestoreError((err as Error).message);
  }
  const actual = await sha256OfFile(file);
  const problem = checksumProblem(file, expected, actual);
  if (problem) throw new RestoreError(problem);
  return actual;
}

export interface RestoreOptions {
  target: DbTarget;
  file: string;
  /** The database to restore into; default `<sourceDb>_restore_<UTC time>`. */
  into: string | null;
  sourceDb: string;
  now?: Date;
  /** Runs the migrations on the restored database; returns the names of those applied. */
  migrate: (database: string) => Promise<string[]>;
}

export interface RestoreResult {
  database: string;
  sha256: string;
  migrations: string[];
}

function schemaState(t: DbTarget, name: string): { exists: boolean; tables: number } {
  const out = querySql(
    t,
    `SELECT (SELECT COUNT(*) FROM information_schema.SCHEMATA WHERE SCHEMA_NAME='${name}'), ` +
      `(SELECT COUNT(*) FROM information_schema.TABLES WHERE TABLE_SCHEMA='${name}')`,
  ).trim();
  const [s, n] = out.split('\t').map(Number);
  return { exists: s > 0, tables: n };
}

/** Loads the gzipped dump into the mariadb client on `database`. */
async function load(t: DbTarget, file: string, database: string): Promise<void> {
  const { args, env } = clientInvocation(t);
  const child = spawn(clientBinary('mariadb'), [...args, `--database=${database}`], { env, stdio: ['pipe', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr.setEncoding('utf8');
  child.stderr.on('data', (d: string) => (stderr = (stderr + d).slice(-4000)));
  const exited = new Promise<number>((resolve) => child.on('close', (code) => resolve(code ?? 1)));
  let streamError: Error | null = null;
  await pipeline(createReadStream(file), createGunzip(), child.stdin).catch((err: Error) => (streamError = err));
  const code = await exited;
  if (streamError) {
    const why = (streamError as Error).message;
    throw new RestoreError(`reading ${file} failed (${why}): the backup is cut off or damaged${code !== 0 ? `\n${clientErrors(stderr)}` : ''}`);
  }
  if (code !== 0) throw new RestoreError(`loading ${file} into ${database} failed (mariadb exit ${code}):\n${clientErrors(stderr)}`);
}

/** Verify, load into a fresh database, migrate. A database this call created is dropped again when the load fails. */
export async function runRestore(o: RestoreOptions): Promise<RestoreResult> {
  const sha256 = await verifyBackupChecksum(o.file);
  const database = o.into ?? restoreDatabaseName(o.sourceDb, o.now ?? new Date());
  const problem = databaseNameProblem(database);
  if (problem) throw new RestoreError(problem);
  const state = schemaState(o.target, database);
  if (state.tables > 0) {
    throw new RestoreError(`database ${database} already exists and has ${state.tables} table(s): restore into a new one (--into NAME) — nothing changed`);
  }
  if (!state.exists) {
    try {
      querySql(o.target, `CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
    } catch (err) {
      throw new RestoreError(
        `${(err as Error).message}\n${o.target.what} may not create databases: have an administrator create ${database} empty ` +
          '(utf8mb4) with all privileges on it for this account, then run the restore again with --into ' + database,
      );
    }
  }
  try {
    await load(o.target, o.file, database);
  } catch (err) {
    if (!state.exists) querySql(o.target, `DROP DATABASE IF EXISTS \`${database}\``);
    throw err;
  }
  const migrations = await o.migrate(database);
  return { database, sha256, migrations };
}

/** A data source on `database` over the private server's admin socket (for migrations of a restored database). */
export function adminDataSource(t: Extract<DbTarget, { kind: 'socket' }>, config: Config, database: string): DataSource {
  const base = createDataSource({ ...config, DB_NAME: database });
  return new DataSource({ ...base.options, host: undefined, port: undefined, socketPath: t.socket, username: t.user, password: undefined } as typeof base.options);
}

/**
 * The migrations of a restored database, through prepare.ts: on the private server as its admin over the socket, then
 * the app account's table rights (as after every migration run; when that fails, a warning: `npm start` on it gives
 * them); on a database of your own as the migrator (DB_OWNER_USER with DB_OWNER_PASSWORD, else DB_USER), as
 * `npm run db:migrate` does.
 */
export function migratorFor(t: DbTarget, config: Config, warn: (line: string) => void = () => {}): (database: string) => Promise<string[]> {
  return async (database) => {
    if (t.kind === 'tcp') return migrateAsOwner({ ...config, DB_NAME: database });
    const db = adminDataSource(t, config, database);
    await db.initialize();
    try {
      const ran = await migrateOn(db);
      try {
        await applyAppGrants((sql, params) => db.query(sql, params), database, config.DB_USER);
      } catch (err) {
        warn(`The app account ${config.DB_USER} was not given its rights on ${database} (${(err as Error).message}); DB_NAME=${database} npm start gives them.`);
      }
      return ran;
    } finally {
      await db.destroy();
    }
  };
}

async function main(): Promise<void> {
  const { file, into } = parseRestoreArgs(process.argv.slice(2));
  const config = loadConfig();
  const { target } = targetFor(config);
  const abs = path.resolve(file);
  console.log(`Restoring ${abs} on ${target.what} …`);
  const r = await runRestore({ target, file: abs, into, sourceDb: config.DB_NAME, migrate: migratorFor(target, config, (l) => console.warn(l)) });
  console.log(`Checksum: ${r.sha256} (matches ${path.basename(abs)}${CHECKSUM_SUFFIX})`);
  console.log(`Restored into the new database ${r.database}.`);
  console.log(r.migrations.length ? `Applied ${r.migrations.length} migration(s): ${r.migrations.join(', ')}` : 'Migrations: already up to date.');
  console.log(`${config.DB_NAME} is unchanged. To run the app on the restored data, stop it and start it with:`);
  console.log(`  DB_NAME=${r.database} npm start`);
  console.log(`(check its audit trail first with DB_NAME=${r.database} npm run audit:verify)`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
