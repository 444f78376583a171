import { spawnSync } from 'node:child_process';
import path from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app.js';
import { audit, verifyAuditChain } from '../../../server/common/audit.js';
import { AUDIT_CHAIN_COLUMNS, auditEntryHash, factsFromRaw, type RawAuditRow } from '../../../server/common/audit-hash.js';
import { systemClock } from '../../../server/common/clock.js';
import { loadConfig } from '../../../server/config.js';
import { createDataSource } from '../../../server/db/create-data-source.js';
import { AuditChain1796420000000 } from '../../../server/db/migrations/1796420000000-audit-chain.js';
import { applyAppGrants } from '../../../server/scripts/mariadb.js';
import { bearer, createTestUser } from '../../helpers/db.js';
import { openMigratedDb, openOwnerDb } from '../../helpers/fixed-db.js';

// The audit trail's hash chain and the app account's rights on it, on a database of its own (TEST_DB_NAME_AUDIT), since
// these tests change and delete entries behind the app's back (as the migrator) and put them back.

const database = process.env.TEST_DB_NAME_AUDIT ?? '';
const config = loadConfig();
let db: DataSource; // the app account
let owner: DataSource; // the migrator account
let app: Express;
let adminAuth: { Authorization: string };

type Raw = Record<string, unknown>;
// Raw rows with the JSON columns as their stored text (what putBack writes back unchanged).
const rowOf = async (id: number): Promise<Raw> => (await owner.query(`SELECT ${AUDIT_CHAIN_COLUMNS}, prevHash, hash FROM audit_entry WHERE id = ?`, [id]))[0];
const putBack = async (r: Raw) => {
  const cols = Object.keys(r);
  await owner.query(`INSERT INTO audit_entry (${cols.map((c) => `\`${c}\``).join(', ')}) VALUES (${cols.map(() => '?').join(', ')})`, cols.map((c) => r[c]));
};
const ids = async (): Promise<number[]> => (await db.query('SELECT id FROM audit_entry ORDER BY id')).map((r: { id: number }) => Number(r.id));

beforeAll(async () => {
  if (!database) throw new Error('This test needs the audit database of `npm test` (TEST_DB_NAME_AUDIT).');
  db = await openMigratedDb(database);
  owner = await openOwnerDb(database);
  app = createApp({ db, clock: systemClock, config, mailSinkRunning: false });
  const admin = await createTestUser(db, ['admin']);
  adminAuth = bearer(config, admin.id);
  // A few entries to start from, written outside a request (audit() opens its own transaction then).
  for (let i = 0; i < 4; i++) await audit(db.manager, systemClock, { userId: admin.id, action: 'create', entity: 'probe', entityId: i, after: { i, at: new Date() } });
});
afterAll(async () => {
  await db?.destroy();
  await owner?.destroy();
});

describe('the app database account', () => {
  it('may read and append audit entries, and change rows of other tables', async () => {
    expect((await db.query('SELECT COUNT(*) AS n FROM audit_entry'))[0].n).toBeGreaterThanOrEqual(4);
    const site = await request(app).post('/api/sites').set(adminAuth).send({ name: `Audit probe ${Date.now()}`, timeZone: 'UTC' });
    expect(site.status).toBe(201);
    await db.query('UPDATE site SET name = ? WHERE id = ?', [`Audit probe renamed ${Date.now()}`, site.body.id]);
  });

  it('is refused by MariaDB when it tries to change or delete an audit entry', async () => {
    const [first] = await ids();
    await expect(db.query('UPDATE audit_entry SET note = ? WHERE id = ?', ['rewritten', first])).rejects.toMatchObject({
      code: 'ER_TABLEACCESS_DENIED_ERROR',
      message: expect.stringMatching(/UPDATE command denied .* table .*audit_entry/),
    });
    await expect(db.query('DELETE FROM audit_entry WHERE id = ?', [first])).rejects.toMatchObject({
      code: 'ER_TABLEACCESS_DENIED_ERROR',
      message: expect.stringMatching(/DELETE command denied .* table .*audit_entry/),
    });
    expect(await ids()).toContain(first);
  });

  it('may not change the schema (migrations run as the migrator)', async () => {
    await expect(db.query('ALTER TABLE audit_entry DROP COLUMN hash')).rejects.toMatchObject({ code: 'ER_TABLEACCESS_DENIED_ERROR' });
    await expect(db.query('DROP TABLE audit_entry')).rejects.toMatchObject({ code: 'ER_TABLEACCESS_DENIED_ERROR' });
    await expect(db.query('CREATE TABLE probe_x (id int)')).rejects.toMatchObject({ code: 'ER_TABLEACCESS_DENIED_ERROR' });
    await expect(db.query('INSERT INTO migrations (timestamp, name) VALUES (1, ?)', ['Probe1'])).rejects.toMatchObject({ code: 'ER_TABLEACCESS_DENIED_ERROR' });
  });

  it('loses a database-wide grant (as an earlier provisioning gave it) at the next migration run', async () => {
    const grants = async (d: DataSource) => ((await d.query('SHOW GRANTS')) as Record<string, string>[]).map((r) => Object.values(r)[0]).join('\n');
    await owner.query(`GRANT ALL PRIVILEGES ON \`${database}\`.* TO '${config.DB_USER}'@'127.0.0.1'`);
    const allOnDb = new RegExp(`GRANT ALL PRIVILEGES ON \`${database}\`\\.\\*`);
    // New connections: database-wide rights are read when a connection opens its database.
    const plain = createDataSource({ ...config, DB_NAME: database });
    await plain.initialize();
    try {
      expect(await grants(plain)).toMatch(allOnDb);
    } finally {
      await plain.destroy();
    }
    const after = await openMigratedDb(database); // migrating re-applies the table grants and takes the wide one back
    try {
      expect(await grants(after)).not.toMatch(allOnDb);
      expect(await grants(after)).toMatch(/GRANT SELECT, INSERT ON `[^`]+`\.`audit_entry`/);
      await expect(after.query('DELETE FROM audit_entry WHERE id = 1')).rejects.toMatchObject({ code: 'ER_TABLEACCESS_DENIED_ERROR' });
    } finally {
      await after.destroy();
    }
  });
});

describe('the hash chain', () => {
  it('links each new entry to the one before it, and the chain verifies', async () => {
    const rows: { id: number; prevHash: string; hash: string }[] = await db.query('SELECT id, prevHash, hash FROM audit_entry ORDER BY id');
    for (let i = 1; i < rows.length; i++) expect(rows[i].prevHash).toBe(rows[i - 1].hash);
    expect(await verifyAuditChain(db.manager)).toEqual({ intact: true, entries: rows.length });
  });

  it('stays one chain under concurrent writes through the API: consecutive ids, no two entries after the same one', async () => {
    const before = await ids();
    const tag = Date.now();
    const answers = await Promise.all(
      Array.from({ length: 12 }, (_, i) => request(app).post('/api/sites').set(adminAuth).send({ name: `Concurrent ${tag} ${i}`, timeZone: 'UTC' })),
    );
    expect(answers.map((a) => a.status)).toEqual(Array(12).fill(201));
    const after = await ids();
    const added = after.filter((id) => !before.includes(id));
    expect(added).toHaveLength(12);
    expect(added).toEqual(Array.from({ length: 12 }, (_, i) => before[before.length - 1] + 1 + i));
    const rows: { prevHash: string }[] = await db.query('SELECT prevHash FROM audit_entry');
    expect(new Set(rows.map((r) => r.prevHash)).size).toBe(rows.length);
    expect(await verifyAuditChain(db.manager)).toEqual({ intact: true, entries: after.length });
  });

  it('makes a second transaction wait for the first one\'s audit entry (the head is locked until commit)', async () => {
    const order: string[] = [];
    let release!: () => void;
    const hold = new Promise<void>((r) => (release = r));
    let firstAudited!: () => void;
    const audited = new Promise<void>((r) => (firstAudited = r));
    const t1 = db.transaction(async (m) => {
      await audit(m, systemClock, { userId: null, action: 'update', entity: 'probe', entityId: 'slow' });
      firstAudited();
      await hold;
      order.push('first commits');
    });
    await audited;
    const t2 = db.transaction(async (m) => {
      await audit(m, systemClock, { userId: null, action: 'update', entity: 'probe', entityId: 'fast' });
      order.push('second audited');
    });
    await new Promise((r) => setTimeout(r, 300));
    order.push('released');
    release();
    await Promise.all([t1, t2]);
    expect(order).toEqual(['released', 'first commits', 'second audited']);
    const [slow, fast] = await Promise.all(
      ['slow', 'fast'].map(async (e) => (await db.query('SELECT id, prevHash, hash FROM audit_entry WHERE entity = ? AND entityId = ?', ['probe', e]))[0]),
    );
    expect(fast.id).toBe(slow.id + 1);
    expect(fast.prevHash).toBe(slow.hash);
  });

  it('leaves no entry and no moved head when the transaction rolls back', async () => {
    const before = await ids();
    await expect(
      db.transaction(async (m) => {
        await audit(m, systemClock, { userId: null, action: 'create', entity: 'probe', entityId: 'rolled-back' });
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
    expect(await ids()).toEqual(before);
    await audit(db.manager, systemClock, { userId: null, action: 'create', entity: 'probe', entityId: 'after-rollback' });
    expect((await ids()).at(-1)).toBe(before[before.length - 1] + 1);
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });

  it('names an entry whose note was changed (as the migrator), and verifies again once it is put back', async () => {
    const all = await ids();
    const id = all[Math.floor(all.length / 2)];
    const original = await rowOf(id);
    await owner.query('UPDATE audit_entry SET note = ? WHERE id = ?', ['nothing to see here', id]);
    expect(await verifyAuditChain(db.manager)).toMatchObject({ intact: false, broken: { id, kind: 'changed', message: expect.stringContaining(`entry ${id} was changed`) } });
    await owner.query('UPDATE audit_entry SET note = ? WHERE id = ?', [original.note, id]);
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });

  it('names an entry rewritten with a freshly computed hash by the link of the entry after it', async () => {
    const all = await ids();
    const id = all[2];
    const original = await rowOf(id);
    const facts = { ...factsFromRaw(original as unknown as RawAuditRow), note: 'forged' };
    await owner.query('UPDATE audit_entry SET note = ?, hash = ? WHERE id = ?', ['forged', auditEntryHash(facts, String(original.prevHash)), id]);
    expect(await verifyAuditChain(db.manager)).toMatchObject({ intact: false, broken: { id, kind: 'changed' } });
    await owner.query('UPDATE audit_entry SET note = ?, hash = ? WHERE id = ?', [original.note, original.hash, id]);
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });

  it('names a deleted middle entry, and a deleted newest entry', async () => {
    const all = await ids();
    const middle = all[Math.floor(all.length / 2)];
    const saved = await rowOf(middle);
    await owner.query('DELETE FROM audit_entry WHERE id = ?', [middle]);
    expect(await verifyAuditChain(db.manager)).toMatchObject({
      intact: false,
      broken: { id: middle, kind: 'deleted', message: expect.stringContaining(`entry ${middle} is missing (deleted)`) },
    });
    await putBack(saved);
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);

    const newest = all[all.length - 1];
    const savedNewest = await rowOf(newest);
    await owner.query('DELETE FROM audit_entry WHERE id = ?', [newest]);
    expect(await verifyAuditChain(db.manager)).toMatchObject({ intact: false, broken: { id: newest, kind: 'deleted' } });
    await putBack(savedNewest);
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });

  it('names entries that were swapped (reordered)', async () => {
    const all = await ids();
    const [a, b] = [all[1], all[2]];
    const swap = async () => {
      await owner.transaction(async (m) => {
        await m.query('UPDATE audit_entry SET id = 4294967000 WHERE id = ?', [a]);
        await m.query('UPDATE audit_entry SET id = ? WHERE id = ?', [a, b]);
        await m.query('UPDATE audit_entry SET id = ? WHERE id = 4294967000', [b]);
      });
    };
    await swap();
    expect(await verifyAuditChain(db.manager)).toMatchObject({ intact: false, broken: { id: a, kind: 'reordered', message: expect.stringContaining(`written as entry ${b}`) } });
    await swap();
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });
});

describe('the migration that adds the chain', () => {
  it('chains existing entries in id order to the same hashes audit() gives them when writing', async () => {
    const before: { id: number; prevHash: string; hash: string }[] = await db.query('SELECT id, prevHash, hash FROM audit_entry ORDER BY id');
    expect(before.length).toBeGreaterThan(10);
    const migration = new AuditChain1796420000000();
    const qr = owner.createQueryRunner();
    try {
      await migration.down(qr); // entries without their hashes, as before the migration
      expect((await qr.query('SHOW COLUMNS FROM audit_entry')).map((c: { Field: string }) => c.Field)).not.toContain('hash');
      await migration.up(qr);
      await applyAppGrants((sql, params) => qr.query(sql, params), database, config.DB_USER); // as after every migration run
    } finally {
      await qr.release();
    }
    expect(await db.query('SELECT id, prevHash, hash FROM audit_entry ORDER BY id')).toEqual(before);
    expect(await verifyAuditChain(db.manager)).toEqual({ intact: true, entries: before.length });
    await audit(db.manager, systemClock, { userId: null, action: 'create', entity: 'probe', entityId: 'after-backfill' });
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });
});

describe('npm run audit:verify', () => {
  const run = () =>
    spawnSync(path.resolve('node_modules/.bin/tsx'), ['--tsconfig', 'server/tsconfig.json', 'server/scripts/audit-verify.ts'], {
      env: { ...process.env, DB_NAME: database },
      encoding: 'utf8',
      timeout: 60000,
    });

  it('prints the count and exits 0 on an intact trail, names the broken entry and exits 1 on a changed one', async () => {
    const count = (await ids()).length;
    const ok = run();
    expect(ok.stdout).toContain(`audit trail intact: ${count} entries`);
    expect(ok.status).toBe(0);

    const id = (await ids())[3];
    const original = await rowOf(id);
    await owner.query('UPDATE audit_entry SET `after` = ? WHERE id = ?', ['{"i": 99}', id]);
    try {
      const bad = run();
      expect(bad.stderr).toContain(`audit trail broken at entry ${id} (changed)`);
      expect(bad.status).toBe(1);
    } finally {
      await owner.query('UPDATE audit_entry SET `after` = ? WHERE id = ?', [original.after, id]);
    }
    expect((await verifyAuditChain(db.manager)).intact).toBe(true);
  });
});
