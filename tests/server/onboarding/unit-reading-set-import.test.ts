// POST /api/units/:unitId/reading-sets/import: a baseline or routine set from a readings CSV (the session import's
// format), every bad row listed and nothing written, one audited create; kind, time and type checks.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import type { Unit } from '../../../server/features/units/unit.entity.js';
import { DECIMAL_COMMA_MESSAGE } from '../../../shared/numbers.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeUnit } from '../../helpers/factories.js';
import { fileTypeProblem, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';

let env: TestEnv;
let tester: { Authorization: string };
let testerId: number;
let engineer: { Authorization: string };
let unit: Unit;
beforeAll(async () => {
  env = await openTestEnv();
  const t = await createTestUser(env.db, ['tester']);
  testerId = t.id;
  tester = bearer(env.config, t.id);
  engineer = bearer(env.config, (await createTestUser(env.db, ['engineer'])).id);
  unit = await makeUnit(env.db);
});
afterAll(async () => {
  await env.db.destroy();
});

const api = () => request(env.app);
const HEADER = 'quantity,configuration,phase,value,unit';
const setsOf = (unitId: number) => env.db.getRepository(ReadingSet).find({ where: { unitId }, order: { id: 'ASC' } });
const post = (unitId: number, csv: string, fields: Record<string, string>, who = tester) => {
  let req = api().post(`/api/units/${unitId}/reading-sets/import`).set(who);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', Buffer.from(csv), 'factory.csv');
};

describe('POST /api/units/:unitId/reading-sets/import', () => {
  it('stores a factory set marked as the reference, with its readings, audited once', async () => {
    const u = await makeUnit(env.db);
    const csv = `${HEADER}\ncapacitance,CH,,4520,pF\ncapacitance,CHL,,5210,pF\nwinding-resistance,,A,0.412,ohm\n`;
    const res = await post(u.id, csv, { kind: 'factory', takenAt: '2011-03-14', isReference: 'true' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ unitId: u.id, kind: 'factory', isReference: true, values: { capacitancePF: { CH: 4520, CHL: 5210 }, windingResistanceOhm: { A: 0.412 } } });
    const sets = await setsOf(u.id);
    expect(sets.map((s) => [s.kind, s.isReference])).toEqual([['factory', true]]);
    const audits = await env.db.getRepository(AuditEntry).findBy({ entity: 'reading_set', entityId: String(sets[0].id) });
    expect(audits.map((a) => [a.action, a.userId])).toEqual([['create', testerId]]);
  });

  it('answers 400 listing every bad row (decimal comma named) and writes nothing', async () => {
    const csv = `${HEADER}\ncapacitance,CH,,"4520,5",pF\ncapacitance,CHL,,5210,volts\n`;
    const res = await post(unit.id, csv, { kind: 'routine', takenAt: '2024-05-01T09:00:00Z' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['row 2.value']).toBe(DECIMAL_COMMA_MESSAGE);
    expect(res.body.error.fields['row 3.unit']).toBeDefined();
    expect(await setsOf(unit.id)).toEqual([]);
  });

  it('answers 400 naming kind and takenAt when they are wrong', async () => {
    const res = await post(unit.id, `${HEADER}\ncapacitance,CH,,4520,pF\n`, { kind: 'post-fault', takenAt: 'yesterday' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['kind', 'takenAt']);
    expect(await setsOf(unit.id)).toEqual([]);
  });

  it('answers 415 for a file that is not CSV text and 404 for a unit that does not exist', async () => {
    const pdf = await api().post(`/api/units/${unit.id}/reading-sets/import`).set(tester).field('kind', 'routine').field('takenAt', '2024-05-01').attach('file', Buffer.from('%PDF-1.7'), 'set.pdf');
    expect(pdf.status).toBe(415);
    // Refused by its name, with the list the picker reads: the types a unit's readings import takes.
    expect(pdf.body.error.fields.file).toBe(fileTypeProblem(UPLOAD_TYPES.unitReadingSet, 'set.pdf'));
    expect(pdf.body.error.fields.file).toBe('set.pdf is not a readings file: pick a CSV (.csv), text (.txt) or Excel (.xlsx) file.');
    // A .csv name whose bytes are not text: refused by its content.
    const binary = await api().post(`/api/units/${unit.id}/reading-sets/import`).set(tester).field('kind', 'routine').field('takenAt', '2024-05-01').attach('file', Buffer.from([0, 1, 2, 255]), 'set.csv');
    expect(binary.status).toBe(415);
    expect(binary.body.error.fields.file).toMatch(/^set\.csv is not comma-separated text/);
    const missing = await post(987654321, `${HEADER}\ncapacitance,CH,,4520,pF\n`, { kind: 'routine', takenAt: '2024-05-01' });
    expect(missing.status).toBe(404);
  });

  it('refuses an engineer with 403', async () => {
    const res = await post(unit.id, `${HEADER}\ncapacitance,CH,,4520,pF\n`, { kind: 'routine', takenAt: '2024-05-01' }, engineer);
    expect(res.status).toBe(403);
    expect(await setsOf(unit.id)).toEqual([]);
  });
});
