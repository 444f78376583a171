import { describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { Reading } from '../../../server/features/readings/reading.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';

const opened = apiForFile(['admin', 'tester', 'engineer']);
const { api, as, userId } = opened;
const uniq = () => Math.random().toString(36).slice(2, 8);

describe('sites', () => {
  it('creates, lists and renames a site, with an audit entry holding before and after', async () => {
    const name = `Harrow ${uniq()}`;
    const created = await api().post('/api/sites').set(as.admin).send({ name, timeZone: 'Europe/London' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name, timeZone: 'Europe/London' });
    const list = await api().get('/api/sites').set(as.engineer);
    expect(list.body.map((s: { name: string }) => s.name)).toContain(name);
    const patched = await api().patch(`/api/sites/${created.body.id}`).set(as.admin).send({ name: `${name} B` });
    expect(patched.status).toBe(200);
    const entries = await opened.env.db.getRepository(AuditEntry).find({ where: { entity: 'site', entityId: String(created.body.id) }, order: { id: 'ASC' } });
    expect(entries.map((e) => e.action)).toEqual(['create', 'update']);
    expect(entries[1]).toMatchObject({ userId: userId.admin, before: { name }, after: { name: `${name} B` } });
  });

  it('rejects an unknown time zone with 400 naming the field', async () => {
    const res = await api().post('/api/sites').set(as.admin).send({ name: `X ${uniq()}`, timeZone: 'Mars/Olympus' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.timeZone).toMatch(/IANA/);
  });

  it("keeps a site's date format (a locale the runtime knows, or none for the ISO form) and refuses an unknown one", async () => {
    const created = await api().post('/api/sites').set(as.admin).send({ name: `Locale ${uniq()}`, timeZone: 'Europe/Berlin', locale: 'de-DE' });
    expect(created.status).toBe(201);
    expect(created.body.locale).toBe('de-DE');
    const plain = await api().post('/api/sites').set(as.admin).send({ name: `Plain ${uniq()}`, timeZone: 'UTC' });
    expect(plain.body.locale).toBeNull();
    const bad = await api().patch(`/api/sites/${created.body.id}`).set(as.admin).send({ locale: 'xx-NOPE' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.locale).toMatch(/not a known locale/);
    const cleared = await api().patch(`/api/sites/${created.body.id}`).set(as.admin).send({ locale: '' });
    expect(cleared.status).toBe(200);
    expect(cleared.body).toMatchObject({ locale: null, timeZone: 'Europe/Berlin' });
  });

  it('answers 409 for a duplicate name', async () => {
    const s = await makeSite(opened.env.db);
    const res = await api().post('/api/sites').set(as.admin).send({ name: s.name, timeZone: 'UTC' });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.name).toBe('already in use');
  });
});

describe('designs', () => {
  it('creates a design, lists it with its unit count and shows its sister units', async () => {
    const body = {
      reference: `KV-40-${uniq()}`,
      maker: 'Invented Transformer Works',
      vectorGroup: 'YNd1',
      hvKV: 132,
      lvKV: 33,
      coolingStages: [{ stage: 'ONAN', kVA: 40000 }, { stage: 'ONAF', kVA: 60000 }],
      impedancePercent: 10.5,
      impedanceBaseKVA: 40000,
      requiredCapacitance: ['CH', 'CL', 'CHL'],
    };
    const created = await api().post('/api/designs').set(as.admin).send(body);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ ...body, windings: 'two-winding', phases: 3, conductor: 'Cu' });
    await makeUnit(opened.env.db, { designId: created.body.id, siteId: (await makeSite(opened.env.db)).id });
    const list = await api().get('/api/designs').set(as.tester);
    expect(list.body.find((d: { id: number }) => d.id === created.body.id).unitCount).toBe(1);
    const one = await api().get(`/api/designs/${created.body.id}`).set(as.tester);
    expect(one.body.units).toHaveLength(1);
    expect((await api().patch(`/api/designs/${created.body.id}`).set(as.admin).send({ notes: 'sister family' })).body.notes).toBe('sister family');
  });

  it('rejects a design without cooling stages and with a negative impedance, naming both fields', async () => {
    const res = await api().post('/api/designs').set(as.admin).send({ reference: 'x', maker: 'y', vectorGroup: 'Dyn11', hvKV: 66, lvKV: 11, coolingStages: [], impedancePercent: -1, impedanceBaseKVA: 12000 });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['coolingStages', 'impedancePercent']));
  });

  it('answers 404 JSON for an unknown design', async () => {
    const res = await api().get('/api/designs/99999999').set(as.tester);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('units', () => {
  it('creates a unit whose nameplate defaults come from its design', async () => {
    const site = await makeSite(opened.env.db);
    const design = await makeDesign(opened.env.db, { impedancePercent: 8, impedanceBaseKVA: 12000, hvKV: 66, lvKV: 11 });
    const res = await api().post('/api/units').set(as.admin).send({ serial: `KVP-${uniq()}`, siteId: site.id, designId: design.id, year: 2005 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ siteId: site.id, designId: design.id, ratedKVA: 12000, impedancePercent: 8, hvKV: 66, lvKV: 11, phases: 3 });
  });

  it('changes a unit and audits the change with before and after', async () => {
    const unit = await makeUnit(opened.env.db, { systemImpedancePercent: 0 });
    const res = await api().patch(`/api/units/${unit.id}`).set(as.admin).send({ systemImpedancePercent: 0.4, position: 'T9' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ systemImpedancePercent: 0.4, position: 'T9' });
    const entry = await opened.env.db.getRepository(AuditEntry).findOneOrFail({ where: { entity: 'unit', entityId: String(unit.id), action: 'update' } });
    expect(entry.before).toMatchObject({ systemImpedancePercent: 0, position: 'T1' });
    expect(entry.after).toMatchObject({ systemImpedancePercent: 0.4, position: 'T9' });
  });

  it('answers 409 naming the serial when a change would duplicate another unit\'s serial', async () => {
    const a = await makeUnit(opened.env.db);
    const b = await makeUnit(opened.env.db);
    const res = await api().patch(`/api/units/${b.id}`).set(as.admin).send({ serial: a.serial });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.serial).toBe('already in use');
  });

  it('rejects unknown site and design ids with 400 naming both', async () => {
    const res = await api().post('/api/units').set(as.admin).send({ serial: `KVP-${uniq()}`, siteId: 99999999, designId: 99999998 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({ siteId: expect.any(String), designId: expect.any(String) });
  });

  it('pages, filters and sorts the fleet on the server', async () => {
    const site = await makeSite(opened.env.db);
    const design = await makeDesign(opened.env.db);
    const prefix = `PG${uniq()}`;
    for (const n of [3, 1, 2]) await makeUnit(opened.env.db, { serial: `${prefix}-${n}`, siteId: site.id, designId: design.id });
    const page1 = await api().get(`/api/units?siteId=${site.id}&sort=-serial&pageSize=2&page=1`).set(as.tester);
    expect(page1.status).toBe(200);
    expect(page1.body.total).toBe(3);
    expect(page1.body.items.map((u: { serial: string }) => u.serial)).toEqual([`${prefix}-3`, `${prefix}-2`]);
    expect(page1.body.items[0]).toMatchObject({ siteId: site.id, designId: design.id, siteName: site.name, designReference: design.reference });
    const page2 = await api().get(`/api/units?siteId=${site.id}&sort=-serial&pageSize=2&page=2`).set(as.tester);
    expect(page2.body.items.map((u: { serial: string }) => u.serial)).toEqual([`${prefix}-1`]);
    const q = await api().get(`/api/units?q=${prefix}-2`).set(as.tester);
    expect(q.body.items.map((u: { serial: string }) => u.serial)).toEqual([`${prefix}-2`]);
  });

  it('rejects an unknown sort and a page size over 500 with 400 naming query fields', async () => {
    const res = await api().get('/api/units?sort=colour&pageSize=501').set(as.tester);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['query.sort', 'query.pageSize']));
  });
});

describe('POST /api/units/:id/reading-sets', () => {
  it('stores a factory set in the case format, with the insulation temperature from top and bottom oil, and gives it back', async () => {
    const unit = await makeUnit(opened.env.db);
    const body = {
      kind: 'factory',
      takenAt: '2019-05-02',
      topOilC: 30,
      bottomOilC: 26,
      tapPosition: '9b',
      capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 },
      dissipationPercent: { CH: 0.28, CL: 0.31, CHL: 0.25 },
      reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } },
    };
    const res = await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'factory', temperatureC: 28, tapPosition: '9b' });
    expect(res.body.values).toEqual({
      takenAt: '2019-05-02',
      temperatureC: 28,
      tapPosition: '9b',
      capacitancePF: body.capacitancePF,
      dissipationPercent: body.dissipationPercent,
      reactance: body.reactance,
    });
    const detail = await api().get(`/api/units/${unit.id}`).set(as.engineer);
    expect(detail.body.readingSets).toHaveLength(1);
    expect(detail.body.design).toMatchObject({ id: unit.designId, reference: expect.stringMatching(/^D-/) }); // the factory's design
  });

  it('rejects a post-fault kind, a missing date and a negative capacitance, naming each field, and stores nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const res = await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'post-fault', capacitancePF: { CH: -3 } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['kind', 'takenAt', 'capacitancePF.CH']));
    expect(await opened.env.db.getRepository(ReadingSet).count({ where: { unitId: unit.id } })).toBe(0);
    expect(await opened.env.db.getRepository(Reading).count({ where: { readingSet: { unitId: unit.id } } })).toBe(0);
  });
});
