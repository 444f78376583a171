import { In, LessThan, type EntityManager } from 'typeorm';
import { parseCase } from '../../shared/schemas/case.js';
import { resultSchema } from '../../shared/schemas/result.js';
import { computeThroughFault } from '../../shared/screening/index.js';
import { notFound } from '../common/app-error.js';
import { caseUnit } from '../features/events/case-export.service.js';
import { FaultEvent } from '../features/events/fault-event.entity.js';
import { ReadingSet } from '../features/readings/reading-set.entity.js';
import { Screening } from '../features/screenings/screening.entity.js';
import { Unit } from '../features/units/unit.entity.js';
import { User } from '../features/users/user.entity.js';
import type { ScreeningReportData } from './report-data.js';
import { loadCriteria } from '../features/criteria/criteria.service.js';

/** Assembles what the e-mail and the PDF say about a stored screening. */
export async function loadReportData(m: EntityManager, screeningId: number, appUrl: string): Promise<ScreeningReportData> {
  const s = await m.getRepository(Screening).findOne({ where: { id: screeningId } });
  if (!s) throw notFound('Screening');
  const event = await m.getRepository(FaultEvent).findOneOrFail({ where: { id: s.eventId } });
  const unit = await m.getRepository(Unit).findOneOrFail({ where: { id: event.unitId }, relations: { site: true, design: true } });
  const sessions = await m.getRepository(ReadingSet).find({ where: { eventId: event.id } });
  const userIds = [...new Set([s.computedById, ...sessions.map((x) => x.createdById)].filter((x): x is number => typeof x === 'number'))];
  const users = userIds.length ? await m.getRepository(User).find({ where: { id: In(userIds) } }) : [];
  const person = (id: number | null) => {
    const u = users.find((x) => x.id === id);
    return u ? { name: u.name, email: u.email } : null;
  };
  const testers = [...new Set(sessions.map((x) => x.createdById))].map(person).filter((x): x is { name: string; email: string } => x !== null);

  // Earlier faults of the unit that reached the mechanical segment start ("the 2nd such fault since 2024").
  const prior = await m.getRepository(FaultEvent).find({ where: { unitId: unit.id, occurredAt: LessThan(event.occurredAt) }, order: { occurredAt: 'ASC' } });
  const cu = caseUnit(unit);
  const priorHigh = prior.filter((p) => computeThroughFault(cu, { occurredAt: p.occurredAt.toISOString(), type: p.type, side: p.side, shots: p.shots })?.highDuty);

  const parsedCase = parseCase(s.case);
  const parsedResult = resultSchema.safeParse(s.result);
  if (!parsedCase.ok || !parsedResult.success) throw new Error(`Stored screening ${s.id} does not validate`);
  return {
    screening: { id: s.id, computedAt: s.computedAt.toISOString(), criteriaVersion: s.criteriaVersion, comparison: s.comparison, computedBy: person(s.computedById) },
    event: {
      id: event.id,
      occurredAt: event.occurredAt.toISOString(),
      type: event.type,
      side: event.side,
      faultedPhases: event.faultedPhases,
      transformerTripped: event.transformerTripped,
      protectionOperated: event.protectionOperated,
      notes: event.notes,
      status: event.status,
      priorHighDutyCount: priorHigh.length,
      priorHighDutySince: priorHigh[0]?.occurredAt.toISOString() ?? null,
    },
    unit: {
      id: unit.id,
      serial: unit.serial,
      position: unit.position,
      ratedKVA: unit.ratedKVA,
      hvKV: unit.hvKV,
      lvKV: unit.lvKV,
      impedancePercent: unit.impedancePercent,
      designReference: unit.design.reference,
    },
    site: { name: unit.site.name, timeZone: unit.site.timeZone },
    testers,
    case: parsedCase.value,
    result: parsedResult.data,
    criteria: (await loadCriteria(m, s.criteriaVersion)).criteria,
    eventUrl: `${appUrl.replace(/\/$/, '')}/events/${event.id}`,
  };
}
