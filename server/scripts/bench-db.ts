import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { ensureDatabaseAndUser, mariaDbPaths, startMariaDb, stopMariaDb } from './mariadb.js';

// npm run bench: the demo seed into fresh databases on a throw-away MariaDB; with `-- --db` also API timings on a
// database holding the demo scenario plus a 5 000-unit fleet with 10 000 events (figures go to the README).

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const a = s.address() as net.AddressInfo;
      s.close(() => resolve(a.port));
    });
  });
}

const SEED_RUNS = 3;

export async function benchDatabase(opts: { fleet: boolean }): Promise<void> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'gapsight-bench-'));
  const p = mariaDbPaths(path.join(tmp, 'db'), await freePort());
  try {
    await startMariaDb(p, { bufferPoolMB: 256 });
    const pw = randomBytes(12).toString('hex');
    ensureDatabaseAndUser(p, 'gapsight_bench', 'gapsight', pw);
    for (let i = 1; i <= SEED_RUNS; i++) ensureDatabaseAndUser(p, `gapsight_seed_${i}`, 'gapsight', pw);
    Object.assign(process.env, {
      DB_PORT: String(p.port),
      DB_NAME: 'gapsight_bench',
      DB_PASSWORD: pw,
      JWT_SECRET: randomBytes(32).toString('hex'),
      DATA_DIR: path.join(tmp, 'data'),
      LOG_LEVEL: 'warn',
    });
    const { default: db } = await import('../db/data-source.js');
    const { DataSource } = await import('typeorm');
    const { seedDemo } = await import('../db/seed/demo-seed.js');

    // The demo seed as `npm start` runs it on a first start: migrated, empty database; one fresh database a run.
    const seedMs: number[] = [];
    for (let i = 1; i <= SEED_RUNS; i++) {
      const fresh = new DataSource({ ...db.options, database: `gapsight_seed_${i}` } as typeof db.options);
      await fresh.initialize();
      await fresh.runMigrations({ transaction: 'each' });
      const start = performance.now();
      if (!(await seedDemo(fresh))) throw new Error('the demo seed did not run on a fresh database');
      seedMs.push(performance.now() - start);
      await fresh.destroy();
    }
    const median = [...seedMs].sort((a, b) => a - b)[Math.floor(SEED_RUNS / 2)];
    console.log(
      `${'seedDemo into a fresh database'.padEnd(44)} ${String(SEED_RUNS).padStart(7)} runs  ${median.toFixed(0).padStart(9)} ms/run (median; ${seedMs.map((ms) => ms.toFixed(0)).join(', ')} ms)`,
    );
    if (!opts.fleet) return;

    const { loadConfig } = await import('../config.js');
    const { createApp } = await import('../app.js');
    const { signToken } = await import('../common/auth.js');
    const { systemClock } = await import('../common/clock.js');
    const { migrateAndSeedOn } = await import('./prepare.js');
    const { default: request } = await import('supertest');
    await db.initialize();
    await migrateAndSeedOn(db, { seed: true });
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
    await db.destroy();
  } finally {
    await stopMariaDb(p).catch(() => undefined);
    rmSync(tmp, { recursive: true, force: true });
  }
}
