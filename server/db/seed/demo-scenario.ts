// Writes the "Kestrel Valley Power" demo scenario inside the seed's transaction: sites, designs, units, baselines and
// routine tests, sweeps, and the three fault events with their sessions, screenings, decisions, finding and follow-ups.
// Every write goes through the service the API route calls, with its body checked by the route's schema, and a fixed
// clock set to each step's instant: rows, their times and their audit entries are what the app writes at that time.
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { GapsightResult } from '../../../shared/schemas/result.js';
import { decisionBodySchema, findingBodySchema, followUpCloseSchema, type DecisionBody } from '../../../shared/schemas/screening.js';
import { designBodySchema, eventBodySchema, readingSetBodySchema, sessionBodySchema, siteBodySchema, unitBodySchema, type EventBody } from '../../../shared/schemas/fleet.js';
import { FOLLOW_UPS } from '../../../shared/screening/verdict.js';
import type { FixedClock } from '../../common/clock.js';
import { Design } from '../../features/designs/design.entity.js';
import { createDesign } from '../../features/designs/designs.service.js';
import { logEvent } from '../../features/events/events.service.js';
import { addSessionSweep, createSession } from '../../features/events/sessions.service.js';
import { Notification } from '../../features/notifications/notification.entity.js';
import { recordMailSent } from '../../features/notifications/notifications.service.js';
import type { ReadingSetKind } from '../../features/readings/reading-set.entity.js';
import type { SweepFields } from '../../features/readings/sweeps.service.js';
import { closeFollowUp, decide as decideService, recordFinding, runScreening } from '../../features/screenings/screenings.service.js';
import { Site } from '../../features/sites/site.entity.js';
import { createSite } from '../../features/sites/sites.service.js';
import { addUnitReadingSet, addUnitSweep, createUnit } from '../../features/units/units.service.js';
import { buildManagerMail } from '../../reports/manager-mail.js';
import { loadReportData } from '../../reports/report-data.service.js';
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

/** A body as the route takes it: parsed by the route's schema (defaults filled, bad demo data fails loudly). */
const asRoute = <S extends z.ZodType>(schema: S, value: unknown): z.output<S> => schema.parse(value);

/** A demo design without the demo's own keys (key, tap, nominal readings). */
const designFieldsOf = ({ key: _key, tap: _tap, nominal: _nominal, ...design }: (typeof DEMO_DESIGNS)[keyof typeof DEMO_DESIGNS]) => design;

export async function seedScenario(m: EntityManager, clock: FixedClock, users: DemoUserIds, now: Date): Promise<DemoScenarioResult> {
  const t = demoTimeline(now);

  // ---------- sites, designs, units ----------
  const setupAt = t.setup;
  clock.set(setupAt);
  const siteIds: Record<string, number> = {};
  for (const s of DEMO_SITES) {
    const existing = await m.getRepository(Site).findOne({ where: { name: s.name } });
    siteIds[s.name] = existing ? existing.id : (await createSite(m, clock, users.admin, asRoute(siteBodySchema, { name: s.name, timeZone: s.timeZone }))).id;
  }
  const designIds = {} as Record<FamilyKey, number>;
  for (const d of Object.values(DEMO_DESIGNS)) {
    const existing = await m.getRepository(Design).findOne({ where: { reference: d.reference } });
    designIds[d.key] = existing
      ? existing.id
      : (
          await createDesign(
            m,
            clock,
            users.admin,
            // The design's own fields only: the body schema refuses unknown keys (the demo's key, tap, nominal readings).
            asRoute(designBodySchema, designFieldsOf(d)),
          )
        ).id;
  }
  const unitIds: Record<string, number> = {};
  for (const u of DEMO_UNITS) {
    const d = DEMO_DESIGNS[u.family];
    const body = asRoute(unitBodySchema, {
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
    });
    unitIds[u.serial] = (await createUnit(m, clock, users.admin, body)).id;
  }

  // ---------- reading sets ----------
  // Factory results were entered from the makers' test reports when the fleet was set up; routine sets later that day;
  // commissioning sets five hours after the tests; post-fault sessions an hour after they were taken.
  let backEntered = 0;
  const enteredAt = (kind: ReadingSetKind, takenAt: Date) =>
    takenAt < setupAt ? at(setupAt, ++backEntered * 20 * MINUTE) : at(takenAt, kind === 'routine' ? 16 * HOUR : kind === 'post-fault' ? HOUR : 5 * HOUR);
  const addSet = async (serial: string, kind: Exclude<ReadingSetKind, 'post-fault'>, body: ReadingBody): Promise<number> => {
    clock.set(enteredAt(kind, new Date(body.takenAt)));
    return (await addUnitReadingSet(m, clock, users.tester, unitIds[serial], asRoute(readingSetBodySchema, { ...body, kind }))).id;
  };
  const traces = (serial: string, state: SweepState, session: string, field: boolean) =>
    sessionTraces(serial, state, session, field).map((tr) => {
      const freqs = tr.points.map((p) => p[0]);
      const fields: SweepFields = {
        label: tr.label,
        testType: tr.testType,
        winding: tr.winding,
        phase: tr.phase,
        terminals: tr.terminals,
        tapPosition: tr.tapPosition,
        ...(tr.demagnetised === null ? {} : { demagnetised: tr.demagnetised }),
      };
      return { fields, parsed: { points: tr.points, minHz: Math.min(...freqs), maxHz: Math.max(...freqs) }, fileName: tr.fileName };
    });
  /** Baseline traces on one of the unit's reading sets (POST /api/units/:unitId/sweeps). */
  const addUnitTraces = async (serial: string, setId: number, state: SweepState, session: string, field: boolean, when: Date) => {
    clock.set(when);
    for (const tr of traces(serial, state, session, field)) await addUnitSweep(m, clock, users.tester, unitIds[serial], setId, tr.fields, tr.parsed, tr.fileName);
  };
  /** Post-fault traces on a session (POST /api/sessions/:sessionId/sweeps). */
  const addSessionTraces = async (serial: string, sessionId: number, state: SweepState, session: string, when: Date) => {
    clock.set(when);
    for (const tr of traces(serial, state, session, true)) await addSessionSweep(m, clock, users.tester, sessionId, tr.fields, tr.parsed, tr.fileName);
  };

  for (const u of DEMO_UNITS) {
    const factoryId = await addSet(u.serial, 'factory', factoryBody(u));
    if (u.serial === RECENT_EVENT_SERIAL || u.serial === HISTORY_EVENT_SERIAL) {
      await addUnitTraces(u.serial, factoryId, 'factory', 'factory', false, at(setupAt, ++backEntered * 20 * MINUTE));
    }
    const dates = routineDates(u, now);
    for (let k = 0; k < dates.length; k++) await addSet(u.serial, 'routine', routineBody(u, dates[k], k));
  }

  // ---------- shared steps of an event's life ----------
  const logFault = async (body: EventBody): Promise<number> => {
    clock.set(at(new Date(body.occurredAt), 40 * MINUTE));
    return (await logEvent(m, clock, users.protection, asRoute(eventBodySchema, body))).id;
  };

  const session = async (eventId: number, body: ReadingBody): Promise<number> => {
    clock.set(enteredAt('post-fault', new Date(body.takenAt)));
    return (await createSession(m, clock, users.tester, eventId, asRoute(sessionBodySchema, body))).id;
  };

  // The screenings of the story ran under criteria set 1 (the set published then); the managers' mail went out two
  // minutes later (the worker's record of it; the outbox of those days is not kept).
  const screen = async (eventId: number, when: Date): Promise<{ id: number; result: GapsightResult }> => {
    clock.set(when);
    const s = await runScreening(m, clock, users.tester, eventId, { criteriaVersion: 1, comparison: false });
    clock.set(at(when, 2 * MINUTE));
    const { subject } = buildManagerMail(await loadReportData(m, s.id, ''));
    const queued = await m.getRepository(Notification).find({ where: { screeningId: s.id, status: 'queued' }, order: { id: 'ASC' } });
    for (const n of queued) await recordMailSent(m, clock, n.id, { subject, messageId: `<demo-notification-${n.id}@gapsight.invalid>`, attempts: 1 });
    return { id: s.id, result: s.result };
  };

  const decide = async (screeningId: number, body: DecisionBody, when: Date): Promise<{ followUpIds: number[] }> => {
    clock.set(when);
    const d = await decideService(m, clock, users.manager, screeningId, asRoute(decisionBodySchema, body));
    return { followUpIds: d.followUps.map((f) => f.id) };
  };

  const closeFollowUpAt = async (followUpId: number, result: string, when: Date) => {
    clock.set(when);
    await closeFollowUp(m, clock, users.manager, followUpId, asRoute(followUpCloseSchema, { result }).result);
  };

  // ---------- KVP-HX-T2, two years ago: a feeder fault, unit in service (duty-only path) ----------
  const hx2 = RECENT_EVENT_SERIAL;
  const priorEventId = await logFault(priorEventBody(unitIds[hx2], t));
  await session(priorEventId, priorGasSession(t));
  const prior = await screen(priorEventId, t.priorScreening);
  // The unit stayed in service: the samples count from the event (rules revision 2 wording).
  const priorFollowUps: { task: string; due: Date; result: string }[] = [
    { task: FOLLOW_UPS.gasNow, due: t.priorGasSample, result: 'The next-day sample of the post-fault session: C2H2 0 ppm, H2 +3 ppm against the routine sample. Normal.' },
    { task: FOLLOW_UPS.gas24hEvent, due: at(t.priorFault, DAY), result: 'Taken with the next-day sample: C2H2 0 ppm, H2 +3 ppm. Normal.' },
    { task: FOLLOW_UPS.gas1wEvent, due: at(t.priorFault, 7 * DAY), result: 'C2H2 0 ppm, H2 29 ppm, CO 412 ppm: in line with the routine trend.' },
    { task: FOLLOW_UPS.gas1mEvent, due: at(t.priorFault, 30 * DAY), result: 'C2H2 0 ppm; all gases within the unit\'s normal trend. Closed.' },
  ].filter((f) => prior.result.followUps.includes(f.task));
  const priorDecision = await decide(
    prior.id,
    {
      outcome: 'release',
      reason: 'Unit stayed in service; fault below the mechanical segment (duty-only path) and the next-day oil sample shows no acetylene. Keep the gas follow-ups.',
      followUps: priorFollowUps.map((f) => ({ task: f.task, dueAt: f.due.toISOString() })),
    },
    t.priorDecision,
  );
  for (const [k, f] of priorFollowUps.entries()) await closeFollowUpAt(priorDecision.followUpIds[k], f.result, at(f.due, 6 * HOUR));

  // ---------- KVP-MB-T1, about 14 months ago: high duty → no-go → hold → inspected → repaired → go → released ----------
  const mb1 = HISTORY_EVENT_SERIAL;
  const historyEventId = await logFault(historyEventBody(unitIds[mb1], t));
  const hs = await session(historyEventId, historySession(t));
  await addSessionTraces(mb1, hs, 'deformed', 'post-fault', at(t.historySession, 5 * HOUR));
  const first = await screen(historyEventId, t.historyScreening1);
  await decide(
    first.id,
    {
      outcome: 'hold',
      reason: 'No-go: CL up and CHL down with the phase B reactance, excitation current and sweep all moved, and acetylene in the oil. Hold for internal inspection (untank).',
    },
    t.historyHold,
  );
  clock.set(t.historyFinding);
  await recordFinding(
    m,
    clock,
    users.engineer,
    historyEventId,
    asRoute(findingBodySchema, {
      classification: 'deformation-confirmed',
      text: 'Untanked at the maker\'s works: the LV (inner) winding of phase B shows radial buckling inward (forced buckling) over about a third of its circumference, with six spacer columns displaced and two discs tilted near the top. LV windings A and C and all HV windings sound; clamping pressure found low on all three limbs. Remedy: new LV winding for phase B, all windings re-clamped, oil processed.',
    }),
  );
  // Back at site: commissioning tests (the new reference fingerprint), then the event's re-test.
  const commissioningId = await addSet(mb1, 'commissioning', repairedBody(t, 'commissioning'));
  await addUnitTraces(mb1, commissioningId, 'repaired', 'commissioning', true, at(t.repairCommissioning, 6 * HOUR));
  const retest = await session(historyEventId, repairedBody(t, 'retest'));
  await addSessionTraces(mb1, retest, 'repaired', 'retest', at(t.historyRetest, 5 * HOUR));
  const second = await screen(historyEventId, t.historyScreening2);
  const r = t.historyReenergised;
  const historyFollowUps: { task: string; due: Date; closed?: { at: Date; result: string } }[] = [
    { task: FOLLOW_UPS.gas24h, due: at(r, DAY), closed: { at: at(r, DAY + 3 * HOUR), result: 'H2 6 ppm, CH4 1.4, C2H6 0.8, C2H4 0.4, C2H2 0, CO 24, CO2 230 ppm: no acetylene. Normal.' } },
    { task: FOLLOW_UPS.gas1w, due: at(r, 7 * DAY), closed: { at: at(r, 7 * DAY + 5 * HOUR), result: 'H2 9 ppm, CH4 2.0, C2H4 0.6, C2H2 0, CO 41 ppm: slow rise of CO as expected for new paper insulation. Normal.' } },
    { task: FOLLOW_UPS.gas1m, due: at(r, 30 * DAY) },
    { task: FOLLOW_UPS.sweepNextOutage, due: at(r, 180 * DAY) },
  ];
  const release = await decide(
    second.id,
    {
      outcome: 'release-with-restrictions',
      reason: 'Re-test after repair is back on the fingerprint (go). Release with restrictions until the gas follow-ups are clean.',
      restrictions: 'Load held at or below 40 MVA (ONAN rating) and auto-reclose on the Millbrook 33 kV feeders blocked until the 1-month oil sample is clean.',
      followUps: historyFollowUps.map((f) => ({ task: f.task, dueAt: f.due.toISOString() })),
    },
    t.historyRelease,
  );
  for (const [k, f] of historyFollowUps.entries()) if (f.closed) await closeFollowUpAt(release.followUpIds[k], f.closed.result, f.closed.at);

  // ---------- KVP-HX-T2, three days ago: the event the demo screens (expected: conditional) ----------
  // Logging it leaves the unit without a recommendation until the event is screened.
  const recentEventId = await logFault(recentEventBody(unitIds[hx2], t));
  await session(recentEventId, recentSession1(t));
  const s2 = await session(recentEventId, recentSession2(t));
  await addSessionTraces(hx2, s2, 'factory', 'post-fault', at(t.recentSession2, 4 * HOUR));

  return { unitIds, priorEventId, historyEventId, recentEventId, timeline: t };
}
