import { describe, expect, it } from 'vitest';
import { Attachment } from '../../../server/features/attachments/attachment.entity.js';
import { FaultEvent } from '../../../server/features/events/fault-event.entity.js';
import { Reading } from '../../../server/features/readings/reading.entity.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import { parseCase } from '../../../shared/schemas/case.js';
import { criteriaV2, screenCase } from '../../../shared/screening/index.js';
import { fileTypeProblem, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeUnit } from '../../helpers/factories.js';
import { sweepCsv } from '../../helpers/sweep-csv.js';

const opened = apiForFile(['protection', 'tester']);
const { api, as } = opened;

// Invented demo values: a 40 MVA 132/33 kV unit (Kestrel Valley Power style).
async function logFault(unitId: number, over: Record<string, unknown> = {}) {
  const res = await api()
    .post('/api/events')
    .set(as.protection)
    .send({ unitId, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 6.3, durationS: 0.12 }, { currentKA: 6.1, durationS: 0.08 }], protectionOperated: ['overcurrent'], ...over });
  expect(res.status).toBe(201);
  return res.body as { id: number; status: string; throughFault: Record<string, number | boolean | string> };
}

describe('POST /api/events', () => {
  it('logs a fault and answers its duty: 40 MVA at 33 kV has a rated current of 699.8 A', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    expect(ev.status).toBe('logged');
    // Rated current kVA/(√3·kV) = 40000/(√3·33) = 699.819 A (case-format worked value).
    expect(ev.throughFault.ratedCurrentA).toBeCloseTo(699.819, 3);
    expect(ev.throughFault.category).toBe('IV');
    const u = await opened.env.db.getRepository(Unit).findOneByOrFail({ id: unit.id });
    expect(u.lastEventId).toBe(ev.id);
    expect(u.lastEventStatus).toBe('logged');
  });

  it('rejects a zero duration, an unknown protection and a missing side with 400 naming each field', async () => {
    const unit = await makeUnit(opened.env.db);
    const res = await api().post('/api/events').set(as.protection).send({ unitId: unit.id, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', shots: [{ currentKA: 6, durationS: 0 }], protectionOperated: ['magic'] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['side', 'shots.0.durationS', 'protectionOperated.0']));
    expect(await opened.env.db.getRepository(FaultEvent).count({ where: { unitId: unit.id } })).toBe(0);
  });

  it('lists events newest first, filtered by unit and status', async () => {
    const unit = await makeUnit(opened.env.db);
    const a = await logFault(unit.id, { occurredAt: '2025-01-01T00:00:00Z' });
    const b = await logFault(unit.id, { occurredAt: '2026-01-01T00:00:00Z' });
    const res = await api().get(`/api/events?unitId=${unit.id}&status=logged`).set(as.tester);
    expect(res.body.total).toBe(2);
    expect(res.body.items.map((e: { id: number }) => e.id)).toEqual([b.id, a.id]);
    expect(res.body.items[0].unitSerial).toBe(unit.serial);
  });
});

describe('relay-record attachments', () => {
  const cfg = 'KESTREL VALLEY HX,REL670,1999\n3,3A,0D\n1,IA,A,,A,1,0,0,-32767,32767,1,1,P\n';

  it('stores a COMTRADE .cfg with its checksum and gives the bytes back', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const res = await api().post(`/api/events/${ev.id}/attachments`).set(as.protection).attach('file', Buffer.from(cfg), 'fault.cfg');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'fault.cfg', kind: 'comtrade-cfg', size: cfg.length });
    expect(res.body.sha256).toMatch(/^[0-9a-f]{64}$/);
    const dl = await api().get(`/api/events/${ev.id}/attachments/${res.body.id}`).set(as.tester).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(dl.status).toBe(200);
    expect((dl.body as Buffer).toString()).toBe(cfg);
  });

  it('answers 415 for a file whose content does not match its extension, and stores nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const res = await api().post(`/api/events/${ev.id}/attachments`).set(as.protection).attach('file', Buffer.from('%PDF-1.4 not a cfg'), 'fault.cfg');
    expect(res.status).toBe(415);
    expect(res.body.error.fields.file).toBe('the .cfg file is a PDF document: upload it with a .pdf name');
    const exe = await api().post(`/api/events/${ev.id}/attachments`).set(as.protection).attach('file', Buffer.from('MZ\x90\x00'), 'relay.exe');
    expect(exe.status).toBe(415);
    expect(await opened.env.db.getRepository(Attachment).count({ where: { ownerType: 'event', ownerId: ev.id } })).toBe(0);
  });

  it('answers 413 for a file over the upload limit', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const big = Buffer.alloc(12 * 1024 * 1024 + 1, 'a');
    const res = await api().post(`/api/events/${ev.id}/attachments`).set(as.protection).attach('file', big, 'huge.txt');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file_too_large');
  });

  it('answers 400 naming the file field when no file is sent', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const res = await api().post(`/api/events/${ev.id}/attachments`).set(as.protection).field('x', 'y');
    expect(res.status).toBe(400);
    expect(res.body.error.fields.file).toBe('required');
  });
});

describe('sessions, imports and sweeps', () => {
  it('opens a session (event → testing), imports a readings CSV, adds a sweep, and the case export carries them all', async () => {
    const unit = await makeUnit(opened.env.db);
    await api().post(`/api/units/${unit.id}/reading-sets`).set(as.tester).send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 } }).expect(201);
    const factory = (await api().get(`/api/units/${unit.id}`).set(as.tester)).body.readingSets[0];
    const base = await api().post(`/api/units/${unit.id}/sweeps`).set(as.tester).field('label', 'HV-A-open').field('testType', 'open-circuit').field('readingSetId', String(factory.id)).attach('file', Buffer.from(sweepCsv()), 'base.csv');
    expect(base.status).toBe(201);
    expect(base.body.pointCount).toBe(60);
    const ev = await logFault(unit.id);
    const session = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z', temperatureC: 31, capacitancePF: { CH: 3131 } });
    expect(session.status).toBe(201);
    expect(session.body.eventStatus).toBe('testing');
    const csv = 'quantity,configuration,phase,value,unit\ncapacitance,CL,,9.990,nF\ncapacitance,CHL,,5405,pF\nreactance,,A,11.6,%\n';
    const imp = await api().post(`/api/sessions/${session.body.id}/imports`).set(as.tester).attach('file', Buffer.from(csv), 'readings.csv');
    expect(imp.status).toBe(200);
    expect(imp.body.imported).toBe(3);
    const sw = await api().post(`/api/sessions/${session.body.id}/sweeps`).set(as.tester).field('label', 'HV-A-open').field('testType', 'open-circuit').attach('file', Buffer.from(sweepCsv(0.5)), 'post.csv');
    expect(sw.status).toBe(201);
    const points = await api().get(`/api/sweeps/${sw.body.id}`).set(as.tester);
    expect(points.body.points).toHaveLength(60);

    const exported = await api().get(`/api/events/${ev.id}/case`).set(as.tester);
    expect(exported.status).toBe(200);
    const c = exported.body;
    expect(parseCase(c).ok).toBe(true);
    expect(c.baseline.capacitancePF).toEqual({ CH: 3120, CL: 9870, CHL: 5210 });
    expect(c.postFault.capacitancePF).toEqual({ CH: 3131, CL: 9990, CHL: 5405 });
    expect(c.postFault.reactance).toEqual({ A: { percent: 11.6 } });
    expect(c.sweeps).toHaveLength(1);
    expect(c.sweeps[0].baseline).toHaveLength(60);
    expect(c.fault.shots).toHaveLength(2);
    // It runs through the engine unchanged.
    expect(['go', 'conditional', 'no-go']).toContain(screenCase(c).recommendation);

    const detail = await api().get(`/api/events/${ev.id}`).set(as.tester);
    expect(detail.body.status).toBe('testing');
    expect(detail.body.sessions).toHaveLength(1);
    expect(detail.body.sessions[0].sweeps).toHaveLength(1);
    expect(detail.body.audit.map((a: { action: string }) => a.action)).toEqual(expect.arrayContaining(['create', 'update', 'import']));
    // Each entry in words: the person by name, the session by its time and tester, no code names.
    const summaries: string[] = detail.body.audit.map((a: { summary: string }) => a.summary);
    const tester = detail.body.people[String(detail.body.sessions[0].createdById)].name;
    expect(summaries).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/ logged the fault of \d{1,2} [A-Z][a-z]{2} \d{4} \d{2}:\d{2}: /),
        expect.stringMatching(/ moved the event from logged to testing \(/),
        expect.stringMatching(new RegExp(`^${tester} imported 3 rows of readings from “readings\\.csv” into the tests of 29 Nov 2026 \\d{2}:\\d{2} by ${tester}\\.$`)),
      ]),
    );
    for (const s of summaries) expect(s).not.toMatch(/\b[a-z]+_[a-z]+\b|\b[a-z]+[A-Z][A-Za-z]*\b/);
  });

  it('rejects a CSV with bad rows as a whole, lists every bad row, and changes nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    const csv = 'quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\ncapacitance,CL,,"9990,5",pF\nreactance,,A,abc,%\nvoltage,,A,1,V\n';
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from(csv), 'readings.csv');
    expect(res.status).toBe(400);
    const keys = Object.keys(res.body.error.fields);
    expect(keys.some((k) => k.startsWith('row 3.'))).toBe(true);
    expect(keys.some((k) => k.startsWith('row 4.'))).toBe(true);
    expect(keys.some((k) => k.startsWith('row 5.'))).toBe(true);
    expect(res.body.error.fields['row 3.value']).toMatch(/decimal comma/);
    expect(await opened.env.db.getRepository(Reading).count({ where: { readingSetId: session.id } })).toBe(0);
  });

  it('refuses a readings file whose value is outside the case format range (a capacitance in the wrong unit) and stores nothing', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    // 5e9 pF = 5 mF: far beyond the 1e8 pF upper bound of shared/schemas/bounds.ts (common practice).
    const csv = 'quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\ncapacitance,CL,,5000000000,pF\n';
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from(csv), 'readings.csv');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain('capacitancePF.CL');
    expect(res.body.error.message).toMatch(/^The file has a value out of range; nothing was imported: capacitancePF\.CL: /);
    expect(await opened.env.db.getRepository(Reading).count({ where: { readingSetId: session.id } })).toBe(0);
  });

  it('names the first problem of a bad readings file in its message (line, column in words, what is wrong) and how many more', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    const csv = 'quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\ncapacitance,CL,,"9990,5",pF\nreactance,,A,abc,%\nvoltage,,A,1,V\n';
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from(csv), 'readings.csv');
    expect(res.status).toBe(400);
    const problems = Object.keys(res.body.error.fields).length;
    expect(problems).toBeGreaterThan(1);
    expect(res.body.error.message).toBe(
      `The file has errors; nothing was imported: line 3, value: ${res.body.error.fields['row 3.value']} (and ${problems - 1} more problems).`,
    );
    // One problem: no "more".
    const one = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from('quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,furlongs\n'), 'r.csv');
    expect(one.status).toBe(400);
    expect(one.body.error.message).toBe(`The file has errors; nothing was imported: line 2, unit: ${one.body.error.fields['row 2.unit']}.`);
    expect(one.body.error.message).not.toContain('more problem');
  });

  it('answers 415 naming the field file and the types it takes for a readings file of another type', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from('quantity,configuration,phase,value,unit\n'), 'readings.docx');
    expect(res.status).toBe(415);
    expect(res.body.error.fields.file).toBe(fileTypeProblem(UPLOAD_TYPES.sessionReadings, 'readings.docx'));
    expect(res.body.error.fields.file).toBe('readings.docx is not a readings file: pick a CSV (.csv) or text (.txt) file.');
  });

  it('answers 415 for an import that is not CSV text', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    const res = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0]), 'readings.csv');
    expect(res.status).toBe(415);
  });

  it('answers 409 to a new session or an import on a released event', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    const session = (await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-29T08:00:00Z' })).body;
    await opened.env.db.getRepository(FaultEvent).update(ev.id, { status: 'released' });
    const again = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-11-30T08:00:00Z' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('invalid_status');
    const imp = await api().post(`/api/sessions/${session.id}/imports`).set(as.tester).attach('file', Buffer.from('quantity,configuration,phase,value,unit\ncapacitance,CH,,3131,pF\n'), 'r.csv');
    expect(imp.status).toBe(409);
  });

  it('moves a held event back to testing when a re-test session is opened', async () => {
    const unit = await makeUnit(opened.env.db);
    const ev = await logFault(unit.id);
    await opened.env.db.getRepository(FaultEvent).update(ev.id, { status: 'held' });
    const res = await api().post(`/api/events/${ev.id}/sessions`).set(as.tester).send({ takenAt: '2026-12-01T08:00:00Z' });
    expect(res.status).toBe(201);
    expect((await opened.env.db.getRepository(FaultEvent).findOneByOrFail({ id: ev.id })).status).toBe('testing');
  });
});

describe('POST /api/screenings/preview', () => {
  it('answers the engine result for a case body, and 400 invalid_input naming the bad field of an invalid case', async () => {
    const c = { format: 'gapsight-case/1', unit: { serial: 'X', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5 }, fault: { occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', shots: [{ currentKA: 6.3, durationS: 0.12 }] } };
    const ok = await api().post('/api/screenings/preview').set(as.tester).send(c);
    expect(ok.status).toBe(200);
    const parsed = parseCase(c);
    if (!parsed.ok) throw new Error('the test case should be valid');
    // The preview screens with the newest published criteria set: version 2 (rules revision 2).
    expect(ok.body).toEqual(JSON.parse(JSON.stringify(screenCase(parsed.value, criteriaV2))));
    const bad = await api().post('/api/screenings/preview').set(as.tester).send({ ...c, unit: { ...c.unit, ratedKVA: -1 } });
    expect(bad.status).toBe(400);
    // The common error shape of every route: invalid_input with the field paths named.
    expect(bad.body.error.code).toBe('invalid_input');
    expect(Object.keys(bad.body.error.fields)).toContain('unit.ratedKVA');
  });
});
