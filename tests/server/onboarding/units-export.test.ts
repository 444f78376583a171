// GET /api/units/export: the fleet table as filtered, as .xlsx (read back with exceljs) or CSV (text cells that would
// run as formulas escaped), with a safe Content-Disposition; `export` is never read as a unit id.
import ExcelJS from 'exceljs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { unitParams } from '../../../server/common/params.js';
import type { Site } from '../../../server/features/sites/site.entity.js';
import { FLEET_EXPORT_COLUMNS, UNIT_SHEET_FIELDS } from '../../../shared/imports/units-sheet.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';

let env: TestEnv;
let engineer: { Authorization: string };
let admin: { Authorization: string };
let site: Site;
let p: string;
beforeAll(async () => {
  env = await openTestEnv();
  engineer = bearer(env.config, (await createTestUser(env.db, ['engineer'])).id);
  admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
  site = await makeSite(env.db, { timeZone: 'Australia/Sydney' });
  const design = await makeDesign(env.db);
  p = `E${Math.random().toString(36).slice(2, 8).toUpperCase()}-`;
  await makeUnit(env.db, { serial: `${p}B`, position: '=HYPERLINK("http://x")', siteId: site.id, designId: design.id, hvKV: 132.5 });
  await makeUnit(env.db, { serial: `${p}A`, position: '+44 bay', siteId: site.id, designId: design.id, hvKV: 66 });
  // Another site's unit: filtered out.
  await makeUnit(env.db, { serial: `${p}Z` });
});
afterAll(async () => {
  await env.db.destroy();
});

const api = () => request(env.app);
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('GET /api/units/export', () => {
  it('answers an .xlsx of the filtered fleet, sorted as asked, readable back', async () => {
    const res = await api().get(`/api/units/export?format=xlsx&siteId=${site.id}&sort=serial`).set(engineer).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="gapsight-fleet-\d{4}-\d{2}-\d{2}\.xlsx"$/);
    expect(res.headers['x-total-count']).toBe('2');
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(res.body as unknown as ArrayBuffer);
    const ws = wb.worksheets[0];
    expect((ws.getRow(1).values as unknown[]).slice(1)).toEqual([...FLEET_EXPORT_COLUMNS]);
    const serialCol = FLEET_EXPORT_COLUMNS.indexOf('serial') + 1;
    const hvCol = FLEET_EXPORT_COLUMNS.indexOf('hvKV') + 1;
    const positionCol = FLEET_EXPORT_COLUMNS.indexOf('position') + 1;
    expect([2, 3].map((r) => ws.getRow(r).getCell(serialCol).value)).toEqual([`${p}A`, `${p}B`]);
    // Numbers stay numbers; text stays text (never a formula).
    expect(ws.getRow(3).getCell(hvCol).value).toBe(132.5);
    // A formula-like text is escaped with a leading apostrophe (OWASP "CSV injection", common practice).
    expect(ws.getRow(3).getCell(positionCol).value).toBe('\'=HYPERLINK("http://x")');
    expect(ws.getRow(3).getCell(positionCol).type).toBe(ExcelJS.ValueType.String);
    expect(ws.rowCount).toBe(3);
  });

  it('answers CSV with text cells that start with = + - @ escaped', async () => {
    const res = await api().get(`/api/units/export?format=csv&siteId=${site.id}&sort=-serial`).set(engineer);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="gapsight-fleet-\d{4}-\d{2}-\d{2}\.csv"$/);
    const lines = res.text.replace(/^\uFEFF/, '').trimEnd().split('\r\n');
    expect(lines[0]).toBe(FLEET_EXPORT_COLUMNS.join(','));
    expect(lines).toHaveLength(3);
    expect(lines[1].startsWith(`${p}B,"'=HYPERLINK(""http://x"")",${site.name},`)).toBe(true);
    expect(lines[2].startsWith(`${p}A,'+44 bay,${site.name},`)).toBe(true);
  });

  it('writes a file the units import reads back: every field found, each serial already in the fleet', async () => {
    const file = await api().get(`/api/units/export?format=xlsx&siteId=${site.id}`).set(engineer).buffer(true).parse(binary);
    const res = await api().post('/api/units/import').set(admin).field('dryRun', 'true').attach('file', file.body as Buffer, 'fleet.xlsx');
    expect(res.status).toBe(200);
    expect(Object.fromEntries(UNIT_SHEET_FIELDS.map((f) => [f, res.body.columns[f]]))).toEqual(Object.fromEntries(UNIT_SHEET_FIELDS.map((f) => [f, f])));
    expect(res.body.fields).toEqual({ 'row 2.serial': 'a unit with this serial exists', 'row 3.serial': 'a unit with this serial exists' });
  });

  it('answers 400 naming the format when it is neither xlsx nor csv', async () => {
    const res = await api().get('/api/units/export?format=pdf').set(engineer);
    expect(res.status).toBe(400);
    expect(res.body.error.fields['query.format']).toBe('xlsx or csv');
  });

  it('is never taken for a unit id', () => {
    expect(unitParams.safeParse({ unitId: 'export' }).success).toBe(false);
    expect(unitParams.safeParse({ unitId: 'import' }).success).toBe(false);
  });

  it('answers 401 without a token', async () => {
    expect((await api().get('/api/units/export')).status).toBe(401);
  });
});
