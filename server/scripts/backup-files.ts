// Pure helpers of `npm run db:backup` / `db:restore`: file names, which old backups rotation removes, the checksum file
// (sha256sum's format, so `sha256sum -c` checks it too), the binary log position written into a dump, argument parsing.
// No I/O here.

export const BACKUP_PREFIX = 'gapsight-';
export const BACKUP_SUFFIX = '.sql.gz';
export const CHECKSUM_SUFFIX = '.sha256';
export const DEFAULT_BACKUP_KEEP = 14;

/** `20261203T080128Z`: the UTC instant to the second, sortable as text. */
export function utcStamp(at: Date): string {
  return at.toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/[-:]/g, '');
}

const NAME_RE = /^gapsight-(\d{8}T\d{6}Z)(?:-(\d+))?\.sql\.gz$/;

/** A backup's stamp and sequence number (two backups within one second: `…Z-2`), or null for any other file name. */
export function parseBackupName(name: string): { stamp: string; seq: number } | null {
  const m = NAME_RE.exec(name);
  return m ? { stamp: m[1], seq: m[2] ? Number(m[2]) : 1 } : null;
}

/** `gapsight-<UTC stamp>.sql.gz`, or `…-2.sql.gz`, `…-3.sql.gz` when that name is already in the folder. */
export function backupFileName(at: Date, existing: Iterable<string>): string {
  const taken = new Set(existing);
  const stamp = utcStamp(at);
  for (let seq = 1; ; seq++) {
    const name = `${BACKUP_PREFIX}${stamp}${seq === 1 ? '' : `-${seq}`}${BACKUP_SUFFIX}`;
    if (!taken.has(name) && !taken.has(name + '.partial')) return name;
  }
}

/** Newest first: by stamp, then sequence number. */
function newestFirst(a: string, b: string): number {
  const pa = parseBackupName(a)!;
  const pb = parseBackupName(b)!;
  if (pa.stamp !== pb.stamp) return pa.stamp < pb.stamp ? 1 : -1;
  return pb.seq - pa.seq;
}

/**
 * Rotation: of the folder's file names, the backups (only names this tool writes; any other file is never touched) to
 * keep (the newest `keep`) and to remove (the rest, oldest last), each with its checksum file.
 */
export function chooseRotation(names: Iterable<string>, keep: number): { keep: string[]; remove: string[] } {
  if (!Number.isInteger(keep) || keep < 1) throw new Error(`keep must be a whole number of at least 1 (got ${keep})`);
  const backups = [...new Set(names)].filter((n) => parseBackupName(n) !== null).sort(newestFirst);
  return { keep: backups.slice(0, keep), remove: backups.slice(keep) };
}

/** BACKUP_KEEP: how many backups rotation keeps (default 14). */
export function parseBackupKeep(value: string | undefined): number {
  if (value === undefined || value.trim() === '') return DEFAULT_BACKUP_KEEP;
  const n = Number(value.trim());
  if (!Number.isInteger(n) || n < 1) throw new Error(`BACKUP_KEEP: a whole number of at least 1 (got "${value}")`);
  return n;
}

/** The checksum file's text, as `sha256sum` writes it: `<hex>  <file name>`. */
export function checksumLine(sha256Hex: string, fileName: string): string {
  return `${sha256Hex}  ${fileName}\n`;
}

/** The SHA-256 in a checksum file's text for that backup; an error naming the checksum file when it says something else. */
export function parseChecksumFile(text: string, checksumFile: string): string {
  const m = /^([0-9a-f]{64}) [ *](.+)$/m.exec(text.trim());
  if (!m) throw new Error(`${checksumFile}: not a SHA-256 checksum line ("<64 hex digits>  <file name>")`);
  return m[1];
}

/** Null when the checksums agree, else why the backup is refused (naming the file). */
export function checksumProblem(file: string, expectedHex: string, actualHex: string): string | null {
  if (expectedHex.toLowerCase() === actualHex.toLowerCase()) return null;
  return `${file}: checksum mismatch (expected ${expectedHex}, the file has ${actualHex}); the file is damaged or was changed — not restored`;
}

export interface BinlogPosition {
  file: string;
  position: number;
  gtid: string | null;
}

/**
 * The binary log coordinates that `mariadb-dump --master-data=2` writes as comments near the top of the dump
 * (`-- CHANGE MASTER TO MASTER_LOG_FILE='binlog.000002', MASTER_LOG_POS=1234;`, and the GTID position with
 * `-- SET GLOBAL gtid_slave_pos='0-1-42';`); null when the dump has none (binary log off).
 */
export function binlogPositionFromDump(head: string): BinlogPosition | null {
  const m = /^-- CHANGE MASTER TO MASTER_LOG_FILE='([^']+)',\s*MASTER_LOG_POS=(\d+);/m.exec(head);
  if (!m) return null;
  const g = /^-- SET GLOBAL gtid_slave_pos='([^']*)';/m.exec(head);
  return { file: m[1], position: Number(m[2]), gtid: g ? g[1] || null : null };
}

const DB_NAME_RE = /^[A-Za-z0-9_]{1,64}$/;

/** Default restore target: `<DB_NAME>_restore_<UTC stamp>` (a database name has at most 64 characters). */
export function restoreDatabaseName(dbName: string, at: Date): string {
  const name = `${dbName}_restore_${utcStamp(at).replace('Z', '').replace('T', '_')}`;
  if (!DB_NAME_RE.test(name)) throw new Error(`DB_NAME "${dbName}" is too long to add _restore_<time>; name the target with --into`);
  return name;
}

/** Null when `name` can be a database name here (letters, digits and _; at most 64), else the reason. */
export function databaseNameProblem(name: string): string | null {
  return DB_NAME_RE.test(name) ? null : `--into: "${name}" is not a database name (letters, digits and _ only, at most 64 characters)`;
}

/** `db:restore FILE [--into NAME]`. */
export function parseRestoreArgs(argv: string[]): { file: string; into: string | null } {
  let file: string | null = null;
  let into: string | null = null;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--into') {
      into = argv[++i] ?? null;
      if (into === null) throw new Error('--into needs a database name');
    } else if (a.startsWith('--into=')) into = a.slice('--into='.length);
    else if (a.startsWith('--')) throw new Error(`unknown option ${a}`);
    else if (file === null) file = a;
    else throw new Error(`one backup file at a time (got "${file}" and "${a}")`);
  }
  if (file === null) throw new Error('name the backup file: npm run db:restore -- FILE [--into NAME]');
  if (into !== null) {
    const problem = databaseNameProblem(into);
    if (problem) throw new Error(problem);
  }
  return { file, into };
}
