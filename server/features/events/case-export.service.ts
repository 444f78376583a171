import { In, LessThan, Not, type EntityManager } from 'typeorm';
import { isBaselineSet } from '../../../shared/readings/baseline.js';
import { loggedFault, toPriorFault } from '../../../shared/screening/duty-history.js';
import { mergeReadingSets } from '../../../shared/readings/merge.js';
import { unitToCase } from '../../../shared/readings/unit-case.js';
import type { Fault, GapsightCase, PriorFault, ReadingSet as CaseReadingSet } from '../../../shared/schemas/case.js';
import { notFound } from '../../common/app-error.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { loadCaseReadingSets } from '../readings/readings.service.js';
import { SweepTrace } from '../readings/sweep-trace.entity.js';
import { Unit } from '../units/unit.entity.js';
import { FaultEvent } from './fault-event.entity.js';

/** The unit block of a case, from the unit and its design. */
export function caseUnit(unit: Unit): GapsightCase['unit'] {
  return unitToCase(unit);
}

/** A logged event as the case format's fault (or prior fault): location and current basis only when recorded. */
export function caseFault(e: FaultEvent): Fault {
  return {
    occurredAt: e.occurredAt.toISOString(),
    type: e.type,
    side: e.side,
    ...(e.location !== null ? { location: e.location } : {}),
    ...(e.currentIs !== null ? { currentIs: e.currentIs } : {}),
    transformerTripped: e.transformerTripped,
    protectionOperated: e.protectionOperated as Fault['protectionOperated'],
    shots: e.shots,
  };
}

/** An earlier event of the unit as a prior fault (its own side, location and current basis). */
export function casePriorFault(p: FaultEvent): PriorFault {
  return toPriorFault(loggedFault({ occurredAt: p.occurredAt.toISOString(), type: p.type, side: p.side, location: p.location, currentIs: p.currentIs, shots: p.shots }));
}

const isReferenceSet = (s: ReadingSet) => isBaselineSet(s);

function mergeOf(sets: ReadingSet[], values: Map<number, CaseReadingSet>): CaseReadingSet | undefined {
  return mergeReadingSets(sets.map((s) => values.get(s.id)!).filter(Boolean));
}

/** Conditions alone (no measured value) do not make a reading set. */
const CONDITION_ONLY = ['takenAt', 'temperatureC', 'tapPosition', 'demagnetised', 'hoursDeEnergised', 'windingTemperatureC'];

function isEmptySet(s: CaseReadingSet | undefined): boolean {
  return !s || Object.keys(s).every((k) => CONDITION_ONLY.includes(k));
}

/**
 * Assembles the `gapsight-case/1` of an event from the database: the baseline is the newest value of each quantity over
 * the reference sets (factory, commissioning, or marked) taken before the fault; `previous` the same over routine sets
 * before the fault; `postFault` the merge of all the event's sessions (newest value per quantity); prior faults are
 * the unit's earlier events; sisters are the other units of the design with their latest (non post-fault) readings;
 * each post-fault sweep label (newest trace) is paired with the newest baseline trace of that label.
 */
export async function buildEventCase(m: EntityManager, eventId: number): Promise<GapsightCase> {
  const event = await m.getRepository(FaultEvent).findOne({ where: { id: eventId } });
  if (!event) throw notFound('Event');
  const unit = await m.getRepository(Unit).createQueryBuilder('u').innerJoinAndSelect('u.design', 'd').where('u.id = :id', { id: event.unitId }).getOneOrFail();

  const ownSets = await m.getRepository(ReadingSet).find({ where: { unitId: unit.id }, order: { takenAt: 'ASC', id: 'ASC' } });
  const before = (s: ReadingSet) => s.takenAt.getTime() < event.occurredAt.getTime();
  const referenceSets = ownSets.filter((s) => isReferenceSet(s) && before(s));
  const routineSets = ownSets.filter((s) => s.kind === 'routine' && !s.isReference && before(s));
  const sessions = ownSets.filter((s) => s.kind === 'post-fault' && s.eventId === event.id);
  const values = await loadCaseReadingSets(m, [...referenceSets, ...routineSets, ...sessions]);

  const priorEvents = await m.getRepository(FaultEvent).find({
    where: { unitId: unit.id, occurredAt: LessThan(event.occurredAt), id: Not(event.id) },
    order: { occurredAt: 'ASC', id: 'ASC' },
  });

  // Only sisters with a reading set that is not post-fault can add a sister block: the others are not read at all.
  const sisterUnits: { id: number; serial: string }[] = await m
    .getRepository(Unit)
    .createQueryBuilder('u')
    .select(['u.id AS id', 'u.serial AS serial'])
    .where('u.designId = :designId AND u.id <> :id', { designId: unit.designId, id: unit.id })
    .andWhere("EXISTS (SELECT 1 FROM reading_set rs WHERE rs.unitId = u.id AND rs.kind <> 'post-fault')")
    .orderBy('u.serial', 'ASC')
    .getRawMany();
  const sisterSets = sisterUnits.length
    ? await m.getRepository(ReadingSet).find({ where: { unitId: In(sisterUnits.map((u) => u.id)), kind: Not('post-fault') }, order: { takenAt: 'ASC', id: 'ASC' } })
    : [];
  const sisterValues = await loadCaseReadingSets(m, sisterSets);
  const sisters = sisterUnits
    .map((u) => {
      const merged = mergeOf(sisterSets.filter((s) => s.unitId === u.id), sisterValues);
      return isEmptySet(merged) ? null : { serial: u.serial, ...merged! };
    })
    .filter((s): s is NonNullable<typeof s> => s !== null);

  const sweeps = await eventSweeps(m, sessions, referenceSets, routineSets);

  const baseline = mergeOf(referenceSets, values);
  const previous = mergeOf(routineSets, values);
  const postFault = mergeOf(sessions, values);
  const c: GapsightCase = {
    format: 'gapsight-case/1',
    unit: caseUnit(unit),
    fault: caseFault(event),
    priorFaults: priorEvents.map(casePriorFault),
    ...(baseline && !isEmptySet(baseline) ? { baseline } : {}),
    ...(previous && !isEmptySet(previous) ? { previous } : {}),
    ...(postFault && !isEmptySet(postFault) ? { postFault } : {}),
    ...(sisters.length ? { sisters } : {}),
    ...(sweeps.length ? { sweeps } : {}),
  };
  return c;
}

async function eventSweeps(m: EntityManager, sessions: ReadingSet[], referenceSets: ReadingSet[], routineSets: ReadingSet[]): Promise<NonNullable<GapsightCase['sweeps']>> {
  if (!sessions.length) return [];
  const setIds = [...sessions, ...referenceSets, ...routineSets].map((s) => s.id);
  const traces = await m.getRepository(SweepTrace).find({ where: { readingSetId: In(setIds) } });
  const setTime = new Map([...sessions, ...referenceSets, ...routineSets].map((s) => [s.id, s.takenAt.getTime()]));
  const newestFirst = (a: SweepTrace, b: SweepTrace) => setTime.get(b.readingSetId)! - setTime.get(a.readingSetId)! || b.id - a.id;
  const inSets = (sets: ReadingSet[]) => {
    const ids = new Set(sets.map((s) => s.id));
    return traces.filter((t) => ids.has(t.readingSetId)).sort(newestFirst);
  };
  const post = inSets(sessions);
  const refs = inSets(referenceSets);
  const routine = inSets(routineSets);
  const labels = [...new Set(post.map((t) => t.label))].sort();
  return labels.map((label) => {
    const p = post.find((t) => t.label === label)!;
    const b = refs.find((t) => t.label === label) ?? routine.find((t) => t.label === label);
    // Winding and phase: the post-fault trace's, else its baseline trace's. The baseline tap: as recorded with the
    // post-fault trace, else the baseline trace's own tap.
    const winding = p.winding ?? b?.winding ?? null;
    const phase = p.phase ?? b?.phase ?? null;
    const baselineTap = p.baselineTapPosition ?? b?.tapPosition ?? null;
    return {
      label,
      testType: p.testType,
      ...(winding !== null ? { winding } : {}),
      ...(phase !== null ? { phase } : {}),
      ...(p.tapPosition !== null ? { tapPosition: p.tapPosition } : {}),
      ...(b && baselineTap !== null ? { baselineTapPosition: baselineTap } : {}),
      ...(p.demagnetised !== null ? { demagnetised: p.demagnetised } : {}),
      ...(b ? { baseline: b.points as [number, number][] } : {}),
      postFault: p.points as [number, number][],
    };
  });
}
