import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FixedClock } from '../../../server/common/clock.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { FollowUp } from '../../../server/features/screenings/follow-up.entity.js';
import type { Site } from '../../../server/features/sites/site.entity.js';
import type { Unit } from '../../../server/features/units/unit.entity.js';
import { followUpListPageSchema, type FollowUpListItem } from '../../../shared/schemas/responses/index.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeSite, makeUnit } from '../../helpers/factories.js';

// GET /api/follow-ups: due buckets computed against a fixed clock, site filter, order, paging (invented values).

const NOW = '2026-06-10T12:00:00Z';
const clock = new FixedClock(NOW);
let env: TestEnv;
let auth: { Authorization: string };
let london: Site;
let newYork: Site;
let eventId: number;
const ids: Record<string, number> = {};

async function addEvent(unit: Unit) {
  const repo = env.db.getRepository(FaultEvent);
  return repo.save(repo.create({ unitId: unit.id, occurredAt: new Date('2026-05-20T03:00:00Z'), type: 'three-phase', side: 'lv', shots: [{ currentKA: 6, durationS: 0.1 }], protectionOperated: [], transformerTripped: true, status: 'released' }));
}

async function addFollowUp(name: string, event: number, dueAt: string | null, closedAt: string | null = null) {
  const repo = env.db.getRepository(FollowUp);
  const f = await repo.save(repo.create({ eventId: event, task: `Task ${name}`, dueAt: dueAt ? new Date(dueAt) : null, closedAt: closedAt ? new Date(closedAt) : null, result: closedAt ? 'done' : null }));
  ids[name] = f.id;
}

beforeAll(async () => {
  env = await openTestEnv({ clock });
  auth = bearer(env.config, (await createTestUser(env.db, ['tester'])).id);
  london = await makeSite(env.db, { timeZone: 'Europe/London' });
  newYork = await makeSite(env.db, { timeZone: 'America/New_York' });
  const lu = await makeUnit(env.db, { siteId: london.id });
  const nu = await makeUnit(env.db, { siteId: newYork.id });
  const le = await addEvent(lu);
  const ne = await addEvent(nu);
  eventId = le.id;
  await addFollowUp('overdueOld', le.id, '2026-06-01T09:00:00Z');
  await addFollowUp('overdueToday', le.id, '2026-06-10T08:00:00Z');
  await addFollowUp('dueSoon', le.id, '2026-06-12T08:00:00Z');
  // Exactly seven days from now: past the end of "this week".
  await addFollowUp('dueEdge', le.id, '2026-06-17T12:00:00Z');
  await addFollowUp('noDue', le.id, null);
  await addFollowUp('closed', le.id, '2026-06-02T09:00:00Z', '2026-06-03T09:00:00Z');
  await addFollowUp('newYork', ne.id, '2026-06-05T00:00:00Z');
});

afterAll(async () => {
  await env.db.destroy();
});

type Page = { items: FollowUpListItem[]; total: number; page: number; pageSize: number };

async function list(query: string): Promise<Page> {
  const res = await request(env.app).get(`/api/follow-ups?${query}`).set(auth);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return followUpListPageSchema.parse(res.body);
}
const idsOf = (p: Page) => p.items.map((f) => f.id);

describe('GET /api/follow-ups', () => {
  it('lists the overdue ones of a site, most overdue first, with days overdue on the site’s calendar', async () => {
    clock.set(NOW);
    const p = await list(`due=overdue&siteId=${london.id}`);
    expect(idsOf(p)).toEqual([ids.overdueOld, ids.overdueToday]);
    expect(p.total).toBe(2);
    // Due 1 June 10:00 London time, now 10 June 13:00: nine calendar days; due earlier today: none yet.
    expect(p.items.map((f) => f.daysOverdue)).toEqual([9, 0]);
    expect(p.items[0]).toMatchObject({ eventId, siteId: london.id, siteName: london.name, siteTimeZone: 'Europe/London', task: 'Task overdueOld', dueAt: '2026-06-01T09:00:00.000Z', closedAt: null, eventStatus: 'released' });
  });

  it('counts days overdue in the site’s own zone', async () => {
    clock.set(NOW);
    // Due 4 June 20:00 New York time, now 10 June 08:00 there: six calendar days.
    const p = await list(`due=overdue&siteId=${newYork.id}`);
    expect(idsOf(p)).toEqual([ids.newYork]);
    expect(p.items[0].daysOverdue).toBe(6);
  });

  it('lists as due this week those due from now to seven days ahead (the seventh day’s instant excluded), soonest first', async () => {
    clock.set(NOW);
    const p = await list(`due=week&siteId=${london.id}`);
    expect(idsOf(p)).toEqual([ids.dueSoon]);
    expect(p.items[0].daysOverdue).toBeNull();
  });

  it('lists every open one newest due first, those without a due date last, never a closed one', async () => {
    clock.set(NOW);
    const p = await list(`due=open&siteId=${london.id}`);
    expect(idsOf(p)).toEqual([ids.dueEdge, ids.dueSoon, ids.overdueToday, ids.overdueOld, ids.noDue]);
    expect(idsOf(await list(`siteId=${london.id}`))).toEqual(idsOf(p));
  });

  it('moves a follow-up from this week to overdue as the clock passes its due time', async () => {
    clock.set('2026-06-13T12:00:00Z');
    const overdue = await list(`due=overdue&siteId=${london.id}`);
    expect(idsOf(overdue)).toEqual([ids.overdueOld, ids.overdueToday, ids.dueSoon]);
    expect(overdue.items.map((f) => f.daysOverdue)).toEqual([12, 3, 1]);
    expect(idsOf(await list(`due=week&siteId=${london.id}`))).toEqual([ids.dueEdge]);
    clock.set(NOW);
  });

  it('lists across sites without a site filter', async () => {
    clock.set(NOW);
    const p = await list('due=overdue&pageSize=500');
    expect(idsOf(p)).toEqual(expect.arrayContaining([ids.overdueOld, ids.overdueToday, ids.newYork]));
    expect(idsOf(p)).not.toContain(ids.closed);
    expect(idsOf(p)).not.toContain(ids.dueSoon);
  });

  it('answers one page with the total of every page', async () => {
    clock.set(NOW);
    const first = await list(`due=open&siteId=${london.id}&pageSize=2`);
    const last = await list(`due=open&siteId=${london.id}&pageSize=2&page=3`);
    expect(first).toMatchObject({ total: 5, page: 1, pageSize: 2 });
    expect(idsOf(first)).toEqual([ids.dueEdge, ids.dueSoon]);
    expect(idsOf(last)).toEqual([ids.noDue]);
  });

  it('answers 400 naming the field for an unknown bucket, a bad site id or page size', async () => {
    for (const [query, field] of [
      ['due=later', 'query.due'],
      ['siteId=0', 'query.siteId'],
      ['pageSize=1000', 'query.pageSize'],
    ]) {
      const res = await request(env.app).get(`/api/follow-ups?${query}`).set(auth);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    }
  });

  it('answers 401 without a token', async () => {
    expect((await request(env.app).get('/api/follow-ups')).status).toBe(401);
  });
});
