import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { brotliCompressSync, constants as zlib } from 'node:zlib';
import { benchEngine } from './bench/engine.js';
import { chromiumMissing, measureFirstLoad, type PageBytes } from './bench/first-load.js';
import { compareShapes, startLoadChild } from './bench/load.js';
import { figure, figureProblems, textTable, writeReadmeTable, type BenchReport, type Figure } from './bench/report.js';
import { FULL_FLEET, QUICK_FLEET } from './bench/seed.js';
import { clientIsStale, buildClient } from './build-client.js';
import { ensureDatabaseAndUser, freePort, mariaDbPaths, startMariaDb, stopMariaDb } from './mariadb.js';

// npm run bench — every figure against its floor measured in the same run (README "Benchmarks"): the engine, the read
// API under load, imports, the screening write path and the first load, on a throw-away MariaDB holding the demo seed
// and a bulk fleet. `-- --quick`: the same steps at small sizes (a smoke run; figures not comparable).
// `-- --write-readme`: the table goes into the README too. `-- --dist DIR`: serve that built client (else dist/ when
// fresh, else a build into the temp folder). `-- --json FILE`: where the JSON goes.
// Timing belongs here, never in tests.

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const args = process.argv.slice(2);
const quick = args.includes('--quick');
const argValue = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const sizes = quick
  ? { fleet: QUICK_FLEET, engineRuns: 20, loadSeconds: 1, connections: [2, 5], readingsRows: 2000, rowsPerFile: 1000, sweepPoints: 2000, screenings: 20 }
  : { fleet: FULL_FLEET, engineRuns: 500, loadSeconds: 10, connections: [10, 50], readingsRows: 50000, rowsPerFile: 10000, sweepPoints: 20000, screenings: 200 };
/** Full runs write bench/results.json (committed); quick runs the OS temp folder, so a smoke run never touches the repo. */
const jsonPath = argValue('--json') ?? (quick ? path.join(os.tmpdir(), 'gapsight-bench-results.quick.json') : path.join(root, 'bench', 'results.json'));

const started = performance.now();
const log = (l: string) => console.log(`[${((performance.now() - started) / 1000).toFixed(1).padStart(5)} s] ${l}`);
const figures: Figure[] = [];
const skipped: string[] = [];
const setup: Record<string, unknown> = {};
const loadAverageAtStart = os.loadavg();
const startedAt = new Date().toISOString();
const tmp = mkdtempSync(path.join(os.tmpdir(), 'gapsight-bench-'));
const cleanups: (() => Promise<unknown>)[] = [];
let cleaning: Promise<void> | null = null;
function cleanup(): Promise<void> {
  cleaning ??= (async () => {
    for (const c of cleanups.reverse()) await c().catch(() => undefined);
    rmSync(tmp, { recursive: true, force: true });
  })();
  return cleaning;
}
process.once('SIGINT', () => {
  console.error('\nInterrupted: stopping the bench database and removing its folder…');
  void cleanup().then(() => process.exit(130));
});

/** Keys of the event file the app computes (the floor answers their inputs: priorFaults, the audit rows). */
const COMPUTED_IN_APP = /^(throughFault|dutyCase)(\.|$)|^audit\[\]\.summary$/;
const fmtMs = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

async function main(): Promise<void> {
  // 1. Engine (no database).
  log(`Engine: one full case, ${sizes.engineRuns} runs…`);
  const eng = benchEngine(sizes.engineRuns);
  figures.push(
    figure('engine', `Engine: parseCase → screenCase, one full case (median of ${eng.runs})`, eng.engineMs, eng.floorMs, 'ms', '≤ 2 ms and ≤ 3 × floor', (r, v) => v <= 2 && r <= 3, `screenCase alone ${eng.screenOnlyMs.toFixed(2)} ms; ${eng.indicators} indicators`),
    figure('engine.screenOnly', 'Engine: screenCase alone (case parsed beforehand)', eng.screenOnlyMs, eng.floorMs, 'ms', '≤ 2 ms and ≤ 3 × floor', (r, v) => v <= 2 && r <= 3),
  );

  // The client, built before anything listens (the build is the slowest step of a quick run when dist/ is stale).
  const chromiumProblem = chromiumMissing();
  let staticDir: string | undefined = argValue('--dist');
  const given = staticDir !== undefined;
  if (chromiumProblem) {
    skipped.push(`first load — ${chromiumProblem}`);
    console.warn(chromiumProblem);
  } else if (!staticDir) {
    if (!clientIsStale(root, 'dist')) staticDir = path.join(root, 'dist');
    else {
      log('Building the client into the temp folder…');
      const out = path.join(tmp, 'dist');
      if (!buildClient(root, out, true)) throw new Error('the client build failed');
      staticDir = out;
    }
  }
  setup.client = given ? `given (--dist ${staticDir})` : staticDir === path.join(root, 'dist') ? 'dist/ (fresh)' : staticDir ? 'built for this run' : 'none';

  // 2. The throw-away MariaDB, migrations, demo seed, bulk fleet.
  const p = mariaDbPaths(path.join(tmp, 'db'), await freePort());
  log(`MariaDB on port ${p.port} in ${tmp}…`);
  cleanups.push(() => stopMariaDb(p));
  await startMariaDb(p, { bufferPoolMB: 256 });
  const owner = { user: 'gapsight_owner', password: randomBytes(12).toString('hex') };
  // The bench connects as the schema's owner (as the old bench did): the app account's table grants are not the subject.
  const provision = ensureDatabaseAndUser as (...a: unknown[]) => string;
  provision(p, 'gapsight_bench', 'gapsight', randomBytes(12).toString('hex'), owner);
  Object.assign(process.env, {
    DB_HOST: '127.0.0.1',
    DB_PORT: String(p.port),
    DB_NAME: 'gapsight_bench',
    DB_USER: owner.user,
    DB_PASSWORD: owner.password,
    JWT_SECRET: randomBytes(32).toString('hex'),
    DATA_DIR: path.join(tmp, 'data'),
    LOG_LEVEL: 'warn',
  });
  const { default: db } = await import('../db/data-source.js');
  const { migrateAndSeedOn } = await import('./prepare.js');
  const { seedBulkFleet } = await import('./bench/seed.js');
  await db.initialize();
  cleanups.push(() => db.destroy());
  let t = performance.now();
  await migrateAndSeedOn(db, { seed: true });
  setup.migrationsAndDemoSeedMs = Math.round(performance.now() - t);
  const fleet = await seedBulkFleet(db, sizes.fleet);
  setup.bulkSeed = { ...sizes.fleet, ms: Math.round(fleet.ms) };
  log(`Migrations + demo seed ${fmtMs(setup.migrationsAndDemoSeedMs as number)}; bulk seed (${sizes.fleet.units} units, ${sizes.fleet.events} events, ${sizes.fleet.readings} readings) ${fmtMs(fleet.ms)}`);

  // 3. The app and the floor, listening on 127.0.0.1.
  const { loadConfig } = await import('../config.js');
  const { createApp } = await import('../app.js');
  const { systemClock } = await import('../common/clock.js');
  const { DEMO_PASSWORD } = await import('../db/seed/demo-users.js');
  const { startFloorServer } = await import('./bench/floor-server.js');
  const config = loadConfig();
  const app = createApp({ db, clock: systemClock, config, mailSinkRunning: false }, { staticDir });
  const server = app.listen(await freePort(), '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  cleanups.push(() => new Promise((resolve) => (server.closeAllConnections(), server.close(resolve))));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const floor = await startFloorServer({ host: '127.0.0.1', port: p.port, user: owner.user, password: owner.password, database: 'gapsight_bench' });
  cleanups.push(() => floor.close());
  const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@kestrel-valley.example', password: DEMO_PASSWORD }) });
  if (!login.ok) throw new Error(`sign-in as the demo admin failed: ${login.status}`);
  const token = ((await login.json()) as { token: string }).token;
  const auth = { authorization: `Bearer ${token}` };

  // 4. Read API under load: the app against the floor, URL by URL, at each concurrency.
  const [demoEvent] = (await db.query(
    "SELECT e.id, e.unitId FROM fault_event e JOIN unit u ON u.id = e.unitId WHERE u.serial NOT LIKE 'BENCH-%' AND EXISTS (SELECT 1 FROM screening s WHERE s.eventId = e.id) ORDER BY e.occurredAt DESC LIMIT 1",
  )) as { id: number; unitId: number }[];
  if (!demoEvent) throw new Error('the demo seed has no screened event');
  const urls: [string, string][] = [
    ['units', '/api/units'],
    ['events', '/api/events'],
    ['event', `/api/events/${demoEvent.id}`],
    ['case', `/api/events/${demoEvent.id}/case`],
  ];
  const shapes: Record<string, unknown> = {};
  for (const [key, url] of urls) {
    const a = await fetch(`${base}${url}`, { headers: auth });
    const f = await fetch(`${floor.url}${url}`);
    if (!a.ok || !f.ok) throw new Error(`${url}: app ${a.status}, floor ${f.status}`);
    const cmp = compareShapes(await a.json(), await f.json());
    // Figures the app computes from rows the floor reads too (the duty from the earlier faults, the audit in words).
    const computed = cmp.missingInFloor.filter((k) => COMPUTED_IN_APP.test(k));
    cmp.missingInFloor = cmp.missingInFloor.filter((k) => !COMPUTED_IN_APP.test(k));
    shapes[key] = { ...cmp, computedInApp: computed };
    if (cmp.missingInFloor.length) log(`  ${url}: in the app's answer, not the floor's: ${cmp.missingInFloor.join(', ')}`);
  }
  setup.shapes = shapes;
  const loader = await startLoadChild(root);
  cleanups.push(async () => loader.stop());
  for (const [key, url] of urls) {
    for (const c of sizes.connections) {
      log(`Load: GET ${url} at ${c} connections, ${sizes.loadSeconds} s each for the app and the floor…`);
      const a = await loader.run(`${base}${url}`, c, sizes.loadSeconds, auth);
      const f = await loader.run(`${floor.url}${url}`, c, sizes.loadSeconds);
      const missing = (shapes[key] as ReturnType<typeof compareShapes>).missingInFloor;
      const computed = (shapes[key] as { computedInApp: string[] }).computedInApp;
      const same = `${missing.length ? `floor lacks ${missing.length} key(s): ${missing.slice(0, 4).join(', ')}${missing.length > 4 ? ', …' : ''}` : 'same keys'}${computed.length ? ' (besides the duty and audit sentences the app computes; the floor sends their input rows)' : ''}; ${(shapes[key] as { counts: string }).counts}`;
      const name = `GET ${url.replace(/\/\d+/, '/:id')} @${c}`;
      const rps = figure(`load.${key}.${c}.rps`, `${name}: requests/s`, a.rps, f.rps, 'req/s', '≥ 0.5 × floor', (r) => r >= 0.5 && a.errors === 0, `${a.requests} requests (floor ${f.requests})${a.errors || f.errors ? `; failed answers: app ${a.errors} (${JSON.stringify(a.statuses)}), floor ${f.errors}` : ''}; ${same}`);
      const p95 = figure(`load.${key}.${c}.p95`, `${name}: p95 latency`, a.p95, f.p95, 'ms', '≤ 2 × floor', (r) => r <= 2, `p50 ${a.p50.toFixed(1)} / p99 ${a.p99.toFixed(1)} ms; floor p50 ${f.p50.toFixed(1)} / p99 ${f.p99.toFixed(1)} ms`);
      figures.push(rps, p95);
      ((setup.load ??= []) as unknown[]).push({ url, connections: c, app: a, floor: f });
      log(`  app ${a.rps.toFixed(0)} req/s p95 ${a.p95.toFixed(1)} ms; floor ${f.rps.toFixed(0)} req/s p95 ${f.p95.toFixed(1)} ms`);
    }
  }

  // 5. Imports.
  const { benchReadingsImport, benchSweepImport } = await import('./bench/imports.js');
  const post = async (url: string, form: FormData) => {
    const res = await fetch(`${base}${url}`, { method: 'POST', headers: auth, body: form });
    return { status: res.status, text: await res.text() };
  };
  const units = (await db.query("SELECT id, serial FROM unit WHERE serial LIKE 'BENCH-%' ORDER BY serial")) as { id: number; serial: string }[];
  log(`Imports: ${sizes.readingsRows} reading rows as ${sizes.readingsRows / sizes.rowsPerFile} files of ${sizes.rowsPerFile}…`);
  const ri = await benchReadingsImport(post, floor.pool, units, sizes.readingsRows, sizes.rowsPerFile);
  figures.push(
    figure('import.readings', `Import: ${ri.rows} reading rows, ${ri.files} CSV files of ${sizes.rowsPerFile} (POST /api/units/reading-sets/import, the largest row cap)`, ri.routeMs, ri.floorMs, 'ms', '≤ 1.5 × floor', (r) => r <= 1.5, 'floor: multi-row INSERTs of the same sets and readings'),
  );
  const [set] = (await db.query("SELECT id FROM reading_set WHERE unitId = ? AND kind = 'commissioning' LIMIT 1", [units[0].id])) as { id: number }[];
  const si = await benchSweepImport(post, floor.pool, units[0].id, set.id, sizes.sweepPoints);
  figures.push(
    figure('import.sweep', `Import: one ${si.rows}-point sweep CSV (POST /api/units/:id/sweeps)`, si.routeMs, si.floorMs, 'ms', '≤ 1.5 × floor', (r) => r <= 1.5, 'floor: one INSERT of the stored row, points serialised to JSON'),
  );

  // 6. Screening write path.
  const { benchScreenings } = await import('./bench/screenings.js');
  log(`Screenings: ${sizes.screenings} events in a row…`);
  const postJson = async (url: string, body: unknown) => {
    const res = await fetch(`${base}${url}`, { method: 'POST', headers: { ...auth, 'content-type': 'application/json' }, body: JSON.stringify(body) });
    return { status: res.status, text: await res.text() };
  };
  const sc = await benchScreenings(db, postJson, fleet.screenableEventIds.slice(0, sizes.screenings));
  figures.push(
    figure('screening', `Screening write path: POST /api/events/:id/screenings, ${sc.count} in a row (median)`, sc.routeMs, sc.engineMs, 'ms', 'no goal set (engine alone is the floor)', () => null, 'case assembly, engine, stored result, audit, status, notifications'),
  );

  // 7. First load.
  if (staticDir && !chromiumProblem) {
    const [demoUnit] = (await db.query("SELECT id FROM unit WHERE serial NOT LIKE 'BENCH-%' ORDER BY id LIMIT 1")) as { id: number }[];
    const all = [
      { page: 'desk', path: '/' },
      { page: 'fleet', path: '/units' },
      { page: 'unit file', path: `/units/${demoEvent.unitId ?? demoUnit.id}` },
      { page: 'events', path: '/events' },
      { page: 'event file', path: `/events/${demoEvent.id}` },
      { page: 'criteria', path: '/criteria' },
      { page: 'people', path: '/admin/people' },
    ];
    // A quick run visits the desk and the heaviest page only.
    const pages = quick ? all.filter((x) => x.page === 'desk' || x.page === 'event file') : all;
    log('First load: Chromium, one fresh context a page…');
    const fl = await measureFirstLoad(base, token, pages);
    // The floor of a visit: its static files compressed with brotli at the highest quality (what the same files could
    // weigh on the wire), its API answers as measured.
    const brotli = new Map<string, number>();
    const best = (items: PageBytes['items'], only?: (type: string) => boolean) =>
      items
        .filter((i) => i.bytes > 0 && (!only || only(i.type)))
        .reduce((sum, i) => {
          const u = new URL(i.url);
          if (u.pathname.startsWith('/api/')) return sum + i.bytes;
          let file = path.join(staticDir!, decodeURIComponent(u.pathname));
          if (!existsSync(file) || u.pathname === '/' || !path.extname(file)) file = path.join(staticDir!, 'index.html');
          if (!brotli.has(file)) brotli.set(file, brotliCompressSync(readFileSync(file), { params: { [zlib.BROTLI_PARAM_QUALITY]: 11 } }).length);
          return sum + brotli.get(file)!;
        }, 0);
    const kB = (b: number) => b / 1000;
    const signIn = fl.pages[0];
    const deskAfter = fl.pages.find((x) => x.page.startsWith('desk after'))!;
    const jsFloor = best(signIn.items, (t) => t === 'Script') + best(deskAfter.items, (t) => t === 'Script');
    figures.push(
      figure('firstLoad.signInDeskJs', 'First load: JS of sign-in + desk (compressed, desk after sign-in)', kB(fl.signInDeskJs), kB(jsFloor), 'kB', '≤ 200 kB', (_r, v) => v <= 200, `encodings: ${signIn.encodings.join(', ')}`),
    );
    for (const pg of fl.pages.filter((x) => !x.page.startsWith('desk after'))) {
      figures.push(
        figure(`firstLoad.${pg.page.replace(/\s+/g, '-')}`, `First load: ${pg.page} (${pg.path.replace(/\/\d+$/, '/:id')}), all bytes`, kB(pg.total), kB(best(pg.items)), 'kB', '≤ 350 kB', (_r, v) => v <= 350, `JS ${kB(pg.js).toFixed(0)} kB, CSS ${kB(pg.css).toFixed(0)} kB, fonts ${kB(pg.fonts).toFixed(0)} kB, API ${kB(pg.api).toFixed(0)} kB, other ${kB(pg.other).toFixed(0)} kB; JS/CSS served as ${pg.encodings.join(', ') || 'nothing'}`),
      );
    }
  }
}

const machine = () => {
  const cpus = os.cpus();
  return { cpus: cpus[0]?.model ?? 'unknown', cpuCount: cpus.length, node: process.version, date: startedAt, loadAverageAtStart, platform: `${process.platform}/${process.arch}` };
};

let failed: unknown = null;
try {
  await main();
} catch (err) {
  failed = err;
} finally {
  await cleanup();
}
const report: BenchReport = { mode: quick ? 'quick' : 'full', machine: machine(), setup, figures, skipped };
console.log(`\n${textTable(figures)}`);
for (const f of figures) if (f.detail) console.log(`  ${f.figure}: ${f.detail}`);
for (const s of skipped) console.log(`Skipped: ${s}`);
mkdirSync(path.dirname(jsonPath), { recursive: true });
writeFileSync(jsonPath, `${JSON.stringify(report, null, 2)}\n`);
console.log(`\nJSON: ${path.relative(process.cwd(), jsonPath) || jsonPath}`);
const problems = figureProblems(figures);
if (!failed && args.includes('--write-readme')) {
  if (writeReadmeTable(path.join(root, 'README.md'), report)) console.log('README: the table between <!-- bench:begin --> and <!-- bench:end --> is rewritten.');
  else problems.push('README has no <!-- bench:begin --> / <!-- bench:end --> markers');
}
if (failed) {
  console.error(`\nThe bench failed: ${failed instanceof Error ? (failed.stack ?? failed.message) : String(failed)}`);
  process.exit(1);
}
if (problems.length) {
  console.error(`\nFigures missing or not positive:\n${problems.join('\n')}`);
  process.exit(1);
}
process.exit(0);
