import type { DataSource } from 'typeorm';

// Exact row counts (COUNT(*), not information_schema's estimate) of every table of the entity metadata, in one query.

export type RowCounts = Record<string, number>;

/** Every entity table's name, sorted (the tables the corpus watches). */
export function entityTables(db: DataSource): string[] {
  return [...new Set(db.entityMetadatas.filter((m) => m.tableType !== 'view').map((m) => m.tableName))].sort();
}

/** COUNT(*) of each table, one round trip. */
export async function countRows(db: DataSource, tables: readonly string[]): Promise<RowCounts> {
  const sql = tables.map((t) => `SELECT ${db.driver.escape(t).replace(/`/g, "'")} AS t, COUNT(*) AS n FROM ${db.driver.escape(t)}`).join(' UNION ALL ');
  const rows: { t: string; n: string | number }[] = await db.query(sql);
  return Object.fromEntries(rows.map((r) => [r.t, Number(r.n)]));
}

/** Tables whose count differs, as "table: before → after". */
export function countChanges(before: RowCounts, after: RowCounts): string[] {
  return Object.keys({ ...before, ...after })
    .filter((t) => before[t] !== after[t])
    .map((t) => `${t}: ${before[t]} → ${after[t]}`);
}

/** Tables that lost rows. */
export function countDecreases(before: RowCounts, after: RowCounts): string[] {
  return Object.keys(before)
    .filter((t) => (after[t] ?? 0) < before[t]!)
    .map((t) => `${t}: ${before[t]} → ${after[t]}`);
}
