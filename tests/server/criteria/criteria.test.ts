import request from 'supertest';
import { MoreThan } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { CriteriaSet } from '../../../server/features/criteria/criteria-set.entity.js';
import { criteriaSetListSchema, criteriaSetViewSchema } from '../../../shared/schemas/responses/index.js';
import { criteriaV2 } from '../../../shared/screening/criteria-sets.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeSite, makeUnit } from '../../helpers/factories.js';

let env: TestEnv;
let admin: { Authorization: string };
let engineer: { Authorization: string };
let tester: { Authorization: string };
let protection: { Authorization: string };
let siteId: number;

beforeAll(async () => {
  env = await openTestEnv();
  admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
  engineer = bearer(env.config, (await createTestUser(env.db, ['engineer'])).id);
  tester = bearer(env.config, (await createTestUser(env.db, ['tester'])).id);
  protection = bearer(env.config, (await createTestUser(env.db, ['protection'])).id);
  siteId = (await makeSite(env.db)).id;
});
afterAll(async () => {
  // The test database is shared by the server test files: leave the built-in sets 1 and 2 as the only ones.
  await env.db.getRepository(CriteriaSet).delete({ version: MoreThan(2) });
  await env.db.destroy();
});

const api = () => request(env.app);

describe('GET /api/criteria', () => {
  it('lists the built-in published sets, newest first, in the answer schema', async () => {
    const res = await api().get('/api/criteria').set(tester).expect(200);
    const list = criteriaSetListSchema.parse(res.body);
    const published = list.filter((c) => c.status === 'published').map((c) => c.version);
    expect(published.slice(-2)).toEqual([2, 1]);
  });

  it('gives one version with its thresholds; 404 for one that does not exist', async () => {
    const one = criteriaSetViewSchema.parse((await api().get('/api/criteria/2').set(tester).expect(200)).body);
    expect(one).toMatchObject({ version: 2, status: 'published', name: criteriaV2.name });
    expect(one.thresholds.capacitance.shiftBands).toEqual(criteriaV2.capacitance.shiftBands);
    expect((await api().get('/api/criteria/999').set(tester)).status).toBe(404);
  });
});

describe('drafts', () => {
  it('lets an engineer draft from a version (the next version), change it, but not publish it', async () => {
    const created = await api().post('/api/criteria').set(engineer).send({ fromVersion: 2, name: 'Engineer draft', notes: 'trying wider bands' });
    expect(created.status).toBe(201);
    const d = criteriaSetViewSchema.parse(created.body);
    expect(d).toMatchObject({ status: 'draft', name: 'Engineer draft', notes: 'trying wider bands', publishedAt: null });
    expect(d.version).toBeGreaterThan(2);
    expect(d.thresholds.version).toBe(d.version);

    const thresholds = structuredClone(d.thresholds);
    thresholds.capacitance.shiftBands[0].from = 2.5;
    const patched = criteriaSetViewSchema.parse((await api().patch(`/api/criteria/${d.version}`).set(engineer).send({ thresholds, notes: 'watch from 2.5 %' }).expect(200)).body);
    expect(patched.thresholds.capacitance.shiftBands[0].from).toBe(2.5);
    expect(patched.notes).toBe('watch from 2.5 %');
    expect((await api().get(`/api/criteria/${d.version}`).set(tester)).body.thresholds.capacitance.shiftBands[0].from).toBe(2.5);

    const audits = await env.db.getRepository(AuditEntry).findBy({ entity: 'criteria_set', entityId: String(d.id) });
    expect(audits.map((a) => a.action).sort()).toEqual(['create', 'update']);
    const update = audits.find((a) => a.action === 'update');
    expect((update?.after as { changes: { path: string; from: unknown; to: unknown }[] }).changes).toEqual([
      expect.objectContaining({ path: 'capacitance.shiftBands[0].from', from: 2, to: 2.5 }),
    ]);

    const publish = await api().post(`/api/criteria/${d.version}/publish`).set(engineer);
    expect(publish.status).toBe(403);
    expect((await api().post('/api/criteria').set(tester).send({ fromVersion: 2 })).status).toBe(403);
  });

  it('answers 400 naming the path of a bad threshold, and of a version that is not the row\'s', async () => {
    const d = (await api().post('/api/criteria').set(engineer).send({ fromVersion: 2 }).expect(201)).body;
    const bad = structuredClone(d.thresholds);
    bad.capacitance.shiftBands[1].from = 'three';
    const res = await api().patch(`/api/criteria/${d.version}`).set(engineer).send({ thresholds: bad });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['thresholds.capacitance.shiftBands[1].from']);

    const wrongVersion = { ...d.thresholds, version: 1 };
    const res2 = await api().patch(`/api/criteria/${d.version}`).set(engineer).send({ thresholds: wrongVersion });
    expect(res2.status).toBe(400);
    expect(res2.body.error.fields).toHaveProperty(['thresholds.version']);

    const res3 = await api().post('/api/criteria').set(engineer).send({ fromVersion: 999 });
    expect(res3.status).toBe(400);
    expect(res3.body.error.fields).toHaveProperty('fromVersion');
  });

  it('answers 409 on changing or publishing a published version', async () => {
    const res = await api().patch('/api/criteria/2').set(admin).send({ notes: 'x' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/published/);
    const again = await api().post('/api/criteria/2/publish').set(admin);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already published/);
  });
});

// Invented demo readings of a 40 MVA 132/33 kV two-winding unit (as the screening tests build them).
async function eventWithChlShift(CHL: number) {
  const unit = await makeUnit(env.db, { siteId });
  const reactance = { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } };
  await api()
    .post(`/api/units/${unit.id}/reading-sets`)
    .set(tester)
    .send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance })
    .expect(201);
  const ev = (await api().post('/api/events').set(protection).send({ unitId: unit.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }] })).body;
  await api()
    .post(`/api/events/${ev.id}/sessions`)
    .set(tester)
    .send({ takenAt: '2026-11-29T08:00:00Z', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL }, reactance })
    .expect(201);
  return ev.id as number;
}

describe('one event screened under two versions', () => {
  it('gives two verdicts for a CHL shift of +3.5 % once the investigate band starts above it', async () => {
    // 5392.35 / 5210 − 1 = +3.5 % (hand computed): investigate under set 2 (bands 2 / 3 / 5 %), watch once investigate starts at 4 %.
    const eventId = await eventWithChlShift(5392.35);
    const d = (await api().post('/api/criteria').set(engineer).send({ fromVersion: 2, name: 'Investigate from 4 %' }).expect(201)).body;
    const thresholds = structuredClone(d.thresholds);
    thresholds.capacitance.shiftBands = [
      { from: 2, level: 'watch' },
      { from: 4, level: 'investigate' },
      { from: 5, level: 'critical' },
    ];
    await api().patch(`/api/criteria/${d.version}`).set(engineer).send({ thresholds }).expect(200);

    // A draft screens only as a comparison.
    const draftRun = await api().post(`/api/events/${eventId}/screenings`).set(engineer).send({ comparison: true, criteriaVersion: d.version });
    expect(draftRun.status).toBe(201);

    const published = criteriaSetViewSchema.parse((await api().post(`/api/criteria/${d.version}/publish`).set(admin).expect(200)).body);
    expect(published.status).toBe('published');
    expect(published.publishedAt).not.toBeNull();
    expect((await api().patch(`/api/criteria/${d.version}`).set(admin).send({ notes: 'late' })).status).toBe(409);

    const normal = await api().post(`/api/events/${eventId}/screenings`).set(tester).send({});
    expect(normal.status).toBe(201);
    expect(normal.body.criteriaVersion).toBe(d.version);
    const old = await api().post(`/api/events/${eventId}/screenings`).set(engineer).send({ comparison: true, criteriaVersion: 2 });
    expect(old.status).toBe(201);
    expect(old.body.result.recommendation).toBe('conditional');
    expect(normal.body.result.recommendation).not.toBe(old.body.result.recommendation);
    expect(normal.body.result.recommendation).toBe(draftRun.body.result.recommendation);
    const chl = (r: { result: { indicators: { key: string; level: string }[] } }) => r.result.indicators.find((i) => i.key === 'capacitance.CHL.shiftPercent')?.level;
    expect([chl(normal.body), chl(old.body)]).toEqual(['watch', 'investigate']);
  });
});
