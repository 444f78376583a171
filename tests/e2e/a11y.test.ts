import { createRequire } from 'node:module';
import { randomUUID } from 'node:crypto';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';
import { demoApi, logFault, makeTestUnit, openAs, screenEvent, type DemoRole } from '../helpers/browser-pages.js';

// axe-core in Chromium on every page, as the role that uses it: no serious or critical violation. Also on each page:
// one `main` landmark and no positive tabindex (the keyboard follows the page's order).

const AXE_PATH = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

let running: Running;
let browser: Browser;
let api: ReturnType<typeof demoApi>;
const demoEventIds: number[] = [];
let screenedId = 0;
let unitId = 0;

beforeAll(async () => {
  ({ running } = await startTestServer());
  api = demoApi(running.url);
  const events = await api.call<{ items: { id: number }[] }>('admin', 'GET', '/events?pageSize=100');
  demoEventIds.push(...events.items.map((e) => e.id));
  // A screened event of our own: the manager's decision panel is on it.
  unitId = await makeTestUnit(api, `AX-${randomUUID().slice(0, 6).toUpperCase()}`);
  screenedId = await logFault(api, unitId, 30);
  await screenEvent(api, screenedId, 20);
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

interface AxeNode { target: string[]; failureSummary?: string }
interface AxeViolation { id: string; impact: string | null; help: string; nodes: AxeNode[] }

async function axeViolations(page: Page): Promise<AxeViolation[]> {
  await page.addScriptTag({ path: AXE_PATH });
  const result = await page.evaluate(() => (window as unknown as { axe: { run: (d: Document, o: object) => Promise<{ violations: unknown[] }> } }).axe.run(document, { resultTypes: ['violations'] }));
  return result.violations as AxeViolation[];
}

function describeViolations(violations: AxeViolation[]): string {
  return violations
    .map((v) => `${v.id} (${v.impact}): ${v.help}\n${v.nodes.slice(0, 5).map((n) => `    ${n.target.join(' ')} — ${(n.failureSummary ?? '').replace(/\s+/g, ' ')}`).join('\n')}`)
    .join('\n');
}

async function checkPage(role: DemoRole | null, path: string): Promise<void> {
  const page = await openAs(browser, running.url, api, role, path);
  try {
    const serious = (await axeViolations(page)).filter((v) => v.impact === 'serious' || v.impact === 'critical');
    expect(serious, `${path} as ${role ?? 'nobody'}:\n${describeViolations(serious)}`).toEqual([]);
    const landmarks = await page.evaluate(() => ({
      mains: document.querySelectorAll('main, [role="main"]').length,
      positiveTabindex: Array.from(document.querySelectorAll('[tabindex]')).filter((e) => Number(e.getAttribute('tabindex')) > 0).map((e) => e.outerHTML.slice(0, 120)),
    }));
    expect(landmarks.mains, `${path}: one main landmark`).toBe(1);
    expect(landmarks.positiveTabindex, `${path}: no positive tabindex`).toEqual([]);
  } finally {
    await page.close();
  }
}

describe('axe-core: no serious or critical violation', () => {
  it('the sign-in page', () => checkPage(null, '/sign-in'));

  it.each(['admin', 'protection', 'tester', 'manager', 'engineer'] as const)('the desk of the %s', (role) => checkPage(role, '/'));

  it('the fleet', () => checkPage('engineer', '/units'));
  it('a unit file', () => checkPage('engineer', `/units/${unitId}`));
  it('the events list', () => checkPage('engineer', '/events'));

  // Every demo event in one case: the file's 60 s limit is for one page, and a busy machine (the server tests run
  // beside the browser tests) takes longer than that for all of them.
  it('every demo event file, as the tester', async () => {
    expect(demoEventIds.length).toBeGreaterThan(0);
    for (const id of demoEventIds) await checkPage('tester', `/events/${id}`);
  }, 300_000);
  it('a screened event file with the decision panel, as the manager', () => checkPage('manager', `/events/${screenedId}`));
  it('the new fault form', () => checkPage('protection', '/events/new'));
  it('the outbox', () => checkPage('manager', '/dev/outbox'));
  it('the password page', () => checkPage('engineer', '/password'));
  it.each(['people', 'sites', 'designs', 'units'])('administration: %s', (tab) => checkPage('admin', `/admin/${tab}`));
  it('the page for an address with no page', () => checkPage('engineer', '/no/such/page'));
  it('a missing event', () => checkPage('engineer', '/events/999999'));
  it('the page of a place the role may not go', () => checkPage('engineer', '/admin/people'));
});

describe('keyboard focus', () => {
  it('a Quasar button reached with Tab shows the focus ring', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', '/units');
    let ring: { tag: string; style: string; width: string } | null = null;
    for (let i = 0; i < 40 && !ring; i += 1) {
      await page.keyboard.press('Tab');
      ring = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null;
        if (!el?.classList.contains('q-btn') || !el.closest('main')) return null;
        const s = getComputedStyle(el);
        return { tag: el.textContent?.trim() ?? '', style: s.outlineStyle, width: s.outlineWidth };
      });
    }
    expect(ring, 'Tab reaches a button on the page').not.toBeNull();
    expect(ring!.style).toBe('solid');
    expect(parseFloat(ring!.width)).toBeGreaterThanOrEqual(2);
    await page.close();
  });

  it('Tab goes from the skip link to the header, then the drawer, then the page', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', '/units');
    const order: string[] = [];
    for (let i = 0; i < 12; i += 1) {
      await page.keyboard.press('Tab');
      order.push(
        await page.evaluate(() => {
          const el = document.activeElement;
          if (!el) return 'none';
          if (el.closest('.q-header')) return 'header';
          if (el.closest('.q-drawer')) return 'drawer';
          if (el.closest('main')) return 'main';
          return el.classList.contains('gs-skip-link') ? 'skip' : 'other';
        }),
      );
    }
    const firstOf = (part: string) => order.indexOf(part);
    expect(order[0]).toBe('skip');
    expect(firstOf('header')).toBeGreaterThan(0);
    expect(firstOf('drawer')).toBeGreaterThan(firstOf('header'));
    expect(firstOf('main')).toBeGreaterThan(firstOf('drawer'));
    // Once in the drawer, the header is not visited again before the page.
    expect(order.slice(firstOf('drawer'), firstOf('main')).every((p) => p === 'drawer')).toBe(true);
    await page.close();
  });
});
