import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { In, Not } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mergeReadingSets } from '../../../shared/readings/merge.js';
import type { GapsightCase } from '../../../shared/schemas/case.js';
import { criteriaV1, criteriaV2, modifiedZScore, screenCase, sisterIndicators } from '../../../shared/screening/index.js';
import { AppSetting } from '../../../server/common/app-setting.entity.js';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { DEMO_DESIGNS, DEMO_SITES, DEMO_UNITS, CHL_OUTLIER_SERIAL, HISTORY_EVENT_SERIAL, RECENT_EVENT_SERIAL, unitsCsv } from '../../../server/db/seed/demo-fleet.js';
import { SEED_MARKER_KEY, seedDemo } from '../../../server/db/seed/demo-seed.js';
import { Design } from '../../../server/features/designs/design.entity.js';
import { buildEventCase, caseUnit } from '../../../server/features/events/case-export.service.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { loadCaseReadingSets } from '../../../server/features/readings/readings.service.js';
import { SweepTrace } from '../../../server/features/readings/sweep-trace.entity.js';
import { Decision } from '../../../server/features/screenings/decision.entity.js';
import { Finding } from '../../../server/features/screenings/finding.entity.js';
import { FollowUp } from '../../../server/features/screenings/follow-up.entity.js';
import { Screening } from '../../../server/features/screenings/screening.entity.js';
import { Site } from '../../../server/features/sites/site.entity.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import { User } from '../../../server/features/users/user.entity.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

// The demo seed on the shared test database: other files may have seeded already (the marker makes it idempotent),
// so everything is found by the scenario's serials and names, never by global counts.

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const SERIALS = DEMO_UNITS.map((u) => u.serial);

let env: TestEnv;
let units: Unit[];
const unitBySerial = (serial: string) => units.find((u) => u.serial === serial)!;

/** Row counts of everything the scenario owns. */
async function scenarioCounts() {
  const ids = units.map((u) => u.id);
  const events = await env.db.getRepository(FaultEvent).find({ where: { unitId: In(ids) } });
  const eventIds = events.map((e) => e.id);
  const sets = await env.db.getRepository(ReadingSet).find({ where: { unitId: In(ids) } });
  return {
    units: ids.length,
    events: events.length,
    sets: sets.length,
    sweeps: await env.db.getRepository(SweepTrace).count({ where: { readingSetId: In(sets.map((s) => s.id)) } }),
    screenings: await env.db.getRepository(Screening).count({ where: { eventId: In(eventIds) } }),
    followUps: await env.db.getRepository(FollowUp).count({ where: { eventId: In(eventIds) } }),
    sites: await env.db.getRepository(Site).count({ where: { name: In(DEMO_SITES.map((s) => s.name)) } }),
    designs: await env.db.getRepository(Design).count({ where: { reference: In(Object.values(DEMO_DESIGNS).map((d) => d.reference)) } }),
    audit: await env.db.getRepository(AuditEntry).count({ where: { entity: 'fault_event', entityId: In(eventIds.map(String)) } }),
  };
}

async function eventsOf(serial: string): Promise<FaultEvent[]> {
  return env.db.getRepository(FaultEvent).find({ where: { unitId: unitBySerial(serial).id }, order: { occurredAt: 'ASC', id: 'ASC' } });
}

beforeAll(async () => {
  env = await openTestEnv();
  await seedDemo(env.db);
  units = await env.db.getRepository(Unit).find({ where: { serial: In(SERIALS) }, relations: { site: true, design: true } });
});
afterAll(async () => {
  await env.db.destroy();
});

describe('seedDemo', () => {
  it('seeds once: a second call changes nothing and says so', async () => {
    const marker = await env.db.getRepository(AppSetting).findOneBy({ key: SEED_MARKER_KEY });
    expect(marker).not.toBeNull();
    const before = await scenarioCounts();
    expect(await seedDemo(env.db)).toBe(false);
    expect(await scenarioCounts()).toEqual(before);
  });

  it('creates the demo users, one per role', async () => {
    const users = await env.db.getRepository(User).find({ where: { email: In(['admin', 'protection', 'tester', 'manager', 'engineer'].map((r) => `${r}@kestrel-valley.example`)) } });
    expect(users.map((u) => u.roles[0]).sort()).toEqual(['admin', 'engineer', 'manager', 'protection', 'tester']);
  });
});

describe('the Kestrel Valley Power fleet', () => {
  it('has three sites with their time zones and two design families', async () => {
    const sites = await env.db.getRepository(Site).find({ where: { name: In(DEMO_SITES.map((s) => s.name)) } });
    expect(sites.map((s) => [s.name, s.timeZone]).sort()).toEqual([
      ['Harrow Cross', 'Europe/London'],
      ['Millbrook', 'Europe/London'],
      ['Quarry Lane', 'Europe/Dublin'],
    ]);
    const designs = await env.db.getRepository(Design).find({ where: { reference: In(['NTW-40-132/33-YNd1', 'BME-12-66/11-Dyn11']) } });
    expect(designs).toHaveLength(2);
    const large = designs.find((d) => d.reference === 'NTW-40-132/33-YNd1')!;
    expect(large).toMatchObject({ vectorGroup: 'YNd1', hvKV: 132, lvKV: 33, impedancePercent: 10.5, impedanceBaseKVA: 40000, requiredCapacitance: ['CH', 'CL', 'CHL'] });
  });

  it('has thirteen units (eight 40 MVA sisters, five 12 MVA), each with a factory set and a routine set', async () => {
    expect(units).toHaveLength(13);
    expect(units.filter((u) => u.design.reference === 'NTW-40-132/33-YNd1')).toHaveLength(8);
    expect(units.filter((u) => u.design.reference === 'BME-12-66/11-Dyn11')).toHaveLength(5);
    expect(new Set(units.map((u) => u.site.name))).toEqual(new Set(['Harrow Cross', 'Millbrook', 'Quarry Lane']));
    for (const u of units) expect(u.year).toBeGreaterThanOrEqual(1998);
    const sets = await env.db.getRepository(ReadingSet).find({ where: { unitId: In(units.map((u) => u.id)) } });
    for (const u of units) {
      const own = sets.filter((s) => s.unitId === u.id);
      expect(own.filter((s) => s.kind === 'factory'), u.serial).toHaveLength(1);
      expect(own.filter((s) => s.kind === 'routine').length, u.serial).toBeGreaterThanOrEqual(1);
    }
  });

  it('keeps baseline sweeps on the factory sets of the two event units (log-spaced, checksummed)', async () => {
    for (const serial of [RECENT_EVENT_SERIAL, HISTORY_EVENT_SERIAL]) {
      const factory = await env.db.getRepository(ReadingSet).findOneByOrFail({ unitId: unitBySerial(serial).id, kind: 'factory' });
      const traces = await env.db.getRepository(SweepTrace).find({ where: { readingSetId: factory.id } });
      expect(traces.map((t) => t.label).sort()).toEqual(['HV-A-open', 'HV-B-open', 'HV-B-short', 'HV-C-open']);
      // Rules revision 2: every trace names its winding and phase (a trace without a phase satisfies no phase).
      expect(traces.map((t) => `${t.label} ${t.winding} ${t.phase}`).sort()).toEqual(['HV-A-open hv A', 'HV-B-open hv B', 'HV-B-short hv B', 'HV-C-open hv C']);
      for (const t of traces) {
        expect(t.pointCount).toBe(t.points.length);
        expect(t.pointCount).toBeGreaterThanOrEqual(150);
        expect(t.minHz).toBe(20);
        expect(t.maxHz).toBe(1e6);
      }
    }
  });

  it('matches examples/demo/units.csv', () => {
    expect(readFileSync(path.join(root, 'examples/demo/units.csv'), 'utf8')).toBe(unitsCsv());
  });
});

describe('the recent through-fault on KVP-HX-T2', () => {
  it('is in testing with two sessions, and its case screens conditional on CHL alone', async () => {
    const events = await eventsOf(RECENT_EVENT_SERIAL);
    expect(events).toHaveLength(2);
    const recent = events[1];
    expect(recent.status).toBe('testing');
    expect(Date.now() - recent.occurredAt.getTime()).toBeLessThan(5 * 86400e3);
    expect(await env.db.getRepository(ReadingSet).count({ where: { eventId: recent.id, kind: 'post-fault' } })).toBe(2);
    expect(await env.db.getRepository(Screening).count({ where: { eventId: recent.id } })).toBe(0);
    const unit = await env.db.getRepository(Unit).findOneByOrFail({ serial: RECENT_EVENT_SERIAL });
    expect(unit).toMatchObject({ lastEventId: recent.id, lastEventStatus: 'testing', lastRecommendation: null });

    const c = await buildEventCase(env.db.manager, recent.id);
    expect(c.priorFaults).toHaveLength(1);
    expect(c.sisters?.length).toBe(7);
    expect(c.fault).toMatchObject({ side: 'lv', location: 'lv', currentIs: 'line' });
    expect(c.sweeps?.map((w) => `${w.label} ${w.winding} ${w.phase} ${w.tapPosition}/${w.baselineTapPosition}`)).toEqual(['HV-A-open hv A 9b/9b', 'HV-B-open hv B 9b/9b', 'HV-B-short hv B 9b/9b', 'HV-C-open hv C 9b/9b']);
    expect(Object.keys(c.postFault?.bushings ?? {})).toEqual(['H1', 'H2', 'H3']);
    expect(c.postFault?.hoursDeEnergised).toBe(33); // the newest session gave the winding resistance
    // A screening run now takes the newest published criteria set: version 2.
    const result = screenCase(c, criteriaV2);
    expect(result.recommendation, result.reasons.join('\n')).toBe('conditional');
    expect(result.missing).toEqual([]);
    expect(result.unreliable).toEqual([]);
    expect(result.throughFault?.highDuty).toBe(true);
    const chl = result.indicators.find((i) => i.key === 'capacitance.CHL.shiftPercent')!;
    expect(chl.level).toBe('investigate');
    expect(chl.value as number).toBeGreaterThan(3);
    expect(chl.value as number).toBeLessThan(5);
    // No second independent method at watch or above: no corroboration.
    const flagged = result.indicators.filter((i) => i.level !== 'ok' && !['capacitance', 'power-factor', 'sisters', 'duty'].includes(i.method));
    expect(flagged.map((i) => `${i.key} ${i.level}`)).toEqual([]);
    expect(result.indicators.filter((i) => i.method === 'sweep' && i.key.endsWith('.class')).map((i) => i.value)).toEqual(['normal', 'normal', 'normal', 'normal']);
    // The HV bushings were tested too and are steady.
    expect(result.indicators.filter((i) => i.method === 'bushing').map((i) => `${i.key} ${i.level}`)).toEqual(
      ['H1', 'H2', 'H3'].flatMap((t) => [`bushing.${t}.c1ShiftPercent ok`, `bushing.${t}.c1Pf20RisePercent ok`]),
    );
  });

  it('counts the earlier feeder fault, released on the duty-only path', async () => {
    const [prior] = await eventsOf(RECENT_EVENT_SERIAL);
    // A ground fault on the delta side: the winding current was entered (from the differential relay's record).
    expect(prior).toMatchObject({ status: 'released', transformerTripped: false, type: 'phase-to-ground', side: 'lv', location: 'lv', currentIs: 'winding' });
    const priorCase = await buildEventCase(env.db.manager, prior.id);
    expect(screenCase(priorCase, criteriaV2).throughFault).toMatchObject({ currentBasis: 'winding', highDuty: false });
    expect(screenCase(priorCase, criteriaV2).recommendation).toBe('go');
    const screenings = await env.db.getRepository(Screening).find({ where: { eventId: prior.id } });
    expect(screenings.map((s) => s.recommendation)).toEqual(['go']);
    const decision = await env.db.getRepository(Decision).findOneByOrFail({ screeningId: screenings[0].id });
    expect(decision.outcome).toBe('release');
    const followUps = await env.db.getRepository(FollowUp).find({ where: { eventId: prior.id } });
    expect(followUps.length).toBeGreaterThanOrEqual(3);
    expect(followUps.every((f) => f.closedAt !== null)).toBe(true);
  });
});

describe('the history event on KVP-MB-T1', () => {
  it('went no-go → hold → finding → repair → go → release with restrictions, with follow-ups', async () => {
    const [event] = await eventsOf(HISTORY_EVENT_SERIAL);
    expect(event.status).toBe('released');
    const screenings = await env.db.getRepository(Screening).find({ where: { eventId: event.id, comparison: false }, order: { computedAt: 'ASC', id: 'ASC' } });
    expect(screenings.map((s) => s.recommendation)).toEqual(['no-go', 'go']);
    expect(screenings.every((s) => s.criteriaVersion === 1)).toBe(true);
    // The stored results are what the engine says about the stored cases.
    for (const s of screenings) expect(screenCase(s.case as GapsightCase, criteriaV1).recommendation).toBe(s.recommendation);
    // The decisions still stand under the newest criteria set (a comparison run would agree).
    for (const s of screenings) expect(screenCase(s.case as GapsightCase, criteriaV2).recommendation).toBe(s.recommendation);
    const firstResult = screenings[0].result as { throughFault: { highDuty: boolean }; indicators: { key: string; level: string }[] };
    expect(firstResult.throughFault.highDuty).toBe(true);
    expect(firstResult.indicators.find((i) => i.key === 'capacitance.CL.shiftPercent')?.level).toBe('critical');

    const manager = await env.db.getRepository(User).findOneByOrFail({ email: 'manager@kestrel-valley.example' });
    const decisions = await env.db.getRepository(Decision).find({ where: { screeningId: In(screenings.map((s) => s.id)) }, order: { signedAt: 'ASC' } });
    expect(decisions.map((d) => d.outcome)).toEqual(['hold', 'release-with-restrictions']);
    expect(decisions.every((d) => d.managerId === manager.id && d.reason.length > 20 && !d.againstRecommendation)).toBe(true);
    expect(decisions[1].restrictions).toBeTruthy();

    const engineer = await env.db.getRepository(User).findOneByOrFail({ email: 'engineer@kestrel-valley.example' });
    const [finding] = await env.db.getRepository(Finding).find({ where: { eventId: event.id } });
    expect(finding).toMatchObject({ classification: 'deformation-confirmed', recordedById: engineer.id });
    expect(finding.text).toMatch(/LV .*phase B.*buckl/i);

    const followUps = await env.db.getRepository(FollowUp).find({ where: { eventId: event.id }, order: { dueAt: 'ASC' } });
    expect(followUps.map((f) => f.task)).toEqual([
      'Dissolved-gas sample 24 h after re-energising',
      'Dissolved-gas sample 1 week after re-energising',
      'Dissolved-gas sample 1 month after re-energising',
      'Frequency-response sweep at the next outage',
    ]);
    expect(followUps.map((f) => f.closedAt !== null)).toEqual([true, true, false, false]);
    expect(followUps[2].dueAt!.getTime()).toBeLessThan(Date.now()); // overdue
    expect(followUps[3].dueAt!.getTime()).toBeGreaterThan(Date.now());

    // The repaired unit has a new fingerprint: a commissioning set after the fault, marked as reference.
    const commissioning = await env.db.getRepository(ReadingSet).find({ where: { unitId: event.unitId, kind: 'commissioning', isReference: true } });
    expect(commissioning).toHaveLength(1);
    expect(commissioning[0].takenAt.getTime()).toBeGreaterThan(event.occurredAt.getTime());

    const unit = await env.db.getRepository(Unit).findOneByOrFail({ serial: HISTORY_EVENT_SERIAL });
    expect(unit).toMatchObject({ lastEventId: event.id, lastEventStatus: 'released', lastRecommendation: 'go' });
  });

  it('has every status move in the audit trail, dated in the story', async () => {
    const [event] = await eventsOf(HISTORY_EVENT_SERIAL);
    const moves = await env.db.getRepository(AuditEntry).find({ where: { entity: 'fault_event', entityId: String(event.id), action: In(['create', 'update']) }, order: { at: 'ASC', id: 'ASC' } });
    expect(moves.map((a) => (a.after as { status?: string } | null)?.status)).toEqual(['logged', 'testing', 'screened', 'held', 'testing', 'screened', 'released']);
    expect(moves[0].at.getTime()).toBeLessThan(Date.now() - 300 * 86400e3);
    for (let k = 1; k < moves.length; k++) expect(moves[k].at.getTime()).toBeGreaterThanOrEqual(moves[k - 1].at.getTime());
    const users = await env.db.getRepository(User).find({ where: { email: In(['protection', 'tester', 'manager'].map((r) => `${r}@kestrel-valley.example`)) } });
    const idOf = (role: string) => users.find((u) => u.email.startsWith(role))!.id;
    expect(moves.map((a) => a.userId)).toEqual([idOf('protection'), idOf('tester'), idOf('tester'), idOf('manager'), idOf('tester'), idOf('tester'), idOf('manager')]);
    const screenings = await env.db.getRepository(Screening).find({ where: { eventId: event.id } });
    const decisions = await env.db.getRepository(Decision).find({ where: { screeningId: In(screenings.map((s) => s.id)) } });
    const decided = await env.db.getRepository(AuditEntry).find({ where: { entity: 'fault_event', action: 'decide', entityId: String(event.id) }, order: { at: 'ASC', id: 'ASC' } });
    expect(decided.map((a) => [a.userId, (a.after as { id: number }).id])).toEqual(decisions.sort((a, b) => a.signedAt.getTime() - b.signedAt.getTime()).map((d) => [idOf('manager'), d.id]));
    const screened = await env.db.getRepository(AuditEntry).count({ where: { entity: 'screening', action: 'screen', entityId: In(screenings.map((s) => String(s.id))) } });
    expect(screened).toBe(2);
  });
});

describe('the sister-unit outlier KVP-QL-T1', () => {
  it('stands out in CHL among the 40 MVA sisters (modified z > 3.5, about 5 % above the median)', async () => {
    const family = units.filter((u) => u.design.reference === 'NTW-40-132/33-YNd1');
    const sets = await env.db.getRepository(ReadingSet).find({ where: { unitId: In(family.map((u) => u.id)), kind: Not('post-fault') }, order: { takenAt: 'ASC', id: 'ASC' } });
    const values = await loadCaseReadingSets(env.db.manager, sets);
    const latest = new Map(family.map((u) => [u.serial, mergeReadingSets(sets.filter((s) => s.unitId === u.id).map((s) => values.get(s.id)!))!]));
    const chl = family.map((u) => latest.get(u.serial)!.capacitancePF!.CHL);
    const z = (serial: string) => modifiedZScore(latest.get(serial)!.capacitancePF!.CHL, chl, 0.6745, 0.001).value!;
    expect(Math.abs(z(CHL_OUTLIER_SERIAL))).toBeGreaterThan(3.5);
    for (const u of family) if (u.serial !== CHL_OUTLIER_SERIAL) expect(Math.abs(z(u.serial)), u.serial).toBeLessThan(3.5);

    // The engine, on a case of the outlier's latest readings against its seven sisters.
    const outlier = family.find((u) => u.serial === CHL_OUTLIER_SERIAL)!;
    const c: GapsightCase = {
      format: 'gapsight-case/1',
      unit: caseUnit(outlier),
      postFault: latest.get(CHL_OUTLIER_SERIAL),
      sisters: family.filter((u) => u !== outlier).map((u) => ({ serial: u.serial, ...latest.get(u.serial)! })),
    };
    const indicators = sisterIndicators(c, criteriaV2);
    // Rules revision 2: sister statistics are a state (basis `state`), at most watch — they never corroborate.
    expect(indicators.find((i) => i.key === 'sisters.capacitance.CHL.modifiedZ')).toMatchObject({ level: 'watch', basis: 'state' });
    const dev = indicators.find((i) => i.key === 'sisters.capacitance.CHL.deviationFromMedianPercent')!.value as number;
    expect(dev).toBeGreaterThan(4);
    expect(dev).toBeLessThan(6);
    for (const cfg of ['CH', 'CL']) expect(indicators.find((i) => i.key === `sisters.capacitance.${cfg}.modifiedZ`)?.level).toBe('ok');
  });
});
