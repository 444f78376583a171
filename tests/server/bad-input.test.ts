// Bad input answers 4xx naming the field, never 500: the same record created by eight requests at once (the database's
// unique key catches the ones that passed the "already exists" check together), a lone UTF-16 surrogate in any string,
// a JSON route sent another content type, a file name outside Latin-1 in Content-Disposition, text longer than its column.
import { parse as parseDisposition } from 'content-disposition';
import type { EntityTarget, ObjectLiteral } from 'typeorm';
import { describe, expect, it } from 'vitest';
import { Attachment } from '../../server/features/attachments/attachment.entity.js';
import { Design } from '../../server/features/designs/design.entity.js';
import { ReadingSet } from '../../server/features/readings/reading-set.entity.js';
import { SweepTrace } from '../../server/features/readings/sweep-trace.entity.js';
import { Site } from '../../server/features/sites/site.entity.js';
import { Unit } from '../../server/features/units/unit.entity.js';
import { User } from '../../server/features/users/user.entity.js';
import { makeDesign, makeSite, makeUnit } from '../helpers/factories.js';
import { sweepCsv } from '../helpers/sweep-csv.js';
import { correctionsFlow } from './corrections/flow.js';

const f = correctionsFlow();
const uniq = () => Math.random().toString(36).slice(2, 8);
const count = <T extends ObjectLiteral>(entity: EntityTarget<T>, where: Record<string, unknown>) => f.env.db.getRepository(entity).countBy(where as never);

/** Sends the same POST eight times at once; the statuses, sorted. */
async function eightAtOnce(path: string, body: object, auth: { Authorization: string }) {
  const answers = await Promise.all(Array.from({ length: 8 }, () => f.api().post(path).set(auth).send(body)));
  for (const a of answers) if (a.status === 409) expect(a.body.error.message).toMatch(/already|exists/i);
  return answers.map((a) => a.status).sort();
}
const oneCreated = [201, 409, 409, 409, 409, 409, 409, 409];

describe('the same record created by eight requests at once', () => {
  it('site name: one 201, seven 409, one row', async () => {
    const name = `Concurrent ${uniq()}`;
    expect(await eightAtOnce('/api/sites', { name, timeZone: 'UTC' }, f.as.admin)).toEqual(oneCreated);
    expect(await count(Site, { name })).toBe(1);
  });

  it('design reference: one 201, seven 409, one row', async () => {
    const reference = `KV-C-${uniq()}`;
    const body = { reference, maker: 'Invented Transformer Works', vectorGroup: 'YNd1', hvKV: 132, lvKV: 33, coolingStages: [{ stage: 'ONAN', kVA: 40000 }], impedancePercent: 10.5, impedanceBaseKVA: 40000 };
    expect(await eightAtOnce('/api/designs', body, f.as.admin)).toEqual(oneCreated);
    expect(await count(Design, { reference })).toBe(1);
  });

  it('unit serial: one 201, seven 409 naming the serial, one row', async () => {
    const [site, design] = [await makeSite(f.env.db), await makeDesign(f.env.db)];
    const serial = `KVP-C-${uniq()}`;
    const answers = await Promise.all(Array.from({ length: 8 }, () => f.api().post('/api/units').set(f.as.admin).send({ serial, siteId: site.id, designId: design.id })));
    expect(answers.map((a) => a.status).sort()).toEqual(oneCreated);
    for (const a of answers.filter((x) => x.status === 409)) expect(a.body.error.fields).toEqual({ serial: 'already in use' });
    expect(await count(Unit, { serial })).toBe(1);
  });

  it('user e-mail: one 201, seven 409, one row', async () => {
    const email = `c-${uniq()}@test.example`;
    expect(await eightAtOnce('/api/users', { email, name: 'Concurrent Person', roles: ['tester'] }, f.as.admin)).toEqual(oneCreated);
    expect(await count(User, { email })).toBe(1);
  });
});

describe('a lone UTF-16 surrogate', () => {
  const lone = 'Harrow \ud800';
  it('in a site name is a 400 naming the field, nothing stored', async () => {
    const before = await f.env.db.getRepository(Site).count();
    const res = await f.api().post('/api/sites').set(f.as.admin).send({ name: lone, timeZone: 'UTC' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', fields: { name: 'contains invalid Unicode (a lone surrogate)' } });
    expect(await f.env.db.getRepository(Site).count()).toBe(before);
  });

  it('in a unit serial is a 400 naming the field, nothing stored', async () => {
    const [site, design] = [await makeSite(f.env.db), await makeDesign(f.env.db)];
    const before = await f.env.db.getRepository(Unit).count();
    const res = await f.api().post('/api/units').set(f.as.admin).send({ serial: 'KVP-\udc00', siteId: site.id, designId: design.id });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ serial: 'contains invalid Unicode (a lone surrogate)' });
    expect(await f.env.db.getRepository(Unit).count()).toBe(before);
  });

  it('in a nested reading key or value is a 400 naming its path; a proper pair (an emoji) is fine', async () => {
    const unit = await makeUnit(f.env.db, { siteId: (await makeSite(f.env.db)).id });
    const key = await f.api().post(`/api/units/${unit.id}/reading-sets`).set(f.as.tester).send({ kind: 'factory', takenAt: '2019-05-02', capacitancePF: { 'C\ud800H': 3120 } });
    expect(key.status).toBe(400);
    expect(key.body.error.fields).toEqual({ 'capacitancePF.C\ufffdH': 'key contains invalid Unicode (a lone surrogate)' });
    const value = await f.api().post(`/api/units/${unit.id}/reading-sets`).set(f.as.tester).send({ kind: 'factory', takenAt: '2019-05-02', instrument: `M4100 \udbff`, capacitancePF: { CH: 3120 } });
    expect(value.status).toBe(400);
    expect(value.body.error.fields).toEqual({ instrument: 'contains invalid Unicode (a lone surrogate)' });
    expect(await count(ReadingSet, { unitId: unit.id })).toBe(0);
    const emoji = await f.api().post(`/api/units/${unit.id}/reading-sets`).set(f.as.tester).send({ kind: 'factory', takenAt: '2019-05-02', instrument: 'M4100 \ud83d\udd0c', capacitancePF: { CH: 3120 } });
    expect(emoji.status).toBe(201);
  });
});

describe('a JSON route sent another content type', () => {
  it('text/plain and form-encoded bodies are a 415 naming application/json, nothing stored', async () => {
    const name = `Plain ${uniq()}`;
    const plain = await f.api().post('/api/sites').set(f.as.admin).set('Content-Type', 'text/plain').send(JSON.stringify({ name, timeZone: 'UTC' }));
    expect(plain.status).toBe(415);
    expect(plain.body.error.code).toBe('unsupported_media_type');
    expect(plain.body.error.message).toMatch(/application\/json.*text\/plain/);
    const form = await f.api().post('/api/sites').set(f.as.admin).type('form').send({ name, timeZone: 'UTC' });
    expect(form.status).toBe(415);
    expect(form.body.error.message).toMatch(/application\/x-www-form-urlencoded/);
    expect(await count(Site, { name })).toBe(0);
    // JSON with a charset is JSON; a body-less POST on a route whose body is optional still works.
    const json = await f.api().post('/api/sites').set(f.as.admin).set('Content-Type', 'application/json; charset=utf-8').send(JSON.stringify({ name, timeZone: 'UTC' }));
    expect(json.status).toBe(201);
  });
});

describe('file names outside Latin-1', () => {
  it('an attachment named in German and Chinese uploads, lists and downloads with the same name', async () => {
    const { eventId } = await f.event();
    const finding = await f.api().post(`/api/events/${eventId}/findings`).set(f.as.engineer).send({ classification: 'no-damage', text: 'Seen through the inspection cover.' }).expect(201);
    const name = 'Schaltplan-Übersicht-变压器.pdf';
    const up = await f.api().post(`/api/findings/${finding.body.id}/attachments`).set(f.as.engineer).attach('file', Buffer.from('%PDF-1.7\n% invented\n'), name);
    expect(up.status).toBe(201);
    expect(up.body.name).toBe(name);
    expect((await f.env.db.getRepository(Attachment).findOneByOrFail({ id: up.body.id })).name).toBe(name);
    const ev = (await f.api().get(`/api/events/${eventId}`).set(f.as.tester).expect(200)).body;
    expect(ev.findings[0].attachments[0].name).toBe(name);
    const down = await f.api().get(`/api/findings/${finding.body.id}/attachments/${up.body.id}`).set(f.as.tester);
    expect(down.status).toBe(200);
    const header = down.headers['content-disposition'] as string;
    expect(header).toMatch(/^attachment; filename="[\x20-\x7e]+"; filename\*=UTF-8''/);
    expect(header).toContain(`filename*=UTF-8''${encodeURIComponent(name)}`);
    expect(parseDisposition(header)).toMatchObject({ type: 'attachment', parameters: { filename: name } });
  });

  it('a sweep file named outside Latin-1 is stored as sent; a name over 255 characters is a 400 naming the file', async () => {
    const { sessionId } = await f.event();
    const upload = (name: string, label: string) =>
      f.api().post(`/api/sessions/${sessionId}/sweeps`).set(f.as.tester).field('label', label).field('testType', 'open-circuit').attach('file', Buffer.from(sweepCsv()), name);
    const name = 'Wicklung-Ä-变压器.csv';
    const ok = await upload(name, 'HV-A-open');
    expect(ok.status).toBe(201);
    expect((await f.env.db.getRepository(SweepTrace).findOneByOrFail({ readingSetId: sessionId })).fileName).toBe(name);
    const long = await upload(`${'变'.repeat(256)}.csv`, 'HV-B-open');
    expect(long.status).toBe(400);
    expect(long.body.error.fields.file).toMatch(/255/);
    const label = await upload('b.csv', 'L'.repeat(61));
    expect(label.status).toBe(400);
    expect(Object.keys(label.body.error.fields)).toContain('label');
    expect(await f.env.db.getRepository(SweepTrace).countBy({ readingSetId: sessionId })).toBe(1);
  });

  it('a unit serial outside Latin-1 names the screening report without a 500', async () => {
    const { unitId, eventId } = await f.event();
    await f.env.db.getRepository(Unit).update(unitId, { serial: `变压器-${uniq()}` });
    const s = await f.screen(eventId);
    const res = await f.api().get(`/api/screenings/${s.id}/report.pdf`).set(f.as.tester);
    expect(res.status).toBe(200);
    const parsed = parseDisposition(res.headers['content-disposition'] as string);
    expect(parsed.type).toBe('inline');
    expect(parsed.parameters.filename).toMatch(/^gapsight-变压器-.+-screening-\d+\.pdf$/);
  });
});

describe('text longer than its column', () => {
  it('a configuration label over 20 characters and a tap position over 20 are 400s naming the field', async () => {
    const unit = await makeUnit(f.env.db, { siteId: (await makeSite(f.env.db)).id });
    const label = 'C'.repeat(21);
    const cfg = await f.api().post(`/api/units/${unit.id}/reading-sets`).set(f.as.tester).send({ kind: 'factory', takenAt: '2019-05-02', capacitancePF: { [label]: 3120 } });
    expect(cfg.status).toBe(400);
    expect(Object.keys(cfg.body.error.fields).join(' ')).toContain('capacitancePF');
    const tap = await f.api().post(`/api/units/${unit.id}/reading-sets`).set(f.as.tester).send({ kind: 'factory', takenAt: '2019-05-02', tapPosition: 'T'.repeat(21), capacitancePF: { CH: 3120 } });
    expect(tap.status).toBe(400);
    expect(tap.body.error.fields.tapPosition).toMatch(/20/);
    expect(await count(ReadingSet, { unitId: unit.id })).toBe(0);
  });
});
