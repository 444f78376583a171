import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

// A private MariaDB under a folder of ours: install (apt) when missing, initialise, start detached on 127.0.0.1,
// create the database and the app user, stop. Used by `npm start`, `npm run db:*` and the test harness.

export class ProvisionError extends Error {}

export interface MariaDbPaths {
  baseDir: string;
  datadir: string;
  socket: string;
  pidFile: string;
  logFile: string;
  port: number;
}

/** The files of a private server kept under baseDir. */
export function mariaDbPaths(baseDir: string, port: number): MariaDbPaths {
  const base = path.resolve(baseDir);
  const socket = path.join(base, 'mariadb.sock');
  if (Buffer.byteLength(socket) > 100) {
    throw new ProvisionError(`The data folder path is too long for a Unix socket (${socket}); set DATA_DIR to a shorter path.`);
  }
  return {
    baseDir: base,
    datadir: path.join(base, 'mariadb'),
    socket,
    pidFile: path.join(base, 'mariadb.pid'),
    logFile: path.join(base, 'mariadb.log'),
    port,
  };
}

const SEARCH_DIRS = ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin'];

function which(name: string): string | null {
  if (name.includes('/')) return existsSync(name) ? name : null;
  const dirs = [...(process.env.PATH ?? '').split(':').filter(Boolean), ...SEARCH_DIRS];
  for (const dir of dirs) {
    const p = path.join(dir, name);
    if (existsSync(p)) return p;
  }
  return null;
}

/** The server binary; MARIADBD_BIN names another one to look for (lets tests take the "missing" branch). */
export function findMariadbd(env: NodeJS.ProcessEnv = process.env): string | null {
  return which(env.MARIADBD_BIN ?? 'mariadbd');
}

export function clientBinary(name: 'mariadb' | 'mariadb-admin' | 'mariadb-install-db' | 'mariadb-dump' | 'mariadb-binlog'): string {
  const found = which(name);
  if (!found) throw new ProvisionError(`${name} was not found; install it with: apt-get install -y mariadb-server`);
  return found;
}

export interface InstallOptions {
  env?: NodeJS.ProcessEnv;
  isRoot?: boolean;
  log?: (line: string) => void;
}

/** Makes sure mariadbd exists: installs Debian's mariadb-server with apt-get when we are root, else says how. */
export function ensureMariaDbInstalled(opts: InstallOptions = {}): string {
  const env = opts.env ?? process.env;
  const log = opts.log ?? ((l: string) => console.log(l));
  const found = findMariadbd(env);
  if (found) return found;
  const isRoot = opts.isRoot ?? process.getuid?.() === 0;
  const cmd = 'apt-get update && apt-get install -y mariadb-server';
  if (!isRoot) {
    throw new ProvisionError(`MariaDB is not installed. Run as root:\n  sudo sh -c '${cmd}'\nthen npm start again.`);
  }
  const aptGet = env.APT_GET_BIN ?? 'apt-get';
  log('MariaDB is not installed: installing Debian\'s mariadb-server with apt-get (about a minute) …');
  // Debian's postinst tries to start the system server; a policy-rc.d that exits 101 stops it, only for this install.
  const policy = '/usr/sbin/policy-rc.d';
  const addedPolicy = !existsSync(policy) && !env.APT_GET_BIN;
  if (addedPolicy) writeFileSync(policy, '#!/bin/sh\nexit 101\n', { mode: 0o755 });
  try {
    const aptEnv = { ...env, DEBIAN_FRONTEND: 'noninteractive' };
    const update = spawnSync(aptGet, ['update'], { stdio: 'inherit', env: aptEnv });
    if (update.status !== 0) throw new ProvisionError(`"${aptGet} update" failed (exit ${update.status}). Run: ${cmd}`);
    const install = spawnSync(aptGet, ['install', '-y', 'mariadb-server'], { stdio: 'inherit', env: aptEnv });
    if (install.status !== 0) throw new ProvisionError(`"${aptGet} install -y mariadb-server" failed (exit ${install.status}).`);
  } finally {
    if (addedPolicy) rmSync(policy, { force: true });
  }
  const after = findMariadbd(env);
  if (!after) throw new ProvisionError('mariadb-server was installed but mariadbd is still not found on this machine.');
  return after;
}

function osUser(): string {
  return os.userInfo().username;
}

/** Initialises the datadir once (~2 s). */
export function initDatadir(p: MariaDbPaths): void {
  if (existsSync(path.join(p.datadir, 'mysql'))) return;
  mkdirSync(p.datadir, { recursive: true });
  const r = spawnSync(
    clientBinary('mariadb-install-db'),
    [
      '--no-defaults',
      `--datadir=${p.datadir}`,
      `--user=${osUser()}`,
      '--auth-root-authentication-method=socket',
      '--skip-test-db',
      '--skip-name-resolve',
      '--innodb-log-file-size=16M',
    ],
    { encoding: 'utf8' },
  );
  if (r.status !== 0) {
    rmSync(p.datadir, { recursive: true, force: true });
    throw new ProvisionError(`mariadb-install-db failed:\n${(r.stderr || r.stdout || '').slice(-2000)}`);
  }
}

/** True when our server answers on its socket. */
export function pingSocket(p: MariaDbPaths): boolean {
  if (!existsSync(p.socket)) return false;
  const r = spawnSync(clientBinary('mariadb-admin'), ['--no-defaults', `--socket=${p.socket}`, `-u${osUser()}`, '--connect-timeout=2', 'ping'], {
    encoding: 'utf8',
  });
  return r.status === 0;
}

/** True when something accepts or holds the TCP port on 127.0.0.1. */
export function portInUse(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once('error', () => resolve(true));
    srv.listen({ port, host, exclusive: true }, () => srv.close(() => resolve(false)));
  });
}

/** A TCP port on 127.0.0.1 that was free a moment ago (bound to port 0, then released): for throw-away servers. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const a = srv.address();
      srv.close(() => resolve(typeof a === 'object' && a ? a.port : 0));
    });
  });
}

/** Last lines of the server log, for error messages. */
export function logTail(p: MariaDbPaths, lines = 15): string {
  if (!existsSync(p.logFile)) return '(no log)';
  return readFileSync(p.logFile, 'utf8').trimEnd().split('\n').slice(-lines).join('\n');
}

function pidAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

function readPid(p: MariaDbPaths): number | null {
  if (!existsSync(p.pidFile)) return null;
  const n = Number(readFileSync(p.pidFile, 'utf8').trim());
  return Number.isInteger(n) && n > 0 ? n : null;
}

function isOurMariadbd(pid: number, p: MariaDbPaths): boolean {
  try {
    const cmd = readFileSync(`/proc/${pid}/cmdline`, 'utf8');
    return cmd.includes('mariadbd') && cmd.includes(p.datadir);
  } catch {
    return false;
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export interface StartResult {
  alreadyRunning: boolean;
  pid: number | null;
}

/** The binary log's base name: files `<datadir>/binlog.000001` … (kept 7 days, 64 MiB each), for point-in-time restores. */
export const binlogBase = (p: MariaDbPaths) => path.join(p.datadir, 'binlog');

/** Starts the private server detached (or finds it already up); clear errors for a taken port or a failed start. */
export async function startMariaDb(
  p: MariaDbPaths,
  opts: { bufferPoolMB?: number; timeoutMs?: number; binlog?: boolean } = {},
): Promise<StartResult> {
  const bin = findMariadbd() ?? ensureMariaDbInstalled();
  mkdirSync(p.baseDir, { recursive: true });
  initDatadir(p);
  if (pingSocket(p)) return { alreadyRunning: true, pid: readPid(p) };

  const oldPid = readPid(p);
  if (oldPid && pidAlive(oldPid) && isOurMariadbd(oldPid, p)) {
    // Ours, still starting up (or stuck): give it the normal time to answer.
    if (await waitUntilUp(p, oldPid, opts.timeoutMs ?? 30000)) return { alreadyRunning: true, pid: oldPid };
    throw new ProvisionError(`MariaDB (pid ${oldPid}) is running but does not answer on ${p.socket}.\n${logTail(p)}`);
  }
  // A stale pid file or socket after a crash: remove them so the new server starts clean.
  for (const f of [p.pidFile, p.socket]) if (existsSync(f)) unlinkSync(f);

  if (await portInUse(p.port)) {
    throw new ProvisionError(
      `Port ${p.port} on 127.0.0.1 is held by another program, so the private MariaDB cannot start.\n` +
        `Stop that program or choose another port with DB_PORT (e.g. DB_PORT=${p.port + 1} npm start).`,
    );
  }
  const args = [
    '--no-defaults',
    `--datadir=${p.datadir}`,
    `--socket=${p.socket}`,
    `--pid-file=${p.pidFile}`,
    `--log-error=${p.logFile}`,
    `--port=${p.port}`,
    '--bind-address=127.0.0.1',
    ...(process.getuid?.() === 0 ? ['--user=root'] : []),
    '--skip-name-resolve',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--default-time-zone=+00:00',
    `--innodb-buffer-pool-size=${opts.bufferPoolMB ?? 64}M`,
    '--table-open-cache=400',
    '--performance-schema=OFF',
    '--max-allowed-packet=64M',
    // The binary log (on unless a caller turns it off): row events from a backup's position replay to any later moment.
    ...(opts.binlog === false
      ? ['--skip-log-bin']
      : [`--log-bin=${binlogBase(p)}`, '--binlog-format=ROW', '--server-id=1', '--binlog-expire-logs-seconds=604800', '--max-binlog-size=64M']),
  ];
  const child = spawn(bin, args, { detached: true, stdio: 'ignore' });
  let exited: number | null = null;
  child.on('exit', (code) => (exited = code ?? -1));
  child.unref();
  const deadline = Date.now() + (opts.timeoutMs ?? 30000);
  while (Date.now() < deadline) {
    if (pingSocket(p)) return { alreadyRunning: false, pid: child.pid ?? null };
    if (exited !== null) break;
    await sleep(150);
  }
  throw new ProvisionError(
    `MariaDB did not start${exited !== null ? ` (exit ${exited})` : ''} on 127.0.0.1:${p.port}. Last lines of ${p.logFile}:\n${logTail(p)}`,
  );
}

async function waitUntilUp(p: MariaDbPaths, pid: number, timeoutMs: number): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline && pidAlive(pid)) {
    if (pingSocket(p)) return true;
    await sleep(200);
  }
  return false;
}

/** Runs SQL as the OS user's admin account over the socket. */
export function adminSql(p: MariaDbPaths, sql: string): string {
  const r = spawnSync(clientBinary('mariadb'), ['--no-defaults', `--socket=${p.socket}`, `-u${osUser()}`, '-N', '-B', '-e', sql], {
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new ProvisionError(`SQL failed: ${(r.stderr || '').trim()}`);
  return r.stdout;
}

const quoteString = (s: string) => `'${s.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;

/**
 * Creates the database and its two accounts (passwords from the data folder, generated once, unless given):
 * - the migrator, `<user>_owner` (or owner.user): ALL on the database WITH GRANT OPTION; runs the migrations and then
 *   gives the app its rights (applyAppGrants); password in DATA_DIR/db-owner-password;
 * - the app, `user`: row rights on each table only (appGrantStatements), never on the schema; password in
 *   DATA_DIR/db-password. A database-wide grant from an earlier provisioning is taken back.
 * Returns the app account's password.
 */
export function ensureDatabaseAndUser(p: MariaDbPaths, dbName: string, user: string, password?: string, owner: { user?: string; password?: string } = {}): string {
  const ownerUser = owner.user || `${user}_owner`;
  if (!/^[A-Za-z0-9_]+$/.test(dbName) || !/^[A-Za-z0-9_]+$/.test(user) || !/^[A-Za-z0-9_]+$/.test(ownerUser)) {
    throw new ProvisionError('DB_NAME, DB_USER and DB_OWNER_USER: letters, digits and _ only');
  }
  if (ownerUser === user) throw new ProvisionError('DB_OWNER_USER must differ from DB_USER');
  const pw = password || ensureSecretFile(p.baseDir, 'db-password');
  const ownerPw = owner.password || ensureSecretFile(p.baseDir, 'db-owner-password');
  adminSql(
    p,
    [
      `CREATE DATABASE IF NOT EXISTS \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      `CREATE USER IF NOT EXISTS '${ownerUser}'@'127.0.0.1' IDENTIFIED BY ${quoteString(ownerPw)}`,
      `ALTER USER '${ownerUser}'@'127.0.0.1' IDENTIFIED BY ${quoteString(ownerPw)}`,
      `GRANT ALL PRIVILEGES ON \`${dbName}\`.* TO '${ownerUser}'@'127.0.0.1' WITH GRANT OPTION`,
      `CREATE USER IF NOT EXISTS '${user}'@'127.0.0.1' IDENTIFIED BY ${quoteString(pw)}`,
      `ALTER USER '${user}'@'127.0.0.1' IDENTIFIED BY ${quoteString(pw)}`,
    ].join(';\n'),
  );
  const tables = adminSql(p, `SELECT TABLE_NAME FROM information_schema.TABLES WHERE TABLE_SCHEMA = ${quoteString(dbName)} AND TABLE_TYPE = 'BASE TABLE'`)
    .split('\n')
    .map((l) => l.trim())
    .filter(Boolean);
  adminSql(p, [...appGrantStatements(dbName, user, tables), 'FLUSH PRIVILEGES'].join(';\n'));
  return pw;
}

/** The app account's rights where they are not SELECT, INSERT, UPDATE, DELETE: the audit trail is append-only. */
export const APP_TABLE_RIGHTS: Readonly<Record<string, { grant: string; revoke: string }>> = {
  audit_entry: { grant: 'SELECT, INSERT', revoke: 'UPDATE, DELETE' },
  migrations: { grant: 'SELECT', revoke: 'INSERT, UPDATE, DELETE' },
};

/**
 * The statements that give the app account (user@host) its rights on the given tables of dbName, table by table:
 * SELECT, INSERT, UPDATE, DELETE, but only SELECT and INSERT on audit_entry and only SELECT on the migrations' log;
 * then any database-wide right is taken back (the GRANT before the REVOKE makes sure there is one to take back).
 * Run by the migrator (or the admin) after every migration run: new tables need their grants.
 */
export function appGrantStatements(dbName: string, user: string, tables: readonly string[], host = '127.0.0.1'): string[] {
  const who = `'${user}'@'${host}'`;
  const out: string[] = [];
  for (const t of tables) {
    if (!/^[A-Za-z0-9_]+$/.test(t)) continue;
    const target = `\`${dbName}\`.\`${t}\``;
    const special = APP_TABLE_RIGHTS[t];
    if (!special) out.push(`GRANT SELECT, INSERT, UPDATE, DELETE ON ${target} TO ${who}`);
    else out.push(`GRANT ${special.grant} ON ${target} TO ${who}`, `REVOKE ${special.revoke} ON ${target} FROM ${who}`);
  }
  out.push(`GRANT SELECT ON \`${dbName}\`.* TO ${who}`, `REVOKE ALL PRIVILEGES ON \`${dbName}\`.* FROM ${who}`);
  return out;
}

/**
 * Gives the app account its table rights on every table of the database, through a connection with GRANT OPTION on it
 * (the migrator's). Called after every migration run (server/scripts/prepare.ts).
 */
export async function applyAppGrants(query: (sql: string, params?: unknown[]) => Promise<unknown>, dbName: string, user: string, host = '127.0.0.1'): Promise<void> {
  const rows = (await query("SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_TYPE = 'BASE TABLE'", [dbName])) as { name: string }[];
  for (const sql of appGrantStatements(dbName, user, rows.map((r) => r.name), host)) await query(sql);
}

/** A random secret kept in a 0600 file of the data folder, created on first use. */
export function ensureSecretFile(dir: string, name: string, bytes = 24): string {
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, name);
  if (existsSync(file)) {
    const v = readFileSync(file, 'utf8').trim();
    if (v) return v;
  }
  const v = randomBytes(bytes).toString('hex');
  writeFileSync(file, v + '\n', { mode: 0o600 });
  chmodSync(file, 0o600);
  return v;
}

/** Stops the private server and waits until its process is gone. */
export async function stopMariaDb(p: MariaDbPaths, timeoutMs = 30000): Promise<boolean> {
  const pid = readPid(p);
  if (!pingSocket(p) && !(pid && pidAlive(pid) && isOurMariadbd(pid, p))) return false;
  spawnSync(clientBinary('mariadb-admin'), ['--no-defaults', `--socket=${p.socket}`, `-u${osUser()}`, 'shutdown'], { encoding: 'utf8' });
  const deadline = Date.now() + timeoutMs;
  while (pid && pidAlive(pid) && Date.now() < deadline) await sleep(100);
  if (pid && pidAlive(pid)) process.kill(pid, 'SIGKILL');
  return true;
}
