import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import type { Browser, Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { FaultEvent } from '../../server/features/events/fault-event.entity.js';
import { Decision } from '../../server/features/screenings/decision.entity.js';
import { Site } from '../../server/features/sites/site.entity.js';
import { User } from '../../server/features/users/user.entity.js';
import { emptyDeploymentEnv, startEmptyServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';

// A utility's first day: an empty DEMO=off database, one `npm run user:create` for the first admin, then only the
// browser: a site, a design family, two units from a workbook, the people, baselines, and one fault taken from logging
// to a signed decision and the re-energising time.

const ZONE = 'Europe/London';
const SITE = 'Harrow Lane';
const DESIGN = 'HL-40-132';
const SERIALS = ['HL-T1-2009', 'HL-T2-2009'];

let running: Running;
let db: DataSource;
let browser: Browser;
let work: string;
const passwords: Record<string, string> = {};
/** People still signing in with the one-time password the people page showed. */
const oneTimePasswords = new Set<string>();
let eventId = 0;
let lastPage: Page | null = null;

beforeAll(async () => {
  ({ running, db } = await startEmptyServer());
  browser = await launchChromium();
  work = mkdtempSync(path.join(os.tmpdir(), 'gapsight-onboarding-'));
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
  if (db?.isInitialized) await db.destroy();
});

afterEach(async (ctx) => {
  if (ctx.task.result?.state === 'fail' && lastPage && !lastPage.isClosed()) await shot(lastPage, `failed-${ctx.task.name.slice(4, 30).replace(/\W+/g, '-')}`);
});

async function shot(page: Page, name: string): Promise<void> {
  if (process.env.E2E_SHOTS) await page.screenshot({ path: `${process.env.E2E_SHOTS}/onboarding-${name}.png`, fullPage: true });
}

/** Picks a file the way a person does: click the file field, answer the browser's file chooser. */
async function pickFile(page: Page, testId: string, file: string): Promise<void> {
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.click(`[data-test="${testId}"]`)]);
  await chooser.setFiles(file);
}

/** The wall-clock time at the site, as a datetime-local input takes it. */
function siteLocal(d: Date, seconds = false): string {
  const p = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23' })
      .formatToParts(d)
      .map((x) => [x.type, x.value]),
  );
  return `${p.year}-${p.month}-${p.day}T${p.hour}:${p.minute}${seconds ? `:${p.second}` : ''}`;
}

async function signIn(email: string): Promise<Page> {
  const page = await browser.newPage({ viewport: { width: 1366, height: 900 } });
  lastPage = page;
  await page.goto(`${running.url}/sign-in`);
  await page.fill('[data-test="signin-email"]', email);
  await page.fill('[data-test="signin-password"]', passwords[email]);
  await page.click('[data-test="signin-submit"]');
  if (oneTimePasswords.has(email)) {
    // The first sign-in with a one-time password leads to choosing one's own password, and nowhere else.
    await page.waitForSelector('[data-test="password-title"]');
    expect((await page.textContent('[data-test="password-title"]'))?.trim()).toBe('Choose your password');
    const chosen = `${email.split('@')[0]} chose this passphrase`;
    await page.fill('[data-test="password-current"]', passwords[email]);
    await page.fill('[data-test="password-new"]', chosen);
    await page.fill('[data-test="password-repeat"]', chosen);
    await page.click('[data-test="password-submit"]');
    passwords[email] = chosen;
    oneTimePasswords.delete(email);
  }
  await page.waitForSelector('[data-test="desk-title"]');
  return page;
}

/** Adds a person on the people page and returns the one-time password the dialog shows. */
async function addPerson(page: Page, name: string, email: string, role: string): Promise<string> {
  await page.click('[data-test="person-add"]');
  await page.fill('[data-test="person-name"]', name);
  await page.fill('[data-test="person-email"]', email);
  await page.click(`[data-test="person-role-${role}"]`);
  await page.click('[data-test="person-all-sites"]');
  await page.click('[data-test="person-submit"]');
  await page.waitForSelector('[data-test="otp-dialog"]');
  expect(await page.textContent('[data-test="otp-email"]')).toContain(email);
  const password = ((await page.textContent('[data-test="otp-password"]')) ?? '').trim();
  expect(password.length).toBeGreaterThanOrEqual(12);
  await shot(page, `otp-${role}`);
  await page.click('[data-test="otp-close"]');
  await page.waitForSelector('[data-test="otp-dialog"]', { state: 'detached' });
  oneTimePasswords.add(email);
  return password;
}

const READINGS_HEADER = 'quantity,configuration,phase,value,unit';

describe('from an empty DEMO=off database to a decided, re-energised event', () => {
  it('npm run user:create makes the first admin in the empty database', async () => {
    expect(await db.getRepository(User).count()).toBe(0);
    expect(await db.getRepository(Site).count()).toBe(0);
    const email = 'admin@harrow-utility.example';
    const r = spawnSync(
      process.execPath,
      ['node_modules/tsx/dist/cli.mjs', '--tsconfig', 'server/tsconfig.json', 'server/scripts/user-create.ts', '--email', email, '--name', 'Ada Admin', '--roles', 'admin', '--all-sites'],
      { encoding: 'utf8', env: emptyDeploymentEnv() },
    );
    expect(r.status, r.stderr).toBe(0);
    const password = /Password \(shown once\): (\S+)/.exec(r.stdout)?.[1];
    expect(password).toBeDefined();
    passwords[email] = password!;
    expect(await db.getRepository(User).findOneByOrFail({ email })).toMatchObject({ roles: ['admin'], demo: false });
  });

  it('the admin adds a site, a design family, two units from a workbook, and a tester, a manager and a protection engineer', async () => {
    const page = await signIn('admin@harrow-utility.example');

    await page.goto(`${running.url}/admin/sites`);
    await page.waitForSelector('[data-test="sites-empty"]');
    await shot(page, 'sites-empty');
    await page.click('[data-test="site-add"]');
    await page.fill('[data-test="site-name"]', SITE);
    await page.fill('[data-test="site-time-zone"]', ZONE);
    await page.click('[data-test="site-submit"]');
    await page.waitForSelector(`[data-test="sites-table"] >> text=${SITE}`);

    await page.goto(`${running.url}/admin/designs`);
    await page.waitForSelector('[data-test="designs-empty"]');
    await page.click('[data-test="design-add"]');
    await page.fill('[data-test="design-reference"]', DESIGN);
    await page.fill('[data-test="design-maker"]', 'Northfield Transformers');
    await page.fill('[data-test="design-vector-group"]', 'YNd1');
    await page.fill('[data-test="design-hv-kv"]', '132');
    await page.fill('[data-test="design-lv-kv"]', '33');
    await page.fill('[data-test="design-impedance"]', '12.5');
    await page.fill('[data-test="design-impedance-base"]', '40000');
    await page.fill('[data-test="design-stage-name-0"]', 'ONAN');
    await page.fill('[data-test="design-stage-kva-0"]', '40000');
    await page.fill('[data-test="design-required-capacitance"]', 'CH, CL, CHL');
    await shot(page, 'design-form');
    await page.click('[data-test="design-submit"]');
    await page.waitForSelector(`[data-test="designs-table"] >> text=${DESIGN}`);

    // The fleet workbook an engineer keeps: one unit a row, the design's nameplate values left to the design.
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Fleet');
    ws.addRow(['Serial', 'Position', 'Site', 'Design', 'Year', 'Rating (kVA)']);
    ws.addRow([SERIALS[0], 'T1', SITE, DESIGN, 2009, 40000]);
    ws.addRow([SERIALS[1], 'T2', SITE, DESIGN, 2009, 40000]);
    const xlsx = path.join(work, 'harrow-fleet.xlsx');
    writeFileSync(xlsx, Buffer.from(await wb.xlsx.writeBuffer()));

    await page.goto(`${running.url}/units`);
    await page.waitForSelector('[data-test="fleet-empty"]');
    await page.click('[data-test="import-units"]');
    await pickFile(page, 'unit-import', xlsx);
    await page.waitForSelector('[data-test="unit-import-preview"]');
    expect(await page.locator('[data-test="unit-import-row"]').count()).toBe(2);
    expect(await page.locator('[data-test="unit-import-problem"]').count()).toBe(0);
    await shot(page, 'unit-import');
    expect(await page.textContent('[data-test="unit-import-submit"]')).toContain('Import 2 units');
    await page.click('[data-test="unit-import-submit"]');
    await page.waitForSelector('[data-test="unit-import"]', { state: 'detached' });
    for (const serial of SERIALS) await page.waitForSelector(`[data-test="fleet-table"] >> text=${serial}`);
    await shot(page, 'fleet');

    await page.goto(`${running.url}/admin/people`);
    await page.waitForSelector('[data-test="people-table"]');
    passwords['tess@harrow-utility.example'] = await addPerson(page, 'Tess Tester', 'tess@harrow-utility.example', 'tester');
    passwords['max@harrow-utility.example'] = await addPerson(page, 'Max Manager', 'max@harrow-utility.example', 'manager');
    passwords['pat@harrow-utility.example'] = await addPerson(page, 'Pat Protection', 'pat@harrow-utility.example', 'protection');
    for (const name of ['Tess Tester', 'Max Manager', 'Pat Protection']) await page.waitForSelector(`[data-test="people-table"] >> text=${name}`);
    await page.close();
  });

  it('the tester enters a factory set for each unit on its unit file from a readings CSV, marked as the reference', async () => {
    const page = await signIn('tess@harrow-utility.example');
    const csv = path.join(work, 'factory.csv');
    writeFileSync(csv, `${READINGS_HEADER}\ncapacitance,CH,,4520,pF\ncapacitance,CL,,6130,pF\ncapacitance,CHL,,5210,pF\n`);
    for (const serial of SERIALS) {
      await page.goto(`${running.url}/units`);
      await page.click(`[data-test="unit-link"] >> text=${serial}`);
      await page.waitForSelector('[data-test="no-baseline"]');
      await page.click('[data-test="import-reading-set"]');
      await page.fill('[data-test="set-import-taken"]', '2009-06-15');
      await page.click('[data-test="set-import-reference"]');
      await pickFile(page, 'set-import-file', csv);
      await page.click('[data-test="set-import-submit"]');
      await page.waitForSelector('[data-test="reading-sets"]');
      await page.waitForSelector('[data-test="no-baseline"]', { state: 'detached' });
      expect(await page.locator('[data-test="reading-set-row"]').count()).toBe(1);
    }
    await shot(page, 'unit-file');
    await page.close();
  });

  it('the protection engineer logs the fault on the first unit', async () => {
    const page = await signIn('pat@harrow-utility.example');
    await page.goto(`${running.url}/events/new`);
    await page.click('[data-test="unit-picker"]');
    await page.keyboard.type(SERIALS[0]);
    await page.click(`.q-menu .q-item >> text=${SERIALS[0]}`);
    await page.waitForSelector('[data-test="unit-summary"]');
    await page.fill('[data-test="occurred-at"]', siteLocal(new Date(Date.now() - 3 * 3600_000)));
    await page.click('[data-test="type-phase-to-ground"]');
    await page.click('[data-test="side-hv"]');
    await page.click('[data-test="phase-A"]');
    await page.fill('[data-test="shot-current-0"]', '0.6');
    await page.fill('[data-test="shot-duration-0"]', '0.12');
    await shot(page, 'log-fault');
    await page.click('[data-test="submit"]');
    await page.waitForURL(/\/events\/\d+$/);
    eventId = Number(/\/events\/(\d+)$/.exec(page.url())?.[1]);
    await page.waitForSelector('[data-test="event-title"]');
    expect(await db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).toMatchObject({ status: 'logged' });
    await page.close();
  });

  it('the tester opens a session, imports its readings and runs the screening', async () => {
    const page = await signIn('tess@harrow-utility.example');
    await page.goto(`${running.url}/events/${eventId}`);
    await page.click('[data-test="new-session"]');
    await page.fill('[data-test="session-tap"]', '9');
    await page.click('[data-test="session-submit"]');
    await page.waitForSelector('[data-test="session"]');
    await page.click('[data-test^="import-"]');
    const csv = path.join(work, 'session.csv');
    writeFileSync(csv, `${READINGS_HEADER}\ncapacitance,CH,,4523,pF\ncapacitance,CL,,6134,pF\ncapacitance,CHL,,5214,pF\n`);
    await pickFile(page, 'import-file', csv);
    await page.waitForSelector('[data-test="import-preview"]');
    expect(await page.locator('[data-test="preview-row"]').count()).toBe(3);
    await page.click('[data-test="import-upload"]');
    await page.waitForSelector('[data-test="readings-import"]', { state: 'detached' });
    await page.click('[data-test="run-screening"]');
    await page.waitForSelector('[data-test="verdict-word"]');
    await shot(page, 'screened');
    // Capacitance against the factory sets is ok, the duty is moderate; reactance (required for the duty) is missing.
    expect(((await page.textContent('[data-test="verdict-word"]')) ?? '').replace(/\s+/g, ' ').trim()).toBe('Recommendation Conditional');
    expect((await page.textContent('[data-test="verdict-reason"]'))?.trim()).toBe('Complete: reactance phase A, reactance phase B, reactance phase C');
    const missing = await page.locator('[data-test="missing-item"]').allTextContents();
    expect(missing.map((t) => t.replace(/^help_outline\s*/, '').trim())).toEqual([
      'Missing: reactance phase A',
      'Missing: reactance phase B',
      'Missing: reactance phase C',
    ]);
    const reasons = (await page.locator('[data-test="reason"]').allTextContents()).map((t) => t.trim());
    expect(reasons).toContain('Capacitance is the only evidence and it is ok: an ok capacitance does not rule out axial movement (add leakage reactance or a sweep)');
    expect((await db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).status).toBe('screened');
    await page.close();
  });

  it('the manager signs a release with restrictions and records the re-energised time', async () => {
    const page = await signIn('max@harrow-utility.example');
    await page.goto(`${running.url}/events/${eventId}`);
    await page.waitForSelector('[data-test="decision-panel"]');
    await page.click('[data-test="outcome-release-with-restrictions"]');
    await page.fill('[data-test="decision-restrictions"]', 'Load limited to the ONAN rating until the oil sample is back.');
    await page.fill('[data-test="decision-reason"]', 'Capacitance within a tenth of a per cent of the factory set on every configuration.');
    await page.click('[data-test="decision-sign"]');
    await page.click('[data-test="confirm-ok"]');
    await page.waitForSelector('[data-test="decision-outcome"]');
    expect(await page.textContent('[data-test="decision-outcome"]')).toMatch(/restrictions/i);
    expect((await db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).status).toBe('released');

    // The field takes seconds too: the first whole second after the signature, once the clock has passed it.
    const decisions = await db.getRepository(Decision).find();
    expect(decisions.map((d) => d.outcome)).toEqual(['release-with-restrictions']);
    const signedAt = decisions[0].signedAt;
    const at = new Date(Math.ceil(signedAt.getTime() / 1000) * 1000);
    while (Date.now() < at.getTime()) await new Promise((r) => setTimeout(r, 50));
    const energised = siteLocal(at, true);
    await page.click('[data-test="record-energised"]');
    await page.fill('[data-test="energised-input"]', energised);
    await page.click('[data-test="energised-save"]');
    await page.waitForSelector('[data-test="energised-at"] >> text=Re-energised');
    await shot(page, 'decided');
    const stored = (await db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).energisedAt;
    expect(stored?.toISOString()).toBe(at.toISOString());
    await page.close();
  });
});
