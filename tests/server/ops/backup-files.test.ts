import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  backupFileName,
  binlogPositionFromDump,
  checksumLine,
  chooseRotation,
  parseBackupKeep,
  parseBackupName,
  parseChecksumFile,
  parseRestoreArgs,
  restoreDatabaseName,
  utcStamp,
} from '../../../server/scripts/backup-files.js';
import { RestoreError, sha256OfFile, verifyBackupChecksum } from '../../../server/scripts/db-restore.js';

// Names, rotation, checksum files and the refusal of a damaged backup (no database needed).

const tmp = mkdtempSync(path.join(os.tmpdir(), 'gapsight-backup-files-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

// SHA-256("abc"): the worked example of FIPS 180-2, appendix B.1.
const SHA256_ABC = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';

describe('backup file names', () => {
  it('stamps the UTC time to the second and adds -2, -3 for a second backup in the same second', () => {
    const at = new Date('2026-12-03T08:01:28.456Z');
    expect(utcStamp(at)).toBe('20261203T080128Z');
    expect(backupFileName(at, [])).toBe('gapsight-20261203T080128Z.sql.gz');
    expect(backupFileName(at, ['gapsight-20261203T080128Z.sql.gz'])).toBe('gapsight-20261203T080128Z-2.sql.gz');
    expect(backupFileName(at, ['gapsight-20261203T080128Z.sql.gz', 'gapsight-20261203T080128Z-2.sql.gz.partial'])).toBe(
      'gapsight-20261203T080128Z-3.sql.gz',
    );
    expect(parseBackupName('gapsight-20261203T080128Z-2.sql.gz')).toEqual({ stamp: '20261203T080128Z', seq: 2 });
    expect(parseBackupName('gapsight-20261203T080128Z.sql.gz.sha256')).toBeNull();
    expect(parseBackupName('notes.sql.gz')).toBeNull();
  });

  it('names the restore target after the database and the UTC time, within 64 characters', () => {
    expect(restoreDatabaseName('gapsight', new Date('2026-12-03T08:01:28Z'))).toBe('gapsight_restore_20261203_080128');
    expect(() => restoreDatabaseName('x'.repeat(50), new Date())).toThrow(/--into/);
  });
});

describe('rotation', () => {
  const names = [
    'gapsight-20261201T020000Z.sql.gz',
    'gapsight-20261203T020000Z.sql.gz',
    'gapsight-20261202T020000Z.sql.gz',
    'gapsight-20261203T020000Z-2.sql.gz',
    'gapsight-20261203T020000Z.sql.gz.sha256',
    'keep-me.sql.gz',
    'README.txt',
  ];

  it('keeps the newest N backups (same second: the higher sequence is newer) and removes the rest, oldest last', () => {
    expect(chooseRotation(names, 2)).toEqual({
      keep: ['gapsight-20261203T020000Z-2.sql.gz', 'gapsight-20261203T020000Z.sql.gz'],
      remove: ['gapsight-20261202T020000Z.sql.gz', 'gapsight-20261201T020000Z.sql.gz'],
    });
  });

  it('never touches other files and removes nothing while there are at most N', () => {
    const r = chooseRotation(names, 14);
    expect(r.remove).toEqual([]);
    expect(r.keep).toHaveLength(4);
    expect(r.keep).not.toContain('keep-me.sql.gz');
    expect(() => chooseRotation(names, 0)).toThrow(/at least 1/);
  });

  it('reads BACKUP_KEEP (default 14) and names it when it is not a whole number of at least 1', () => {
    expect(parseBackupKeep(undefined)).toBe(14);
    expect(parseBackupKeep(' 3 ')).toBe(3);
    expect(() => parseBackupKeep('0')).toThrow(/BACKUP_KEEP/);
    expect(() => parseBackupKeep('two')).toThrow(/BACKUP_KEEP/);
  });
});

describe('the binary log position in a dump', () => {
  it("reads mariadb-dump --master-data=2's comment at the top and the GTID position written after the tables", () => {
    // Lines as mariadb-dump 10.11 writes them (copied from a dump of a scratch database).
    const dump = [
      '-- Alternately, following is the position of the binary logging from SHOW MASTER STATUS at point of backup.',
      '',
      "-- CHANGE MASTER TO MASTER_LOG_FILE='binlog.000001', MASTER_LOG_POS=862;",
      '',
      'CREATE TABLE `a` (`id` int(11) NOT NULL);',
      '-- The deferred gtid setting for slave corresponding to the master-data CHANGE-MASTER follows',
      '',
      "-- SET GLOBAL gtid_slave_pos='0-1-3';",
    ].join('\n');
    expect(binlogPositionFromDump(dump)).toEqual({ file: 'binlog.000001', position: 862, gtid: '0-1-3' });
    expect(binlogPositionFromDump('CREATE TABLE `a` (`id` int);')).toBeNull();
  });
});

describe('restore arguments', () => {
  it('takes one file and an optional --into NAME', () => {
    expect(parseRestoreArgs(['b.sql.gz'])).toEqual({ file: 'b.sql.gz', into: null });
    expect(parseRestoreArgs(['b.sql.gz', '--into', 'gapsight_old'])).toEqual({ file: 'b.sql.gz', into: 'gapsight_old' });
    expect(parseRestoreArgs(['--into=gapsight_old', 'b.sql.gz'])).toEqual({ file: 'b.sql.gz', into: 'gapsight_old' });
    expect(() => parseRestoreArgs([])).toThrow(/name the backup file/);
    expect(() => parseRestoreArgs(['b.sql.gz', '--into', 'drop table; x'])).toThrow(/--into/);
    expect(() => parseRestoreArgs(['a.sql.gz', 'b.sql.gz'])).toThrow(/one backup file/);
  });
});

describe('checksums', () => {
  it('hashes a file with SHA-256 and writes the line sha256sum writes', async () => {
    const f = path.join(tmp, 'abc.txt');
    writeFileSync(f, 'abc');
    expect(await sha256OfFile(f)).toBe(SHA256_ABC);
    expect(checksumLine(SHA256_ABC, 'abc.txt')).toBe(`${SHA256_ABC}  abc.txt\n`);
    expect(parseChecksumFile(`${SHA256_ABC}  abc.txt\n`, 'abc.txt.sha256')).toBe(SHA256_ABC);
    expect(() => parseChecksumFile('garbage', 'abc.txt.sha256')).toThrow(/abc\.txt\.sha256/);
  });

  it('accepts an intact backup and refuses one with a flipped byte, naming the file', async () => {
    const f = path.join(tmp, 'gapsight-20261203T080128Z.sql.gz');
    const bytes = Buffer.from(Array.from({ length: 1000 }, (_, i) => (i * 7) % 256));
    writeFileSync(f, bytes);
    writeFileSync(f + '.sha256', checksumLine(await sha256OfFile(f), path.basename(f)));
    await expect(verifyBackupChecksum(f)).resolves.toMatch(/^[0-9a-f]{64}$/);

    const flipped = Buffer.from(bytes);
    flipped[500] ^= 0x01;
    writeFileSync(f, flipped);
    const err = await verifyBackupChecksum(f).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(RestoreError);
    expect((err as Error).message).toContain(f);
    expect((err as Error).message).toMatch(/checksum mismatch.*not restored/);
    expect(readFileSync(f + '.sha256', 'utf8')).toContain(path.basename(f));
  });

  it('refuses a backup whose checksum file is missing', async () => {
    const f = path.join(tmp, 'gapsight-20261203T090000Z.sql.gz');
    writeFileSync(f, 'x');
    await expect(verifyBackupChecksum(f)).rejects.toThrow(/checksum file gapsight-20261203T090000Z\.sql\.gz\.sha256 is missing/);
  });
});
