// Writes the "Kestrel Valley Power" demo scenario inside the seed's transaction: sites, designs, units, baselines and
// routine tests, sweeps, and the three fault events with their sessions, screenings, decisions, finding and follow-ups.
// Every write goes through the same service functions the API uses (audited). The connection's clock is set to each
// step's instant (MariaDB `SET timestamp`), so audit entries and created/updated times read as the story happened;
// it is reset before the connection goes back to the pool.
import type { EntityManager } from 'typeorm';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import { screenCase } from '../../../shared/screening/index.js';
import { FOLLOW_UPS } from '../../../shared/screening/verdict.js';
import { audit } from '../../common/audit.js';
import { loadCriteria } from '../../features/criteria/criteria.service.js';
import { Design } from '../../features/designs/design.entity.js';
import { buildEventCase } from '../../features/events/case-export.service.js';
import { createEventRow, moveEvent } from '../../features/events/events.service.js';
import { FaultEvent } from '../../features/events/fault-event.entity.js';
import { Notification } from '../../features/notifications/notification.entity.js';
import { ReadingSet, type ReadingSetKind } from '../../features/readings/reading-set.entity.js';
import { insertReadingSet } from '../../features/readings/readings.service.js';
import { insertSweepTrace } from '../../features/readings/sweeps.service.js';
import { Decision } from '../../features/screenings/decision.entity.js';
import { Finding } from '../../features/screenings/finding.entity.js';
import { FollowUp } from '../../features/screenings/follow-up.entity.js';
import { Screening } from '../../features/screenings/screening.entity.js';
import { Site } from '../../features/sites/site.entity.js';
import { Unit } from '../../features/units/unit.entity.js';
import {
  DEMO_DESIGNS,
  DEMO_SITES,
  DEMO_UNITS,
  HISTORY_EVENT_SERIAL,
  RECENT_EVENT_SERIAL,
  demoSite,
  factoryBody,
  routineBody,
  routineDates,
  type FamilyKey,
  type ReadingBody,
} from './demo-fleet.js';
import {
  at,
  demoTimeline,
  historyEventBody,
  historySession,
  priorEventBody,
  priorGasSession,
  recentEventBody,
  recentSession1,
  recentSession2,
  repairedBody,
  sessionTraces,
  type DemoTimeline,
  type SweepState,
} from './demo-events.js';

export interface DemoUserIds {
  admin: number;
  protection: number;
  tester: number;
  manager: number;
  engineer: number;
}

/** Ids of what the scenario created (for the start log and the tests). */
export interface DemoScenarioResult {
  unitIds: Record<string, number>;
  priorEventId: number;
  historyEventId: number;
  recentEventId: number;
  timeline: DemoTimeline;
}

const MINUTE = 60e3;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

/** The transaction connection's clock: CURRENT_TIMESTAMP (row defaults, audit times) reads the story's instant. */
class StoryClock {
  constructor(private readonly m: EntityManager) {}

  /** Runs `fn` with the connection's clock at `when`. */
  async at<T>(when: Date, fn: () => Promise<T>): Promise<T> {
    await this.m.query('SET timestamp = ?', [when.getTime() / 1000]);
    return fn();
  }

  async reset(): Promise<void> {
    await this.m.query('SET timestamp = DEFAULT');
  }
}

export async function seedScenario(m: EntityManager, users: DemoUserIds, now: Date): Promise<DemoScenarioResult> {
  const clock = new StoryClock(m);
  try {
    return await writeScenario(m, users, now, clock);
  } finally {
    await clock.reset();
  }
}

async function writeScenario(m: EntityManager, users: DemoUserIds, now: Date, clock: StoryClock): Promise<DemoScenarioResult> {
  const t = demoTimeline(now);
  const { version: criteriaVersion, criteria } = await loadCriteria(m, 1);

  // ---------- sites, designs, units ----------
  const setupAt = t.setup;
  const siteIds: Record<string, number> = {};
  await clock.at(setupAt, async () => {
    for (const s of DEMO_SITES) {
      const existing = await m.getRepository(Site).findOne({ where: { name: s.name } });
      const id = existing ? existing.id : (await m.insert(Site, { name: s.name, timeZone: s.timeZone })).identifiers[0].id as number;
      siteIds[s.name] = id;
      if (!existing) await audit(m, { userId: users.admin, action: 'create', entity: 'site', entityId: id, after: { name: s.name, timeZone: s.timeZone }, note: 'demo data' });
    }
  });
  const designIds = {} as Record<FamilyKey, number>;
  await clock.at(setupAt, async () => {
    for (const d of Object.values(DEMO_DESIGNS)) {
      const row = {
        reference: d.reference,
        maker: d.maker,
        windings: d.windings,
        vectorGroup: d.vectorGroup,
        phases: d.phases,
        hvKV: d.hvKV,
        lvKV: d.lvKV,
        tvKV: null,
        coolingStages: d.coolingStages,
        impedancePercent: d.impedancePercent,
        impedanceBaseKVA: d.impedanceBaseKVA,
        conductor: d.conductor,
        requiredCapacitance: d.requiredCapacitance,
        notes: d.notes,
      };
      const existing = await m.getRepository(Design).findOne({ where: { reference: d.reference } });
      const id = existing ? existing.id : ((await m.insert(Design, row)).identifiers[0].id as number);
      designIds[d.key] = id;
      if (!existing) await audit(m, { userId: users.admin, action: 'create', entity: 'design', entityId: id, after: row, note: 'demo data' });
    }
  });
  const unitRows = DEMO_UNITS.map((u) => {
    const d = DEMO_DESIGNS[u.family];
    return {
      serial: u.serial,
      position: u.position,
      siteId: siteIds[u.site],
      designId: designIds[u.family],
      year: u.year,
      phases: d.phases,
      hvKV: d.hvKV,
      lvKV: d.lvKV,
      ratedKVA: d.impedanceBaseKVA,
      impedancePercent: d.impedancePercent,
      systemImpedancePercent: demoSite(u.site).systemImpedancePercent,
      conductor: d.conductor,
    };
  });
  const unitIds = await clock.at(setupAt, async () => {
    await m.insert(Unit, unitRows);
    const units = await m.getRepository(Unit).find({ where: unitRows.map((u) => ({ serial: u.serial })) });
    const ids = Object.fromEntries(units.map((u) => [u.serial, u.id])) as Record<string, number>;
    for (const row of unitRows) await audit(m, { userId: users.admin, action: 'create', entity: 'unit', entityId: ids[row.serial], after: row, note: 'demo data' });
    return ids;
  });

  // ---------- reading sets ----------
  // Factory results were entered from the makers' test reports when the fleet was set up; later sets on the day.
  let backEntered = 0;
  const addSet = async (serial: string, kind: ReadingSetKind, body: ReadingBody, userId: number, eventId: number | null = null): Promise<ReadingSet> => {
    const takenAt = new Date(body.takenAt);
    const enteredAt = takenAt < setupAt ? at(setupAt, ++backEntered * 20 * MINUTE) : at(takenAt, kind === 'routine' ? 16 * HOUR : 5 * HOUR);
    return clock.at(enteredAt, () => insertReadingSet(m, { unitId: unitIds[serial], kind, eventId, body, userId }));
  };
  const addTraces = async (setId: number, serial: string, state: SweepState, session: string, field: boolean, when: Date, userId: number) => {
    await clock.at(when, async () => {
      for (const tr of sessionTraces(serial, state, session, field)) {
        const freqs = tr.points.map((p) => p[0]);
        await insertSweepTrace(
          m,
          setId,
          {
            label: tr.label,
            testType: tr.testType,
            winding: tr.winding,
            phase: tr.phase,
            terminals: tr.terminals,
            tapPosition: tr.tapPosition,
            ...(tr.demagnetised === null ? {} : { demagnetised: tr.demagnetised }),
          },
          { points: tr.points, minHz: Math.min(...freqs), maxHz: Math.max(...freqs) },
          tr.fileName,
          userId,
        );
      }
    });
  };

  for (const u of DEMO_UNITS) {
    const factory = await addSet(u.serial, 'factory', factoryBody(u), users.tester);
    if (u.serial === RECENT_EVENT_SERIAL || u.serial === HISTORY_EVENT_SERIAL) {
      await addTraces(factory.id, u.serial, 'factory', 'factory', false, at(setupAt, (++backEntered) * 20 * MINUTE), users.tester);
    }
    const dates = routineDates(u, now);
    for (let k = 0; k < dates.length; k++) await addSet(u.serial, 'routine', routineBody(u, dates[k], k), users.tester);
  }

  // ---------- shared steps of an event's life ----------
  const move = (eventId: number, to: FaultEvent['status'], userId: number, what: string, when: Date) => clock.at(when, () => moveEvent(m, eventId, to, userId, what));

  const screen = async (eventId: number, when: Date): Promise<{ id: number; result: GapsightResult }> => {
    const c = await buildEventCase(m, eventId);
    const result = screenCase(c, criteria);
    const id = await clock.at(when, async () => {
      const repo = m.getRepository(Screening);
      const row = repo.create({
        eventId,
        case: c as Record<string, unknown>,
        result: result as unknown as Record<string, unknown>,
        recommendation: result.recommendation,
        criteriaVersion,
        comparison: false,
        computedById: users.tester,
        computedAt: when,
      });
      const sid = (await repo.save(row)).id;
      await audit(m, { userId: users.tester, action: 'screen', entity: 'screening', entityId: sid, after: { eventId, recommendation: result.recommendation, criteriaVersion, reasons: result.reasons } });
      return sid;
    });
    await move(eventId, 'screened', users.tester, 'A screening', when);
    const event = await m.getRepository(FaultEvent).findOneByOrFail({ id: eventId });
    await clock.at(when, () => m.update(Unit, event.unitId, { lastRecommendation: result.recommendation }));
    // The manager's mail went out after the screening (the outbox of those days is not kept: only the log row).
    await m.insert(Notification, {
      eventId,
      screeningId: id,
      to: 'manager@kestrel-valley.example',
      subject: `[Gapsight] ${result.recommendation.toUpperCase()}: ${(await m.getRepository(Unit).findOneByOrFail({ id: event.unitId })).serial} after the fault of ${event.occurredAt.toISOString().slice(0, 10)}`,
      status: 'sent',
      attempts: 1,
      sentAt: at(when, 2 * MINUTE),
      messageId: `<demo-screening-${id}@gapsight.invalid>`,
    });
    return { id, result };
  };

  const decide = async (
    eventId: number,
    screeningId: number,
    outcome: Decision['outcome'],
    reason: string,
    restrictions: string | null,
    when: Date,
  ): Promise<void> => {
    await clock.at(when, async () => {
      const id = (await m.insert(Decision, { screeningId, managerId: users.manager, outcome, restrictions, reason, againstRecommendation: false, signedAt: when })).identifiers[0].id as number;
      await audit(m, { userId: users.manager, action: 'decide', entity: 'decision', entityId: id, after: { eventId, screeningId, outcome, restrictions, reason } });
    });
    await move(eventId, outcome === 'hold' ? 'held' : 'released', users.manager, `Decision: ${outcome}`, when);
  };

  const followUp = async (eventId: number, task: string, dueAt: Date, createdAt: Date, closed?: { at: Date; result: string }): Promise<void> => {
    const id = await clock.at(createdAt, async () => {
      const fid = (await m.insert(FollowUp, { eventId, task, dueAt })).identifiers[0].id as number;
      await audit(m, { userId: users.manager, action: 'create', entity: 'follow_up', entityId: fid, after: { eventId, task, dueAt: dueAt.toISOString() } });
      return fid;
    });
    if (closed) {
      await clock.at(closed.at, async () => {
        await m.update(FollowUp, id, { closedAt: closed.at, closedById: users.manager, result: closed.result });
        await audit(m, { userId: users.manager, action: 'update', entity: 'follow_up', entityId: id, before: { closedAt: null }, after: { closedAt: closed.at.toISOString(), result: closed.result } });
      });
    }
  };

  const logEvent = async (body: Parameters<typeof createEventRow>[1]): Promise<number> => {
    const when = at(new Date(body.occurredAt), 40 * MINUTE);
    const event = await clock.at(when, () => createEventRow(m, body, users.protection));
    return event.id;
  };

  const session = async (serial: string, eventId: number, body: ReadingBody): Promise<ReadingSet> => {
    await move(eventId, 'testing', users.tester, 'A new post-fault session', new Date(body.takenAt));
    return addSet(serial, 'post-fault', body, users.tester, eventId);
  };

  // ---------- KVP-HX-T2, two years ago: a feeder fault, unit in service (duty-only path) ----------
  const hx2 = RECENT_EVENT_SERIAL;
  const priorEventId = await logEvent(priorEventBody(unitIds[hx2], t));
  await session(hx2, priorEventId, priorGasSession(t));
  const prior = await screen(priorEventId, t.priorScreening);
  await decide(priorEventId, prior.id, 'release', 'Unit stayed in service; fault below the mechanical segment (duty-only path) and the next-day oil sample shows no acetylene. Keep the gas follow-ups.', null, t.priorDecision);
  // The unit stayed in service: the samples count from the event (rules revision 2 wording).
  const priorFollowUps: { task: string; due: Date; result: string }[] = [
    { task: FOLLOW_UPS.gasNow, due: t.priorGasSample, result: 'The next-day sample of the post-fault session: C2H2 0 ppm, H2 +3 ppm against the routine sample. Normal.' },
    { task: FOLLOW_UPS.gas24hEvent, due: at(t.priorFault, DAY), result: 'Taken with the next-day sample: C2H2 0 ppm, H2 +3 ppm. Normal.' },
    { task: FOLLOW_UPS.gas1wEvent, due: at(t.priorFault, 7 * DAY), result: 'C2H2 0 ppm, H2 29 ppm, CO 412 ppm: in line with the routine trend.' },
    { task: FOLLOW_UPS.gas1mEvent, due: at(t.priorFault, 30 * DAY), result: 'C2H2 0 ppm; all gases within the unit\'s normal trend. Closed.' },
  ];
  for (const f of priorFollowUps) {
    if (!prior.result.followUps.includes(f.task)) continue;
    await followUp(priorEventId, f.task, f.due, t.priorDecision, { at: at(f.due, 6 * HOUR), result: f.result });
  }

  // ---------- KVP-MB-T1, about 14 months ago: high duty → no-go → hold → inspected → repaired → go → released ----------
  const mb1 = HISTORY_EVENT_SERIAL;
  const historyEventId = await logEvent(historyEventBody(unitIds[mb1], t));
  const hs = await session(mb1, historyEventId, historySession(t));
  await addTraces(hs.id, mb1, 'deformed', 'post-fault', true, at(t.historySession, 5 * HOUR), users.tester);
  const first = await screen(historyEventId, t.historyScreening1);
  await decide(
    historyEventId,
    first.id,
    'hold',
    'No-go: CL up and CHL down with the phase B reactance, excitation current and sweep all moved, and acetylene in the oil. Hold for internal inspection (untank).',
    null,
    t.historyHold,
  );
  await clock.at(t.historyFinding, async () => {
    const id = (
      await m.insert(Finding, {
        eventId: historyEventId,
        classification: 'deformation-confirmed',
        text: 'Untanked at the maker\'s works: the LV (inner) winding of phase B shows radial buckling inward (forced buckling) over about a third of its circumference, with six spacer columns displaced and two discs tilted near the top. LV windings A and C and all HV windings sound; clamping pressure found low on all three limbs. Remedy: new LV winding for phase B, all windings re-clamped, oil processed.',
        recordedById: users.engineer,
        recordedAt: t.historyFinding,
      })
    ).identifiers[0].id as number;
    await audit(m, { userId: users.engineer, action: 'create', entity: 'finding', entityId: id, after: { eventId: historyEventId, classification: 'deformation-confirmed' } });
  });
  // Back at site: commissioning tests (the new reference fingerprint), then the event's re-test.
  const commissioning = await addSet(mb1, 'commissioning', repairedBody(t, 'commissioning'), users.tester);
  await addTraces(commissioning.id, mb1, 'repaired', 'commissioning', true, at(t.repairCommissioning, 6 * HOUR), users.tester);
  const retest = await session(mb1, historyEventId, repairedBody(t, 'retest'));
  await addTraces(retest.id, mb1, 'repaired', 'retest', true, at(t.historyRetest, 5 * HOUR), users.tester);
  const second = await screen(historyEventId, t.historyScreening2);
  await decide(
    historyEventId,
    second.id,
    'release-with-restrictions',
    'Re-test after repair is back on the fingerprint (go). Release with restrictions until the gas follow-ups are clean.',
    'Load held at or below 40 MVA (ONAN rating) and auto-reclose on the Millbrook 33 kV feeders blocked until the 1-month oil sample is clean.',
    t.historyRelease,
  );
  const r = t.historyReenergised;
  await followUp(historyEventId, FOLLOW_UPS.gas24h, at(r, DAY), t.historyRelease, { at: at(r, DAY + 3 * HOUR), result: 'H2 6 ppm, CH4 1.4, C2H6 0.8, C2H4 0.4, C2H2 0, CO 24, CO2 230 ppm: no acetylene. Normal.' });
  await followUp(historyEventId, FOLLOW_UPS.gas1w, at(r, 7 * DAY), t.historyRelease, { at: at(r, 7 * DAY + 5 * HOUR), result: 'H2 9 ppm, CH4 2.0, C2H4 0.6, C2H2 0, CO 41 ppm: slow rise of CO as expected for new paper insulation. Normal.' });
  await followUp(historyEventId, FOLLOW_UPS.gas1m, at(r, 30 * DAY), t.historyRelease);
  await followUp(historyEventId, FOLLOW_UPS.sweepNextOutage, at(r, 180 * DAY), t.historyRelease);

  // ---------- KVP-HX-T2, three days ago: the event the demo screens (expected: conditional) ----------
  const recentEventId = await logEvent(recentEventBody(unitIds[hx2], t));
  await session(hx2, recentEventId, recentSession1(t));
  const s2 = await session(hx2, recentEventId, recentSession2(t));
  await addTraces(s2.id, hx2, 'factory', 'post-fault', true, at(t.recentSession2, 4 * HOUR), users.tester);
  // The fleet list's recommendation is the newest screening of the unit's last event: none yet for the recent one.
  await m.update(Unit, unitIds[hx2], { lastRecommendation: null });

  return { unitIds, priorEventId, historyEventId, recentEventId, timeline: t };
}
