import { randomUUID } from 'node:crypto';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';
import { demoApi, innerScrollersOf, logFault, makeTestUnit, openAs, overflowOf, screenEvent, settled, type DemoRole } from '../helpers/browser-pages.js';

// Phone (390 px), tablet (1024 px) and desktop (1440 px): no page scrolls sideways (the document's scroll width is the
// viewport's), and the session form's date-time field is wide enough to read and type into.

let running: Running;
let browser: Browser;
let api: ReturnType<typeof demoApi>;
let unitId: number;
/** A screened event of this test's own unit, awaiting the manager's decision. */
let screenedId: number;
/** An event of another own unit with no session yet (the tester's "New session"). */
let testingId: number;
/** The demo unit with the most history (reading sets, sweeps, two faults). */
let demoUnitId: number;

beforeAll(async () => {
  ({ running } = await startTestServer());
  api = demoApi(running.url);
  const tag = randomUUID().slice(0, 6).toUpperCase();
  unitId = await makeTestUnit(api, `W-${tag}-A`);
  screenedId = await logFault(api, unitId, 30);
  await screenEvent(api, screenedId, 20);
  testingId = await logFault(api, await makeTestUnit(api, `W-${tag}-B`), 5);
  demoUnitId = (await api.call<{ items: { id: number }[] }>('engineer', 'GET', '/units?q=KVP-HX-T2')).items[0].id;
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

async function expectNoSidewaysScroll(page: Page, what: string): Promise<void> {
  const o = await overflowOf(page);
  expect(o.scrollWidth, `${what}: the page scrolls sideways (${o.scrollWidth} px in ${o.clientWidth} px); widest: ${o.culprits.join('; ')}`).toBe(o.clientWidth);
}

const WIDTHS = [1440, 1024, 390] as const;

describe.each(WIDTHS)('at %i px wide', (width) => {
  it('the screened event file fits', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', `/events/${screenedId}`, width);
    await page.waitForSelector('[data-test="event-title"]');
    await expectNoSidewaysScroll(page, `event file at ${width}`);
    await page.close();
  });

  it('the decision panel fits, for the manager', async () => {
    const page = await openAs(browser, running.url, api, 'manager', `/events/${screenedId}`, width);
    const panel = page.locator('[data-test="decision-panel"]');
    await panel.waitFor();
    await panel.scrollIntoViewIfNeeded();
    await expectNoSidewaysScroll(page, `decision panel at ${width}`);
    const box = await panel.boundingBox();
    expect(box, 'the decision panel is laid out').not.toBeNull();
    expect(box!.x + box!.width, 'the decision panel ends inside the viewport').toBeLessThanOrEqual(width);
    await page.close();
  });

  it('the session form fits and its date-time field is wide enough to type a date and time', async () => {
    const page = await openAs(browser, running.url, api, 'tester', `/events/${testingId}`, width);
    await page.click('[data-test="new-session"]');
    const form = page.locator('[data-test="session-form"]');
    await form.waitFor();
    await expectNoSidewaysScroll(page, `session form at ${width}`);

    const when = form.locator('input[type="datetime-local"]').first();
    await when.scrollIntoViewIfNeeded();
    const box = await when.boundingBox();
    expect(box?.width ?? 0, 'the date-time field has room for a date and a time').toBeGreaterThan(100);
    // Typed as a person does: the field takes the date and the time.
    await when.click();
    await when.fill('2026-03-04T05:06');
    expect(await when.inputValue()).toBe('2026-03-04T05:06');
    await page.close();
  });
});

// Tables fit too: no table scrolls sideways inside its card (rows stack on a phone, cells wrap on a tablet).
describe.each([1024, 390])('lists at %i px wide', (width) => {
  const pages: [DemoRole, string][] = [
    ['engineer', '/units'],
    ['tester', '/units/UNIT'],
    ['engineer', '/events'],
    ['admin', '/admin/people'],
    ['admin', '/admin/sites'],
    ['admin', '/admin/designs'],
    ['admin', '/admin/units'],
  ];
  it.each(pages)('as %s, %s: no table scrolls sideways', async (role, path) => {
    const page = await openAs(browser, running.url, api, role, path.replace('UNIT', String(demoUnitId)), width);
    expect(await innerScrollersOf(page), `${path} at ${width}`).toEqual([]);
    await page.close();
  });
});

describe('at 390 px wide (a phone)', () => {
  const pages: [DemoRole | null, string, string][] = [
    [null, '/sign-in', 'the sign-in page'],
    ['engineer', '/units', 'the fleet'],
    ['engineer', '/events', 'the events list'],
    ['manager', '/', 'the manager’s desk'],
    ['tester', '/', 'the tester’s desk'],
    ['protection', '/', 'the protection engineer’s desk'],
    ['engineer', '/', 'the engineer’s desk'],
    ['protection', '/events/new', 'the new fault form'],
    ['manager', '/dev/outbox', 'the outbox'],
    ['engineer', '/password', 'the password page'],
    ['admin', '/admin/people', 'administration: people'],
    ['admin', '/admin/sites', 'administration: sites'],
    ['admin', '/admin/designs', 'administration: design families'],
    ['admin', '/admin/units', 'administration: units'],
    ['engineer', '/no/such/page', 'the page for an address with no page'],
  ];
  it.each(pages)('as %s, %s fits', async (role, path, what) => {
    const page = await openAs(browser, running.url, api, role, path, 390);
    await expectNoSidewaysScroll(page, what);
    await page.close();
  });

  it('the unit file fits', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', `/units/${unitId}`, 390);
    await page.waitForSelector('h1');
    await expectNoSidewaysScroll(page, 'unit file');
    await page.close();
  });

  it('the fleet table shows each unit as a stacked row, its words inside the screen', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', '/units', 390);
    const table = page.locator('[data-test="fleet-table"]');
    const tableBox = await table.boundingBox();
    expect(tableBox!.x + tableBox!.width).toBeLessThanOrEqual(390);
    // No cell reaches past the table's right edge (nothing hidden behind a sideways scroll inside the table).
    const widest = await page.$$eval('[data-test="fleet-table"] tbody td', (cells) => Math.max(...cells.map((c) => c.getBoundingClientRect().right)));
    expect(widest).toBeLessThanOrEqual(tableBox!.x + tableBox!.width + 1);
    await page.close();
  });

  it('the measure sees a page that does scroll sideways (a 900 px wide block in the page)', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', '/units', 390);
    await page.evaluate(() => {
      const wide = document.createElement('div');
      wide.style.cssText = 'width: 900px; height: 4px';
      wide.setAttribute('data-test', 'too-wide');
      document.querySelector('main h1')!.after(wide);
    });
    const o = await overflowOf(page);
    expect(o.scrollWidth).toBeGreaterThan(o.clientWidth);
    expect(o.culprits.join(' ')).toContain('too-wide');
    await page.close();
  });

  it('the shell at 390: the header fits and the drawer opens over the page from the menu button', async () => {
    const page = await openAs(browser, running.url, api, 'manager', '/units', 390);
    const header = await page.locator('.q-header').boundingBox();
    expect(header!.width).toBeLessThanOrEqual(390);
    for (const sel of ['[data-test="nav-toggle"]', '[data-test="change-password"]', '[data-test="signout"]']) {
      const b = await page.locator(sel).boundingBox();
      expect(b!.x + b!.width, `${sel} is on the screen`).toBeLessThanOrEqual(390);
    }
    expect(await page.locator('#app-nav').isVisible()).toBe(false);
    await page.click('[data-test="nav-toggle"]');
    await page.locator('#app-nav').waitFor({ state: 'visible' });
    await page.click('[data-test="nav-events"]');
    await page.waitForURL(/\/events$/);
    await settled(page);
    await expectNoSidewaysScroll(page, 'events list reached from the drawer');
    await page.close();
  });
});

describe('a stacked list on a phone', () => {
  it('keeps every cell’s column name on a hovered (tapped) row', async () => {
    const page = await openAs(browser, running.url, api, 'tester', '/events', 390);
    const row = page.locator('.gs-stack-table tbody tr').first();
    await row.waitFor();
    const labels = () => row.locator('td[data-label]').evaluateAll((tds) => tds.map((td) => [td.getAttribute('data-label'), getComputedStyle(td, '::before').content]));
    const before = await labels();
    expect(before.length).toBeGreaterThan(3);
    await row.hover();
    const hovered = await labels();
    // The name shown beside each value is the cell's data-label, hovered or not (Quasar draws its hover veil there).
    for (const [label, content] of [...before, ...hovered]) expect(content).toBe(JSON.stringify(label));
    await page.close();
  });
});
