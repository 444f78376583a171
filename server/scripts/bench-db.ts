import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { monitorEventLoopDelay, performance } from 'node:perf_hooks';
import { ensureDatabaseAndUser, freePort, mariaDbPaths, startMariaDb, stopMariaDb } from './mariadb.js';

// npm run bench: the demo seed into fresh databases on a throw-away MariaDB; with `-- --db` also API timings on a
// database holding the demo scenario plus a 5 000-unit fleet with 10 000 events (figures go to the README).

const SEED_RUNS = 3;

export async function benchDatabase(opts: { fleet: boolean; imports?: boolean }): Promise<void> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'gapsight-bench-'));
  const p = mariaDbPaths(path.join(tmp, 'db'), await freePort());
  try {
    await startMariaDb(p, { bufferPoolMB: 256 });
    const pw = randomBytes(12).toString('hex');
    // The bench connects as the schema's owner (migrations, then the app on the same account): the provisioning gives
    // the app's own account row rights only, granted table by table after each migration run, which a bench need not
    // repeat. (Passed as a loose call: the owner's password is the provisioning's fifth argument.)
    const provision = ensureDatabaseAndUser as (...args: unknown[]) => string;
    const owner = { user: 'gapsight_owner', password: randomBytes(12).toString('hex') };
    provision(p, 'gapsight_bench', 'gapsight', pw, owner);
    for (let i = 1; i <= SEED_RUNS; i++) provision(p, `gapsight_seed_${i}`, 'gapsight', pw, owner);
    Object.assign(process.env, {
      DB_PORT: String(p.port),
      DB_NAME: 'gapsight_bench',
      DB_USER: owner.user,
      DB_PASSWORD: owner.password,
      JWT_SECRET: randomBytes(32).toString('hex'),
      DATA_DIR: path.join(tmp, 'data'),
      LOG_LEVEL: 'warn',
    });
    const { default: db } = await import('../db/data-source.js');
    const { DataSource } = await import('typeorm');
    const { seedDemo } = await import('../db/seed/demo-seed.js');

    // The demo seed as `npm start` runs it on a first start: migrated, empty database; one fresh database a run.
    const seedMs: number[] = [];
    for (let i = 1; i <= (opts.imports && !opts.fleet ? 0 : SEED_RUNS); i++) {
      const fresh = new DataSource({ ...db.options, database: `gapsight_seed_${i}` } as typeof db.options);
      await fresh.initialize();
      await fresh.runMigrations({ transaction: 'each' });
      const start = performance.now();
      if (!(await seedDemo(fresh))) throw new Error('the demo seed did not run on a fresh database');
      seedMs.push(performance.now() - start);
      await fresh.destroy();
    }
    const median = [...seedMs].sort((a, b) => a - b)[Math.floor(SEED_RUNS / 2)];
    if (seedMs.length) console.log(
      `${'seedDemo into a fresh database'.padEnd(44)} ${String(SEED_RUNS).padStart(7)} runs  ${median.toFixed(0).padStart(9)} ms/run (median; ${seedMs.map((ms) => ms.toFixed(0)).join(', ')} ms)`,
    );
    if (!opts.fleet && !opts.imports) return;

    const { loadConfig } = await import('../config.js');
    const { createApp } = await import('../app.js');
    const { signToken } = await import('../common/auth.js');
    const { systemClock } = await import('../common/clock.js');
    const { migrateAndSeedOn } = await import('./prepare.js');
    const { default: request } = await import('supertest');
    await db.initialize();
    await migrateAndSeedOn(db, { seed: opts.fleet });
    if (!opts.fleet) {
      await benchImports(db, createApp({ db, clock: systemClock, config: loadConfig(), mailSinkRunning: false }), loadConfig().jwtSecret, signToken);
      await db.destroy();
      return;
    }
    const [site] = await db.query('SELECT id FROM site ORDER BY id LIMIT 1');
    const designs: { id: number }[] = await db.query('SELECT id FROM design ORDER BY id');
    const t0 = performance.now();
    for (let i = 0; i < 5000; i += 1000) {
      const rows = Array.from({ length: 1000 }, (_, k) => [`BENCH-${String(i + k).padStart(5, '0')}`, 'T1', site.id, designs[(i + k) % designs.length].id, 3, 132, 33, 40000, 10.5, 0, 'Cu']);
      await db.query(`INSERT INTO unit (serial, position, siteId, designId, phases, hvKV, lvKV, ratedKVA, impedancePercent, systemImpedancePercent, conductor) VALUES ${rows.map(() => '(?,?,?,?,?,?,?,?,?,?,?)').join(',')}`, rows.flat());
    }
    const ids: number[] = (await db.query("SELECT id FROM unit WHERE serial LIKE 'BENCH-%'")).map((r: { id: number }) => r.id);
    for (let i = 0; i < ids.length; i += 500) {
      const rows = ids.slice(i, i + 500).flatMap((id, k) => [0, 1].map((j) => [id, new Date(Date.UTC(2021, 0, 1) + ((i + k) * 2 + j) * 3600_000), 'three-phase', 'lv', '[{"currentKA":3,"durationS":0.1}]', '[]', 'released']));
      await db.query(`INSERT INTO fault_event (unitId, occurredAt, type, side, shots, protectionOperated, status) VALUES ${rows.map(() => '(?,?,?,?,?,?,?)').join(',')}`, rows.flat());
    }
    await db.query('ANALYZE TABLE unit, fault_event');
    console.log(`\nDatabase: 5 000 extra units and 10 000 events inserted in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    const config = loadConfig();
    const app = createApp({ db, clock: systemClock, config, mailSinkRunning: false });
    const [tester] = await db.query("SELECT id FROM `user` WHERE email = 'tester@kestrel-valley.example'");
    const auth = { Authorization: `Bearer ${signToken(tester.id, config.jwtSecret, '1h')}` };
    const [recent] = await db.query("SELECT e.id FROM fault_event e JOIN unit u ON u.id = e.unitId WHERE u.serial = 'KVP-HX-T2' ORDER BY e.occurredAt DESC LIMIT 1");
    const routes: [string, string][] = [
      ['GET /api/units (page 1, 50 by serial)', '/api/units'],
      ['GET /api/units (page 60, newest event first)', '/api/units?sort=-lastEventAt&page=60'],
      ['GET /api/units?q=BENCH-04 (text filter)', '/api/units?q=BENCH-04'],
      ['GET /api/events (page 1, newest first)', '/api/events'],
      ['GET /api/events?status=released&page=100', '/api/events?status=released&page=100'],
      ['GET /api/events/:id (recent demo event)', `/api/events/${recent.id}`],
      ['GET /api/events/:id/case (recent demo event)', `/api/events/${recent.id}/case`],
    ];
    for (const [name, url] of routes) {
      for (let i = 0; i < 3; i++) await request(app).get(url).set(auth).expect(200);
      const n = 30;
      const start = performance.now();
      for (let i = 0; i < n; i++) await request(app).get(url).set(auth).expect(200);
      const per = (performance.now() - start) / n;
      console.log(`${name.padEnd(48)} ${per.toFixed(1).padStart(7)} ms/request (mean of ${n}, one client)`);
    }
    await benchImports(db, app, config.jwtSecret, signToken);
    await db.destroy();
  } finally {
    await stopMariaDb(p).catch(() => undefined);
    rmSync(tmp, { recursive: true, force: true });
  }
}

/** A configuration label of letters for row i (A, B, …, Z, BA, …), so every reading of a big file is a distinct one. */
function letters(i: number): string {
  let out = '';
  let n = i;
  do {
    out = String.fromCharCode(65 + (n % 26)) + out;
    n = Math.floor(n / 26);
  } while (n > 0);
  return `C${out}`;
}

/** A readings CSV of `rows` capacitance readings, each value cell padded with spaces (trimmed by the parser) to reach `bytes`. */
function readingsFile(rows: number, bytes: number): Buffer {
  const header = 'quantity,configuration,phase,value,unit\n';
  const plain = Array.from({ length: rows }, (_, i) => `capacitance,${letters(i)},,${1000 + (i % 9000)}.5,pF`);
  const room = Math.max(0, bytes - header.length - plain.reduce((n, l) => n + l.length + 1, 0));
  const pad = ' '.repeat(Math.floor(room / Math.max(1, rows)));
  return Buffer.from(header + plain.map((l) => l.replace(',pF', `${pad},pF`)).join('\n') + '\n');
}

/**
 * The largest readings file a session accepts: every list of a set at its cap (50 capacitance and 50 dissipation
 * configurations, 30 bushing terminals with C1, C2 and their dissipation: 220 readings), padded like readingsFile.
 */
function fullSetFile(bytes: number): Buffer {
  const header = 'quantity,configuration,phase,value,unit\n';
  const plain: string[] = [];
  for (let i = 0; i < 50; i++) plain.push(`capacitance,${letters(i)},,${3000 + i}.5,pF`, `dissipation,${letters(i)},,0.3${i % 10},%`);
  for (let i = 0; i < 30; i++) {
    const t = `H${i + 1}`;
    plain.push(`bushing-c1,${t},,${400 + i}.5,pF`, `bushing-c1-dissipation,${t},,0.31,%`, `bushing-c2,${t},,${2000 + i},pF`, `bushing-c2-dissipation,${t},,0.42,%`);
  }
  const room = Math.max(0, bytes - header.length - plain.reduce((n, l) => n + l.length + 1, 0));
  const pad = ' '.repeat(Math.floor(room / plain.length));
  return Buffer.from(header + plain.map((l) => l.replace(/,(pF|%)$/, `${pad},$1`)).join('\n') + '\n');
}

/**
 * The largest allowed readings import (the row cap, padded to the byte limit) and a 2 MiB file far over the cap, each
 * through a listening server while another client asks GET /api/health every 10 ms: the import's time and the health
 * answers' latency (p50, p99, max) during it.
 */
async function benchImports(
  db: import('typeorm').DataSource,
  app: import('express').Express,
  jwtSecret: string,
  signToken: (userId: number, secret: string, expiresIn: string) => string,
): Promise<void> {
  const { READINGS_MAX_ROWS } = await import('../../shared/imports/readings-csv.js');
  const { UPLOAD_LIMITS } = await import('../common/upload.js');
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  const base = `http://127.0.0.1:${(server.address() as net.AddressInfo).port}`;
  try {
    // Its own people and unit (invented), so it needs no demo seed.
    const { User } = await import('../features/users/user.entity.js');
    const { makeDesign, makeSite, makeUnit } = await import('../../tests/helpers/factories.js');
    const who = async (role: 'protection' | 'tester') => {
      const repo = db.getRepository(User);
      const u = await repo.save(repo.create({ email: `bench-${role}-${randomBytes(4).toString('hex')}@bench.example`, name: `Bench ${role}`, passwordHash: '!', roles: [role], allSites: true, sites: [], active: true }));
      return { Authorization: `Bearer ${signToken(u.id, jwtSecret, '1h')}` };
    };
    const protection = await who('protection');
    const tester = await who('tester');
    const unit = await makeUnit(db, { siteId: (await makeSite(db)).id, designId: (await makeDesign(db)).id });
    const json = async (url: string, auth: Record<string, string>, body: unknown) => {
      const res = await fetch(`${base}${url}`, { method: 'POST', headers: { ...auth, 'Content-Type': 'application/json' }, body: JSON.stringify(body) });
      if (res.status !== 201) throw new Error(`${url}: ${res.status} ${await res.text()}`);
      return (await res.json()) as { id: number };
    };
    const cases: [string, Buffer, number][] = [
      [`readings import, a full set (220 rows), ${(UPLOAD_LIMITS.readingsCsvBytes / 1048576).toFixed(0)} MiB`, fullSetFile(UPLOAD_LIMITS.readingsCsvBytes - 1024), 200],
      // At the row cap, but 2 000 capacitance configurations: parsed, then refused by the set's list caps (400).
      [`readings import, ${READINGS_MAX_ROWS} rows (the cap), 2 MiB (refused)`, readingsFile(READINGS_MAX_ROWS, UPLOAD_LIMITS.readingsCsvBytes - 1024), 400],
      ['readings import, 2 MiB of 70 000 rows (refused)', readingsFile(70_000, UPLOAD_LIMITS.readingsCsvBytes - 1024), 400],
    ];
    for (const [name, file, expected] of cases) {
      const event = await json('/api/events', protection, { unitId: unit.id, occurredAt: new Date(Date.now() - 3600_000).toISOString(), type: 'three-phase', side: 'lv', faultedPhases: 'ABC', shots: [{ currentKA: 1, durationS: 0.1 }], protectionOperated: ['overcurrent'] });
      const session = await json(`/api/events/${event.id}/sessions`, tester, { takenAt: new Date().toISOString() });
      const latencies: number[] = [];
      let importing = true;
      const poll = (async () => {
        while (importing) {
          const t = performance.now();
          const res = await fetch(`${base}/api/health`);
          await res.arrayBuffer();
          latencies.push(performance.now() - t);
          await new Promise((resolve) => setTimeout(resolve, 10));
        }
      })();
      const delay = monitorEventLoopDelay({ resolution: 5 });
      delay.enable();
      const form = new FormData();
      form.append('file', new Blob([new Uint8Array(file)], { type: 'text/csv' }), 'readings.csv');
      const start = performance.now();
      const res = await fetch(`${base}/api/sessions/${session.id}/imports`, { method: 'POST', headers: tester, body: form });
      await res.arrayBuffer();
      const ms = performance.now() - start;
      delay.disable();
      importing = false;
      await poll;
      if (res.status !== expected) throw new Error(`${name}: answered ${res.status}, expected ${expected}`);
      const sorted = [...latencies].sort((a, b) => a - b);
      const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)] ?? NaN;
      console.log(`${name.padEnd(48)} ${ms.toFixed(0).padStart(7)} ms (answer ${res.status}; ${(file.length / 1048576).toFixed(2)} MiB)`);
      console.log(`${'  GET /api/health during it'.padEnd(48)} p50 ${at(0.5).toFixed(1)} ms, p99 ${at(0.99).toFixed(1)} ms, max ${sorted[sorted.length - 1]?.toFixed(1)} ms (${sorted.length} answers); longest event-loop stall ${(delay.max / 1e6).toFixed(0)} ms`);
    }
    // Storing the readings of a file at the cap: one query-builder INSERT (as the session import stores them) against
    // 500-row statements with a turn of the event loop between (insertReadingRows), each in a transaction rolled back.
    const { Reading } = await import('../features/readings/reading.entity.js');
    const { insertReadingRows } = await import('../features/imports/insert-readings.js');
    const [set] = await db.query('SELECT id FROM reading_set ORDER BY id DESC LIMIT 1');
    const rows = Array.from({ length: READINGS_MAX_ROWS }, (_, i) => ({ quantity: 'capacitance', configuration: letters(i), phase: null, mode: null, frequencyHz: null, value: 1000 + i, unit: 'pF' }));
    for (const [name, store] of [
      ['one query-builder INSERT', (m: import('typeorm').EntityManager) => m.insert(Reading, rows.map((r) => ({ ...r, readingSetId: set.id })))],
      ['500-row statements, yielding', (m: import('typeorm').EntityManager) => insertReadingRows(m, set.id, rows)],
    ] as const) {
      const delay = monitorEventLoopDelay({ resolution: 5 });
      const start = performance.now();
      delay.enable();
      await db
        .transaction(async (m) => {
          await store(m);
          throw new Error('rollback');
        })
        .catch(() => undefined);
      delay.disable();
      console.log(`${`store ${READINGS_MAX_ROWS} readings: ${name}`.padEnd(48)} ${(performance.now() - start).toFixed(0).padStart(7)} ms; longest event-loop stall ${(delay.max / 1e6).toFixed(0)} ms`);
    }
  } finally {
    await new Promise((resolve) => server.close(resolve));
  }
}
