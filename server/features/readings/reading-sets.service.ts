import { In, MoreThan, MoreThanOrEqual, type EntityManager } from 'typeorm';
import type { SessionPatch } from '../../../shared/schemas/fleet.js';
import type { CorrectedReadingSet, MarkedReference } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { caseText, staleScreening } from '../events/events.service.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { Decision } from '../screenings/decision.entity.js';
import { Screening } from '../screenings/screening.entity.js';
import { Unit } from '../units/unit.entity.js';
import { readingSetConditions } from '../units/units.service.js';
import { applyReadingSetPatch } from './reading-set-correction.js';
import { ReadingSet } from './reading-set.entity.js';
import { SweepTrace } from './sweep-trace.entity.js';
import { sweepMeta } from './sweeps.service.js';
import { loadCaseReadingSets, unmarkOtherReferences } from './readings.service.js';

/** A factory, commissioning or routine set of a unit, with the unit's row locked (corrections and reference marks queue). */
async function unitSet(m: EntityManager, readingSetId: number, what: string): Promise<ReadingSet> {
  const set = await m.getRepository(ReadingSet).findOne({ where: { id: readingSetId } });
  if (!set) throw notFound('Reading set');
  if (set.kind === 'post-fault') {
    throw new AppError('invalid_status', `${what}: this set is a post-fault session of event ${set.eventId} (correct it on the event file).`, 409);
  }
  await m.getRepository(Unit).findOne({ where: { id: set.unitId }, lock: { mode: 'pessimistic_write' } });
  // Read again under the lock: a correction or mark that held it may have changed the set.
  return m.getRepository(ReadingSet).findOneByOrFail({ id: set.id });
}

/** Whether a screening (computed since `computedSince`, when given) of a unit's event after `faultAfter` is decided. */
async function decidedAfter(m: EntityManager, unitId: number, faultAfter: Date, computedSince?: Date): Promise<boolean> {
  const events = await m.getRepository(FaultEvent).find({ where: { unitId, occurredAt: MoreThan(faultAfter) }, select: { id: true } });
  if (!events.length) return false;
  const screenings = await m.getRepository(Screening).find({
    where: { eventId: In(events.map((e) => e.id)), ...(computedSince ? { computedAt: MoreThanOrEqual(computedSince) } : {}) },
    select: { id: true },
  });
  return screenings.length > 0 && (await m.getRepository(Decision).exists({ where: { screeningId: In(screenings.map((s) => s.id)) } }));
}

/**
 * Whether the set is, or by a corrected time would become, an input of a decided screening: a screening of one of the
 * unit's events whose fault came after the set was taken, computed once the set was stored; or, when the correction
 * moves the set earlier, any decided screening of an event it would then precede.
 */
export async function usedByDecidedScreening(m: EntityManager, set: ReadingSet, newTakenAt?: Date): Promise<boolean> {
  if (await decidedAfter(m, set.unitId, set.takenAt, set.createdAt)) return true;
  return !!newTakenAt && newTakenAt.getTime() < set.takenAt.getTime() && decidedAfter(m, set.unitId, newTakenAt);
}

/** The cases of the unit's screened events (a change to its sets may make their screening stale). */
async function screenedCases(m: EntityManager, unitId: number): Promise<Map<number, string>> {
  const events = await m.getRepository(FaultEvent).find({ where: { unitId, status: 'screened' }, select: { id: true } });
  const out = new Map<number, string>();
  for (const e of events) out.set(e.id, await caseText(m, e.id));
  return out;
}

/** Moves each screened event whose case changed back to testing; answers their ids and the note. */
async function staleEvents(m: EntityManager, clock: Clock, cases: Map<number, string>, userId: number, what: string) {
  const ids: number[] = [];
  for (const [eventId, before] of cases) if ((await staleScreening(m, clock, eventId, before, userId, what)).screeningStale) ids.push(eventId);
  const note = ids.length ? `The screening of event ${ids.join(', ')} used the earlier values: back in testing, a new screening is needed.` : null;
  return { staleEventIds: ids, note };
}

/**
 * Corrects a unit's factory, commissioning or routine set (PATCH /api/reading-sets/:readingSetId): only the fields named
 * change, as for a session. 409 when a decided screening used the set (a new set instead).
 */
export async function correctUnitReadingSet(m: EntityManager, clock: Clock, userId: number, readingSetId: number, patch: SessionPatch) {
  const set = await unitSet(m, readingSetId, 'The set cannot be corrected here');
  if (await usedByDecidedScreening(m, set, patch.takenAt ? new Date(patch.takenAt) : undefined)) {
    throw new AppError('invalid_status', 'A decided screening used this reading set: its values never change. Record a new set instead.', 409);
  }
  const cases = await screenedCases(m, set.unitId);
  const { after, values, changed } = await applyReadingSetPatch(m, clock, userId, set, patch, 'Reading set corrected');
  const stale = changed ? await staleEvents(m, clock, cases, userId, 'A correction of a unit reading set') : { staleEventIds: [], note: null };
  return { ...readingSetConditions(after), values, ...stale } satisfies CorrectedReadingSet;
}

/**
 * Marks a set as the unit's reference of its kind (POST /api/reading-sets/:readingSetId/reference): the unit's other
 * reference of that kind is unmarked in the same transaction; each change audited. Marking the reference again changes
 * nothing.
 */
export async function markReference(m: EntityManager, clock: Clock, userId: number, readingSetId: number) {
  const set = await unitSet(m, readingSetId, 'A post-fault session cannot be a reference');
  const repo = m.getRepository(ReadingSet);
  const cases = await screenedCases(m, set.unitId);
  const unmarkedIds = await unmarkOtherReferences(m, clock, userId, set);
  let stale: { staleEventIds: number[]; note: string | null } = { staleEventIds: [], note: null };
  if (!set.isReference) {
    await repo.update(set.id, { isReference: true });
    await audit(m, clock, { userId, action: 'update', entity: 'reading_set', entityId: set.id, before: { isReference: false }, after: { isReference: true }, note: 'Marked as the reference' });
  }
  if (unmarkedIds.length || !set.isReference) stale = await staleEvents(m, clock, cases, userId, 'A new reference set');
  const after = await repo.findOneByOrFail({ id: set.id });
  const values = (await loadCaseReadingSets(m, [after])).get(after.id);
  return { ...readingSetConditions(after), values, unmarkedIds, ...stale } satisfies MarkedReference;
}

/**
 * Removes a sweep trace of a unit's factory, commissioning or routine set (DELETE /api/sweeps/:sweepId), e.g. a file
 * uploaded to the wrong set: 409 when a decided screening used the set (its inputs never change); audited with the
 * trace's description and checksum; screened events whose case changed go back to testing.
 */
export async function removeUnitSweep(m: EntityManager, clock: Clock, userId: number, sweepId: number) {
  const trace = await m.getRepository(SweepTrace).findOne({ where: { id: sweepId } });
  if (!trace) throw notFound('Sweep trace');
  const set = await unitSet(m, trace.readingSetId, 'The trace cannot be removed here');
  if (await usedByDecidedScreening(m, set)) {
    throw new AppError('invalid_status', 'A decided screening used this reading set: its traces never change. Upload the trace to a new set instead.', 409);
  }
  const cases = await screenedCases(m, set.unitId);
  const before = sweepMeta(trace);
  await m.getRepository(SweepTrace).delete(trace.id);
  await audit(m, clock, { userId, action: 'delete', entity: 'sweep_trace', entityId: trace.id, before, note: 'Sweep trace removed' });
  const stale = await staleEvents(m, clock, cases, userId, 'A sweep trace removed from a unit reading set');
  return { id: trace.id, readingSetId: set.id, removed: true as const, ...stale };
}
