import { In, LessThan, Not, type EntityManager, type ObjectLiteral, type SelectQueryBuilder } from 'typeorm';
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

type EventFields = Pick<FaultEvent, 'id' | 'unitId' | 'occurredAt' | 'type' | 'faultedPhases' | 'side' | 'location' | 'currentIs' | 'shots' | 'transformerTripped' | 'protectionOperated' | 'notes' | 'status' | 'createdById' | 'createdAt'>;

/** The event's own record as the API shows it, from the entity or a raw row's fields (eventViewOfRow). */
export function eventView(e: EventFields) {
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

type EventListQuery = z.infer<typeof eventListQuerySchema>;

/** The list's filters on the event table under `alias` (the page and its count apply the same ones). */
function eventFilters<T extends ObjectLiteral>(qb: SelectQueryBuilder<T>, alias: string, q: EventListQuery): SelectQueryBuilder<T> {
  const e = alias;
  if (q.status?.length) qb.andWhere(`${e}.status IN (:...statuses)`, { statuses: q.status });
  if (q.type?.length) qb.andWhere(`${e}.type IN (:...types)`, { types: q.type });
  if (q.unitId) qb.andWhere(`${e}.unitId = :unitId`, { unitId: q.unitId });
  if (q.siteId) qb.andWhere(`${e}.unitId IN (SELECT su.id FROM unit su WHERE su.siteId = :siteId)`, { siteId: q.siteId });
  if (q.q) qb.andWhere(`${e}.unitId IN (SELECT qu.id FROM unit qu WHERE qu.serial LIKE :serial)`, { serial: `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
  if (q.from) qb.andWhere(`${e}.occurredAt >= :from`, { from: q.from });
  if (q.to) qb.andWhere(`${e}.occurredAt <= :to`, { to: q.to });
  if (q.withoutAttachments !== undefined) {
    qb.andWhere(`${q.withoutAttachments ? 'NOT ' : ''}EXISTS (SELECT 1 FROM attachment a WHERE a.ownerType = 'event' AND a.ownerId = ${e}.id)`);
  }
  return qb;
}

/** The columns of an event's own record (EventView) under `e`, as raw columns of the same names. */
export const EVENT_VIEW_COLUMNS = ['id', 'unitId', 'occurredAt', 'type', 'faultedPhases', 'side', 'location', 'currentIs', 'shots', 'transformerTripped', 'protectionOperated', 'notes', 'status', 'createdById', 'createdAt'].map(
  (c) => `e.${c} AS ${c}`,
);

/** A raw row of EVENT_VIEW_COLUMNS as the API shows the event (JSON and boolean columns read as TypeORM reads them). */
export function eventViewOfRow(r: Record<string, unknown>): EventView {
  const json = <T>(v: unknown) => (typeof v === 'string' ? (JSON.parse(v) as T) : (v as T));
  return eventView({
    id: Number(r.id),
    unitId: Number(r.unitId),
    occurredAt: new Date(r.occurredAt as Date),
    type: r.type as FaultEvent['type'],
    faultedPhases: (r.faultedPhases as FaultEvent['faultedPhases']) ?? null,
    side: r.side as FaultEvent['side'],
    location: (r.location as FaultEvent['location']) ?? null,
    currentIs: (r.currentIs as FaultEvent['currentIs']) ?? null,
    shots: json<FaultEvent['shots']>(r.shots),
    transformerTripped: Boolean(r.transformerTripped),
    protectionOperated: json<FaultEvent['protectionOperated']>(r.protectionOperated),
    notes: (r.notes as string | null) ?? null,
    status: r.status as FaultEvent['status'],
    createdById: r.createdById === null || r.createdById === undefined ? null : Number(r.createdById),
    createdAt: new Date(r.createdAt as Date),
  });
}

/**
 * The event-list query of one page (exported so a test can EXPLAIN it): the event table through its indexes, its unit
 * and site by primary key (a subquery), the newest recommendation of each event (a subquery on the screening index).
 * Unit, site and serial filters are subqueries on the unit table's indexes.
 */
export function eventListQuery(m: EntityManager, q: EventListQuery) {
  const qb = m.getRepository(FaultEvent).createQueryBuilder('e');
  const key = q.sort.replace(/^-/, '');
  const dir = q.sort.startsWith('-') ? 'DESC' : 'ASC';
  if (key === 'serial') qb.innerJoin('e.unit', 'u');
  qb.select(EVENT_VIEW_COLUMNS);
  // The unit's serial and site by primary key (a subquery, so the event table alone drives the plan).
  qb.addSelect(
    "(SELECT JSON_OBJECT('serial', ru.serial, 'siteId', ru.siteId, 'name', rs.name, 'timeZone', rs.timeZone, 'locale', rs.locale) FROM unit ru INNER JOIN site rs ON rs.id = ru.siteId WHERE ru.id = e.unitId)",
    'unit',
  );
  qb.addSelect('(SELECT sc.recommendation FROM screening sc WHERE sc.id = (SELECT MAX(sm.id) FROM screening sm WHERE sm.eventId = e.id AND sm.comparison = 0))', 'recommendation');
  eventFilters(qb, 'e', q);
  qb.orderBy(EVENT_SORT_COLUMNS[key], dir);
  // Within one serial or status, newest first; by time, the id breaks ties the same way.
  if (key === 'occurredAt') qb.addOrderBy('e.id', dir);
  else qb.addOrderBy('e.occurredAt', 'DESC').addOrderBy('e.id', 'DESC');
  qb.offset((q.page - 1) * q.pageSize).limit(q.pageSize);
  return qb;
}

/** One page of events, newest first by default, filtered (unit serial, site, unit, statuses, fault types, dates, relay records) and sorted; each with its unit, site and newest recommendation. */
export async function listEvents(m: EntityManager, q: EventListQuery) {
  // The page and, in the same round trip, the number of events matching the filters (an uncorrelated subquery,
  // evaluated once: the filters' index where one applies, as a separate count would).
  const rows = await eventListQuery(m, q)
    .addSelect((sub) => eventFilters(sub.select('COUNT(*)').from(FaultEvent, 'ce'), 'ce', q), 'total')
    .getRawMany<Record<string, unknown>>();
  // A page past the end has no row to carry the total: count alone then.
  const total = rows.length ? Number(rows[0].total) : q.page === 1 ? 0 : await eventFilters(m.getRepository(FaultEvent).createQueryBuilder('ce'), 'ce', q).getCount();
  return {
    items: rows.map((r) => {
      const u = (typeof r.unit === 'string' ? JSON.parse(r.unit) : r.unit) as { serial: string; siteId: number; name: string; timeZone: string; locale: string | null };
      return {
        ...eventViewOfRow(r),
        unitSerial: u.serial,
        siteId: Number(u.siteId),
        siteName: u.name,
        siteTimeZone: u.timeZone,
        siteLocale: u.locale ?? null,
        recommendation: (r.recommendation as Recommendation | null) ?? null,
      };
    }),
    total,
    page: q.page,
    pageSize: q.pageSize,
  } satisfies EventListPage;
}

/** An event with its unit, duty, sessions (values and sweeps), screenings (newest first), decision, follow-ups, findings, attachments and audit trail. */
export async function getEvent(m: EntityManager, id: number) {
  // The event with its unit, site and design in one query; then everything that hangs on the event id, at once.
  const e = await m.getRepository(FaultEvent).createQueryBuilder('e').innerJoinAndSelect('e.unit', 'u').innerJoinAndSelect('u.site', 's').innerJoinAndSelect('u.design', 'd').where('e.id = :id', { id }).getOne();
  if (!e) throw notFound('Event');
  const unit = e.unit;
  const [sessions, screenings, decisions, followUps, findings, notifications, files, duty] = await Promise.all([
    m.getRepository(ReadingSet).find({ where: { eventId: id }, order: { takenAt: 'ASC', id: 'ASC' } }),
    m.getRepository(Screening).find({ where: { eventId: id }, order: { computedAt: 'DESC', id: 'DESC' } }),
    // The decisions on the event's screenings (the screening table's event index, then the decision's unique screening).
    m.getRepository(Decision).createQueryBuilder('dc').innerJoin(Screening, 'sc', 'sc.id = dc.screeningId').where('sc.eventId = :id', { id }).orderBy('dc.signedAt', 'DESC').addOrderBy('dc.id', 'DESC').getMany(),
    m.getRepository(FollowUp).find({ where: { eventId: id }, order: { dueAt: 'ASC', id: 'ASC' } }),
    m.getRepository(Finding).find({ where: { eventId: id }, order: { recordedAt: 'ASC', id: 'ASC' } }),
    m.getRepository(Notification).find({ where: { eventId: id }, order: { id: 'DESC' }, take: 200 }),
    // The event's relay records and its findings' files in one query.
    m
      .getRepository(Attachment)
      .createQueryBuilder('a')
      .where("a.ownerType = 'event' AND a.ownerId = :id", { id })
      .orWhere("a.ownerType = 'finding' AND a.ownerId IN (SELECT f.id FROM finding f WHERE f.eventId = :id)", { id })
      .orderBy('a.id', 'ASC')
      .getMany(),
    eventDuty(m, e, unit),
  ]);
  const attachments = files.filter((a) => a.ownerType === 'event');
  const findingFiles = files.filter((a) => a.ownerType === 'finding');
  const [values, sweeps, auditRows] = await Promise.all([
    loadCaseReadingSets(m, sessions),
    sessions.length ? m.getRepository(SweepTrace).find({ where: { readingSetId: In(sessions.map((s) => s.id)) }, order: { id: 'ASC' } }) : [],
    m.getRepository(AuditEntry).find({
      where: [
        { entity: 'fault_event', entityId: String(id) },
        ...(sessions.length ? [{ entity: 'reading_set', entityId: In(sessions.map((s) => String(s.id))) }] : []),
        ...(screenings.length ? [{ entity: 'screening', entityId: In(screenings.map((s) => String(s.id))) }] : []),
        ...(followUps.length ? [{ entity: 'follow_up', entityId: In(followUps.map((f) => String(f.id))) }] : []),
        ...(findings.length ? [{ entity: 'finding', entityId: In(findings.map((f) => String(f.id))) }] : []),
        ...(files.length ? [{ entity: 'attachment', entityId: In(files.map((a) => String(a.id))) }] : []),
      ],
      order: { at: 'ASC', id: 'ASC' },
      take: 500,
    }),
  ]);
  const userIds = [...new Set([e.createdById, ...sessions.map((s) => s.createdById), ...screenings.map((s) => s.computedById), ...decisions.map((d) => d.managerId), ...decisions.map((d) => d.restrictionsLiftedById), ...followUps.map((f) => f.closedById), ...findings.map((f) => f.recordedById), ...auditRows.map((a) => a.userId)].filter((x): x is number => typeof x === 'number'))];
  const users = userIds.length ? await m.getRepository(User).find({ select: { id: true, name: true, email: true }, where: { id: In(userIds) } }) : [];
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
    ...duty,
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
