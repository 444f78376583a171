// Every export route, as CSV and as .xlsx, writes text that a spreadsheet would run as a formula (starting with = + - @,
// a tab or a carriage return) with a leading apostrophe (common practice: OWASP "CSV injection"), and numbers as numbers.
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';
import { makeDesign, makeSite, makeUnit } from '../../helpers/factories.js';

let env: TestEnv;
let tester: { Authorization: string };
let engineer: { Authorization: string };
let manager: { Authorization: string };
let siteId: number;
let unitId: number;
let eventId: number;
let screeningId: number | null = null;
const api = () => request(env.app);
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};
const FORMULA_START = /^[=+\-@\t\r]/;
const NUMBER = /^-?\d+(\.\d+)?(e[+-]?\d+)?$/i;
const tag = Math.random().toString(36).slice(2, 8);

beforeAll(async () => {
  env = await openTestEnv();
  tester = bearer(env.config, (await createTestUser(env.db, ['tester'])).id);
  engineer = bearer(env.config, (await createTestUser(env.db, ['engineer'])).id);
  manager = bearer(env.config, (await createTestUser(env.db, ['manager'])).id);
  // The person who records the fault is named like a formula: the audit export's "Who" column.
  const protection = bearer(env.config, (await createTestUser(env.db, ['protection'], { name: '@SUM(A1)' })).id);
  siteId = (await makeSite(env.db, { name: `+1 ${tag}` })).id;
  const design = await makeDesign(env.db);
  unitId = (await makeUnit(env.db, { serial: `=HYPERLINK("x")${tag}`, position: '-T1', siteId, designId: design.id, hvKV: 132 })).id;
  const factory = await api()
    .post(`/api/units/${unitId}/reading-sets`)
    .set(tester)
    .send({ kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } });
  expect(factory.status).toBe(201);
  const event = await api()
    .post('/api/events')
    .set(protection)
    .send({ unitId, occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv', faultedPhases: 'ABC', shots: [{ currentKA: 1, durationS: 0.1 }], protectionOperated: ['overcurrent'] });
  expect(event.status).toBe(201);
  eventId = event.body.id;
  const session = await api()
    .post(`/api/events/${eventId}/sessions`)
    .set(tester)
    .send({ takenAt: '2026-11-29T08:00:00Z', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3150 }, reactance: { A: { percent: 11.7 }, B: { percent: 11.58 }, C: { percent: 11.66 } } });
  expect(session.status).toBe(201);
  const screening = await api().post(`/api/events/${eventId}/screenings`).set(tester).send({});
  expect(screening.status, JSON.stringify(screening.body)).toBeLessThan(300);
  screeningId = screening.body.id ?? screening.body.screening?.id ?? null;
});

afterAll(async () => {
  await env?.db.destroy();
});

/** Every cell of an export, read back: CSV with papaparse, .xlsx with exceljs (each value as stored: string or number). */
async function cellsOf(url: string, format: 'csv' | 'xlsx', who: { Authorization: string }): Promise<unknown[][]> {
  const res = await api().get(`${url}${url.includes('?') ? '&' : '?'}format=${format}`).set(who).buffer(true).parse(binary);
  expect(res.status, String(res.body)).toBe(200);
  const bytes = res.body as Buffer;
  if (format === 'csv') return Papa.parse<string[]>(bytes.toString('utf8').replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(bytes as unknown as ArrayBuffer);
  const rows: unknown[][] = [];
  wb.worksheets[0].eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
  return rows;
}

const exportRoutes = () => [
  { name: 'fleet', url: `/api/units/export?siteId=${siteId}`, who: engineer, escaped: [`'=HYPERLINK("x")${tag}`, '\'-T1', `'+1 ${tag}`], number: 132 },
  { name: 'unit readings', url: `/api/units/${unitId}/readings/export`, who: engineer, escaped: [], number: 3120 },
  { name: 'event audit', url: `/api/events/${eventId}/audit/export`, who: manager, escaped: ["'@SUM(A1)"], number: null },
  ...(screeningId === null ? [] : [{ name: 'screening indicators', url: `/api/screenings/${screeningId}/indicators/export`, who: engineer, escaped: [], number: null }]),
];

describe('formula-safe exports', () => {
  it('a screening was run, so its indicators export is checked too', () => {
    expect(screeningId).not.toBeNull();
  });

  it('a negative number stays a number: unescaped digits in CSV, a number cell in .xlsx', async () => {
    const url = `/api/screenings/${screeningId}/indicators/export`;
    const csv = (await cellsOf(url, 'csv', engineer)).flat() as string[];
    const xlsx = (await cellsOf(url, 'xlsx', engineer)).flat();
    const negative = csv.find((t) => NUMBER.test(t) && t.startsWith('-'));
    expect(negative).toBeDefined();
    expect(xlsx).toContain(Number(negative));
  });

  for (const format of ['csv', 'xlsx'] as const) {
    it(`every export route as ${format}: no text cell starts like a formula; formula-like names come back with an apostrophe; numbers stay numbers`, async () => {
      for (const r of exportRoutes()) {
        const cells = (await cellsOf(r.url, format, r.who)).flat();
        const texts = cells.filter((c): c is string => typeof c === 'string');
        // In CSV a number is its digits: a negative number ("-0.57") is a number, not text, and stays unescaped.
        const textOnly = format === 'csv' ? texts.filter((t) => !NUMBER.test(t)) : texts;
        expect(textOnly.filter((t) => FORMULA_START.test(t)), r.name).toEqual([]);
        for (const e of r.escaped) expect(texts, r.name).toContain(e);
        if (r.number !== null) {
          // CSV: the number's digits, unescaped; .xlsx: a number cell.
          if (format === 'csv') expect(texts, r.name).toContain(String(r.number));
          else expect(cells, r.name).toContain(r.number);
        }
      }
    });
  }
});
