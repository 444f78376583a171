import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes, randomUUID } from 'node:crypto';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig, type Config } from '../../../server/config.js';
import { createDataSource } from '../../../server/db/create-data-source.js';
import { serve, type Running } from '../../../server/index.js';
import { createLogger } from '../../../server/logger.js';
import { bearer, createTestUser } from '../../helpers/db.js';
import { startPrivateDb, type PrivateDb } from '../../helpers/fault-db.js';
import { makeDesign, makeSite } from '../../helpers/factories.js';

// Faults on a private MariaDB of this test's own (never the shared test server):
// 1. the database killed (SIGKILL) under a loop of writes and reads, then started again: no 500, every answer during the
//    outage a 503 db_unavailable, the app recovers without a restart, every 201 is in the database and no unit exists
//    without its audit entry;
// 2. the app killed (SIGKILL) during a unit-sheet import and started again: the file's units are all there or none.
// No timing assertions: every request must merely finish (generous limits for a busy 2-core machine).

const REQUEST_LIMIT_MS = 60_000;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function waitUntil(what: string, check: () => boolean | Promise<boolean>, timeoutMs = 120_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`timed out waiting until ${what}`);
    await sleep(100);
  }
}

type Phase = 'up' | 'down' | 'restarting' | 'back';
interface Answer {
  op: 'write' | 'read' | 'health';
  phase: Phase;
  serial?: string;
  status: number;
  code?: string;
  retryAfter: string | null;
  error?: string;
}

let pdb: PrivateDb;
let config: Config;
let db: DataSource;
let running: Running | null = null;
let siteId: number;
let siteName: string;
let designId: number;
let designRef: string;
let auth: { Authorization: string };

beforeAll(async () => {
  pdb = await startPrivateDb();
  config = loadConfig({ ...process.env, ...pdb.env, PORT: '0', MAIL_SINK_PORT: '0' });
  db = createDataSource(config);
  await db.initialize();
  const site = await makeSite(db);
  const design = await makeDesign(db);
  [siteId, siteName, designId, designRef] = [site.id, site.name, design.id, design.reference];
  auth = bearer(config, (await createTestUser(db, ['admin'])).id);
}, 180_000);

afterAll(async () => {
  await running?.stop();
  if (db?.isInitialized) await db.destroy();
  await pdb?.remove();
}, 120_000);

/** Units of this test without their audited create, and audited creates without their unit. */
async function orphans(prefix: string) {
  const unitsWithoutAudit = await db.query(
    `SELECT u.serial FROM unit u LEFT JOIN audit_entry a ON a.entity = 'unit' AND a.action = 'create' AND a.entityId = CAST(u.id AS CHAR)
     WHERE u.serial LIKE ? AND a.id IS NULL`,
    [`${prefix}%`],
  );
  const auditsWithoutUnit = await db.query(
    `SELECT a.entityId FROM audit_entry a LEFT JOIN unit u ON CAST(u.id AS CHAR) = a.entityId
     WHERE a.entity = 'unit' AND a.action = 'create' AND u.id IS NULL`,
  );
  return { unitsWithoutAudit, auditsWithoutUnit };
}

async function serialsIn(prefix: string): Promise<Set<string>> {
  const rows: { serial: string }[] = await db.query('SELECT serial FROM unit WHERE serial LIKE ?', [`${prefix}%`]);
  return new Set(rows.map((r) => r.serial));
}

describe('the database killed under a read/write loop', () => {
  it('answers 503 db_unavailable during the outage, recovers by itself, and loses or half-writes nothing', async () => {
    running = await serve(db, config, { logger: createLogger('silent') });
    const url = running.url;
    const prefix = `F-${randomUUID().slice(0, 6)}-`;
    const answers: Answer[] = [];
    let phase: Phase = 'up';
    let stop = false;
    let n = 0;

    const call = async (op: Answer['op'], init: RequestInit & { path: string }, serial?: string) => {
      const started = phase;
      try {
        const res = await fetch(`${url}${init.path}`, { ...init, signal: AbortSignal.timeout(REQUEST_LIMIT_MS) });
        const body = (await res.json().catch(() => null)) as { error?: { code?: string } } | null;
        answers.push({ op, phase: started, serial, status: res.status, code: body?.error?.code, retryAfter: res.headers.get('retry-after') });
      } catch (err) {
        answers.push({ op, phase: started, serial, status: 0, retryAfter: null, error: (err as Error).message });
      }
    };
    const writer = async () => {
      while (!stop) {
        const serial = `${prefix}${(n += 1)}`;
        await call('write', { path: '/api/units', method: 'POST', headers: { ...auth, 'Content-Type': 'application/json' }, body: JSON.stringify({ serial, siteId, designId }) }, serial);
      }
    };
    const reader = async () => {
      while (!stop) {
        await call('read', { path: '/api/units?pageSize=20&sort=serial', headers: auth });
        await call('health', { path: '/api/health' });
      }
    };
    const count = (f: (a: Answer) => boolean) => answers.filter(f).length;
    const loops = Promise.all([writer(), writer(), reader()]);
    try {
      await waitUntil('the loop has written 10 units', () => count((a) => a.op === 'write' && a.status === 201) >= 10);

      await pdb.kill9();
      phase = 'down';
      const downSince = Date.now();
      // Every worker gets several answers while the server is gone, for a couple of seconds at least.
      await waitUntil(
        'every kind of request was answered during the outage',
        () => Date.now() - downSince >= 2_000 && (['write', 'read', 'health'] as const).every((op) => count((a) => a.phase === 'down' && a.op === op) >= 4),
      );

      phase = 'restarting';
      await pdb.restart();
      phase = 'back';
      const before = count((a) => a.phase === 'back' && a.op === 'write' && a.status === 201);
      await waitUntil('the loop writes again after the restart', () => count((a) => a.phase === 'back' && a.op === 'write' && a.status === 201) >= before + 10);
      await waitUntil('the loop reads again after the restart', () => count((a) => a.phase === 'back' && a.op === 'read' && a.status === 200) >= 3);
    } finally {
      stop = true;
      await loops;
    }

    if (process.env.FAULT_DEBUG) {
      const tally: Record<string, number> = {};
      for (const a of answers) tally[`${a.phase} ${a.op} ${a.status} ${a.code ?? ''}`] = (tally[`${a.phase} ${a.op} ${a.status} ${a.code ?? ''}`] ?? 0) + 1;
      console.log(tally);
    }
    // Every request finished, and none was a 500: a success, or 503 db_unavailable with Retry-After.
    const failed = answers.filter((a) => !(a.status >= 200 && a.status < 300));
    expect(answers.filter((a) => a.status === 0 || a.status === 500)).toEqual([]);
    for (const a of failed) {
      expect(a).toMatchObject({ status: 503, retryAfter: '5' });
      if (a.op !== 'health') expect(a.code).toBe('db_unavailable');
    }
    // Everything sent while the server was gone was refused with 503.
    const down = answers.filter((a) => a.phase === 'down');
    expect(down.length).toBeGreaterThanOrEqual(12);
    expect(down.filter((a) => a.status !== 503)).toEqual([]);
    expect(down.filter((a) => a.op !== 'health' && a.code !== 'db_unavailable')).toEqual([]);

    // Every unit the client was told was created is in the database (committed before the kill, or after the restart).
    const stored = await serialsIn(prefix);
    const created = answers.filter((a) => a.op === 'write' && a.status === 201).map((a) => a.serial!);
    expect(created.filter((s) => !stored.has(s))).toEqual([]);
    // A refused write is there only if its COMMIT reached the log before the kill; nothing else is.
    const sent = new Set(answers.filter((a) => a.op === 'write').map((a) => a.serial!));
    expect([...stored].filter((s) => !sent.has(s))).toEqual([]);
    // Nothing half-written: every unit has its audited create and every audited create its unit.
    expect(await orphans(prefix)).toEqual({ unitsWithoutAudit: [], auditsWithoutUnit: [] });
  }, 300_000);
});

const childEntry = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../helpers/fault-app-child.ts');

/** The app in a process of its own on the private database; resolves with its URL once it listens. */
function startAppChild(env: NodeJS.ProcessEnv): Promise<{ proc: ChildProcess; url: string }> {
  const proc = spawn(process.execPath, ['--import', 'tsx', childEntry], {
    env: { ...env, TSX_TSCONFIG_PATH: 'server/tsconfig.json' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  let err = '';
  proc.stderr!.on('data', (d: Buffer) => void (err += d.toString()));
  return new Promise((resolve, reject) => {
    proc.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = /\{"url":"([^"]+)"\}/.exec(out);
      if (m) resolve({ proc, url: m[1]! });
    });
    proc.once('exit', (code) => reject(new Error(`the app exited (${code}) before listening:\n${err.slice(-2000)}`)));
  });
}

function killed(proc: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (proc.exitCode !== null || proc.signalCode !== null) return resolve();
    proc.once('exit', () => resolve());
    proc.kill('SIGKILL');
  });
}

describe('the app killed during an import', () => {
  it('leaves all of the file or none of it, and takes the same file after a restart', async () => {
    // Still the private database: the first test restarted it, so wait until it answers.
    await waitUntil('the private database answers', async () => (await db.query('SELECT 1').then(() => true, () => false)));
    const rows = 500;
    const prefix = `IMP-${randomUUID().slice(0, 6)}-`;
    const csv = ['serial,site,design', ...Array.from({ length: rows }, (_, i) => `${prefix}${i + 1},${siteName},${designRef}`)].join('\n') + '\n';
    const env = { ...process.env, ...pdb.env, JWT_SECRET: config.jwtSecret || randomBytes(32).toString('hex'), LOG_LEVEL: 'silent' };
    const upload = (url: string) => {
      const form = new FormData();
      form.append('file', new Blob([csv], { type: 'text/csv' }), 'units.csv');
      return fetch(`${url}/api/units/import`, { method: 'POST', headers: auth, body: form, signal: AbortSignal.timeout(300_000) });
    };
    const openTransactions = () => Number(pdb.sql('SELECT COUNT(*) FROM information_schema.innodb_trx').trim());
    const rowsInOpenTransactions = () => Number(pdb.sql('SELECT COALESCE(MAX(trx_rows_modified), 0) FROM information_schema.innodb_trx').trim());

    const first = await startAppChild(env);
    let answered = false;
    const pending = upload(first.url).then(
      (res) => void (answered = res.status > 0),
      () => undefined,
    );
    try {
      // The import is writing: its open transaction has changed rows (units and audit entries, not yet committed).
      await waitUntil('the import has written rows in its transaction', () => answered || rowsInOpenTransactions() >= 40);
      expect(answered, 'the import finished before the app could be killed; make the file larger').toBe(false);
      if (process.env.FAULT_DEBUG) console.log('killing at', rowsInOpenTransactions(), 'rows changed');
    } finally {
      await killed(first.proc);
    }
    await pending;
    // The server rolls back the transaction of the lost connection.
    await waitUntil('the killed transaction is rolled back', () => openTransactions() === 0);
    const afterKill = (await serialsIn(prefix)).size;
    expect([0, rows]).toContain(afterKill);
    expect(await orphans(prefix)).toEqual({ unitsWithoutAudit: [], auditsWithoutUnit: [] });

    // Started again, the app takes the same file whole (no serial left behind blocks it).
    const second = await startAppChild(env);
    try {
      expect((await fetch(`${second.url}/api/health`)).status).toBe(200);
      if (afterKill === 0) {
        const res = await upload(second.url);
        expect(res.status).toBe(201);
        expect(((await res.json()) as { imported: number }).imported).toBe(rows);
      }
      expect((await serialsIn(prefix)).size).toBe(rows);
      expect(await orphans(prefix)).toEqual({ unitsWithoutAudit: [], auditsWithoutUnit: [] });
    } finally {
      await killed(second.proc);
    }
  }, 400_000);
});
