// POST /api/units/reading-sets/import: reading sets of many units from one .xlsx or CSV file (one reading a row, one
// set per serial, kind and takenAt), every bad row listed and nothing written, one audited create per set; the type
// judged by content (415), a dry run that writes nothing; and the per-unit import reading an .xlsx.
import ExcelJS from 'exceljs';
import { beforeAll, describe, expect, it } from 'vitest';
import { In } from 'typeorm';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import type { Unit } from '../../../server/features/units/unit.entity.js';
import { DECIMAL_COMMA_MESSAGE } from '../../../shared/numbers.js';
import { readingSetsImportAnswerSchema, readingSetsImportPreviewSchema } from '../../../shared/schemas/responses/units-io.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeUnit } from '../../helpers/factories.js';
import { fileTypeProblem, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';

const opened = apiForFile(['admin', 'tester', 'engineer']);
const { api, as, userId } = opened;
let u1: Unit;
let u2: Unit;
beforeAll(async () => {
  u1 = await makeUnit(opened.env.db);
  u2 = await makeUnit(opened.env.db);
});
const setsOf = (...unitIds: number[]) => opened.env.db.getRepository(ReadingSet).find({ where: { unitId: In(unitIds) }, order: { id: 'ASC' } });

const HEADER = ['Serial', 'Kind', 'Taken at', 'Quantity', 'Configuration', 'Phase', 'Value', 'Unit', 'Top oil C', 'Reference'];

/** A workbook with a merged title row above the header, then the given rows. */
async function workbook(rows: (string | number | null)[][]): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('Readings');
  ws.getCell('A1').value = 'Baseline readings';
  ws.mergeCells('A1:J1');
  ws.getRow(2).values = HEADER;
  rows.forEach((r, i) => {
    ws.getRow(3 + i).values = r;
  });
  return Buffer.from(await wb.xlsx.writeBuffer());
}

const post = (file: Buffer, name: string, fields: Record<string, string> = {}, who = as.tester) => {
  let req = api().post('/api/units/reading-sets/import').set(who);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', file, name);
};

describe('POST /api/units/reading-sets/import', () => {
  it('creates one set per unit, kind and time from a workbook, each with one audited create', async () => {
    const file = await workbook([
      [u1.serial, 'factory', '2011-03-14', 'capacitance', 'CH', null, 4520, 'pF', 25, 'yes'],
      [u1.serial, 'factory', '2011-03-14', 'capacitance', 'CHL', null, 5210, 'pF', null, null],
      [u1.serial, 'routine', '2020-06-01', 'winding-resistance', null, 'A', 0.41, 'ohm', null, null],
      [u2.serial.toLowerCase(), 'commissioning', '2012-01-10', 'dissipation', 'CH', null, 0.3, '%', null, null],
    ]);
    const res = await post(file, 'baselines.xlsx');
    expect(res.status).toBe(201);
    const answer = readingSetsImportAnswerSchema.parse(res.body);
    expect(answer.imported).toBe(3);
    expect(answer.sets.map((s) => [s.unitId, s.kind, s.rows])).toEqual([
      [u1.id, 'factory', 2],
      [u1.id, 'routine', 1],
      [u2.id, 'commissioning', 1],
    ]);
    const sets = await setsOf(u1.id, u2.id);
    expect(sets.map((s) => [s.unitId, s.kind, s.isReference])).toEqual([
      [u1.id, 'factory', true],
      [u1.id, 'routine', false],
      [u2.id, 'commissioning', false],
    ]);
    const unitFile = await api().get(`/api/units/${u1.id}`).set(as.tester);
    const factory = unitFile.body.readingSets.find((s: { kind: string }) => s.kind === 'factory');
    expect(factory.values.capacitancePF).toEqual({ CH: 4520, CHL: 5210 });
    for (const s of sets) {
      const audits = await opened.env.db.getRepository(AuditEntry).findBy({ entity: 'reading_set', entityId: String(s.id) });
      expect(audits.map((a) => [a.action, a.userId])).toEqual([['create', userId.tester]]);
    }
  });

  it('keeps the time of day of a date cell: two routine sets of one day stay two sets', async () => {
    const u = await makeUnit(opened.env.db);
    const file = await workbook([
      [u.serial, 'routine', new Date('2021-05-04T09:30:00Z') as never, 'capacitance', 'CH', null, 4520, 'pF', null, null],
      [u.serial, 'routine', new Date('2021-05-04T14:00:00Z') as never, 'capacitance', 'CH', null, 4522, 'pF', null, null],
    ]);
    const res = await post(file, 'same-day.xlsx');
    expect(res.status).toBe(201);
    const sets = await setsOf(u.id);
    expect(sets.map((s) => s.takenAt.toISOString())).toEqual(['2021-05-04T09:30:00.000Z', '2021-05-04T14:00:00.000Z']);
  });

  it('answers 400 listing every bad row (decimal comma, unknown serial) and writes nothing', async () => {
    const u = await makeUnit(opened.env.db);
    const file = await workbook([
      [u.serial, 'factory', '2011-03-14', 'capacitance', 'CH', null, 4520, 'pF', null, null],
      [u.serial, 'factory', '2011-03-14', 'capacitance', 'CHL', null, '5210,5', 'pF', null, null],
      ['NO-SUCH-UNIT', 'routine', '2020-06-01', 'capacitance', 'CH', null, 4520, 'pF', null, null],
      [u.serial, 'yearly', '2020-06-01', 'capacitance', 'CH', null, 4520, 'kg', null, null],
    ]);
    const res = await post(file, 'bad.xlsx');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_file');
    expect(res.body.error.fields).toEqual({
      'row 4.value': DECIMAL_COMMA_MESSAGE,
      'row 5.serial': "no unit with serial 'NO-SUCH-UNIT'",
      'row 6.kind': "one of factory, commissioning, routine (found 'yearly')",
      'row 6.unit': "capacitance is given in pF or nF (found 'kg')",
    });
    expect(await setsOf(u.id)).toEqual([]);
  });

  it('imports a CSV file (semicolons), and names its decimal comma', async () => {
    const u = await makeUnit(opened.env.db);
    const good = `serial;kind;takenAt;quantity;configuration;phase;value;unit\n${u.serial};routine;2021-05-02;capacitance;CH;;4520.5;pF\n`;
    const res = await post(Buffer.from(good), 'routine.csv', { dryRun: 'false' }, as.admin);
    expect(res.status).toBe(201);
    expect(res.body.imported).toBe(1);
    expect((await setsOf(u.id)).map((s) => s.kind)).toEqual(['routine']);
    const bad = await post(Buffer.from(good.replace('4520.5', '4520,5')), 'routine.csv');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ 'row 2.value': DECIMAL_COMMA_MESSAGE });
    expect(await setsOf(u.id)).toHaveLength(1);
  });

  it('answers 415 naming the field file and the types it takes for a spreadsheet of another type', async () => {
    const res = await post(Buffer.from('serial,kind,takenAt\n'), 'readings.dat');
    expect(res.status).toBe(415);
    expect(res.body.error.fields.file).toBe(fileTypeProblem(UPLOAD_TYPES.spreadsheet, 'readings.dat'));
  });

  it('answers 415 for a file that is neither .xlsx nor CSV', async () => {
    const res = await post(Buffer.from('%PDF-1.4\n%âãÏÓ\n'), 'readings.csv');
    expect(res.status).toBe(415);
  });

  it('previews with dryRun: the sets found per unit and the row errors, nothing written', async () => {
    const u = await makeUnit(opened.env.db);
    const file = await workbook([
      [u.serial, 'factory', '2011-03-14', 'capacitance', 'CH', null, 4520, 'pF', null, null],
      [u.serial, 'routine', '2020-06-01', 'capacitance', 'CH', null, 'x', 'pF', null, null],
    ]);
    const res = await post(file, 'baselines.xlsx', { dryRun: 'true', mapping: JSON.stringify({ takenAt: 'Taken at' }) });
    expect(res.status).toBe(200);
    const preview = readingSetsImportPreviewSchema.parse(res.body);
    expect(preview.sheet).toBe('Readings');
    expect(preview.headerRow).toBe(2);
    expect(preview.columns.takenAt).toBe('Taken at');
    expect(preview.setCount).toBe(2);
    expect(preview.sets.map((s) => [s.serial, s.kind, s.rows, s.ok])).toEqual([
      [u.serial, 'factory', 1, true],
      [u.serial, 'routine', 1, false],
    ]);
    expect(Object.keys(preview.fields)).toEqual(['row 4.value']);
    expect(await setsOf(u.id)).toEqual([]);
  });

  it('answers 400 naming a mapping field that is no sheet field', async () => {
    const res = await post(await workbook([]), 'x.xlsx', { mapping: JSON.stringify({ colour: 'Serial' }) });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['mapping.colour']);
  });

  it('refuses an engineer with 403', async () => {
    const res = await post(await workbook([]), 'x.xlsx', {}, as.engineer);
    expect(res.status).toBe(403);
  });
});

describe('POST /api/units/:unitId/reading-sets/import (.xlsx)', () => {
  it('reads a workbook of readings rows as the readings CSV, naming rows by sheet row', async () => {
    const u = await makeUnit(opened.env.db);
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Sheet1');
    ws.getRow(1).values = ['quantity', 'configuration', 'phase', 'value', 'unit'];
    ws.getRow(2).values = ['capacitance', 'CH', null, 4520, 'pF'];
    ws.getRow(3).values = ['capacitance', 'CHL', null, '5210,5', 'pF'];
    const bytes = Buffer.from(await wb.xlsx.writeBuffer());
    const req = () => api().post(`/api/units/${u.id}/reading-sets/import`).set(as.tester).field('kind', 'factory').field('takenAt', '2011-03-14');
    const bad = await req().attach('file', bytes, 'factory.xlsx');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ 'row 3.value': DECIMAL_COMMA_MESSAGE });
    ws.getRow(3).values = ['capacitance', 'CHL', null, 5210.5, 'pF'];
    const good = await req().attach('file', Buffer.from(await wb.xlsx.writeBuffer()), 'factory.xlsx');
    expect(good.status).toBe(201);
    expect(good.body.values.capacitancePF).toEqual({ CH: 4520, CHL: 5210.5 });
  });
});
