import { In, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { decisionGoesAgainst, proposedFollowUpDueAt, recountedFollowUpDueAt, AGAINST_REASON_MIN, type DecisionBody, type findingBodySchema } from '../../../shared/schemas/screening.js';
import type { GapsightCase } from '../../../shared/schemas/case.js';
import type { ClosedFollowUp, DecisionAnswer, EnergisedAnswer, LiftedRestrictions, RecordedFinding, RunScreeningAnswer, ScreenedCaseAnswer } from '../../../shared/schemas/responses/index.js';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import { screenCase } from '../../../shared/screening/index.js';
import { formatInstant } from '../../../shared/format.js';
import { AppError, conflict, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { loadCriteria } from '../criteria/criteria.service.js';
import { buildEventCase } from '../events/case-export.service.js';
import { assertMove, moveEvent, refreshUnitLastEvent } from '../events/events.service.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { queueDecisionMail, queueScreeningMail } from '../notifications/notifications.service.js';
import { Unit } from '../units/unit.entity.js';
import { Decision } from './decision.entity.js';
import { Finding } from './finding.entity.js';
import { FollowUp } from './follow-up.entity.js';
import { Screening } from './screening.entity.js';

/** Screens a case as given, with the newest published criteria set; nothing is stored. */
export async function previewScreening(m: EntityManager, c: GapsightCase): Promise<GapsightResult> {
  const { criteria } = await loadCriteria(m);
  return screenCase(c, criteria);
}

/** An engineer runs comparison screenings only; a normal run needs the tester, manager or admin role. */
/** The case a stored screening judged, with its screening's id, version and time. */
export async function screenedCase(m: EntityManager, screeningId: number): Promise<ScreenedCaseAnswer> {
  const s = await m.getRepository(Screening).findOne({ where: { id: screeningId } });
  if (!s) throw notFound('Screening');
  return { screeningId: s.id, eventId: s.eventId, criteriaVersion: s.criteriaVersion, computedAt: s.computedAt.toISOString(), case: s.case as unknown as GapsightCase };
}

export function assertMayRunScreening(roles: readonly string[], comparison: boolean): void {
  if (comparison || roles.some((r) => r === 'tester' || r === 'manager' || r === 'admin')) return;
  throw new AppError('forbidden', 'Engineers may run comparison screenings only; a normal screening needs a tester or a manager.', 403);
}

/**
 * Screens an event from its stored readings. A normal run moves the event to `screened`, records the unit's latest
 * recommendation and queues the managers' mail (`mailsQueued`: the caller kicks the worker once committed); a
 * comparison run, under any criteria version, stores its result and changes nothing else.
 */
export async function runScreening(m: EntityManager, clock: Clock, userId: number, eventId: number, body: { criteriaVersion?: number; comparison: boolean }) {
  const event = await m.getRepository(FaultEvent).findOne({ where: { id: eventId }, lock: { mode: 'pessimistic_write' } });
  if (!event) throw notFound('Event');
  if (!body.comparison) assertMove(event, 'screened', 'A screening');
  const criteria = await loadCriteria(m, body.criteriaVersion);
  if (!body.comparison && criteria.status !== 'published') {
    throw new AppError('invalid_input', 'Some fields are invalid.', 400, { criteriaVersion: `version ${criteria.version} is a draft: run it as a comparison` });
  }
  const caseDoc = await buildEventCase(m, eventId);
  const result = screenCase(caseDoc, criteria.criteria);
  const repo = m.getRepository(Screening);
  const s = await repo.save(
    repo.create({
      eventId,
      case: caseDoc as unknown as Record<string, unknown>,
      result: result as unknown as Record<string, unknown>,
      recommendation: result.recommendation,
      criteriaVersion: criteria.version,
      comparison: body.comparison,
      computedById: userId,
      computedAt: clock.now(),
    }),
  );
  await audit(m, clock, {
    userId,
    action: 'screen',
    entity: 'screening',
    entityId: s.id,
    after: { eventId, recommendation: result.recommendation, criteriaVersion: criteria.version, comparison: body.comparison, missing: result.missing, unreliable: result.unreliable },
  });
  let queued = 0;
  if (!body.comparison) {
    await moveEvent(m, clock, eventId, 'screened', userId, 'A screening');
    const unit = await m.getRepository(Unit).findOneByOrFail({ id: event.unitId });
    await refreshUnitLastEvent(m, clock, unit.id);
    queued = await queueScreeningMail(m, clock, s, unit.siteId, unit.serial);
  }
  return { id: s.id, result, criteriaVersion: criteria.version, comparison: body.comparison, computedAt: s.computedAt.toISOString(), mailsQueued: queued } satisfies RunScreeningAnswer;
}

/** The manager's sign-off on the event's newest screening; moves the event to released or held; confirms follow-ups. */
export async function decide(m: EntityManager, clock: Clock, managerId: number, screeningId: number, body: DecisionBody) {
  const s = await m.getRepository(Screening).findOne({ where: { id: screeningId } });
  if (!s) throw notFound('Screening');
  const event = await m.getRepository(FaultEvent).findOne({ where: { id: s.eventId }, lock: { mode: 'pessimistic_write' } });
  if (!event) throw notFound('Event');
  if (s.comparison) throw conflict('A comparison screening is not a basis for a decision.');
  const newest = await m.getRepository(Screening).findOne({ where: { eventId: s.eventId, comparison: false }, order: { computedAt: 'DESC', id: 'DESC' } });
  if (newest?.id !== s.id) throw conflict(`A newer screening (${newest?.id}) exists: decide on that one.`);
  if (event.status !== 'screened') throw new AppError('invalid_status', `A decision is not possible while the event is ${event.status}.`, 409);
  const against = decisionGoesAgainst(s.recommendation, body.outcome);
  if (against && body.reason.length < AGAINST_REASON_MIN) {
    throw new AppError('invalid_input', 'Some fields are invalid.', 400, {
      reason: `going against the ${s.recommendation} recommendation needs a reason of at least ${AGAINST_REASON_MIN} characters`,
    });
  }
  const now = clock.now();
  const decision = await m.getRepository(Decision).save(
    m.getRepository(Decision).create({
      screeningId,
      managerId,
      outcome: body.outcome,
      restrictions: body.restrictions ?? null,
      reason: body.reason,
      againstRecommendation: against,
      signedAt: now,
    }),
  );
  await moveEvent(m, clock, event.id, body.outcome === 'hold' ? 'held' : 'released', managerId, 'A decision');
  const proposed = (s.result as unknown as GapsightResult).followUps ?? [];
  const tasks = body.followUps ?? (body.outcome === 'hold' ? [] : proposed.map((task) => ({ task, dueAt: proposedFollowUpDueAt(task, now, event.occurredAt) })));
  const followUps = [];
  for (const t of tasks) {
    const f = await m.getRepository(FollowUp).save(m.getRepository(FollowUp).create({ eventId: event.id, task: t.task, dueAt: t.dueAt ? new Date(t.dueAt) : null, createdAt: now }));
    await audit(m, clock, { userId: managerId, action: 'create', entity: 'follow_up', entityId: f.id, after: { eventId: event.id, task: f.task, dueAt: f.dueAt?.toISOString() ?? null } });
    followUps.push({ id: f.id, task: f.task, dueAt: f.dueAt?.toISOString() ?? null, closedAt: null, closedById: null, result: null });
  }
  const view = {
    id: decision.id,
    screeningId,
    managerId,
    outcome: decision.outcome,
    restrictions: decision.restrictions,
    reason: decision.reason,
    againstRecommendation: against,
    signedAt: decision.signedAt.toISOString(),
  };
  await audit(m, clock, {
    userId: managerId,
    action: 'decide',
    entity: 'fault_event',
    entityId: event.id,
    after: { ...view, recommendation: s.recommendation },
    highlighted: against,
    note: against ? `against the ${s.recommendation} recommendation` : undefined,
  });
  await queueDecisionMail(m, clock, decision, s);
  return { ...view, eventStatus: body.outcome === 'hold' ? 'held' : 'released', followUps } satisfies DecisionAnswer;
}

/** Closes a follow-up with its result (409 when already closed). */
export async function closeFollowUp(m: EntityManager, clock: Clock, userId: number, id: number, result: string) {
  const f = await m.getRepository(FollowUp).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
  if (!f) throw notFound('Follow-up');
  if (f.closedAt) throw conflict('This follow-up is already closed.');
  const before = { closedAt: null, result: null };
  f.closedAt = clock.now();
  f.closedById = userId;
  f.result = result;
  await m.getRepository(FollowUp).save(f);
  await audit(m, clock, { userId, action: 'update', entity: 'follow_up', entityId: id, before, after: { closedAt: f.closedAt.toISOString(), result } });
  return { id: f.id, eventId: f.eventId, task: f.task, dueAt: f.dueAt?.toISOString() ?? null, closedAt: f.closedAt.toISOString(), closedById: userId, result } satisfies ClosedFollowUp;
}

/** Records what an inspection found. */
export async function recordFinding(m: EntityManager, clock: Clock, userId: number, eventId: number, body: z.infer<typeof findingBodySchema>) {
  if (!(await m.getRepository(FaultEvent).exists({ where: { id: eventId } }))) throw notFound('Event');
  const f = await m.getRepository(Finding).save(m.getRepository(Finding).create({ eventId, classification: body.classification, text: body.text, recordedById: userId, recordedAt: clock.now() }));
  await audit(m, clock, { userId, action: 'create', entity: 'finding', entityId: f.id, after: { eventId, classification: f.classification, text: f.text } });
  return { id: f.id, eventId, classification: f.classification, text: f.text, recordedById: userId, recordedAt: f.recordedAt.toISOString() } satisfies RecordedFinding;
}

/** The event's newest decision (a released or held event has exactly one in force: the newest). */
async function newestDecision(m: EntityManager, eventId: number): Promise<Decision | null> {
  const screenings = await m.getRepository(Screening).find({ where: { eventId }, select: { id: true } });
  if (!screenings.length) return null;
  return m.getRepository(Decision).findOne({ where: { screeningId: In(screenings.map((s) => s.id)) }, order: { signedAt: 'DESC', id: 'DESC' } });
}

const followUpView = (f: FollowUp) => ({ id: f.id, task: f.task, dueAt: f.dueAt?.toISOString() ?? null, closedAt: f.closedAt?.toISOString() ?? null, closedById: f.closedById, result: f.result });

/**
 * Records when a released unit was re-energised (POST /api/events/:eventId/energised): not before the decision, not in
 * the future (409 naming `at`). Open follow-ups whose due date was counted from the decision (or from an earlier
 * re-energising) are counted again from `at`; each change audited.
 */
export async function recordEnergised(m: EntityManager, clock: Clock, userId: number, eventId: number, atText: string) {
  const event = await m.getRepository(FaultEvent).findOne({ where: { id: eventId }, lock: { mode: 'pessimistic_write' } });
  if (!event) throw notFound('Event');
  if (event.status !== 'released') throw new AppError('invalid_status', `Re-energising is recorded for a released unit; the event is ${event.status}.`, 409);
  const decision = await newestDecision(m, eventId);
  if (!decision) throw new AppError('invalid_status', 'The event has no decision.', 409);
  const at = new Date(atText);
  // Times are typed to the minute: any time in the minute of the signature counts as not before it.
  const signedMinute = Math.floor(decision.signedAt.getTime() / 60_000) * 60_000;
  if (at.getTime() < signedMinute) {
    const unit = await m.getRepository(Unit).findOne({ where: { id: event.unitId }, relations: { site: true } });
    throw new AppError('invalid_time', 'Some fields are invalid.', 409, {
      at: `before the decision, which was signed ${formatInstant(decision.signedAt.toISOString(), unit?.site?.timeZone ?? 'UTC')}`,
    });
  }
  if (at.getTime() > clock.now().getTime()) throw new AppError('invalid_time', 'Some fields are invalid.', 409, { at: 'in the future' });
  const from = event.energisedAt ?? decision.signedAt;
  const before = event.energisedAt?.toISOString() ?? null;
  await m.getRepository(FaultEvent).update(event.id, { energisedAt: at, updatedAt: clock.now() });
  await audit(m, clock, { userId, action: 'update', entity: 'fault_event', entityId: event.id, before: { energisedAt: before }, after: { energisedAt: at.toISOString() }, note: 'Re-energised' });
  const followUps = await m.getRepository(FollowUp).find({ where: { eventId }, order: { dueAt: 'ASC', id: 'ASC' } });
  for (const f of followUps) {
    if (f.closedAt) continue;
    const due = recountedFollowUpDueAt(f.task, f.dueAt?.toISOString() ?? null, from, at, event.occurredAt);
    if (due === null || due === f.dueAt?.toISOString()) continue;
    const old = f.dueAt?.toISOString() ?? null;
    f.dueAt = new Date(due);
    await m.getRepository(FollowUp).update(f.id, { dueAt: f.dueAt });
    await audit(m, clock, { userId, action: 'update', entity: 'follow_up', entityId: f.id, before: { dueAt: old }, after: { dueAt: due }, note: 'Counted from re-energising' });
  }
  followUps.sort((a, b) => (a.dueAt?.getTime() ?? Infinity) - (b.dueAt?.getTime() ?? Infinity) || a.id - b.id);
  return { eventId, energisedAt: at.toISOString(), followUps: followUps.map(followUpView) } satisfies EnergisedAnswer;
}

/** Lifts the restrictions of a release-with-restrictions decision (409 when there are none active); audited. */
export async function liftRestrictions(m: EntityManager, clock: Clock, userId: number, eventId: number, reason: string) {
  const event = await m.getRepository(FaultEvent).findOne({ where: { id: eventId }, lock: { mode: 'pessimistic_write' } });
  if (!event) throw notFound('Event');
  const decision = await newestDecision(m, eventId);
  if (!decision || decision.outcome !== 'release-with-restrictions' || decision.restrictionsLiftedAt) {
    throw new AppError('invalid_status', 'The event has no active restrictions to lift.', 409);
  }
  const now = clock.now();
  await m.getRepository(Decision).update(decision.id, { restrictionsLiftedAt: now, restrictionsLiftedById: userId, restrictionsLiftReason: reason });
  await audit(m, clock, {
    userId,
    action: 'update',
    entity: 'fault_event',
    entityId: event.id,
    before: { restrictions: decision.restrictions, restrictionsLiftedAt: null },
    after: { restrictionsLiftedAt: now.toISOString(), reason },
    note: 'Restrictions lifted',
  });
  return { eventId, decisionId: decision.id, restrictions: decision.restrictions ?? '', liftedAt: now.toISOString(), liftedById: userId, reason } satisfies LiftedRestrictions;
}

/** Restrictions not yet lifted, per unit (release-with-restrictions decisions; several joined, newest first). */
export async function activeRestrictionsByUnit(m: EntityManager, unitIds: number[]): Promise<Map<number, string>> {
  const out = new Map<number, string>();
  if (!unitIds.length) return out;
  const rows = await m
    .getRepository(Decision)
    .createQueryBuilder('d')
    .innerJoin(Screening, 's', 's.id = d.screeningId')
    .innerJoin(FaultEvent, 'e', 'e.id = s.eventId')
    .select(['e.unitId AS unitId', 'd.restrictions AS restrictions'])
    .where('d.outcome = :outcome', { outcome: 'release-with-restrictions' })
    .andWhere('d.restrictionsLiftedAt IS NULL')
    .andWhere('e.unitId IN (:...unitIds)', { unitIds })
    .orderBy('d.signedAt', 'DESC')
    .addOrderBy('d.id', 'DESC')
    .getRawMany<{ unitId: number; restrictions: string | null }>();
  for (const r of rows) {
    if (!r.restrictions) continue;
    const id = Number(r.unitId);
    out.set(id, out.has(id) ? `${out.get(id)}; ${r.restrictions}` : r.restrictions);
  }
  return out;
}
