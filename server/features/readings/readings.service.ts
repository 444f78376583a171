import type { EntityManager } from 'typeorm';
import { In, Not } from 'typeorm';
import { readingSetToRows, rowsToReadingSet, ROW_KEYS, SET_LEVEL_KEYS } from '../../../shared/readings/rows.js';
import type { ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { insertReadingRows } from '../imports/insert-readings.js';
import { Reading } from './reading.entity.js';
import { ReadingSet, type ReadingSetKind } from './reading-set.entity.js';

/** Conditions of a session stored as columns. */
export interface SessionConditions {
  takenAt: string;
  topOilC?: number;
  bottomOilC?: number;
  ambientC?: number;
  humidityPercent?: number;
  instrument?: string;
  instrumentSerial?: string;
  testKV?: number;
  testFrequencyHz?: number;
  hoursDeenergised?: number;
  notes?: string;
  isReference?: boolean;
}

export interface NewReadingSet {
  unitId: number;
  kind: ReadingSetKind;
  eventId?: number | null;
  /** The values, in the case format's reading-set shape (plus the conditions above). */
  body: CaseReadingSet & SessionConditions;
  userId: number | null;
  /** A note for the audit entry (why the set was stored). */
  auditNote?: string;
}

const CONDITION_KEYS = ['topOilC', 'bottomOilC', 'ambientC', 'humidityPercent', 'instrument', 'instrumentSerial', 'testKV', 'testFrequencyHz', 'hoursDeenergised', 'notes', 'isReference', 'kind'];

/** Insulation temperature: as given, else the mean of top and bottom oil, else the one known. */
export function insulationTemperatureC(b: { temperatureC?: number; topOilC?: number; bottomOilC?: number }): number | null {
  if (typeof b.temperatureC === 'number') return b.temperatureC;
  if (typeof b.topOilC === 'number' && typeof b.bottomOilC === 'number') return (b.topOilC + b.bottomOilC) / 2;
  return b.topOilC ?? b.bottomOilC ?? null;
}

/** Stores one reading set with its readings (inside the caller's transaction) and audits it. */
export async function insertReadingSet(m: EntityManager, clock: Clock, input: NewReadingSet): Promise<ReadingSet> {
  const b = input.body;
  const extra: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(b)) {
    if (!(ROW_KEYS as readonly string[]).includes(k) && !(SET_LEVEL_KEYS as readonly string[]).includes(k) && !CONDITION_KEYS.includes(k)) extra[k] = v;
  }
  const set = await m.getRepository(ReadingSet).save(
    m.getRepository(ReadingSet).create({
      unitId: input.unitId,
      kind: input.kind,
      eventId: input.eventId ?? null,
      isReference: b.isReference ?? false,
      takenAt: new Date(b.takenAt),
      temperatureC: insulationTemperatureC(b),
      topOilC: b.topOilC ?? null,
      bottomOilC: b.bottomOilC ?? null,
      ambientC: b.ambientC ?? null,
      humidityPercent: b.humidityPercent ?? null,
      tapPosition: b.tapPosition === undefined ? null : String(b.tapPosition),
      instrument: b.instrument ?? null,
      instrumentSerial: b.instrumentSerial ?? null,
      testKV: b.testKV ?? null,
      testFrequencyHz: b.testFrequencyHz ?? null,
      hoursDeenergised: b.hoursDeEnergised ?? b.hoursDeenergised ?? null,
      demagnetised: b.demagnetised ?? null,
      windingTemperatureC: b.windingTemperatureC ?? null,
      notes: b.notes ?? null,
      extra: Object.keys(extra).length ? extra : null,
      createdById: input.userId,
      createdAt: clock.now(),
    }),
  );
  const rows = readingSetToRows(b);
  await insertReadingRows(m, set.id, rows);
  if (set.isReference) await unmarkOtherReferences(m, clock, input.userId, set);
  await audit(m, clock, {
    userId: input.userId,
    action: 'create',
    entity: 'reading_set',
    entityId: set.id,
    after: { unitId: set.unitId, kind: set.kind, eventId: set.eventId, takenAt: set.takenAt.toISOString(), readings: rows.length },
    ...(input.auditNote ? { note: input.auditNote } : {}),
  });
  return set;
}

/**
 * One reference per unit and kind: the unit's other sets of the set's kind marked as reference are unmarked (each
 * audited). Answers their ids.
 */
export async function unmarkOtherReferences(m: EntityManager, clock: Clock, userId: number | null, set: ReadingSet): Promise<number[]> {
  const repo = m.getRepository(ReadingSet);
  const others = await repo.find({ where: { unitId: set.unitId, kind: set.kind, isReference: true, id: Not(set.id) }, order: { id: 'ASC' } });
  for (const o of others) {
    await repo.update(o.id, { isReference: false });
    await audit(m, clock, { userId, action: 'update', entity: 'reading_set', entityId: o.id, before: { isReference: true }, after: { isReference: false }, note: `Reference moved to reading set ${set.id}` });
  }
  return others.map((o) => o.id);
}

/** A date-time as the case format writes it: the date alone when the time is midnight UTC. */
export function caseDate(d: Date): string {
  const iso = d.toISOString();
  return iso.endsWith('T00:00:00.000Z') ? iso.slice(0, 10) : iso.replace('.000Z', 'Z');
}

/**
 * Loads reading sets as case-format reading sets (values + takenAt, temperatureC, tapPosition and the revision-2 doubts
 * `demagnetised`, `hoursDeEnergised`, `windingTemperatureC`), keyed by id.
 */
export async function loadCaseReadingSets(m: EntityManager, sets: ReadingSet[]): Promise<Map<number, CaseReadingSet>> {
  const out = new Map<number, CaseReadingSet>();
  if (!sets.length) return out;
  const rows = await m.getRepository(Reading).find({ where: { readingSetId: In(sets.map((s) => s.id)) }, order: { id: 'ASC' } });
  const bySet = new Map<number, Reading[]>();
  for (const r of rows) (bySet.get(r.readingSetId) ?? bySet.set(r.readingSetId, []).get(r.readingSetId)!).push(r);
  for (const s of sets) {
    const values = rowsToReadingSet(bySet.get(s.id) ?? []);
    out.set(s.id, {
      takenAt: caseDate(s.takenAt),
      ...(s.temperatureC !== null ? { temperatureC: s.temperatureC } : {}),
      ...(s.tapPosition !== null ? { tapPosition: s.tapPosition } : {}),
      ...(s.demagnetised !== null ? { demagnetised: s.demagnetised } : {}),
      ...(s.hoursDeenergised !== null ? { hoursDeEnergised: s.hoursDeenergised } : {}),
      ...(s.windingTemperatureC !== null ? { windingTemperatureC: s.windingTemperatureC } : {}),
      ...values,
    });
  }
  return out;
}
