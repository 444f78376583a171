import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureDatabaseAndUser, freePort, mariaDbPaths, startMariaDb, stopMariaDb, type MariaDbPaths } from '../server/scripts/mariadb.js';

// `npm test`: type checks, a throw-away MariaDB (temporary datadir, free port), migrations, the client built once,
// then every Vitest project. This one outer process owns the database, so it is stopped even when vitest crashes.

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);
const vitestArgs = process.argv.slice(2);

function step(title: string): void {
  console.log(`\n▶ ${title}`);
}

const DEBIAN_CHROMIUM = '/usr/bin/chromium';

/**
 * Installs Debian's Chromium when it is missing (as `npm start` installs MariaDB); the browser tests drive it.
 * CHROMIUM_PATH names the binary to look for (and the one the browser tests launch).
 */
function ensureChromium(): boolean {
  const exe = process.env.CHROMIUM_PATH ?? DEBIAN_CHROMIUM;
  if (existsSync(exe)) {
    console.log(`✓ ${exe}`);
    return true;
  }
  if (process.getuid?.() !== 0) {
    console.error(`✗ ${exe} is missing and installing it needs root: run sudo sh -c 'apt-get update && apt-get install -y chromium' (or set CHROMIUM_PATH)`);
    return false;
  }
  console.log(`${exe} is missing: installing Debian's chromium with apt-get (about a minute) …`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update', '-qq'], ['install', '-y', '-qq', 'chromium']]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) {
      console.error(`✗ apt-get ${args.join(' ')} failed (exit ${r.status})`);
      return false;
    }
  }
  if (!existsSync(exe)) {
    const hint = exe === DEBIAN_CHROMIUM ? '' : ` (Debian's chromium is ${DEBIAN_CHROMIUM}; unset CHROMIUM_PATH to use it)`;
    console.error(`✗ apt-get installed chromium, but ${exe} is still missing${hint}`);
    return false;
  }
  console.log(`✓ ${exe} installed`);
  return true;
}

let tmp: string | null = null;
let paths: MariaDbPaths | null = null;
/** Every child still running (type checks, the build, Vitest): stopped when the run is interrupted. */
const children = new Set<ReturnType<typeof spawn>>();
let cleaning: Promise<void> | null = null;

interface Finished {
  code: number;
  output: string;
  seconds: number;
}

/** Runs a command in the background, keeping its output (stdout and stderr in order) for the caller to print. */
function runKeepingOutput(cmd: string, args: string[]): Promise<Finished> {
  const started = Date.now();
  return new Promise((resolve) => {
    const c = spawn(cmd, args, { cwd: root, stdio: ['ignore', 'pipe', 'pipe'], env: process.env });
    children.add(c);
    const chunks: Buffer[] = [];
    c.stdout!.on('data', (d: Buffer) => chunks.push(d));
    c.stderr!.on('data', (d: Buffer) => chunks.push(d));
    c.on('error', (err) => chunks.push(Buffer.from(`${String(err)}\n`)));
    c.on('close', (code, sig) => {
      children.delete(c);
      resolve({ code: code ?? (sig ? 1 : 0), output: Buffer.concat(chunks).toString('utf8'), seconds: (Date.now() - started) / 1000 });
    });
  });
}

function cleanup(): Promise<void> {
  return (cleaning ??= (async () => {
    for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
    if (paths) await stopMariaDb(paths).catch(() => undefined);
    if (tmp) rmSync(tmp, { recursive: true, force: true });
  })());
}

for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
  process.once(sig, () => {
    console.error(`\n${sig}: stopping the test database …`);
    cleanup().finally(() => process.exit(130));
  });
}

async function main(): Promise<number> {
  let failures = 0;
  const bin = (name: string) => path.join(root, 'node_modules', '.bin', name);

  // The type checks run in the background from the start, beside the database, the build and the tests (on two cores
  // they fill the moments the tests wait); their output is printed after Vitest's. The client build runs while the
  // database starts and migrates. Each keeps its output and prints it when awaited, so nothing interleaves.
  const typechecks = process.env.SKIP_TYPECHECK
    ? []
    : ([
        ['vue-tsc', ['--noEmit', '-p', 'tsconfig.json']],
        ['tsc', ['--noEmit', '-p', 'server/tsconfig.json']],
      ] as const).map(([name, args]) => ({ name, run: runKeepingOutput(bin(name), [...args]) }));

  tmp = mkdtempSync(path.join(os.tmpdir(), 'gapsight-test-'));
  let build: Promise<Finished> | null = null;
  // E2E_DIST set by the caller to a folder holding a build: the browser tests use it as it is (no build).
  const givenDist = process.env.E2E_DIST && existsSync(path.join(process.env.E2E_DIST, 'index.html')) ? process.env.E2E_DIST : null;
  const out = givenDist ?? path.join(tmp, 'dist');
  if (!process.env.SKIP_E2E_BUILD && !givenDist) {
    const vite = path.join(root, 'node_modules', 'vite', 'bin', 'vite.js');
    // --bypass-lock: Vite refuses a second build of the project while one runs (another `npm test` or `npm run build`);
    // this one writes to its own temporary folder, so the two do not meet.
    build = runKeepingOutput(process.execPath, [vite, 'build', '--outDir', out, '--emptyOutDir', '--logLevel', 'warn', '--bypass-lock']);
  }

  step('Throw-away MariaDB');
  const dbPort = await freePort();
  paths = mariaDbPaths(path.join(tmp, 'db'), dbPort);
  await startMariaDb(paths, { bufferPoolMB: 128 });
  const dbPassword = randomBytes(12).toString('hex');
  // Two accounts, as `npm start` makes them: the migrator (gapsight_owner: the schema) and the app (gapsight: rows only).
  const owner = { user: 'gapsight_owner', password: randomBytes(12).toString('hex') };
  ensureDatabaseAndUser(paths, 'gapsight_test', 'gapsight', dbPassword, owner);
  // A second, empty database for tests that need a database of their own (the demo seed at a fixed date).
  ensureDatabaseAndUser(paths, 'gapsight_fixed', 'gapsight', dbPassword, owner);
  // The browser tests' own database (their app server runs a mail worker and walks the demo flow).
  ensureDatabaseAndUser(paths, 'gapsight_e2e', 'gapsight', dbPassword, owner);
  // An empty database (migrated, nothing seeded) for the browser test that onboards a utility from DEMO=off.
  ensureDatabaseAndUser(paths, 'gapsight_e2e_empty', 'gapsight', dbPassword, owner);
  // An audit trail of its own for the tests that tamper with it (tests/server/ops/audit-chain.test.ts).
  ensureDatabaseAndUser(paths, 'gapsight_audit', 'gapsight', dbPassword, owner);
  console.log(`✓ MariaDB on 127.0.0.1:${dbPort} (datadir ${paths.datadir})`);

  Object.assign(process.env, {
    DATA_DIR: path.join(tmp, 'data'),
    DB_HOST: '127.0.0.1',
    DB_PORT: String(dbPort),
    DB_NAME: 'gapsight_test',
    TEST_DB_NAME_FIXED: 'gapsight_fixed',
    TEST_DB_NAME_EMPTY: 'gapsight_e2e_empty',
    DB_USER: 'gapsight',
    DB_PASSWORD: dbPassword,
    DB_OWNER_USER: owner.user,
    DB_OWNER_PASSWORD: owner.password,
    TEST_DB_NAME_AUDIT: 'gapsight_audit',
    JWT_SECRET: randomBytes(32).toString('hex'),
    DEMO: 'on',
    PORT: '0',
    MAIL_SINK_PORT: '0',
    TEST_DB_SOCKET: paths.socket,
    TEST_DB_PID_FILE: paths.pidFile,
    // Quiet request log; LOG_LEVEL=info npm test … shows it.
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'silent',
  });
  delete process.env.SMTP_HOST;

  step('Migrations');
  // As the migrator, which then gives the app account its table rights (as npm start does).
  const { loadConfig } = await import('../server/config.js');
  const { migrateAsOwner } = await import('../server/scripts/prepare.js');
  const ran = await migrateAsOwner(loadConfig());
  for (const database of ['gapsight_e2e', 'gapsight_e2e_empty']) await migrateAsOwner({ ...loadConfig(), DB_NAME: database });
  console.log(`✓ ${ran.length} migration(s) applied (test and browser-test databases)`);

  if (!process.env.SKIP_E2E_BUILD) {
    step('Chromium for the browser tests');
    if (!ensureChromium()) failures++;
    step('Client build for the browser tests');
    if (givenDist) console.log(`✓ the build in E2E_DIST=${givenDist}`);
    else {
      const b = await build!;
      process.stdout.write(b.output);
      if (b.code !== 0) {
        console.error('✗ client build failed');
        failures++;
      } else console.log(`✓ built (${b.seconds.toFixed(0)} s)`);
    }
    process.env.E2E_DIST = out;
  }

  step('Vitest');
  const vitest = path.join(root, 'node_modules', 'vitest', 'vitest.mjs');
  // One Vitest process: running the API and browser projects side by side in two processes was measured no faster on
  // two cores (the tests are CPU-bound) and made slow app starts time out.
  const code: number = await new Promise((resolve) => {
    const c = spawn(process.execPath, [vitest, 'run', ...vitestArgs], { stdio: 'inherit', env: process.env });
    children.add(c);
    c.on('close', (exit, sig) => {
      children.delete(c);
      resolve(exit ?? (sig ? 1 : 0));
    });
  });
  if (code !== 0) failures++;

  if (typechecks.length) {
    step('Type check: client (vue-tsc) and server (tsc)');
    for (const { name, run } of typechecks) {
      const r = await run;
      process.stdout.write(r.output);
      if (r.code !== 0) {
        console.error(`✗ ${name} found type errors`);
        failures++;
      } else console.log(`✓ ${name} (${r.seconds.toFixed(0)} s)`);
    }
  }
  return failures;
}

main()
  .then(async (failures) => {
    await cleanup();
    if (failures) console.error(`\n✗ npm test: ${failures} step(s) failed`);
    process.exit(failures ? 1 : 0);
  })
  .catch(async (err) => {
    console.error(err);
    await cleanup();
    process.exit(1);
  });
