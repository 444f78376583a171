import { In, type EntityManager } from 'typeorm';
import { daysOverdue, followUpDueRange } from '../../../shared/lists.js';
import type { FollowUpListQuery } from '../../../shared/schemas/fleet.js';
import type { FollowUpListPage } from '../../../shared/schemas/responses/index.js';
import type { Clock } from '../../common/clock.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { FollowUp } from '../screenings/follow-up.entity.js';
import { Unit } from '../units/unit.entity.js';

/**
 * The follow-up query of one page (exported so a test can EXPLAIN it): open follow-ups through the (closedAt, dueAt)
 * index; overdue most overdue first, this week soonest first, every open one newest due first (no due date last).
 */
export function followUpListQuery(m: EntityManager, now: Date, q: FollowUpListQuery) {
  const qb = m.getRepository(FollowUp).createQueryBuilder('f').where('f.closedAt IS NULL');
  const range = followUpDueRange(q.due, now);
  if (range.from) qb.andWhere('f.dueAt >= :from', { from: range.from });
  if (range.before) qb.andWhere('f.dueAt < :before', { before: range.before });
  if (q.siteId) {
    qb.andWhere('f.eventId IN (SELECT se.id FROM fault_event se INNER JOIN unit su ON su.id = se.unitId WHERE su.siteId = :siteId)', { siteId: q.siteId });
  }
  const dir = q.due === 'open' ? 'DESC' : 'ASC';
  qb.orderBy('f.dueAt', dir).addOrderBy('f.id', dir);
  qb.offset((q.page - 1) * q.pageSize).limit(q.pageSize);
  return qb;
}

/** One page of open follow-ups across events (a due bucket, optionally one site), each with its event, unit and site. */
export async function listFollowUps(m: EntityManager, clock: Clock, q: FollowUpListQuery) {
  const now = clock.now();
  const [rows, total] = await followUpListQuery(m, now, q).getManyAndCount();
  const events = rows.length ? await m.getRepository(FaultEvent).find({ where: { id: In([...new Set(rows.map((f) => f.eventId))]) } }) : [];
  const event = new Map(events.map((e) => [e.id, e]));
  const units = events.length ? await m.getRepository(Unit).find({ where: { id: In([...new Set(events.map((e) => e.unitId))]) }, relations: { site: true } }) : [];
  const unit = new Map(units.map((u) => [u.id, u]));
  return {
    items: rows.map((f) => {
      const e = event.get(f.eventId)!;
      const u = unit.get(e.unitId)!;
      return {
        id: f.id,
        task: f.task,
        dueAt: f.dueAt?.toISOString() ?? null,
        closedAt: f.closedAt?.toISOString() ?? null,
        closedById: f.closedById,
        result: f.result,
        eventId: e.id,
        eventStatus: e.status,
        eventOccurredAt: e.occurredAt.toISOString(),
        unitId: u.id,
        unitSerial: u.serial,
        siteId: u.siteId,
        siteName: u.site.name,
        siteTimeZone: u.site.timeZone,
        siteLocale: u.site.locale,
        daysOverdue: daysOverdue(f.dueAt, now, u.site.timeZone),
      };
    }),
    total,
    page: q.page,
    pageSize: q.pageSize,
  } satisfies FollowUpListPage;
}
