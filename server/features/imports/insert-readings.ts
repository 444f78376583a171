import type { EntityManager } from 'typeorm';
import type { ReadingRowData } from '../../../shared/readings/rows.js';
import { Reading } from '../readings/reading.entity.js';

// The rows of a reading set written in statements of CHUNK rows, with a turn of the event loop between them: a file of
// thousands of readings never holds the server for one long statement build (health and other requests answer between
// the chunks). Plain parameterised INSERTs: the query builder's per-value work for thousands of rows is the slow part.

/** Rows per INSERT statement (8 parameters a row). */
const CHUNK = 500;
const COLUMNS = ['readingSetId', 'quantity', 'configuration', 'phase', 'mode', 'frequencyHz', 'value', 'unit'] as const;

/** Lets requests that are waiting run before the next step of a long import. */
export const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Inserts a reading set's rows (inside the caller's transaction), CHUNK rows a statement, yielding between statements. */
export async function insertReadingRows(m: EntityManager, readingSetId: number, rows: readonly ReadingRowData[]): Promise<void> {
  if (!rows.length) return;
  const table = m.connection.getMetadata(Reading).tableName;
  const columns = COLUMNS.map((c) => `\`${c}\``).join(', ');
  for (let i = 0; i < rows.length; i += CHUNK) {
    if (i > 0) await yieldToEventLoop();
    const chunk = rows.slice(i, i + CHUNK);
    const params: unknown[] = [];
    for (const r of chunk) params.push(readingSetId, r.quantity, r.configuration, r.phase, r.mode, r.frequencyHz, r.value, r.unit);
    await m.query(`INSERT INTO \`${table}\` (${columns}) VALUES ${chunk.map(() => '(?, ?, ?, ?, ?, ?, ?, ?)').join(', ')}`, params);
  }
}
