import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createWriteStream, existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { fileURLToPath } from 'node:url';
import { createGzip } from 'node:zlib';
import { loadConfig, type Config } from '../config.js';
import {
  backupFileName,
  binlogPositionFromDump,
  CHECKSUM_SUFFIX,
  checksumLine,
  chooseRotation,
  parseBackupKeep,
  type BinlogPosition,
} from './backup-files.js';
import { clientBinary, mariaDbPaths, pingSocket, ProvisionError, type MariaDbPaths } from './mariadb.js';

// npm run db:backup — a consistent dump of DB_NAME (one InnoDB snapshot, routines, triggers, blobs in hex, the binary log
// position) into DATA_DIR/backups/gapsight-<UTC time>.sql.gz with a .sha256 beside it; keeps the newest BACKUP_KEEP.

/** How the mariadb command-line tools reach the database. */
export type DbTarget =
  | { kind: 'socket'; socket: string; user: string; what: string }
  | { kind: 'tcp'; host: string; port: number; user: string; password: string; what: string };

/** The private server's admin account over its socket (the OS user, no password). */
export function adminTarget(p: Pick<MariaDbPaths, 'socket'>): Extract<DbTarget, { kind: 'socket' }> {
  return { kind: 'socket', socket: p.socket, user: os.userInfo().username, what: `the private MariaDB (admin over ${p.socket})` };
}

const LOCAL_HOSTS = new Set(['127.0.0.1', 'localhost', '::1']);

/**
 * The private server under DATA_DIR when DB_HOST is this machine and its socket answers (admin over the socket; an
 * error when its datadir is there but it does not answer); otherwise (no private server) the configured server over TCP
 * as the migrator when its password is set (it may read triggers and create tables), else as DB_USER.
 */
export function targetFor(config: Config): { target: DbTarget; paths: MariaDbPaths | null } {
  if (LOCAL_HOSTS.has(config.DB_HOST)) {
    const p = mariaDbPaths(config.dataDir, config.DB_PORT);
    if (pingSocket(p)) return { target: adminTarget(p), paths: p };
    if (existsSync(p.datadir)) {
      throw new ProvisionError(`The private MariaDB under ${p.baseDir} does not answer on ${p.socket}: start it with npm run db:start.`);
    }
  }
  const [user, password] = config.dbOwnerPassword ? [config.dbOwnerUser, config.dbOwnerPassword] : [config.DB_USER, config.dbPassword];
  return {
    target: { kind: 'tcp', host: config.DB_HOST, port: config.DB_PORT, user, password, what: `${user}@${config.DB_HOST}:${config.DB_PORT}` },
    paths: null,
  };
}

/** Arguments and environment for mariadb / mariadb-dump (the password through MYSQL_PWD, never on the command line). */
export function clientInvocation(t: DbTarget): { args: string[]; env: NodeJS.ProcessEnv } {
  const base = ['--no-defaults', '--default-character-set=utf8mb4'];
  if (t.kind === 'socket') return { args: [...base, `--socket=${t.socket}`, `--user=${t.user}`], env: { ...process.env } };
  return {
    args: [...base, '--protocol=TCP', `--host=${t.host}`, `--port=${t.port}`, `--user=${t.user}`],
    env: { ...process.env, MYSQL_PWD: t.password },
  };
}

/** The error lines of a mariadb client's stderr (it also echoes the failing statement, which may be a whole table). */
export function clientErrors(stderr: string): string {
  const lines = stderr.split('\n').filter((l) => /^(ERROR|mariadb(-dump)?:)/.test(l.trim()));
  return (lines.length ? lines.join('\n') : stderr.slice(-500)).trim();
}

/** One SQL statement through the mariadb client; its tab-separated output. */
export function querySql(t: DbTarget, sql: string, database?: string): string {
  const { args, env } = clientInvocation(t);
  const r = spawnSync(clientBinary('mariadb'), [...args, '-N', '-B', ...(database ? [`--database=${database}`] : []), '-e', sql], {
    encoding: 'utf8',
    env,
  });
  if (r.status !== 0) throw new ProvisionError(`SQL on ${t.what} failed: ${clientErrors(r.stderr || '')}`);
  return r.stdout;
}

export interface BackupResult {
  file: string;
  bytes: number;
  sha256: string;
  binlog: BinlogPosition | null;
  removed: string[];
}

export interface BackupOptions {
  target: DbTarget;
  database: string;
  dir: string;
  keep: number;
  now?: Date;
}

/** Dumps `database` into `dir` (gzip, streamed), writes the checksum file, then removes backups beyond the newest `keep`. */
export async function runBackup(o: BackupOptions): Promise<BackupResult> {
  const binlogOn = querySql(o.target, 'SELECT @@log_bin').trim() === '1';
  mkdirSync(o.dir, { recursive: true });
  const name = backupFileName(o.now ?? new Date(), readdirSync(o.dir));
  const file = path.join(o.dir, name);
  const partial = `${file}.partial`;
  const { args, env } = clientInvocation(o.target);
  const dumpArgs = [
    ...args,
    '--single-transaction',
    '--routines',
    '--triggers',
    '--hex-blob',
    ...(binlogOn ? ['--master-data=2'] : []),
    o.database,
  ];
  const child = spawn(clientBinary('mariadb-dump'), dumpArgs, { env, stdio: ['ignore', 'pipe', 'pipe'] });
  let stderr = '';
  child.stderr.setEncoding('utf8');
  child.stderr.on('data', (d: string) => (stderr = (stderr + d).slice(-4000)));
  const exited = new Promise<number>((resolve) => child.on('close', (code) => resolve(code ?? 1)));
  // The position is near the top; the GTID position (written after the tables) near the end.
  let head = '';
  let tail = '';
  const watch = new Transform({
    transform(chunk: Buffer, _enc, done) {
      if (head.length < 16384) head += chunk.toString('utf8', 0, Math.min(chunk.length, 16384));
      tail = (tail + chunk.toString('latin1')).slice(-8192);
      done(null, chunk);
    },
  });
  const hash = createHash('sha256');
  let bytes = 0;
  const count = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      bytes += chunk.length;
      done(null, chunk);
    },
  });
  try {
    await pipeline(child.stdout, watch, createGzip({ level: 6 }), count, createWriteStream(partial, { mode: 0o600 }));
    const code = await exited;
    if (code !== 0) throw new ProvisionError(`mariadb-dump of ${o.database} on ${o.target.what} failed (exit ${code}):\n${clientErrors(stderr)}`);
  } catch (err) {
    rmSync(partial, { force: true });
    if (child.exitCode === null) child.kill();
    throw err;
  }
  renameSync(partial, file);
  const sha256 = hash.digest('hex');
  writeFileSync(file + CHECKSUM_SUFFIX, checksumLine(sha256, name), { mode: 0o600 });
  const binlog = binlogPositionFromDump(`${head}\n${tail}`);
  const removed = chooseRotation(readdirSync(o.dir), o.keep).remove;
  for (const old of removed) {
    rmSync(path.join(o.dir, old), { force: true });
    rmSync(path.join(o.dir, old + CHECKSUM_SUFFIX), { force: true });
  }
  return { file, bytes, sha256, binlog, removed };
}

const mib = (n: number) => (n >= 1048576 ? `${(n / 1048576).toFixed(1)} MiB` : `${(n / 1024).toFixed(1)} KiB`);

async function main(): Promise<void> {
  const config = loadConfig();
  const keep = parseBackupKeep(process.env.BACKUP_KEEP);
  const { target } = targetFor(config);
  const dir = path.join(config.dataDir, 'backups');
  console.log(`Backing up ${config.DB_NAME} from ${target.what} …`);
  const r = await runBackup({ target, database: config.DB_NAME, dir, keep });
  console.log(`Backup:   ${r.file}`);
  console.log(`Size:     ${mib(statSync(r.file).size)}`);
  console.log(`SHA-256:  ${r.sha256} (in ${path.basename(r.file)}${CHECKSUM_SUFFIX})`);
  if (r.binlog) {
    console.log(`Binary log position: ${r.binlog.file} at ${r.binlog.position}${r.binlog.gtid ? ` (GTID ${r.binlog.gtid})` : ''}`);
    console.log('  (replay later changes from here with mariadb-binlog: see README, "Backup and restore")');
  } else {
    console.log('Binary log position: none (the binary log is off on this server: no point-in-time restore beyond this backup)');
  }
  if (r.removed.length) console.log(`Removed ${r.removed.length} older backup(s) (keeping ${keep}): ${r.removed.join(', ')}`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((err) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
