import type { DataSource } from 'typeorm';
import { readingSetToRows } from '../../../shared/readings/rows.js';
import type { ReadingSet } from '../../../shared/schemas/case.js';

// The bench's bulk fleet, inserted with multi-row INSERTs straight into the tables the app reads (invented values):
// design families of 50 units each, a commissioning (baseline) set per unit, events spread over the units with their
// shots, and a post-fault set on each unit's newest event. 20 readings a set, so readings = 20 × (units + units).

export interface FleetSize {
  units: number;
  events: number;
  /** Readings in all: half in the baseline sets, half in the post-fault sets (20 a set). */
  readings: number;
}

export const FULL_FLEET: FleetSize = { units: 5000, events: 20000, readings: 200000 };
export const QUICK_FLEET: FleetSize = { units: 50, events: 200, readings: 2000 };

/** Units a design family holds (49 sisters each). */
export const FAMILY_SIZE = 50;
export const READINGS_PER_SET = 20;
const CONFIGS = ['CH', 'CL', 'CHL', 'CHT', 'CLT'];
const PHASES = ['A', 'B', 'C'];

/** A reading set of 20 values for unit i (the shift moves every value a little: post-fault sets differ from baseline). */
export function benchReadingSet(i: number, shift: number): ReadingSet {
  const w = (k: number) => 1 + ((((i * 7 + k * 13) % 17) - 8) / 1000) + shift;
  return {
    capacitancePF: Object.fromEntries(CONFIGS.map((c, k) => [c, Math.round(3000 * (k + 1) * w(k) * 10) / 10])),
    dissipationPercent: Object.fromEntries(CONFIGS.map((c, k) => [c, Math.round(0.25 * w(k + 5) * 1000) / 1000])),
    reactance: Object.fromEntries(PHASES.map((p, k) => [p, { percent: Math.round(11.6 * w(k + 10) * 1000) / 1000 }])),
    excitationCurrentMA: Object.fromEntries(PHASES.map((p, k) => [p, Math.round((k === 1 ? 19.5 : 28.5) * w(k + 13) * 10) / 10])),
    windingResistanceOhm: Object.fromEntries(PHASES.map((p, k) => [p, Math.round(0.84 * w(k + 16) * 10000) / 10000])),
    turnsRatio: { A: Math.round(2.31 * w(19) * 1000) / 1000 },
  };
}

type Query = (sql: string, params?: unknown[]) => Promise<unknown>;

/** Multi-row INSERT of `rows` (arrays in column order), `chunk` rows a statement. */
export async function insertRows(query: Query, table: string, columns: readonly string[], rows: readonly unknown[][], chunk = 2000): Promise<void> {
  const one = `(${columns.map(() => '?').join(',')})`;
  for (let i = 0; i < rows.length; i += chunk) {
    const part = rows.slice(i, i + chunk);
    await query(`INSERT INTO \`${table}\` (${columns.map((c) => `\`${c}\``).join(',')}) VALUES ${part.map(() => one).join(',')}`, part.flat());
  }
}

export const READING_COLUMNS = ['readingSetId', 'quantity', 'configuration', 'phase', 'mode', 'frequencyHz', 'value', 'unit'] as const;

/** The reading rows (in READING_COLUMNS order) of a case-format set stored under set id `setId`. */
export function readingRowsOf(setId: number, set: ReadingSet): unknown[][] {
  return readingSetToRows(set).map((r) => [setId, r.quantity, r.configuration ?? null, r.phase ?? null, r.mode ?? null, r.frequencyHz ?? null, r.value, r.unit]);
}

/** Ids of the rows just inserted with one auto-increment range (InnoDB gives consecutive ids to a multi-row INSERT run). */
async function idsFrom(db: DataSource, table: string, firstId: number): Promise<number[]> {
  return ((await db.query(`SELECT id FROM \`${table}\` WHERE id >= ? ORDER BY id`, [firstId])) as { id: number }[]).map((r) => Number(r.id));
}

async function nextId(db: DataSource, table: string): Promise<number> {
  const [r] = (await db.query(`SELECT COALESCE(MAX(id), 0) + 1 AS n FROM \`${table}\``)) as { n: number }[];
  return Number(r.n);
}

export interface SeededFleet {
  unitIds: number[];
  /** The newest event of each unit (each has a post-fault set with readings). */
  screenableEventIds: number[];
  siteId: number;
  ms: number;
}

/** Inserts the bulk fleet (after the demo seed) and runs ANALYZE on the tables it filled. */
export async function seedBulkFleet(db: DataSource, size: FleetSize): Promise<SeededFleet> {
  const t0 = performance.now();
  const q: Query = (sql, params) => db.query(sql, params as unknown[]);
  const [site] = (await db.query('SELECT id FROM site ORDER BY id LIMIT 1')) as { id: number }[];
  const families = Math.ceil(size.units / FAMILY_SIZE);
  const firstDesign = await nextId(db, 'design');
  await insertRows(
    q,
    'design',
    ['reference', 'maker', 'windings', 'vectorGroup', 'phases', 'hvKV', 'lvKV', 'coolingStages', 'impedancePercent', 'impedanceBaseKVA', 'conductor', 'requiredCapacitance'],
    Array.from({ length: families }, (_, f) => [`BENCH-D${String(f).padStart(4, '0')}`, 'Bench Works', 'two-winding', 'YNd1', 3, 132, 33, JSON.stringify([{ stage: 'ONAN', kVA: 40000 }]), 10.5, 40000, 'Cu', JSON.stringify(['CH', 'CL', 'CHL'])]),
  );
  const designIds = await idsFrom(db, 'design', firstDesign);

  const firstUnit = await nextId(db, 'unit');
  await insertRows(
    q,
    'unit',
    ['serial', 'position', 'siteId', 'designId', 'year', 'phases', 'hvKV', 'lvKV', 'ratedKVA', 'impedancePercent', 'systemImpedancePercent', 'conductor'],
    Array.from({ length: size.units }, (_, i) => [`BENCH-${String(i).padStart(5, '0')}`, `T${(i % 4) + 1}`, site.id, designIds[Math.floor(i / FAMILY_SIZE)], 1990 + (i % 30), 3, 132, 33, 40000, 10.5, 0.8, 'Cu']),
  );
  const unitIds = await idsFrom(db, 'unit', firstUnit);

  // Events: spread evenly over the units from 2021 on; shots of 1–3 reclosures. Each unit's newest event is being tested
  // (its post-fault set below), the others released.
  const perUnit = Math.max(1, Math.round(size.events / size.units));
  const types = ['three-phase', 'phase-to-phase', 'phase-to-ground', 'phase-to-phase-to-ground'];
  const eventRows: unknown[][] = [];
  for (let n = 0; n < size.events; n++) {
    const u = n % size.units;
    const k = Math.floor(n / size.units);
    const shots = Array.from({ length: 1 + (n % 3) }, (_, s) => ({ currentKA: Math.round((2 + ((n + s) % 17) / 4) * 100) / 100, durationS: [0.08, 0.12, 0.25][s % 3] }));
    const at = new Date(Date.UTC(2021, 0, 1) + (k * size.units + u) * 6 * 3600_000 / Math.max(1, perUnit));
    eventRows.push([unitIds[u], at, types[n % 4], n % 5 === 0 ? 'hv' : 'lv', n % 4 === 0 ? 'ABC' : 'A', JSON.stringify(shots), n % 2, JSON.stringify(n % 2 ? ['overcurrent'] : ['differential', 'overcurrent']), n >= size.events - size.units ? 'testing' : 'released']);
  }
  const firstEvent = await nextId(db, 'fault_event');
  await insertRows(q, 'fault_event', ['unitId', 'occurredAt', 'type', 'side', 'faultedPhases', 'shots', 'transformerTripped', 'protectionOperated', 'status'], eventRows);
  const eventIds = await idsFrom(db, 'fault_event', firstEvent);
  // The newest event of each unit: the last `units` rows (events are laid out unit by unit, round after round).
  const newest = eventIds.slice(-size.units);
  const newestAt = eventRows.slice(-size.units).map((r) => r[1] as Date);
  await db.query(
    `UPDATE unit u JOIN (SELECT e.unitId, e.id, e.occurredAt, e.status FROM fault_event e JOIN (SELECT unitId, MAX(occurredAt) AS at FROM fault_event WHERE id >= ? GROUP BY unitId) m ON m.unitId = e.unitId AND m.at = e.occurredAt) x ON x.unitId = u.id SET u.lastEventId = x.id, u.lastEventAt = x.occurredAt, u.lastEventStatus = x.status`,
    [firstEvent],
  );

  // Reading sets: a commissioning set per unit (2015) and a post-fault set on each unit's newest event.
  const setsWanted = Math.round(size.readings / READINGS_PER_SET);
  const baselineSets = Math.min(size.units, Math.ceil(setsWanted / 2));
  const postSets = Math.min(size.units, setsWanted - baselineSets);
  const firstSet = await nextId(db, 'reading_set');
  const setRows: unknown[][] = [];
  for (let i = 0; i < baselineSets; i++) setRows.push([unitIds[i], 'commissioning', null, 0, new Date(Date.UTC(2015, 3, 1 + (i % 28))), 25, '9b']);
  for (let i = 0; i < postSets; i++) setRows.push([unitIds[i], 'post-fault', newest[i], 0, new Date(newestAt[i].getTime() + 24 * 3600_000), 30, '9b']);
  await insertRows(q, 'reading_set', ['unitId', 'kind', 'eventId', 'isReference', 'takenAt', 'temperatureC', 'tapPosition'], setRows);
  const setIds = await idsFrom(db, 'reading_set', firstSet);
  const readingRows: unknown[][] = [];
  for (let s = 0; s < setIds.length; s++) {
    const post = s >= baselineSets;
    const i = post ? s - baselineSets : s;
    readingRows.push(...readingRowsOf(setIds[s], benchReadingSet(i, post ? 0.004 * ((i % 5) - 1) : 0)));
  }
  await insertRows(q, 'reading', READING_COLUMNS, readingRows);
  await db.query('ANALYZE TABLE design, unit, fault_event, reading_set, reading');
  return { unitIds, screenableEventIds: newest.slice(0, postSets), siteId: site.id, ms: performance.now() - t0 };
}
