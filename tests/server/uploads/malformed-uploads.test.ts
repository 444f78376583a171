// Malformed uploads answer 4xx naming the field `file` (never 500) on every upload route, and nothing is written: a cut-off
// or boundary-less multipart body, no file part, two file parts, the file under another field name; and, for the CSV
// importers, an empty file, a file of separators only, a header alone, a binary file named .csv, a file over the row cap.
import ExcelJS from 'exceljs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { READINGS_MAX_ROWS } from '../../../shared/imports/readings-csv.js';
import { UNIT_IMPORT_ROW_LIMIT } from '../../../shared/imports/units-sheet-fields.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';
import { sweepCsv } from '../../helpers/sweep-csv.js';

let env: TestEnv;
let tester: { Authorization: string };
let admin: { Authorization: string };
let unitId: number;
let sessionId: number;
let readingSetId: number;
const api = () => request(env.app);

/** Row counts of every table of the database (a rejected upload must leave each unchanged). */
async function rowCounts(): Promise<Record<string, number>> {
  const tables: { name: string }[] = await env.db.query('SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = \'BASE TABLE\'');
  const out: Record<string, number> = {};
  for (const { name } of tables) out[name] = Number((await env.db.query(`SELECT COUNT(*) AS n FROM \`${name}\``))[0].n);
  return out;
}

beforeAll(async () => {
  env = await openTestEnv();
  tester = bearer(env.config, (await createTestUser(env.db, ['tester'])).id);
  admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
  const protection = bearer(env.config, (await createTestUser(env.db, ['protection'])).id);
  const site = await makeSite(env.db);
  const design = await makeDesign(env.db);
  unitId = (await makeUnit(env.db, { siteId: site.id, designId: design.id })).id;
  const factory = await api().post(`/api/units/${unitId}/reading-sets`).set(tester).send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, capacitancePF: { CH: 3120 } });
  expect(factory.status).toBe(201);
  readingSetId = factory.body.id;
  const event = await api()
    .post('/api/events')
    .set(protection)
    .send({ unitId, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', faultedPhases: 'ABC', shots: [{ currentKA: 1, durationS: 0.1 }], protectionOperated: ['overcurrent'] });
  expect(event.status).toBe(201);
  const session = await api().post(`/api/events/${event.body.id}/sessions`).set(tester).send({ takenAt: '2026-11-29T08:00:00Z', capacitancePF: { CH: 3120 } });
  expect(session.status).toBe(201);
  sessionId = session.body.id;
});

afterAll(async () => {
  await env?.db.destroy();
});

type Route = { name: string; path: () => string; who: () => { Authorization: string }; fields?: () => Record<string, string>; csv: string; fileName: string };

const READINGS = 'quantity,configuration,phase,value,unit\ncapacitance,CL,,9870,pF\n';
const routes: Route[] = [
  { name: 'session readings import', path: () => `/api/sessions/${sessionId}/imports`, who: () => tester, csv: READINGS, fileName: 'readings.csv' },
  { name: 'session sweep', path: () => `/api/sessions/${sessionId}/sweeps`, who: () => tester, fields: () => ({ label: 'HV-A-open', testType: 'open-circuit', winding: 'hv', phase: 'A' }), csv: sweepCsv(0.1), fileName: 'post.csv' },
  { name: 'unit sweep', path: () => `/api/units/${unitId}/sweeps`, who: () => tester, fields: () => ({ label: 'HV-A-open', testType: 'open-circuit', winding: 'hv', phase: 'A', readingSetId: String(readingSetId) }), csv: sweepCsv(), fileName: 'base.csv' },
  { name: 'units sheet', path: () => '/api/units/import', who: () => admin, csv: 'serial,site,design\n', fileName: 'units.csv' },
  { name: 'reading-sets sheet', path: () => '/api/units/reading-sets/import', who: () => tester, csv: 'serial,kind,takenAt,quantity,configuration,phase,value,unit\n', fileName: 'sets.csv' },
  { name: "one unit's reading set", path: () => `/api/units/${unitId}/reading-sets/import`, who: () => tester, fields: () => ({ kind: 'routine', takenAt: '2024-05-01' }), csv: READINGS, fileName: 'readings.csv' },
];

/** A multipart body by hand (boundary `x`): the given fields, then each file part. */
function multipart(fields: Record<string, string>, files: { field: string; name: string; data: string }[], close = true): Buffer {
  const parts = [
    ...Object.entries(fields).map(([k, v]) => `--x\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`),
    ...files.map((f) => `--x\r\nContent-Disposition: form-data; name="${f.field}"; filename="${f.name}"\r\nContent-Type: text/csv\r\n\r\n${f.data}\r\n`),
  ];
  return Buffer.from(`${parts.join('')}${close ? '--x--\r\n' : ''}`);
}

const send = (r: Route, body: Buffer, contentType = 'multipart/form-data; boundary=x') => api().post(r.path()).set(r.who()).set('Content-Type', contentType).send(body);

/** 4xx (never 500), the error naming `file`, and every table's row count as before. */
async function expectRefused(res: request.Response, before: Record<string, number>, status?: number) {
  if (status !== undefined) expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(400);
  expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
  expect(Object.keys(res.body.error?.fields ?? {}).join(' '), JSON.stringify(res.body)).toMatch(/\bfile\b|header/);
  expect(await rowCounts()).toEqual(before);
}

describe.each(routes)('$name: a malformed multipart body', (r) => {
  it('cut off half-way → 400 invalid_upload naming file', async () => {
    const before = await rowCounts();
    const whole = multipart(r.fields?.() ?? {}, [{ field: 'file', name: r.fileName, data: r.csv }], false);
    const res = await send(r, whole.subarray(0, Math.floor(whole.length * 0.6)));
    await expectRefused(res, before, 400);
    expect(res.body.error.code).toBe('invalid_upload');
  });

  it('without its boundary → 400 invalid_upload naming file', async () => {
    const before = await rowCounts();
    const res = await send(r, multipart(r.fields?.() ?? {}, [{ field: 'file', name: r.fileName, data: r.csv }]), 'multipart/form-data');
    await expectRefused(res, before, 400);
    expect(res.body.error.code).toBe('invalid_upload');
  });

  it('with no file part → 400 naming file', async () => {
    const before = await rowCounts();
    await expectRefused(await send(r, multipart(r.fields?.() ?? {}, [])), before, 400);
  });

  it('with two file parts → 400 naming file', async () => {
    const before = await rowCounts();
    const file = { field: 'file', name: r.fileName, data: r.csv };
    await expectRefused(await send(r, multipart(r.fields?.() ?? {}, [file, file])), before, 400);
  });

  it('with the file under another field name → 400 naming file', async () => {
    const before = await rowCounts();
    await expectRefused(await send(r, multipart(r.fields?.() ?? {}, [{ field: 'upload', name: r.fileName, data: r.csv }])), before, 400);
  });
});

describe.each(routes)('$name: a malformed CSV', (r) => {
  const post = (data: string | Buffer, name = r.fileName) => {
    let req = api().post(r.path()).set(r.who());
    for (const [k, v] of Object.entries(r.fields?.() ?? {})) req = req.field(k, v);
    return req.attach('file', Buffer.isBuffer(data) ? data : Buffer.from(data), name);
  };

  it.each([
    ['an empty file', ''],
    ['a file of commas only', ',,,,\n,,,,\n,,,\n'],
    ['a file of semicolons only', ';;;\n;;;\n'],
    ['a header alone', r.csv.split('\n')[0] + '\n'],
  ])('%s → 400 naming file or header', async (_what, data) => {
    const before = await rowCounts();
    await expectRefused(await post(data), before, 400);
  });

  it('a binary file named .csv → 4xx naming file', async () => {
    const before = await rowCounts();
    const bytes = Buffer.from(Array.from({ length: 2048 }, (_, i) => (i * 131 + 7) % 256));
    await expectRefused(await post(bytes), before);
  });
});

describe('row cap', () => {
  it(`a readings file over ${READINGS_MAX_ROWS} rows → 400 naming file with the cap and the file's count`, async () => {
    const before = await rowCounts();
    const n = READINGS_MAX_ROWS + 1;
    const lines = Array.from({ length: n }, (_, i) => `capacitance,C${i.toString(26).replace(/\d/g, (d) => 'QRSTUVWXYZ'[Number(d)])},,${1000 + i},pF`);
    const res = await api().post(`/api/sessions/${sessionId}/imports`).set(tester).attach('file', Buffer.from(`quantity,configuration,phase,value,unit\n${lines.join('\n')}\n`), 'big.csv');
    await expectRefused(res, before, 400);
    expect(res.body.error.fields.file).toMatch(/at most 2 000 rows a file; this file has 2 001/);
  });

  it('a units workbook (.xlsx, read in a worker thread) far over its cap → 400 naming file', async () => {
    const before = await rowCounts();
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('units');
    ws.addRow(['serial', 'site', 'design', 'position']);
    // The cap plus the allowance for title rows (10), plus one: 5 011 data rows.
    for (let i = 0; i < UNIT_IMPORT_ROW_LIMIT + 11; i++) ws.addRow([`X${i}`, 'Nowhere', 'None', 'T1']);
    const bytes = Buffer.from(await wb.xlsx.writeBuffer());
    const res = await api().post('/api/units/import').set(admin).attach('file', bytes, 'units.xlsx');
    await expectRefused(res, before, 400);
    expect(res.body.error.fields.file).toBe('at most 5 000 units a file; this file has 5 011: split it into smaller files');
  });

  it('a workbook that is not one (a ZIP named .xlsx with a broken workbook inside) → 4xx naming file', async () => {
    const before = await rowCounts();
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet('units').addRow(['serial']);
    const bytes = Buffer.from(await wb.xlsx.writeBuffer());
    // Cut the archive short: its directory still names xl/workbook.xml, its entries cannot be unpacked.
    const broken = Buffer.concat([bytes.subarray(0, 200), Buffer.alloc(400, 0x41), bytes.subarray(bytes.length - 2000)]);
    await expectRefused(await api().post('/api/units/import').set(admin).attach('file', broken, 'units.xlsx'), before);
  });
});
