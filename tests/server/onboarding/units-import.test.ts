// POST /api/units/import: .xlsx and CSV fleet files, every bad row listed before anything is saved, all or nothing,
// one audited create per unit; the type judged by content (415), the size limit (413), a dry run that saves nothing.
import ExcelJS from 'exceljs';
import { beforeAll, describe, expect, it } from 'vitest';
import { Like } from 'typeorm';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { UPLOAD_LIMITS } from '../../../server/common/upload.js';
import { Unit } from '../../../server/features/units/unit.entity.js';
import type { Design } from '../../../server/features/designs/design.entity.js';
import type { Site } from '../../../server/features/sites/site.entity.js';
import { DECIMAL_COMMA_MESSAGE } from '../../../shared/numbers.js';
import { unitImportAnswerSchema, unitImportPreviewSchema } from '../../../shared/schemas/responses/units-io.js';
import { apiForFile } from '../../helpers/api-file.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';
import { fileTypeProblem, UPLOAD_TYPES } from '../../../shared/uploads/file-types.js';

const opened = apiForFile(['admin', 'tester']);
const { api, as, userId } = opened;
let site: Site;
let design: Design;
beforeAll(async () => {
  site = await makeSite(opened.env.db);
  design = await makeDesign(opened.env.db, { hvKV: 132, lvKV: 33, impedancePercent: 10.5, impedanceBaseKVA: 40000 });
});
const uniq = () => Math.random().toString(36).slice(2, 8).toUpperCase();
const unitsLike = (prefix: string) => opened.env.db.getRepository(Unit).find({ where: { serial: Like(`${prefix}%`) }, order: { serial: 'ASC' } });
const createAudits = (ids: number[]) =>
  Promise.all(ids.map((id) => opened.env.db.getRepository(AuditEntry).findBy({ entity: 'unit', entityId: String(id), action: 'create' })));

/**
 * A register as engineers keep it: a title row, then a two-row header with vertically merged cells (Serial, Site,
 * Design, Impedance) and a horizontally merged "Voltage (kV)" over HV and LV; the site cell merged down two units.
 */
async function register(rows: (string | number | null)[][], opts: { siteMergedOver?: [number, number] } = {}): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('Units');
  ws.getCell('A1').value = 'Transformer register';
  ws.mergeCells('A1:G1');
  ws.getRow(2).values = ['Serial', 'Site', 'Design', 'Voltage (kV)', null, 'Impedance %', 'Year'];
  ws.getRow(3).values = [null, null, null, 'HV', 'LV', null, null];
  for (const col of ['A', 'B', 'C', 'F', 'G']) ws.mergeCells(`${col}2:${col}3`);
  ws.mergeCells('D2:E2');
  rows.forEach((r, i) => {
    ws.getRow(4 + i).values = r;
  });
  if (opts.siteMergedOver) ws.mergeCells(`B${opts.siteMergedOver[0]}:B${opts.siteMergedOver[1]}`);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

describe('POST /api/units/import (.xlsx)', () => {
  it('answers 400 listing every bad row (decimal comma named) and writes nothing', async () => {
    const p = `X${uniq()}-`;
    await makeUnit(opened.env.db, { serial: `${p}TAKEN`, siteId: site.id, designId: design.id });
    const file = await register([
      [`${p}1`, site.name, design.reference, 132, 33, 10.5, 2011],
      [`${p}2`, site.name, design.reference, '132,5', 33, null, null],
      [`${p}3`, 'No Such Site', design.reference, 132, 33, null, null],
      [`${p}4`, site.name, 'NO-SUCH-DESIGN', 132, 'thirty', null, null],
      [`${p}1`, site.name, design.reference, null, null, null, null],
      [`${p}TAKEN`, site.name, design.reference, null, null, null, null],
    ]);
    const res = await api().post('/api/units/import').set(as.admin).attach('file', file, 'register.xlsx');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_file');
    expect(res.body.error.fields).toEqual({
      'row 5.hvKV': DECIMAL_COMMA_MESSAGE,
      'row 6.site': "no site named 'No Such Site'",
      'row 7.design': "no design with reference 'NO-SUCH-DESIGN'",
      'row 7.lvKV': 'not a number',
      'row 8.serial': 'repeats the serial of row 4',
      'row 9.serial': 'a unit with this serial exists',
    });
    expect((await unitsLike(p)).map((u) => u.serial)).toEqual([`${p}TAKEN`]);
  });

  it('imports a good workbook (merged header and site cells read as their master cell) with one audited create per unit', async () => {
    const p = `G${uniq()}-`;
    const file = await register(
      [
        [`${p}1`, site.name, design.reference, 132, 33, 10.5, 2011],
        [`${p}2`, null, design.reference.toLowerCase(), 66, 11, null, null],
      ],
      { siteMergedOver: [4, 5] },
    );
    const res = await api().post('/api/units/import').set(as.admin).attach('file', file, 'register.xlsx');
    expect(res.status).toBe(201);
    expect(unitImportAnswerSchema.safeParse(res.body).success).toBe(true);
    expect(res.body.imported).toBe(2);
    expect(res.body.rows.map((r: { row: number; serial: string }) => [r.row, r.serial])).toEqual([
      [4, `${p}1`],
      [5, `${p}2`],
    ]);
    const units = await unitsLike(p);
    expect(units.map((u) => [u.serial, u.siteId, u.designId, u.hvKV, u.lvKV, u.impedancePercent, u.year])).toEqual([
      [`${p}1`, site.id, design.id, 132, 33, 10.5, 2011],
      // Impedance and year left empty: the design's impedance, no year.
      [`${p}2`, site.id, design.id, 66, 11, 10.5, null],
    ]);
    const audits = await createAudits(units.map((u) => u.id));
    expect(audits.map((a) => a.length)).toEqual([1, 1]);
    expect(audits[0][0]).toMatchObject({ userId: userId.admin, after: { serial: `${p}1`, hvKV: 132 } });
  });

  it('answers a dry run with the columns found, the rows and every problem, and saves nothing', async () => {
    const p = `D${uniq()}-`;
    const file = await register([
      [`${p}1`, site.name, design.reference, 132, 33, 10.5, 2011],
      [`${p}2`, site.name, design.reference, '33,0', 11, null, null],
    ]);
    const res = await api().post('/api/units/import').set(as.admin).field('dryRun', 'true').attach('file', file, 'register.xlsx');
    expect(res.status).toBe(200);
    expect(unitImportPreviewSchema.safeParse(res.body).success).toBe(true);
    expect(res.body).toMatchObject({
      dryRun: true,
      imported: 0,
      sheet: 'Units',
      headerRow: 3,
      columns: { serial: 'Serial', site: 'Site', design: 'Design', hvKV: 'HV', lvKV: 'LV', impedancePercent: 'Impedance %', year: 'Year', position: null },
      total: 2,
      good: 1,
      fields: { 'row 5.hvKV': DECIMAL_COMMA_MESSAGE },
    });
    expect(res.body.rows.map((r: { row: number; ok: boolean; cells: { hvKV: string } }) => [r.row, r.ok, r.cells.hvKV])).toEqual([
      [4, true, '132'],
      [5, false, '33,0'],
    ]);
    expect(await unitsLike(p)).toEqual([]);
  });

  it('takes a column mapping for headers it does not know', async () => {
    const p = `M${uniq()}-`;
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Sheet1');
    ws.addRow(['Asset', 'Where', 'Family', 'Primary']);
    ws.addRow([`${p}1`, site.name, design.reference, 132]);
    const file = Buffer.from(await wb.xlsx.writeBuffer());
    const mapping = JSON.stringify({ serial: 'asset', site: 'Where', design: 'Family', hvKV: 'Primary' });
    const res = await api().post('/api/units/import').set(as.admin).field('mapping', mapping).attach('file', file, 'assets.xlsx');
    expect(res.status).toBe(201);
    expect((await unitsLike(p)).map((u) => [u.serial, u.hvKV])).toEqual([[`${p}1`, 132]]);
  });

  it('answers 400 naming the mapping when it is not JSON or names an unknown field', async () => {
    const file = Buffer.from(`serial,site,design\nQ-${uniq()},${site.name},${design.reference}\n`);
    const notJson = await api().post('/api/units/import').set(as.admin).field('mapping', '{serial:').attach('file', file, 'u.csv');
    expect(notJson.status).toBe(400);
    expect(notJson.body.error.fields.mapping).toMatch(/not JSON/);
    const unknown = await api().post('/api/units/import').set(as.admin).field('mapping', '{"colour":"Serial"}').attach('file', file, 'u.csv');
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields['mapping.colour']).toMatch(/not a unit field/);
  });
});

describe('POST /api/units/import (CSV)', () => {
  it('answers 400 for a semicolon file with decimal commas, naming each row, and writes nothing', async () => {
    const p = `C${uniq()}-`;
    const csv = `serial;site;design;hvKV;lvKV\n${p}1;${site.name};${design.reference};132;33\n${p}2;${site.name};${design.reference};132,5;33\n`;
    const res = await api().post('/api/units/import').set(as.admin).attach('file', Buffer.from(csv), 'units.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'row 3.hvKV': DECIMAL_COMMA_MESSAGE });
    expect(await unitsLike(p)).toEqual([]);
  });

  it('imports a good CSV with aliases in the header, one audited create per unit', async () => {
    const p = `V${uniq()}-`;
    const csv = `Serial No,Position,Substation,Design Ref,HV (kV),Rating kVA,Conductor\n${p}1,T1,${site.name},${design.reference},132,45000,Al\n${p}2,T2,${site.name},${design.reference},,,\n`;
    const res = await api().post('/api/units/import').set(as.admin).attach('file', Buffer.from(csv), 'units.csv');
    expect(res.status).toBe(201);
    expect(res.body.imported).toBe(2);
    const units = await unitsLike(p);
    expect(units.map((u) => [u.serial, u.position, u.ratedKVA, u.conductor])).toEqual([
      [`${p}1`, 'T1', 45000, 'Al'],
      [`${p}2`, 'T2', 40000, 'Cu'],
    ]);
    expect((await createAudits(units.map((u) => u.id))).map((a) => a.length)).toEqual([1, 1]);
  });
});

describe('POST /api/units/import (file checks and roles)', () => {
  it('answers 415 for a file that is neither .xlsx nor CSV, whatever its name', async () => {
    const pdf = await api().post('/api/units/import').set(as.admin).attach('file', Buffer.from('%PDF-1.7\n%…'), 'units.xlsx');
    expect(pdf.status).toBe(415);
    expect(pdf.body.error.fields.file).toMatch(/PDF/);
    const binary = await api().post('/api/units/import').set(as.admin).attach('file', Buffer.from([0, 1, 2, 3, 255, 254]), 'units.csv');
    expect(binary.status).toBe(415);
  });

  it('answers 415 naming the field file and the types it takes for a spreadsheet of another type, before reading it', async () => {
    // CSV text under a COMTRADE name: refused by its name, with the shared list of what a spreadsheet import takes.
    const dat = await api().post('/api/units/import').set(as.admin).attach('file', Buffer.from('serial,site\nKV-1,Harrow Cross\n'), 'units.dat');
    expect(dat.status).toBe(415);
    expect(dat.body.error.fields.file).toBe(fileTypeProblem(UPLOAD_TYPES.spreadsheet, 'units.dat'));
    expect(dat.body.error.fields.file).toBe('units.dat is not a spreadsheet: pick an Excel (.xlsx), CSV (.csv) or text (.txt) file.');
  });

  it('answers 413 for a file over the upload limit', async () => {
    const big = Buffer.alloc(UPLOAD_LIMITS.unitSheetBytes + 1, 0x61);
    const res = await api().post('/api/units/import').set(as.admin).attach('file', big, 'units.csv');
    expect(res.status).toBe(413);
  });

  it('answers 400 naming the file field when no file is attached', async () => {
    const res = await api().post('/api/units/import').set(as.admin).field('dryRun', 'true');
    expect(res.status).toBe(400);
    expect(res.body.error.fields.file).toBe('required');
  });

  it('refuses a tester with 403 and writes nothing', async () => {
    const p = `R${uniq()}-`;
    const res = await api().post('/api/units/import').set(as.tester).attach('file', Buffer.from(`serial,site,design\n${p}1,${site.name},${design.reference}\n`), 'u.csv');
    expect(res.status).toBe(403);
    expect(await unitsLike(p)).toEqual([]);
  });
});
