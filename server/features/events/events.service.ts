import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { EventBody, EventPatch } from '../../../shared/schemas/fleet.js';
import type { CorrectedEvent, CreatedEvent } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { Decision } from '../screenings/decision.entity.js';
import { Screening } from '../screenings/screening.entity.js';
import { buildEventCase } from './case-export.service.js';
import { Unit } from '../units/unit.entity.js';
import { eventThroughFault, eventView } from './events.query.js';
import { FaultEvent, type EventStatus } from './fault-event.entity.js';

/** The status moves of the brief's workflow; any other move is a 409. */
export const EVENT_MOVES: Record<EventStatus, EventStatus[]> = {
  logged: ['testing'],
  testing: ['testing', 'screened'],
  screened: ['testing', 'screened', 'released', 'held'],
  held: ['testing'],
  released: [],
};

/** Throws 409 unless the event may move from its status to `to`. */
export function assertMove(event: FaultEvent, to: EventStatus, what: string): void {
  if (!EVENT_MOVES[event.status].includes(to)) {
    throw new AppError('invalid_status', `${what} is not possible while the event is ${event.status}.`, 409);
  }
}

/**
 * Keeps the unit's "last event" columns (fleet list) in step with its newest event; the unit's recommendation is the
 * newest (non-comparison) screening of that event, none while it has none.
 */
export async function refreshUnitLastEvent(m: EntityManager, clock: Clock, unitId: number): Promise<void> {
  const newest = await m.getRepository(FaultEvent).findOne({ where: { unitId }, order: { occurredAt: 'DESC', id: 'DESC' } });
  const screening = newest
    ? await m.getRepository(Screening).findOne({ where: { eventId: newest.id, comparison: false }, order: { computedAt: 'DESC', id: 'DESC' } })
    : null;
  await m.getRepository(Unit).update(unitId, {
    lastEventAt: newest?.occurredAt ?? null,
    lastEventId: newest?.id ?? null,
    lastEventStatus: newest?.status ?? null,
    lastRecommendation: screening?.recommendation ?? null,
    updatedAt: clock.now(),
  });
}

/** Inserts a fault event (status logged), audits it and updates the unit's last-event columns. */
export async function createEventRow(m: EntityManager, clock: Clock, userId: number | null, body: EventBody): Promise<FaultEvent> {
  const unit = await m.getRepository(Unit).findOne({ where: { id: body.unitId } });
  if (!unit) throw new AppError('invalid_input', 'Some fields are invalid.', 400, { unitId: `no unit with id ${body.unitId}` });
  const repo = m.getRepository(FaultEvent);
  const event = await repo.save(
    repo.create({
      unitId: body.unitId,
      occurredAt: new Date(body.occurredAt),
      type: body.type,
      side: body.side,
      location: body.location ?? null,
      currentIs: body.currentIs ?? null,
      faultedPhases: body.faultedPhases ?? null,
      shots: body.shots.map((s) => ({ currentKA: s.currentKA, durationS: s.durationS })),
      transformerTripped: body.transformerTripped ?? true,
      protectionOperated: body.protectionOperated ?? [],
      notes: body.notes ?? null,
      status: 'logged',
      createdById: userId,
      createdAt: clock.now(),
      updatedAt: clock.now(),
    }),
  );
  await audit(m, clock, { userId, action: 'create', entity: 'fault_event', entityId: event.id, after: eventAuditView(event) });
  await refreshUnitLastEvent(m, clock, event.unitId);
  return event;
}

/** Logs a fault event (POST /api/events): the stored event with its through-fault duty. */
export async function logEvent(m: EntityManager, clock: Clock, userId: number, body: EventBody) {
  const event = await createEventRow(m, clock, userId, body);
  const unit = await m.getRepository(Unit).findOneOrFail({ where: { id: event.unitId }, relations: { design: true } });
  return { ...eventView(event), throughFault: await eventThroughFault(m, event, unit) } satisfies CreatedEvent;
}

/** Moves an event to a new status (checked against the workflow), audited, with the unit's columns kept in step. */
export async function moveEvent(m: EntityManager, clock: Clock, eventId: number, to: EventStatus, userId: number | null, what: string): Promise<FaultEvent> {
  const repo = m.getRepository(FaultEvent);
  const event = await repo.findOne({ where: { id: eventId }, lock: { mode: 'pessimistic_write' } });
  if (!event) throw notFound('Event');
  assertMove(event, to, what);
  if (event.status !== to) {
    const before = event.status;
    event.status = to;
    await repo.update(event.id, { status: to, updatedAt: clock.now() });
    await audit(m, clock, { userId, action: 'update', entity: 'fault_event', entityId: event.id, before: { status: before }, after: { status: to }, note: what });
    await refreshUnitLastEvent(m, clock, event.unitId);
  }
  return event;
}

/** The fields of an event worth keeping in the audit trail. */
export function eventAuditView(e: FaultEvent): Record<string, unknown> {
  return {
    unitId: e.unitId,
    occurredAt: e.occurredAt.toISOString(),
    type: e.type,
    side: e.side,
    location: e.location,
    currentIs: e.currentIs,
    faultedPhases: e.faultedPhases,
    shots: e.shots,
    transformerTripped: e.transformerTripped,
    protectionOperated: e.protectionOperated,
    notes: e.notes,
    status: e.status,
  };
}

/** A decision exists on one of the event's screenings (its inputs are then never changed). */
export async function eventHasDecision(m: EntityManager, eventId: number, screenedSince?: Date): Promise<boolean> {
  const screenings = await m.getRepository(Screening).find({ where: { eventId }, select: { id: true, computedAt: true } });
  const used = screenedSince ? screenings.filter((s) => s.computedAt.getTime() >= screenedSince.getTime()) : screenings;
  return used.length > 0 && (await m.getRepository(Decision).exists({ where: { screeningId: In(used.map((s) => s.id)) } }));
}

/** 409 once the event is released or held, or a screening of it (one that used `since`'s data, when given) is decided. */
export async function assertCorrectable(m: EntityManager, event: FaultEvent, what: string, since?: Date): Promise<void> {
  if (event.status === 'released' || event.status === 'held' || (await eventHasDecision(m, event.id, since))) {
    throw new AppError('invalid_status', `${what}: the screening that used it is decided (the event is ${event.status}).`, 409);
  }
}

/** The case the event's screening is computed from, as text (to tell whether a correction made a screening stale). */
export async function caseText(m: EntityManager, eventId: number): Promise<string> {
  return JSON.stringify(await buildEventCase(m, eventId));
}

/**
 * A screened event whose case changed needs a new screening: it moves back to testing. Answers whether it did and
 * the note the answer carries.
 */
export async function staleScreening(m: EntityManager, clock: Clock, eventId: number, caseBefore: string, userId: number, what: string) {
  const event = await m.getRepository(FaultEvent).findOneByOrFail({ id: eventId });
  if (event.status !== 'screened' || (await caseText(m, eventId)) === caseBefore) return { screeningStale: false, note: null, status: event.status };
  await moveEvent(m, clock, eventId, 'testing', userId, `${what}: the screening used the earlier values`);
  return { screeningStale: true, note: 'The screening used the earlier values: the event is back in testing and needs a new screening.', status: 'testing' as const };
}

const PATCH_FIELDS = ['occurredAt', 'type', 'side', 'location', 'currentIs', 'faultedPhases', 'shots', 'transformerTripped', 'protectionOperated', 'notes'] as const;

/**
 * Corrects a logged fault's facts before a decision (PATCH /api/events/:eventId): only the fields named change; audited
 * with the changed fields before and after. Answers the event with its recomputed duty.
 */
export async function correctEvent(m: EntityManager, clock: Clock, userId: number, eventId: number, patch: EventPatch) {
  const repo = m.getRepository(FaultEvent);
  const event = await repo.findOne({ where: { id: eventId }, lock: { mode: 'pessimistic_write' } });
  if (!event) throw notFound('Event');
  await assertCorrectable(m, event, 'The fault cannot be corrected');
  const caseBefore = await caseText(m, eventId);
  const oldView = eventAuditView(event);
  const changes: Partial<FaultEvent> = {};
  for (const key of PATCH_FIELDS) {
    const v = patch[key];
    if (v === undefined) continue;
    if (key === 'occurredAt') changes.occurredAt = new Date(v as string);
    else if (key === 'shots') changes.shots = (v as EventPatch['shots'])!.map((s) => ({ currentKA: s.currentKA, durationS: s.durationS }));
    else (changes as Record<string, unknown>)[key] = v;
  }
  Object.assign(event, changes);
  const newView = eventAuditView(event);
  const before: Record<string, unknown> = {};
  const after: Record<string, unknown> = {};
  for (const key of PATCH_FIELDS) {
    if (JSON.stringify(oldView[key]) !== JSON.stringify(newView[key])) {
      before[key] = oldView[key];
      after[key] = newView[key];
    }
  }
  let stale: { screeningStale: boolean; note: string | null } = { screeningStale: false, note: null };
  if (Object.keys(after).length) {
    await repo.update(event.id, { ...changes, updatedAt: clock.now() });
    await audit(m, clock, { userId, action: 'update', entity: 'fault_event', entityId: event.id, before, after, note: 'Fault corrected' });
    if ('occurredAt' in after) await refreshUnitLastEvent(m, clock, event.unitId);
    const moved = await staleScreening(m, clock, event.id, caseBefore, userId, 'A correction of the fault');
    stale = { screeningStale: moved.screeningStale, note: moved.note };
  }
  const fresh = await repo.findOneByOrFail({ id: event.id });
  const unit = await m.getRepository(Unit).findOneOrFail({ where: { id: fresh.unitId }, relations: { design: true } });
  return { ...eventView(fresh), throughFault: await eventThroughFault(m, fresh, unit), ...stale } satisfies CorrectedEvent;
}
