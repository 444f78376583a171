import type { EntityManager } from 'typeorm';
import type { EventBody } from '../../../shared/schemas/fleet.js';
import type { CreatedEvent } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { Screening } from '../screenings/screening.entity.js';
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
