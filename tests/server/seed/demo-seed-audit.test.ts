import request from 'supertest';
import { In } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { DEMO_DESIGNS, DEMO_SITES, DEMO_UNITS } from '../../../server/db/seed/demo-fleet.js';
import { seedDemo } from '../../../server/db/seed/demo-seed.js';
import { DEMO_USERS } from '../../../server/db/seed/demo-users.js';
import { Design } from '../../../server/features/designs/design.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { SweepTrace } from '../../../server/features/readings/sweep-trace.entity.js';
import { Decision } from '../../../server/features/screenings/decision.entity.js';
import { Finding } from '../../../server/features/screenings/finding.entity.js';
import { FollowUp } from '../../../server/features/screenings/follow-up.entity.js';
import { Screening } from '../../../server/features/screenings/screening.entity.js';
import { Site } from '../../../server/features/sites/site.entity.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import { User } from '../../../server/features/users/user.entity.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeUnit } from '../../helpers/factories.js';

// The demo seed's audit trail against what the app writes: a decision signed through the API here is the reference.

let env: TestEnv;
let appDecideRow: AuditEntry;

beforeAll(async () => {
  env = await openTestEnv();
  await seedDemo(env.db);
  const tester = bearer(env.config, (await createTestUser(env.db, ['tester'])).id);
  const protection = bearer(env.config, (await createTestUser(env.db, ['protection'])).id);
  const manager = bearer(env.config, (await createTestUser(env.db, ['manager'])).id);
  const api = () => request(env.app);
  // Invented readings: a factory set and an unchanged post-fault session of a 40 MVA unit, a small fault (go).
  const unit = await makeUnit(env.db);
  const readings = { temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } };
  await api().post(`/api/units/${unit.id}/reading-sets`).set(tester).send({ kind: 'factory', takenAt: '2019-05-02', ...readings }).expect(201);
  const ev = (await api().post('/api/events').set(protection).send({ unitId: unit.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }] }).expect(201)).body;
  await api().post(`/api/events/${ev.id}/sessions`).set(tester).send({ takenAt: '2026-11-29T08:00:00Z', ...readings }).expect(201);
  const s = (await api().post(`/api/events/${ev.id}/screenings`).set(tester).send({}).expect(201)).body;
  await api().post(`/api/screenings/${s.id}/decision`).set(manager).send({ outcome: 'release', reason: 'Readings unchanged.' }).expect(201);
  appDecideRow = await env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'fault_event', entityId: String(ev.id), action: 'decide' });
});
afterAll(async () => {
  await env.db.destroy();
});

async function seededUnits() {
  return env.db.getRepository(Unit).find({ where: { serial: In(DEMO_UNITS.map((u) => u.serial)) } });
}

async function seededEvents() {
  return env.db.getRepository(FaultEvent).find({ where: { unitId: In((await seededUnits()).map((u) => u.id)) } });
}

describe('the demo seed audit trail', () => {
  it('has, for every seeded decision, the decide entry on its event that the decision route writes', async () => {
    const events = await seededEvents();
    const screenings = await env.db.getRepository(Screening).find({ where: { eventId: In(events.map((e) => e.id)) } });
    const decisions = await env.db.getRepository(Decision).find({ where: { screeningId: In(screenings.map((s) => s.id)) } });
    expect(decisions).toHaveLength(3);
    const appKeys = Object.keys(appDecideRow.after as Record<string, unknown>).sort();
    for (const d of decisions) {
      const s = screenings.find((x) => x.id === d.screeningId)!;
      const rows = await env.db.getRepository(AuditEntry).find({ where: { entity: 'fault_event', entityId: String(s.eventId), action: 'decide' } });
      const row = rows.find((r) => (r.after as { id?: number }).id === d.id);
      expect(row, `decision ${d.id}`).toBeDefined();
      expect(Object.keys(row!.after as Record<string, unknown>).sort()).toEqual(appKeys);
      expect(row!.after).toEqual({
        id: d.id,
        screeningId: d.screeningId,
        managerId: d.managerId,
        outcome: d.outcome,
        restrictions: d.restrictions,
        reason: d.reason,
        againstRecommendation: d.againstRecommendation,
        signedAt: d.signedAt.toISOString(),
        recommendation: s.recommendation,
      });
      expect(row!.userId).toBe(d.managerId);
      expect(row!.highlighted).toBe(d.againstRecommendation);
      expect(row!.at.getTime()).toBe(d.signedAt.getTime());
    }
  });

  it('has a create entry, dated as the row, for every row the seed created, and a screen entry for every screening', async () => {
    const units = await seededUnits();
    const events = await seededEvents();
    const eventIds = events.map((e) => e.id);
    const sets = await env.db.getRepository(ReadingSet).find({ where: { unitId: In(units.map((u) => u.id)) } });
    const created: [string, { id: number; createdAt?: Date; recordedAt?: Date }[]][] = [
      ['user', await env.db.getRepository(User).find({ where: { email: In(DEMO_USERS.map((u) => u.email)) } })],
      ['site', await env.db.getRepository(Site).find({ where: { name: In(DEMO_SITES.map((s) => s.name)) } })],
      ['design', await env.db.getRepository(Design).find({ where: { reference: In(Object.values(DEMO_DESIGNS).map((d) => d.reference)) } })],
      ['unit', units],
      ['fault_event', events],
      ['reading_set', sets],
      ['sweep_trace', await env.db.getRepository(SweepTrace).find({ where: { readingSetId: In(sets.map((s) => s.id)) } })],
      ['follow_up', await env.db.getRepository(FollowUp).find({ where: { eventId: In(eventIds) } })],
      ['finding', await env.db.getRepository(Finding).find({ where: { eventId: In(eventIds) } })],
    ];
    for (const [entity, rows] of created) {
      expect(rows.length, entity).toBeGreaterThan(0);
      const entries = await env.db.getRepository(AuditEntry).find({ where: { entity, action: 'create', entityId: In(rows.map((r) => String(r.id))) } });
      expect(entries.map((a) => a.entityId).sort(), entity).toEqual(rows.map((r) => String(r.id)).sort());
      for (const r of rows) {
        const when = r.createdAt ?? r.recordedAt!;
        expect(entries.find((a) => a.entityId === String(r.id))!.at.getTime(), `${entity} ${r.id}`).toBe(when.getTime());
      }
    }
    const screenings = await env.db.getRepository(Screening).find({ where: { eventId: In(eventIds) } });
    expect(screenings).toHaveLength(3);
    const screened = await env.db.getRepository(AuditEntry).find({ where: { entity: 'screening', action: 'screen', entityId: In(screenings.map((s) => String(s.id))) } });
    expect(screened.map((a) => [a.entityId, a.at.getTime()]).sort()).toEqual(screenings.map((s) => [String(s.id), s.computedAt.getTime()]).sort());
  });
});
