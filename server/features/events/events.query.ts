import { In, LessThan, Not, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { Recommendation } from '../../../shared/schemas/enums.js';
import type { eventListQuerySchema } from '../../../shared/schemas/fleet.js';
import type { EventDetail, EventListPage, EventView } from '../../../shared/schemas/responses/index.js';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import { auditSentence, type AuditWordsContext } from '../../../shared/audit-words.js';
import { sessionInSentence } from '../../../shared/session-name.js';
import { dutyWithPriorFaults } from '../../../shared/screening/duty-history.js';
import { notFound } from '../../common/app-error.js';
import { AuditEntry } from '../../common/audit-entry.entity.js';
import { Attachment } from '../attachments/attachment.entity.js';
import { attachmentView } from '../attachments/attachments.service.js';
import { designView } from '../designs/designs.service.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { loadCaseReadingSets } from '../readings/readings.service.js';
import { SweepTrace } from '../readings/sweep-trace.entity.js';
import { sweepMeta } from '../readings/sweeps.service.js';
import { Decision } from '../screenings/decision.entity.js';
import { Finding } from '../screenings/finding.entity.js';
import { FollowUp } from '../screenings/follow-up.entity.js';
import { Notification } from '../notifications/notification.entity.js';
import { Screening } from '../screenings/screening.entity.js';
import { Unit } from '../units/unit.entity.js';
import { readingSetConditions, unitView } from '../units/units.service.js';
import { User } from '../users/user.entity.js';
import { caseFault, casePriorFault, caseUnit } from './case-export.service.js';
import { FaultEvent } from './fault-event.entity.js';

export function eventView(e: FaultEvent) {
  return {
    id: e.id,
    unitId: e.unitId,
    occurredAt: e.occurredAt.toISOString(),
    type: e.type,
    faultedPhases: e.faultedPhases,
    side: e.side,
    location: e.location,
    currentIs: e.currentIs,
    shots: e.shots,
    transformerTripped: e.transformerTripped,
    protectionOperated: e.protectionOperated,
    notes: e.notes,
    status: e.status,
    createdById: e.createdById,
    createdAt: e.createdAt.toISOString(),
  } satisfies EventView;
}

/** The event's through-fault duty (with the unit's earlier faults counted), as the engine computes it. */
export async function eventThroughFault(m: EntityManager, e: FaultEvent, unit: Unit) {
  return (await eventDuty(m, e, unit)).throughFault;
}

/** The event's duty with its earlier faults, and the same inputs in the case format (the duty curve is drawn from them). */
async function eventDuty(m: EntityManager, e: FaultEvent, unit: Unit) {
  const prior = await m.getRepository(FaultEvent).find({ where: { unitId: e.unitId, occurredAt: LessThan(e.occurredAt), id: Not(e.id) }, order: { occurredAt: 'ASC', id: 'ASC' } });
  const priorFaults = prior.map((p) => ({ id: p.id, ...casePriorFault(p) }));
  const dutyCase = { unit: caseUnit(unit), fault: caseFault(e), priorFaults: prior.map(casePriorFault) };
  return { throughFault: dutyWithPriorFaults(dutyCase.unit, dutyCase.fault, priorFaults, e.id), dutyCase };
}

const EVENT_SORT_COLUMNS: Record<string, string> = { occurredAt: 'e.occurredAt', serial: 'u.serial', status: 'e.status' };

/**
 * The event-list query of one page (exported so a test can EXPLAIN it): the event table through its indexes, the unit
 * table only when sorting by serial; unit, site and serial filters are subqueries on the unit table's indexes.
 */
export function eventListQuery(m: EntityManager, q: z.infer<typeof eventListQuerySchema>) {
  const qb = m.getRepository(FaultEvent).createQueryBuilder('e');
  const key = q.sort.replace(/^-/, '');
  const dir = q.sort.startsWith('-') ? 'DESC' : 'ASC';
  if (key === 'serial') qb.innerJoin('e.unit', 'u');
  if (q.status?.length) qb.andWhere('e.status IN (:...statuses)', { statuses: q.status });
  if (q.type?.length) qb.andWhere('e.type IN (:...types)', { types: q.type });
  if (q.unitId) qb.andWhere('e.unitId = :unitId', { unitId: q.unitId });
  if (q.siteId) qb.andWhere('e.unitId IN (SELECT su.id FROM unit su WHERE su.siteId = :siteId)', { siteId: q.siteId });
  if (q.q) qb.andWhere('e.unitId IN (SELECT qu.id FROM unit qu WHERE qu.serial LIKE :serial)', { serial: `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
  if (q.from) qb.andWhere('e.occurredAt >= :from', { from: q.from });
  if (q.to) qb.andWhere('e.occurredAt <= :to', { to: q.to });
  if (q.withoutAttachments !== undefined) {
    qb.andWhere(`${q.withoutAttachments ? 'NOT ' : ''}EXISTS (SELECT 1 FROM attachment a WHERE a.ownerType = 'event' AND a.ownerId = e.id)`);
  }
  qb.orderBy(EVENT_SORT_COLUMNS[key], dir);
  // Within one serial or status, newest first; by time, the id breaks ties the same way.
  if (key === 'occurredAt') qb.addOrderBy('e.id', dir);
  else qb.addOrderBy('e.occurredAt', 'DESC').addOrderBy('e.id', 'DESC');
  qb.offset((q.page - 1) * q.pageSize).limit(q.pageSize);
  return qb;
}

/** One page of events, newest first by default, filtered (unit serial, site, unit, statuses, fault types, dates, relay records) and sorted; each with its unit, site and newest recommendation. */
export async function listEvents(m: EntityManager, q: z.infer<typeof eventListQuerySchema>) {
  const [events, total] = await eventListQuery(m, q).getManyAndCount();
  const units = events.length ? await m.getRepository(Unit).find({ where: { id: In([...new Set(events.map((e) => e.unitId))]) }, relations: { site: true } }) : [];
  const unit = new Map(units.map((u) => [u.id, u]));
  const latest: { eventId: number; recommendation: Recommendation }[] = events.length
    ? await m.query(
        'SELECT s.eventId, s.recommendation FROM screening s JOIN (SELECT eventId, MAX(id) AS id FROM screening WHERE comparison = 0 AND eventId IN (?) GROUP BY eventId) m ON m.id = s.id',
        [events.map((e) => e.id)],
      )
    : [];
  const rec = new Map(latest.map((r) => [Number(r.eventId), r.recommendation]));
  return {
    items: events.map((e) => {
      const u = unit.get(e.unitId)!;
      return { ...eventView(e), unitSerial: u.serial, siteId: u.siteId, siteName: u.site.name, siteTimeZone: u.site.timeZone, siteLocale: u.site.locale, recommendation: rec.get(e.id) ?? null };
    }),
    total,
    page: q.page,
    pageSize: q.pageSize,
  } satisfies EventListPage;
}

/** An event with its unit, duty, sessions (values and sweeps), screenings (newest first), decision, follow-ups, findings, attachments and audit trail. */
export async function getEvent(m: EntityManager, id: number) {
  const e = await m.getRepository(FaultEvent).findOne({ where: { id } });
  if (!e) throw notFound('Event');
  const unit = await m.getRepository(Unit).findOneOrFail({ where: { id: e.unitId }, relations: { site: true, design: true } });
  const sessions = await m.getRepository(ReadingSet).find({ where: { eventId: id }, order: { takenAt: 'ASC', id: 'ASC' } });
  const values = await loadCaseReadingSets(m, sessions);
  const sweeps = sessions.length ? await m.getRepository(SweepTrace).find({ where: { readingSetId: In(sessions.map((s) => s.id)) }, order: { id: 'ASC' } }) : [];
  const screenings = await m.getRepository(Screening).find({ where: { eventId: id }, order: { computedAt: 'DESC', id: 'DESC' } });
  const decisions = screenings.length ? await m.getRepository(Decision).find({ where: { screeningId: In(screenings.map((s) => s.id)) }, order: { signedAt: 'DESC', id: 'DESC' } }) : [];
  const followUps = await m.getRepository(FollowUp).find({ where: { eventId: id }, order: { dueAt: 'ASC', id: 'ASC' } });
  const findings = await m.getRepository(Finding).find({ where: { eventId: id }, order: { recordedAt: 'ASC', id: 'ASC' } });
  const notifications = await m.getRepository(Notification).find({ where: { eventId: id }, order: { id: 'DESC' }, take: 200 });
  const attachments = await m.getRepository(Attachment).find({ where: { ownerType: 'event', ownerId: id }, order: { id: 'ASC' } });
  const findingFiles = findings.length ? await m.getRepository(Attachment).find({ where: { ownerType: 'finding', ownerId: In(findings.map((f) => f.id)) }, order: { id: 'ASC' } }) : [];
  const auditRows = await m.getRepository(AuditEntry).find({
    where: [
      { entity: 'fault_event', entityId: String(id) },
      ...(sessions.length ? [{ entity: 'reading_set', entityId: In(sessions.map((s) => String(s.id))) }] : []),
      ...(screenings.length ? [{ entity: 'screening', entityId: In(screenings.map((s) => String(s.id))) }] : []),
      ...(followUps.length ? [{ entity: 'follow_up', entityId: In(followUps.map((f) => String(f.id))) }] : []),
      ...(findings.length ? [{ entity: 'finding', entityId: In(findings.map((f) => String(f.id))) }] : []),
      ...(attachments.length + findingFiles.length ? [{ entity: 'attachment', entityId: In([...attachments, ...findingFiles].map((a) => String(a.id))) }] : []),
    ],
    order: { at: 'ASC', id: 'ASC' },
    take: 500,
  });
  const userIds = [...new Set([e.createdById, ...sessions.map((s) => s.createdById), ...screenings.map((s) => s.computedById), ...decisions.map((d) => d.managerId), ...decisions.map((d) => d.restrictionsLiftedById), ...followUps.map((f) => f.closedById), ...findings.map((f) => f.recordedById), ...auditRows.map((a) => a.userId)].filter((x): x is number => typeof x === 'number'))];
  const users = userIds.length ? await m.getRepository(User).find({ where: { id: In(userIds) } }) : [];
  const people = Object.fromEntries(users.map((u) => [u.id, { id: u.id, name: u.name, email: u.email }]));
  // The audit trail in words: people by name, sessions by time and tester, follow-ups by task, on the site's clock.
  const zone = unit.site.timeZone;
  const auditWords: AuditWordsContext = {
    timeZone: zone,
    person: (uid) => people[uid]?.name,
    readingSet: (sid) => {
      const s = sessions.find((x) => String(x.id) === sid);
      return s ? sessionInSentence({ takenAt: s.takenAt.toISOString(), createdById: s.createdById }, zone, (uid) => (uid != null ? people[uid]?.name : null)) : null;
    },
    followUp: (fid) => followUps.find((f) => String(f.id) === fid)?.task,
  };
  return {
    ...eventView(e),
    unit: { ...unitView(unit), site: { id: unit.site.id, name: unit.site.name, timeZone: unit.site.timeZone, locale: unit.site.locale }, design: designView(unit.design) },
    ...(await eventDuty(m, e, unit)),
    sessions: sessions.map((s) => ({ ...readingSetConditions(s), values: values.get(s.id), sweeps: sweeps.filter((t) => t.readingSetId === s.id).map(sweepMeta) })),
    screenings: screenings.map((s) => ({
      id: s.id,
      recommendation: s.recommendation,
      criteriaVersion: s.criteriaVersion,
      comparison: s.comparison,
      computedById: s.computedById,
      computedAt: s.computedAt.toISOString(),
      result: s.result as unknown as GapsightResult,
    })),
    decision: decisions[0]
      ? {
          id: decisions[0].id,
          screeningId: decisions[0].screeningId,
          managerId: decisions[0].managerId,
          outcome: decisions[0].outcome,
          restrictions: decisions[0].restrictions,
          reason: decisions[0].reason,
          againstRecommendation: decisions[0].againstRecommendation,
          signedAt: decisions[0].signedAt.toISOString(),
        }
      : null,
    decisions: decisions.map((d) => ({ id: d.id, screeningId: d.screeningId, managerId: d.managerId, outcome: d.outcome, restrictions: d.restrictions, reason: d.reason, againstRecommendation: d.againstRecommendation, signedAt: d.signedAt.toISOString() })),
    followUps: followUps.map((f) => ({ id: f.id, task: f.task, dueAt: f.dueAt?.toISOString() ?? null, closedAt: f.closedAt?.toISOString() ?? null, closedById: f.closedById, result: f.result })),
    findings: findings.map((f) => ({ id: f.id, classification: f.classification, text: f.text, recordedById: f.recordedById, recordedAt: f.recordedAt.toISOString(), attachments: findingFiles.filter((a) => a.ownerId === f.id).map(attachmentView) })),
    attachments: attachments.map(attachmentView),
    notifications: notifications.map((n) => ({
      id: n.id,
      screeningId: n.screeningId,
      kind: n.kind,
      to: n.to,
      subject: n.subject,
      status: n.status,
      attempts: n.attempts,
      lastError: n.lastError,
      sentAt: n.sentAt?.toISOString() ?? null,
      createdAt: n.createdAt.toISOString(),
    })),
    audit: auditRows.map((a) => ({
      id: a.id,
      at: a.at.toISOString(),
      userId: a.userId,
      action: a.action,
      entity: a.entity,
      entityId: a.entityId,
      before: a.before,
      after: a.after,
      highlighted: a.highlighted,
      note: a.note,
      summary: auditSentence(a, auditWords),
    })),
    people,
    energisedAt: e.energisedAt?.toISOString() ?? null,
    activeRestrictions: decisions[0]?.outcome === 'release-with-restrictions' && !decisions[0].restrictionsLiftedAt ? decisions[0].restrictions : null,
    restrictionsLifted: decisions[0]?.restrictionsLiftedAt
      ? { at: decisions[0].restrictionsLiftedAt.toISOString(), byId: decisions[0].restrictionsLiftedById, reason: decisions[0].restrictionsLiftReason ?? '' }
      : null,
  } satisfies EventDetail;
}
