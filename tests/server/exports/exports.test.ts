// GET /api/units/:id/readings/export, /api/screenings/:id/indicators/export and /api/events/:id/audit/export: each as
// .xlsx (read back with exceljs) and CSV (formula-looking text escaped), to anyone signed in.
import ExcelJS from 'exceljs';
import type request from 'supertest';
import { In } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import { Reading } from '../../../server/features/readings/reading.entity.js';
import { ReadingSet } from '../../../server/features/readings/reading-set.entity.js';
import { formulaSafe } from '../../../shared/imports/units-sheet.js';
import { AUDIT_EXPORT_COLUMNS, INDICATORS_EXPORT_COLUMNS, READINGS_EXPORT_COLUMNS } from '../../../shared/exports/sheets.js';
import { fieldLabel, indicatorLabel } from '../../../shared/vocabulary.js';
import { bearer, createTestUser } from '../../helpers/db.js';
import { correctionsFlow } from '../corrections/flow.js';

const f = correctionsFlow();

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

async function xlsxRows(url: string): Promise<{ headers: Record<string, string>; rows: unknown[][] }> {
  const res = await f.api().get(url).set(f.as.manager).buffer(true).parse(binary);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(res.body as unknown as ArrayBuffer);
  const rows: unknown[][] = [];
  wb.worksheets[0].eachRow({ includeEmpty: false }, (r) => rows.push((r.values as unknown[]).slice(1)));
  return { headers: res.headers as Record<string, string>, rows };
}

/** CSV lines split into cells (quoted cells with commas and doubled quotes understood). */
function parseCsv(text: string): string[][] {
  expect(text.startsWith('\uFEFF')).toBe(true);
  const out: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  const body = text.slice(1);
  for (let i = 0; i < body.length; i += 1) {
    const c = body[i];
    if (quoted) {
      if (c === '"' && body[i + 1] === '"') (cell += '"'), (i += 1);
      else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') row.push(cell), (cell = '');
    else if (c === '\r' && body[i + 1] === '\n') {
      row.push(cell);
      out.push(row);
      row = [];
      cell = '';
      i += 1;
    } else cell += c;
  }
  return out;
}

let unitId = 0;
let eventId = 0;
let screeningId = 0;
let oddName = '';
beforeAll(async () => {
  ({ unitId, eventId } = await f.event());
  screeningId = (await f.screen(eventId)).id;
  // A person whose name looks like a formula records a finding: the audit export must not let it run.
  oddName = '=HYPERLINK("http://x","y")';
  const odd = bearer(f.env.config, (await createTestUser(f.env.db, ['engineer'], { name: oddName })).id);
  await f.api().post(`/api/events/${eventId}/findings`).set(odd).send({ classification: 'other', text: 'Oil sample taken.' }).expect(201);
});

describe('GET /api/units/:unitId/readings/export', () => {
  it('answers an .xlsx with one row per reading of the unit (factory set and post-fault session)', async () => {
    const sets = await f.env.db.getRepository(ReadingSet).findBy({ unitId });
    const count = await f.env.db.getRepository(Reading).countBy({ readingSetId: In(sets.map((s) => s.id)) });
    const { headers, rows } = await xlsxRows(`/api/units/${unitId}/readings/export?format=xlsx`);
    expect(headers['content-disposition']).toMatch(/^attachment; filename="gapsight-unit-.+-readings\.xlsx"; filename\*=UTF-8''/);
    expect(rows[0]).toEqual([...READINGS_EXPORT_COLUMNS]);
    expect(rows).toHaveLength(count + 1);
    expect(count).toBe(12);
    const col = (name: (typeof READINGS_EXPORT_COLUMNS)[number]) => READINGS_EXPORT_COLUMNS.indexOf(name);
    const chl = rows.filter((r) => r[col('Configuration / phase')] === 'CHL');
    expect(chl.map((r) => [r[col('Set kind')], r[col('Quantity')], r[col('Value')], r[col('Taken at (UTC)')]])).toEqual([
      ['Factory', 'Capacitance', 5210, '2019-05-02T00:00:00.000Z'],
      ['Post-fault', 'Capacitance', 5210, '2026-11-29T08:00:00.000Z'],
    ]);
    expect(headers['x-exported-count']).toBe(String(count));
  });

  it('answers the same rows as CSV; 400 naming format for another format; 404 for an unknown unit', async () => {
    const res = await f.api().get(`/api/units/${unitId}/readings/export?format=csv`).set(f.as.protection);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    const rows = parseCsv(res.text);
    expect(rows[0]).toEqual([...READINGS_EXPORT_COLUMNS]);
    expect(rows).toHaveLength(13);
    const bad = await f.api().get(`/api/units/${unitId}/readings/export?format=pdf`).set(f.as.tester);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['query.format']);
    expect((await f.api().get('/api/units/987654321/readings/export?format=csv').set(f.as.tester)).status).toBe(404);
    expect((await f.api().get(`/api/units/${unitId}/readings/export?format=csv`)).status).toBe(401);
  });
});

describe('GET /api/screenings/:screeningId/indicators/export', () => {
  it('answers one row per indicator of the stored result, labelled in words, as .xlsx and CSV', async () => {
    const ev = (await f.api().get(`/api/events/${eventId}`).set(f.as.tester).expect(200)).body;
    const indicators = ev.screenings[0].result.indicators as Array<{ key: string; value: unknown; rule: string; source: string }>;
    expect(indicators.length).toBeGreaterThan(0);
    const { rows } = await xlsxRows(`/api/screenings/${screeningId}/indicators/export?format=xlsx`);
    expect(rows[0]).toEqual([...INDICATORS_EXPORT_COLUMNS]);
    const at = (n: (typeof INDICATORS_EXPORT_COLUMNS)[number]) => INDICATORS_EXPORT_COLUMNS.indexOf(n);
    expect(rows.slice(1).map((r) => [r[at('Indicator')], r[at('Key')], r[at('Rule')], r[at('Source')]])).toEqual(
      indicators.map((i) => [indicatorLabel(i.key), i.key, i.rule, i.source]),
    );
    const csv = await f.api().get(`/api/screenings/${screeningId}/indicators/export?format=csv`).set(f.as.engineer);
    expect(csv.status).toBe(200);
    expect(parseCsv(csv.text)).toHaveLength(indicators.length + 1);
    expect((await f.api().get('/api/screenings/987654321/indicators/export').set(f.as.tester)).status).toBe(404);
  });
});

describe('GET /api/events/:eventId/audit/export', () => {
  it('answers the event file audit trail: site time and UTC, who, the entry as a sentence, before/after as JSON with fields in words', async () => {
    const ev = (await f.api().get(`/api/events/${eventId}`).set(f.as.tester).expect(200)).body;
    const { rows } = await xlsxRows(`/api/events/${eventId}/audit/export?format=xlsx`);
    expect(rows[0]).toEqual([...AUDIT_EXPORT_COLUMNS]);
    expect(rows).toHaveLength(ev.audit.length + 1);
    const at = (n: (typeof AUDIT_EXPORT_COLUMNS)[number]) => AUDIT_EXPORT_COLUMNS.indexOf(n);
    // The Action column is the audit trail's sentence, as the event file shows it (never "Created fault event").
    expect(rows.slice(1).map((r) => r[at('Action')])).toEqual(ev.audit.map((a: { summary: string }) => formulaSafe(a.summary)));
    for (const r of rows.slice(1)) expect(String(r[at('Action')])).not.toMatch(/^(Created|Changed) (fault event|finding)$/);
    const finding = ev.audit.find((a: { entity: string; action: string }) => a.entity === 'finding' && a.action === 'create');
    const findingRow = rows.find((r) => r[at('Action')] === formulaSafe(finding.summary));
    expect(findingRow?.[at('Who')]).toBe(formulaSafe(oddName));
    // Before/after keep the values, with the fields named in words.
    expect(JSON.parse(String(findingRow?.[at('After')]))).toMatchObject({
      [fieldLabel('finding', 'eventId')]: eventId,
      [fieldLabel('finding', 'classification')]: 'other',
      [fieldLabel('finding', 'text')]: 'Oil sample taken.',
    });
    const first = ev.audit[0];
    expect(rows[1][at('Time (UTC)')]).toBe(first.at);
    expect(String(rows[1][at('Time (site)')])).toMatch(new RegExp(`^\\d{4}-\\d{2}-\\d{2} \\d{2}:\\d{2} [+−]\\d{2}:\\d{2} ${ev.unit.site.timeZone}$`));
  });

  it('escapes a name that looks like a formula in CSV', async () => {
    const res = await f.api().get(`/api/events/${eventId}/audit/export?format=csv`).set(f.as.protection);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="gapsight-event-${eventId}-audit.csv"; filename*=UTF-8''gapsight-event-${eventId}-audit.csv`);
    const rows = parseCsv(res.text);
    const who = rows.map((r) => r[AUDIT_EXPORT_COLUMNS.indexOf('Who')]);
    expect(who).toContain(`'${oddName}`);
    expect(who).not.toContain(oddName);
    expect((await f.api().get('/api/events/987654321/audit/export?format=csv').set(f.as.tester)).status).toBe(404);
  });
});
