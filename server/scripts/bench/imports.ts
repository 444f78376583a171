import { createHash } from 'node:crypto';
import type { Pool } from 'mysql2/promise';
import { readingSetToRows } from '../../../shared/readings/rows.js';
import { benchReadingSet, insertRows, READING_COLUMNS, READINGS_PER_SET } from './seed.js';

// Imports against their floor. Readings: the route that takes the most rows a file — POST /api/units/reading-sets/import
// (10 000 rows, reading sets of many units) — gets the rows as files at its cap; the floor inserts the same sets and
// readings into reading_set and reading with multi-row INSERTs over mysql2. Sweep: one 20 000-point CSV through
// POST /api/units/:unitId/sweeps against one INSERT of the sweep_trace row that route stores (points as JSON).

export interface ImportFigure { routeMs: number; floorMs: number; rows: number; files: number }

type Post = (url: string, form: FormData) => Promise<{ status: number; text: string }>;

/** A reading-sets CSV of the given units' 20-reading sets, all taken at `takenAt`. */
export function readingSetsCsv(serials: readonly string[], takenAt: string, shift: number): string {
  const lines = ['serial,kind,takenAt,quantity,configuration,phase,value,unit'];
  serials.forEach((serial, i) => {
    for (const r of readingSetToRows(benchReadingSet(i, shift))) lines.push(`${serial},routine,${takenAt},${r.quantity},${r.configuration ?? ''},${r.phase ?? ''},${r.value},${r.unit}`);
  });
  return lines.join('\n') + '\n';
}

export async function benchReadingsImport(post: Post, pool: Pool, units: { id: number; serial: string }[], totalRows: number, rowsPerFile: number): Promise<ImportFigure> {
  const setsPerFile = rowsPerFile / READINGS_PER_SET;
  const files = Math.ceil(totalRows / rowsPerFile);
  if (units.length < setsPerFile) throw new Error(`the readings import needs ${setsPerFile} units, the fleet has ${units.length}`);
  let routeMs = 0;
  let floorMs = 0;
  let rows = 0;
  for (let f = 0; f < files; f++) {
    const chosen = Array.from({ length: setsPerFile }, (_, i) => units[(f * setsPerFile + i) % units.length]);
    const csv = readingSetsCsv(chosen.map((u) => u.serial), `2018-${String((f % 12) + 1).padStart(2, '0')}-${String(1 + Math.floor(f / 12)).padStart(2, '0')}`, 0.001 * f);
    const lineCount = csv.split('\n').length - 2;
    if (lineCount !== rowsPerFile) throw new Error(`the readings file has ${lineCount} rows, meant ${rowsPerFile}`);
    const form = new FormData();
    form.append('file', new Blob([csv], { type: 'text/csv' }), `reading-sets-${f + 1}.csv`);
    let t = performance.now();
    const res = await post('/api/units/reading-sets/import', form);
    routeMs += performance.now() - t;
    if (res.status !== 201) throw new Error(`reading-sets import ${f + 1}: ${res.status} ${res.text.slice(0, 400)}`);
    rows += lineCount;

    // The floor: the same sets (one row each) and readings, taken a year earlier so the two never mix.
    const takenAt = new Date(Date.UTC(2017, f % 12, 1 + Math.floor(f / 12)));
    t = performance.now();
    const conn = await pool.getConnection();
    try {
      await conn.beginTransaction();
      const [r] = (await conn.query(`INSERT INTO reading_set (unitId, kind, isReference, takenAt) VALUES ${chosen.map(() => '(?,?,?,?)').join(',')}`, chosen.flatMap((u) => [u.id, 'routine', 0, takenAt]))) as unknown as [{ insertId: number }];
      const readingRows = chosen.flatMap((_, i) =>
        readingSetToRows(benchReadingSet(i, 0.001 * f)).map((x) => [r.insertId + i, x.quantity, x.configuration ?? null, x.phase ?? null, x.mode ?? null, x.frequencyHz ?? null, x.value, x.unit]),
      );
      await insertRows((sql, params) => conn.query(sql, params), 'reading', READING_COLUMNS, readingRows, 2000);
      await conn.commit();
    } finally {
      conn.release();
    }
    floorMs += performance.now() - t;
  }
  return { routeMs, floorMs, rows, files };
}

/** A 20 000-point (or `points`) sweep CSV, log-spaced from 20 Hz to 2 MHz. */
export function sweepCsv(points: number): { csv: string; pts: [number, number, number][] } {
  const pts: [number, number, number][] = Array.from({ length: points }, (_, i) => {
    const f = Math.round(20 * Math.pow(1e5, i / (points - 1)) * 1000) / 1000;
    return [f, Math.round((-40 - 20 * Math.sin(Math.log10(f) * 3)) * 1000) / 1000, Math.round(-88 + (i % 50) / 10 * 100) / 100];
  });
  return { pts, csv: ['frequencyHz,magnitudeDb,phaseDeg', ...pts.map((p) => p.join(','))].join('\n') + '\n' };
}

export async function benchSweepImport(post: Post, pool: Pool, unitId: number, readingSetId: number, points: number): Promise<ImportFigure> {
  const { csv, pts } = sweepCsv(points);
  const form = new FormData();
  form.append('label', 'BENCH-HV-A-open');
  form.append('testType', 'open-circuit');
  form.append('readingSetId', String(readingSetId));
  form.append('file', new Blob([csv], { type: 'text/csv' }), 'sweep.csv');
  let t = performance.now();
  const res = await post(`/api/units/${unitId}/sweeps`, form);
  const routeMs = performance.now() - t;
  if (res.status !== 201) throw new Error(`sweep import: ${res.status} ${res.text.slice(0, 400)}`);
  // The floor: serialise the points and store the row the route stores (its checksum of the file computed beforehand).
  const sha = createHash('sha256').update(csv).digest('hex');
  t = performance.now();
  await pool.query(
    'INSERT INTO sweep_trace (readingSetId, label, testType, points, pointCount, minHz, maxHz, sha256, fileName) VALUES (?,?,?,?,?,?,?,?,?)',
    [readingSetId, 'BENCH-FLOOR', 'open-circuit', JSON.stringify(pts), pts.length, pts[0][0], pts[pts.length - 1][0], sha, 'sweep.csv'],
  );
  const floorMs = performance.now() - t;
  return { routeMs, floorMs, rows: points, files: 1 };
}
