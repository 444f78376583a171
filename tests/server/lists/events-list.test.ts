import { beforeAll, describe, expect, it } from 'vitest';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import type { Site } from '../../../server/features/sites/site.entity.js';
import type { Unit } from '../../../server/features/units/unit.entity.js';
import type { EventStatus } from '../../../shared/schemas/enums.js';
import type { FaultType } from '../../../shared/schemas/case.js';
import { eventListPageSchema } from '../../../shared/schemas/responses/index.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';

// GET /api/events: every filter, paging and sorting, on events of this file's own sites (invented values).

const file = apiForFile(['protection', 'engineer']);
const { api, as } = file;

let site: Site;
let otherSite: Site;
let units: Unit[];
let other: Unit;
const ids: Record<string, number> = {};
const tag = `LST${Date.now().toString(36).toUpperCase()}`;

async function addEvent(name: string, unit: Unit, occurredAt: string, status: EventStatus, type: FaultType = 'three-phase') {
  const repo = file.env.db.getRepository(FaultEvent);
  const e = await repo.save(repo.create({ unitId: unit.id, occurredAt: new Date(occurredAt), type, side: 'lv', shots: [{ currentKA: 6.3, durationS: 0.12 }], protectionOperated: ['overcurrent'], transformerTripped: true, status }));
  ids[name] = e.id;
}

beforeAll(async () => {
  site = await makeSite(file.env.db);
  otherSite = await makeSite(file.env.db);
  const design = await makeDesign(file.env.db);
  units = [
    await makeUnit(file.env.db, { siteId: site.id, designId: design.id, serial: `${tag}-B2` }),
    await makeUnit(file.env.db, { siteId: site.id, designId: design.id, serial: `${tag}-A1` }),
  ];
  other = await makeUnit(file.env.db, { siteId: otherSite.id, designId: design.id, serial: `${tag}-C3` });
  await addEvent('b2Jan', units[0], '2026-01-10T08:00:00Z', 'released');
  await addEvent('b2Mar', units[0], '2026-03-31T23:30:00Z', 'testing', 'phase-to-ground');
  await addEvent('a1Feb', units[1], '2026-02-15T12:00:00Z', 'logged', 'phase-to-phase');
  await addEvent('a1Apr', units[1], '2026-04-01T00:00:00Z', 'screened');
  await addEvent('c3Mar', other, '2026-03-01T06:00:00Z', 'logged');
});

type Page = { items: { id: number; unitSerial: string; status: string }[]; total: number; page: number; pageSize: number };

async function list(query: string): Promise<Page> {
  const res = await api().get(`/api/events?${query}`).set(as.engineer);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  eventListPageSchema.parse(res.body);
  return res.body as Page;
}
const idsOf = (p: Page) => p.items.map((e) => e.id);

describe('GET /api/events filters', () => {
  it('finds events by part of a unit serial (q), across sites', async () => {
    const p = await list(`q=${tag}-A`);
    expect(idsOf(p)).toEqual([ids.a1Apr, ids.a1Feb]);
    expect(p.items[0].unitSerial).toBe(`${tag}-A1`);
    expect((await list(`q=${tag}`)).total).toBe(5);
  });

  it('treats % and _ in q as plain characters', async () => {
    expect((await list(`q=${encodeURIComponent(`${tag}%`)}`)).total).toBe(0);
    expect((await list(`q=${encodeURIComponent(`${tag}-_1`)}`)).total).toBe(0);
  });

  it('keeps to one site, and to one unit', async () => {
    expect(idsOf(await list(`siteId=${otherSite.id}`))).toEqual([ids.c3Mar]);
    expect(idsOf(await list(`unitId=${units[0].id}`))).toEqual([ids.b2Mar, ids.b2Jan]);
  });

  it('takes one status, several comma-separated, or the parameter repeated', async () => {
    expect(idsOf(await list(`siteId=${site.id}&status=logged`))).toEqual([ids.a1Feb]);
    expect(idsOf(await list(`siteId=${site.id}&status=logged,released`))).toEqual([ids.a1Feb, ids.b2Jan]);
    expect(idsOf(await list(`siteId=${site.id}&status=testing&status=screened`))).toEqual([ids.a1Apr, ids.b2Mar]);
  });

  it('takes one fault type or several', async () => {
    expect(idsOf(await list(`siteId=${site.id}&type=phase-to-ground`))).toEqual([ids.b2Mar]);
    expect(idsOf(await list(`siteId=${site.id}&type=phase-to-ground,phase-to-phase`))).toEqual([ids.b2Mar, ids.a1Feb]);
  });

  it('keeps the whole day of a date-only `to` and starts `from` at its midnight (UTC)', async () => {
    // b2Mar is at 23:30 on 31 March, a1Apr at midnight on 1 April.
    expect(idsOf(await list(`siteId=${site.id}&from=2026-02-15&to=2026-03-31`))).toEqual([ids.b2Mar, ids.a1Feb]);
    expect(idsOf(await list(`siteId=${site.id}&from=2026-04-01`))).toEqual([ids.a1Apr]);
  });

  it('takes instants as they are, both ends inclusive', async () => {
    expect(idsOf(await list(`siteId=${site.id}&from=2026-02-15T12:00:00Z&to=2026-03-31T23:00:00Z`))).toEqual([ids.a1Feb]);
    expect(idsOf(await list(`siteId=${site.id}&to=2026-01-10T08:00:00Z`))).toEqual([ids.b2Jan]);
  });

  it('lists only events without a relay record when withoutAttachments=true, and only those with one when false', async () => {
    const cfg = 'KESTREL VALLEY HX,REL670,1999\n3,3A,0D\n1,IA,A,,A,1,0,0,-32767,32767,1,1,P\n';
    const up = await api().post(`/api/events/${ids.c3Mar}/attachments`).set(as.protection).attach('file', Buffer.from(cfg), 'fault.cfg');
    expect(up.status).toBe(201);
    expect((await list(`q=${tag}&withoutAttachments=true`)).items.map((e) => e.id)).not.toContain(ids.c3Mar);
    expect((await list(`q=${tag}&withoutAttachments=true`)).total).toBe(4);
    expect(idsOf(await list(`q=${tag}&withoutAttachments=false`))).toEqual([ids.c3Mar]);
  });
});

describe('GET /api/events paging and sorting', () => {
  it('answers one page of the size asked for, with the total of every page', async () => {
    const first = await list(`q=${tag}&pageSize=2&page=1`);
    const third = await list(`q=${tag}&pageSize=2&page=3`);
    expect(first).toMatchObject({ total: 5, page: 1, pageSize: 2 });
    expect(idsOf(first)).toEqual([ids.a1Apr, ids.b2Mar]);
    expect(idsOf(third)).toEqual([ids.b2Jan]);
  });

  it('sorts by fault time both ways', async () => {
    expect(idsOf(await list(`q=${tag}&sort=occurredAt`))).toEqual([ids.b2Jan, ids.a1Feb, ids.c3Mar, ids.b2Mar, ids.a1Apr]);
    expect(idsOf(await list(`q=${tag}&sort=-occurredAt`))).toEqual([ids.a1Apr, ids.b2Mar, ids.c3Mar, ids.a1Feb, ids.b2Jan]);
  });

  it('sorts by unit serial both ways, newest first within a unit', async () => {
    expect(idsOf(await list(`q=${tag}&sort=serial`))).toEqual([ids.a1Apr, ids.a1Feb, ids.b2Mar, ids.b2Jan, ids.c3Mar]);
    expect(idsOf(await list(`q=${tag}&sort=-serial`))).toEqual([ids.c3Mar, ids.b2Mar, ids.b2Jan, ids.a1Apr, ids.a1Feb]);
  });

  it('sorts by status both ways, newest first within a status', async () => {
    const asc = await list(`q=${tag}&sort=status`);
    expect(asc.items.map((e) => e.status)).toEqual(['logged', 'logged', 'released', 'screened', 'testing']);
    expect(idsOf(asc).slice(0, 2)).toEqual([ids.c3Mar, ids.a1Feb]);
    expect((await list(`q=${tag}&sort=-status`)).items.map((e) => e.status)).toEqual(['testing', 'screened', 'released', 'logged', 'logged']);
  });
});

describe('GET /api/events bad queries', () => {
  const bad: [string, string][] = [
    ['status=lost', 'query.status'],
    ['status=logged,lost', 'query.status'],
    ['type=lightning', 'query.type'],
    ['from=yesterday', 'query.from'],
    ['to=2026-02-30', 'query.to'],
    ['from=2026-03-01&to=2026-02-01', 'query.to'],
    ['sort=site', 'query.sort'],
    ['withoutAttachments=yes', 'query.withoutAttachments'],
    ['page=0', 'query.page'],
    ['pageSize=501', 'query.pageSize'],
    ['siteId=abc', 'query.siteId'],
    [`q=${'x'.repeat(61)}`, 'query.q'],
  ];
  for (const [query, field] of bad) {
    it(`answers 400 naming ${field} for ${query.slice(0, 40)}`, async () => {
      const res = await api().get(`/api/events?${query}`).set(as.engineer);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    });
  }

  it('answers 401 without a token', async () => {
    expect((await api().get('/api/events')).status).toBe(401);
  });
});
