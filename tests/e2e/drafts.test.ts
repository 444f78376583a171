import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import type { Running } from '../../server/index.js';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users.js';
import { makeUnit } from '../helpers/factories.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';

// Nothing typed is lost, in Chromium: the fault form's draft survives a reload and a sign-out and sign-in of the same
// person (not another's), is gone once the fault is logged; a session that ends mid-form is signed in again over the
// page; the manager's decision survives a reload, a route change asks first, and the panel fits a 390 px phone.

let running: Running;
let browser: Browser;
let db: DataSource;
let faultUnitId: number;
let screenedEventId: number;

// Invented readings of a 40 MVA 132/33 kV two-winding unit (as in the server's screening tests).
const factory = { kind: 'factory', takenAt: '2019-05-02', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } };

async function tokenOf(email: string): Promise<string> {
  const answer = await fetch(`${running.url}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  expect(answer.status).toBe(200);
  return ((await answer.json()) as { token: string }).token;
}

async function post<T>(path: string, token: string, body: unknown): Promise<T> {
  const answer = await fetch(`${running.url}/api${path}`, { method: 'POST', headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` }, body: JSON.stringify(body) });
  const json = (await answer.json()) as T;
  expect(answer.status, JSON.stringify(json)).toBe(201);
  return json;
}

beforeAll(async () => {
  ({ running } = await startTestServer());
  db = (await import('../../server/db/data-source.js')).default;
  faultUnitId = (await makeUnit(db)).id;
  // A screened event of this test's own: factory readings, a fault two days ago, a session a day ago, a screening.
  const unitId = (await makeUnit(db)).id;
  const [protection, tester] = [await tokenOf('protection@kestrel-valley.example'), await tokenOf('tester@kestrel-valley.example')];
  await post(`/units/${unitId}/reading-sets`, tester, factory);
  const day = 24 * 3600 * 1000;
  const event = await post<{ id: number }>('/events', protection, {
    unitId,
    occurredAt: new Date(Date.now() - 2 * day).toISOString(),
    type: 'three-phase',
    side: 'lv',
    shots: [{ currentKA: 1, durationS: 0.1 }],
    notes: 'Feeder 4 cable fault (drafts browser test)',
  });
  const { takenAt: _factoryDate, kind: _kind, ...readings } = factory;
  await post(`/events/${event.id}/sessions`, tester, { ...readings, takenAt: new Date(Date.now() - day).toISOString(), humidityPercent: 40, instrument: 'M4100' });
  await post(`/events/${event.id}/screenings`, tester, {});
  screenedEventId = event.id;
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto(`${running.url}/sign-in`);
  await page.fill('[data-test="signin-email"]', email);
  await page.fill('[data-test="signin-password"]', DEMO_PASSWORD);
  await page.click('[data-test="signin-submit"]');
  await page.waitForSelector('[data-test="desk-title"]');
}

/** Answers every "leave and lose the changes?" question of the app with `accept` and counts them; the browser's
 * own question on a reload (typed work on the page) is counted apart and always answered "reload". */
function answerLeaveQuestions(page: Page, accept: () => boolean): { asked: number; onReload: number } {
  const count = { asked: 0, onReload: 0 };
  page.on('dialog', (dialog) => {
    if (dialog.type() === 'beforeunload') {
      count.onReload += 1;
      void dialog.accept();
      return;
    }
    count.asked += 1;
    void (accept() ? dialog.accept() : dialog.dismiss());
  });
  return count;
}

const valueOf = (page: Page, selector: string) => page.inputValue(selector);

async function typeFault(page: Page): Promise<void> {
  await page.goto(`${running.url}/events/new?unitId=${faultUnitId}`);
  await page.waitForSelector('[data-test="unit-summary"]');
  await page.fill('[data-test="occurred-at"]', '2026-11-30T04:12');
  await page.click('[data-test="type-phase-to-phase"]');
  await page.click('[data-test="side-lv"]');
  await page.fill('[data-test="shot-current-0"]', '6.3');
  await page.fill('[data-test="shot-duration-0"]', '0.12');
  await page.fill('[data-test="notes"]', 'Relay record from bay 4; recloser locked out.');
}

async function expectFaultRestored(page: Page): Promise<void> {
  await page.waitForSelector('[data-test="draft-notice"]');
  expect(await page.textContent('[data-test="draft-notice"]')).toContain('Draft restored from');
  expect(await valueOf(page, '[data-test="occurred-at"]')).toBe('2026-11-30T04:12');
  expect(await valueOf(page, '[data-test="shot-current-0"]')).toBe('6.3');
  expect(await valueOf(page, '[data-test="shot-duration-0"]')).toBe('0.12');
  expect(await valueOf(page, '[data-test="notes"]')).toBe('Relay record from bay 4; recloser locked out.');
  expect(await page.getAttribute('[data-test="side-lv"]', 'aria-checked')).toBe('true');
  expect(await page.getAttribute('[data-test="type-phase-to-phase"]', 'aria-checked')).toBe('true');
}

describe('nothing typed is lost', () => {
  it('keeps the fault form through a reload and a sign-in again, not for another person, and forgets it once logged', async () => {
    const page = await browser.newPage({ viewport: { width: 1366, height: 900 } });
    const questions = answerLeaveQuestions(page, () => true);
    await signIn(page, 'protection@kestrel-valley.example');
    await typeFault(page);

    await page.reload();
    await expectFaultRestored(page);

    // Sign out (asked first: the form has typed work), then in again as the same person: the draft is still there.
    await page.click('[data-test="signout"]');
    await page.waitForSelector('[data-test="signin-email"]');
    expect(questions.asked).toBeGreaterThanOrEqual(1);
    await signIn(page, 'admin@kestrel-valley.example');
    await page.goto(`${running.url}/events/new?unitId=${faultUnitId}`);
    await page.waitForSelector('[data-test="unit-summary"]');
    expect(await page.locator('[data-test="draft-notice"]').count()).toBe(0);
    expect(await valueOf(page, '[data-test="notes"]')).toBe('');
    await page.click('[data-test="signout"]');
    await page.waitForSelector('[data-test="signin-email"]');

    await signIn(page, 'protection@kestrel-valley.example');
    await page.goto(`${running.url}/events/new`);
    await expectFaultRestored(page);

    // The session ends mid-form (the stored token is refused): sign in again over the page, the text stays.
    await page.evaluate(() => localStorage.setItem('gapsight.token', 'no-longer-valid'));
    await page.click('[data-test="submit"]');
    await page.waitForSelector('[data-test="reauth-dialog"]');
    expect(page.url()).toContain('/events/new');
    await page.fill('[data-test="reauth-password"]', DEMO_PASSWORD);
    await page.click('[data-test="reauth-submit"]');
    await page.waitForSelector('[data-test="reauth-dialog"]', { state: 'detached' });
    expect(await valueOf(page, '[data-test="notes"]')).toBe('Relay record from bay 4; recloser locked out.');

    const asked = questions.asked;
    await page.click('[data-test="submit"]');
    await page.waitForURL(/\/events\/\d+$/);
    expect(questions.asked).toBe(asked); // a logged fault leaves without asking
    const left = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('gapsight.draft.fault-new.')));
    expect(left).toEqual([]);
    await page.goto(`${running.url}/events/new`);
    await page.waitForSelector('[data-test="event-form"]');
    expect(await page.locator('[data-test="draft-notice"]').count()).toBe(0);
    expect(await valueOf(page, '[data-test="notes"]')).toBe('');
    await page.close();
  });

  it('keeps the manager’s decision through a reload, asks before another page replaces it, and fits a 390 px phone', async () => {
    const page = await browser.newPage({ viewport: { width: 390, height: 844 } });
    let accept = false;
    const questions = answerLeaveQuestions(page, () => accept);
    await signIn(page, 'manager@kestrel-valley.example');
    await page.goto(`${running.url}/events/${screenedEventId}`);
    await page.waitForSelector('[data-test="decision-panel"]');
    await page.click('[data-test="outcome-hold"]');
    const reason = 'Sweep within limits but the gas sample is not back yet; hold until it is.';
    await page.fill('[data-test="decision-reason"]', reason);

    await page.reload();
    await page.waitForSelector('[data-test="decision-panel"] [data-test="draft-notice"]');
    expect(await valueOf(page, '[data-test="decision-reason"]')).toBe(reason);
    expect(await page.getAttribute('[data-test="outcome-hold"]', 'aria-checked')).toBe('true');

    // The panel fits the phone: nothing inside it runs past its own width or the screen's.
    await page.click('[data-test="outcome-release-with-restrictions"]');
    await page.fill('[data-test="decision-restrictions"]', 'Load limited to 70 % of ONAN rating; auto-reclose blocked on feeder 4.');
    await page.waitForSelector('[data-test="decision-follow-up"]');
    const fit = await page.$eval('[data-test="decision-panel"]', (panel) => {
      const box = panel.getBoundingClientRect();
      const widest = Math.max(...Array.from(panel.querySelectorAll('*'), (el) => el.getBoundingClientRect().right));
      return { scroll: panel.scrollWidth, client: panel.clientWidth, right: box.right, widest, viewport: window.innerWidth };
    });
    expect(fit.scroll).toBeLessThanOrEqual(fit.client);
    expect(fit.right).toBeLessThanOrEqual(fit.viewport);
    expect(fit.widest).toBeLessThanOrEqual(fit.viewport);

    // Another page would replace the typed decision: asked, and "stay" keeps it.
    await page.click('a.app-brand');
    await expect.poll(() => questions.asked).toBe(1);
    expect(page.url()).toMatch(new RegExp(`/events/${screenedEventId}$`));
    expect(await valueOf(page, '[data-test="decision-reason"]')).toBe(reason);
    accept = true;
    await page.goto(`${running.url}/events/${screenedEventId}`);
    await page.waitForSelector('[data-test="decision-panel"] [data-test="draft-notice"]');
    expect(await valueOf(page, '[data-test="decision-reason"]')).toBe(reason);
    await page.close();
  });
});
