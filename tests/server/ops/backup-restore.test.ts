import { execFile, spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { copyFileSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import mysql from 'mysql2/promise';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app.js';
import { systemClock } from '../../../server/common/clock.js';
import { loadConfig } from '../../../server/config.js';
import { adminTarget, querySql, runBackup, type BackupResult } from '../../../server/scripts/db-backup.js';
import { checksumLine } from '../../../server/scripts/backup-files.js';
import { adminDataSource, migratorFor, RestoreError, runRestore, sha256OfFile } from '../../../server/scripts/db-restore.js';
import { clientBinary } from '../../../server/scripts/mariadb.js';
import { migrateAndSeedOn } from '../../../server/scripts/prepare.js';
import { bearer, createTestUser } from '../../helpers/db.js';
import { makeUnit } from '../../helpers/factories.js';

// Back up a database of its own (migrated, then filled through the API: readings, an event, a screening, a binary relay
// record, the audit rows they write), change it (a unit updated, an event added), restore the backup into a fresh
// database and find every row of every table as it was at the backup, byte for byte; then replay the binary log from the
// backup's position (the README's point-in-time restore) and find the changes too. Admin over the test server's socket;
// the shared server is never stopped or restarted.

const socket = process.env.TEST_DB_SOCKET;
if (!socket) throw new Error('This test needs the database of `npm test` (TEST_DB_SOCKET, tests/run.ts).');
const config = loadConfig();
const admin = adminTarget({ socket });
const tag = randomBytes(4).toString('hex');
const SRC = `gapsight_bk_${tag}`;
const PITR = `gapsight_bk_${tag}_pitr`;
const made = new Set<string>([SRC, PITR]);
const execFileAsync = promisify(execFile);
const tmp = mkdtempSync(path.join(os.tmpdir(), 'gapsight-backup-'));

let src: DataSource;
let conn: mysql.Connection;

/** Every column of every table as the server writes it (text), binary columns as hex, ordered by primary key. */
async function snapshot(database: string): Promise<Record<string, string>> {
  const [tables] = await conn.query<mysql.RowDataPacket[]>(
    "SELECT TABLE_NAME t FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_TYPE = 'BASE TABLE' ORDER BY TABLE_NAME",
    [database],
  );
  const out: Record<string, string> = {};
  for (const { t } of tables) {
    const [cols] = await conn.query<mysql.RowDataPacket[]>(
      'SELECT COLUMN_NAME c, DATA_TYPE d FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = ? AND TABLE_NAME = ? ORDER BY ORDINAL_POSITION',
      [database, t],
    );
    const [pk] = await conn.query<mysql.RowDataPacket[]>(
      "SELECT COLUMN_NAME c FROM information_schema.STATISTICS WHERE TABLE_SCHEMA = ? AND TABLE_NAME = ? AND INDEX_NAME = 'PRIMARY' ORDER BY SEQ_IN_INDEX",
      [database, t],
    );
    const q = (c: string) => `\`${c}\``;
    const binary = /^(tinyblob|blob|mediumblob|longblob|binary|varbinary)$/;
    const select = cols.map(({ c, d }) => (binary.test(d) ? `HEX(${q(c)}) AS ${q(c)}` : q(c))).join(', ');
    const order = (pk.length ? pk : cols).map(({ c }) => q(c)).join(', ');
    const [rows] = await conn.query({
      sql: `SELECT ${select} FROM ${q(database)}.${q(t)} ORDER BY ${order}`,
      // The value's bytes as sent by the server (no parsing into numbers or dates).
      typeCast: (field) => field.buffer()?.toString('utf8') ?? null,
    });
    out[t] = JSON.stringify(rows);
  }
  return out;
}

function replayBinlog(from: NonNullable<BackupResult['binlog']>, source: string, into: string): Promise<void> {
  const dir = path.join(path.dirname(socket!), 'mariadb');
  const files = readdirSync(dir)
    .filter((f) => /^binlog\.\d+$/.test(f) && f >= from.file)
    .sort()
    .map((f) => path.join(dir, f));
  return new Promise((resolve, reject) => {
    const reader = spawn(clientBinary('mariadb-binlog'), [
      '--no-defaults',
      `--start-position=${from.position}`,
      `--database=${source}`,
      `--rewrite-db=${source}->${into}`,
      ...files,
    ]);
    const client = spawn(clientBinary('mariadb'), ['--no-defaults', '--default-character-set=utf8mb4', `--socket=${socket}`, `--user=${admin.user}`]);
    let err = '';
    reader.stderr.on('data', (d) => (err += d));
    client.stderr.on('data', (d) => (err += d));
    reader.stdout.pipe(client.stdin);
    client.on('close', (code) => (code === 0 ? resolve() : reject(new Error(`binlog replay failed (${code}): ${err}`))));
  });
}

beforeAll(async () => {
  conn = await mysql.createConnection({ socketPath: socket, user: admin.user, charset: 'UTF8MB4_UNICODE_CI' });
  querySql(admin, `CREATE DATABASE \`${SRC}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  src = adminDataSource(admin, config, SRC);
  await src.initialize();
  await migrateAndSeedOn(src, { seed: false });
});

afterAll(async () => {
  if (src?.isInitialized) await src.destroy();
  for (const db of made) querySql(admin, `DROP DATABASE IF EXISTS \`${db}\``);
  await conn?.end();
  rmSync(tmp, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('restores every row of every table byte for byte as it was at the backup, changes made after it undone', async () => {
    // Rows through the API: a unit with factory readings, an event with a post-fault session, a screening, and a relay
    // record of every byte value (0x00 … 0xFF: a COMTRADE .dat may be binary) in the blob column. Invented values.
    const app = createApp({ db: src, clock: systemClock, config, mailSinkRunning: false });
    const api = () => request(app);
    const me = await createTestUser(src, ['admin'], { name: 'Backup Tester — Ω ü 😀' });
    const as = bearer(config, me.id);
    const unit = await makeUnit(src, { year: 2010 });
    const readings = { temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } };
    await api().post(`/api/units/${unit.id}/reading-sets`).set(as).send({ kind: 'factory', takenAt: '2019-05-02', ...readings }).expect(201);
    const fault = { unitId: unit.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }] };
    const event = (await api().post('/api/events').set(as).send(fault).expect(201)).body as { id: number };
    await api().post(`/api/events/${event.id}/sessions`).set(as).send({ takenAt: '2026-11-29T08:00:00Z', ...readings }).expect(201);
    await api().post(`/api/events/${event.id}/screenings`).set(as).send({}).expect(201);
    const allBytes = Buffer.from(Array.from({ length: 512 }, (_, i) => i % 256));
    await api().post(`/api/events/${event.id}/attachments`).set(as).attach('file', allBytes, 'relay-Ω.dat').expect(201);

    const before = await snapshot(SRC);
    expect(Object.keys(before)).toEqual(expect.arrayContaining(['unit', 'fault_event', 'attachment_content', 'audit_entry', 'migrations']));
    expect(before.attachment_content).toContain(allBytes.toString('hex').toUpperCase());

    const backup = await runBackup({ target: admin, database: SRC, dir: tmp, keep: 14 });
    expect(path.basename(backup.file)).toMatch(/^gapsight-\d{8}T\d{6}Z\.sql\.gz$/);
    expect(readFileSync(backup.file + '.sha256', 'utf8')).toBe(`${backup.sha256}  ${path.basename(backup.file)}\n`);
    expect(backup.binlog, 'the test server keeps a binary log, so the dump names its position').not.toBeNull();

    // Changes after the backup (nothing deleted).
    await api().patch(`/api/units/${unit.id}`).set(as).send({ year: 2004 }).expect(200);
    const added = await api()
      .post('/api/events')
      .set(as)
      .send({ ...fault, occurredAt: '2026-12-01T10:00:00Z', shots: [{ currentKA: 2, durationS: 0.2 }] })
      .expect(201);
    const changed = await snapshot(SRC);
    expect(changed.unit).not.toBe(before.unit);
    expect(changed.fault_event).not.toBe(before.fault_event);

    const restored = await runRestore({ target: admin, file: backup.file, into: null, sourceDb: SRC, migrate: migratorFor(admin, config) });
    made.add(restored.database);
    expect(restored.database).toMatch(new RegExp(`^${SRC}_restore_\\d{8}_\\d{6}$`));
    expect(restored.migrations).toEqual([]); // the backup already had every migration
    const after = await snapshot(restored.database);
    expect(Object.keys(after)).toEqual(Object.keys(before));
    for (const t of Object.keys(before)) expect(after[t], `table ${t}`).toBe(before[t]);
    // The changed rows as before the change.
    const [[u]] = await conn.query<mysql.RowDataPacket[]>(`SELECT year FROM \`${restored.database}\`.unit WHERE id = ?`, [unit.id]);
    expect(u.year).toBe(2010);
    const [gone] = await conn.query<mysql.RowDataPacket[]>(`SELECT id FROM \`${restored.database}\`.fault_event WHERE id = ?`, [added.body.id]);
    expect(gone).toHaveLength(0);
    // The app's account may use the restored database at once, with the same rights as on any other (audit append-only).
    const asApp = await mysql.createConnection({ host: config.DB_HOST, port: config.DB_PORT, user: config.DB_USER, password: config.dbPassword, database: restored.database });
    try {
      const [[n]] = await asApp.query<mysql.RowDataPacket[]>('SELECT COUNT(*) AS n FROM unit');
      expect(n.n).toBeGreaterThan(0);
      await expect(asApp.query('DELETE FROM audit_entry')).rejects.toThrow(/denied/);
    } finally {
      await asApp.end();
    }
    // The database in use is untouched.
    expect((await snapshot(SRC)).unit).toBe(changed.unit);

    // Point in time: the same backup into another fresh database, then the binary log from the printed position.
    await runRestore({ target: admin, file: backup.file, into: PITR, sourceDb: SRC, migrate: migratorFor(admin, config) });
    await replayBinlog(backup.binlog!, SRC, PITR);
    const rolledForward = await snapshot(PITR);
    for (const t of Object.keys(changed)) expect(rolledForward[t], `table ${t} after the binary log`).toBe(changed[t]);
  });

  it('refuses a damaged or cut-off backup (naming the file) and a target database that has tables, leaving no database behind', async () => {
    const backup = await runBackup({ target: admin, database: SRC, dir: tmp, keep: 14 });
    const damaged = path.join(tmp, 'damaged.sql.gz');
    copyFileSync(backup.file, damaged);
    copyFileSync(backup.file + '.sha256', damaged + '.sha256');
    const bytes = readFileSync(damaged);
    bytes[Math.floor(bytes.length / 2)] ^= 0x40;
    writeFileSync(damaged, bytes);
    const target = `gapsight_bk_${tag}_refused`;
    made.add(target);
    const migrate = migratorFor(admin, config);
    const e1 = await runRestore({ target: admin, file: damaged, into: target, sourceDb: SRC, migrate }).catch((e: unknown) => e);
    expect(e1).toBeInstanceOf(RestoreError);
    expect((e1 as Error).message).toContain(damaged);
    expect(querySql(admin, `SELECT COUNT(*) FROM information_schema.SCHEMATA WHERE SCHEMA_NAME = '${target}'`).trim()).toBe('0');

    // Cut off, with a checksum that matches the cut file: the load fails and the database it created is dropped again.
    const cut = path.join(tmp, 'cut.sql.gz');
    writeFileSync(cut, readFileSync(backup.file).subarray(0, Math.floor(bytes.length * 0.6)));
    writeFileSync(cut + '.sha256', checksumLine(await sha256OfFile(cut), 'cut.sql.gz'));
    const e3 = await runRestore({ target: admin, file: cut, into: target, sourceDb: SRC, migrate }).catch((e: unknown) => e);
    expect(e3).toBeInstanceOf(RestoreError);
    expect((e3 as Error).message).toContain(`reading ${cut} failed`);
    expect(querySql(admin, `SELECT COUNT(*) FROM information_schema.SCHEMATA WHERE SCHEMA_NAME = '${target}'`).trim()).toBe('0');

    const e2 = await runRestore({ target: admin, file: backup.file, into: SRC, sourceDb: SRC, migrate }).catch((e: unknown) => e);
    expect(e2).toBeInstanceOf(RestoreError);
    expect((e2 as Error).message).toMatch(new RegExp(`database ${SRC} already exists and has \\d+ table`));
    expect(existsSync(backup.file)).toBe(true);
  });

  it('works as the commands npm run db:backup and db:restore (the private server found under DATA_DIR)', async () => {
    // DATA_DIR pointing at the test server's folder makes the commands take it for the private server (admin, socket).
    const dataDir = path.dirname(socket);
    const env = { ...process.env, DATA_DIR: dataDir, DB_NAME: SRC, BACKUP_KEEP: '3' };
    const run = (script: string, args: string[] = []) =>
      execFileAsync(path.join('node_modules', '.bin', 'tsx'), ['--tsconfig', 'server/tsconfig.json', `server/scripts/${script}`, ...args], { env });
    const before = await snapshot(SRC);
    try {
      const backup = await run('db-backup.ts');
      const file = /^Backup: +(.+)$/m.exec(backup.stdout)?.[1] ?? '';
      expect(path.dirname(file)).toBe(path.join(dataDir, 'backups'));
      expect(backup.stdout).toMatch(/^SHA-256: +[0-9a-f]{64} /m);
      expect(backup.stdout).toMatch(/^Binary log position: binlog\.\d+ at \d+/m);

      const restore = await run('db-restore.ts', [file]);
      const name = /^ {2}DB_NAME=(\w+) npm start$/m.exec(restore.stdout)?.[1] ?? '';
      expect(name).toMatch(new RegExp(`^${SRC}_restore_\\d{8}_\\d{6}$`));
      made.add(name);
      expect(await snapshot(name)).toEqual(before);

      const refused = await run('db-restore.ts', [file, '--into', SRC]).catch((e: { code: number; stderr: string }) => e);
      expect(refused).toMatchObject({ code: 1 });
      expect((refused as { stderr: string }).stderr).toContain(`database ${SRC} already exists`);
    } finally {
      rmSync(path.join(dataDir, 'backups'), { recursive: true, force: true });
    }
  }, 180_000); // three tsx start-ups on a busy machine

  it('keeps the newest BACKUP_KEEP backups with their checksum files', async () => {
    const dir = path.join(tmp, 'rotation');
    const at = (s: string) => new Date(`2026-12-0${s}T02:00:00Z`);
    for (const d of ['1', '2', '3']) await runBackup({ target: admin, database: SRC, dir, keep: 2, now: at(d) });
    expect(readdirSync(dir).sort()).toEqual([
      'gapsight-20261202T020000Z.sql.gz',
      'gapsight-20261202T020000Z.sql.gz.sha256',
      'gapsight-20261203T020000Z.sql.gz',
      'gapsight-20261203T020000Z.sql.gz.sha256',
    ]);
  });
});
