import type { Browser, BrowserContext, Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users.js';

// Shared steps of the layout and accessibility browser tests: demo tokens, a signed-in page at a width, the API.

export type DemoRole = 'admin' | 'protection' | 'tester' | 'manager' | 'engineer';

export function demoApi(baseUrl: string) {
  const tokens = new Map<DemoRole, string>();
  async function token(role: DemoRole): Promise<string> {
    let t = tokens.get(role);
    if (!t) {
      const r = await fetch(`${baseUrl}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: `${role}@kestrel-valley.example`, password: DEMO_PASSWORD }),
      });
      if (!r.ok) throw new Error(`sign-in of ${role} failed: ${r.status}`);
      t = ((await r.json()) as { token: string }).token;
      tokens.set(role, t);
    }
    return t;
  }
  async function call<T>(role: DemoRole, method: string, path: string, body?: unknown): Promise<T> {
    const r = await fetch(`${baseUrl}/api${path}`, {
      method,
      headers: { authorization: `Bearer ${await token(role)}`, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await r.text();
    if (!r.ok) throw new Error(`${method} ${path} as ${role}: ${r.status} ${text}`);
    return (text ? JSON.parse(text) : null) as T;
  }
  return { token, call };
}

/**
 * One browser context per browser, role and width, kept until the browser closes: a page opened in it finds the app's
 * scripts in the context's cache (compiled once) instead of fetching them again. Each new tab starts as in a fresh
 * context: on its first load its local storage is emptied (no other page's drafts) and holds only the role's token.
 */
const contexts = new WeakMap<Browser, Map<string, Promise<BrowserContext>>>();

async function contextFor(browser: Browser, api: ReturnType<typeof demoApi>, role: DemoRole | null, width: number): Promise<BrowserContext> {
  let byKey = contexts.get(browser);
  if (!byKey) contexts.set(browser, (byKey = new Map()));
  const key = `${role ?? '-'}@${width}`;
  let made = byKey.get(key);
  if (!made) {
    made = (async () => {
      // bypassCSP: the app's Content-Security-Policy (script-src 'self') would refuse the axe-core script the test injects.
      const context = await browser.newContext({ viewport: { width, height: 900 }, bypassCSP: true });
      // The token is in local storage before the app's first script runs (one page load instead of two); only on the
      // tab's first load, so that a sign-out or a draft within a test stays as the test left it through reloads.
      const token = role ? await api.token(role) : null;
      await context.addInitScript((t) => {
        if (sessionStorage.getItem('gapsight.test-signed-in')) return;
        sessionStorage.setItem('gapsight.test-signed-in', '1');
        localStorage.clear();
        if (t) localStorage.setItem('gapsight.token', t);
      }, token);
      return context;
    })();
    byKey.set(key, made);
    made.catch(() => byKey.delete(key));
  }
  return made;
}

/** A page signed in as `role` (token in local storage, as the client keeps it), at `width` × 900, opened on `path`. */
export async function openAs(browser: Browser, baseUrl: string, api: ReturnType<typeof demoApi>, role: DemoRole | null, path: string, width = 1440): Promise<Page> {
  const context = await contextFor(browser, api, role, width);
  const page = await context.newPage();
  trackRequests(page);
  await page.goto(`${baseUrl}${path}`);
  await settled(page);
  return page;
}

interface RequestTracker {
  inFlight: number;
  lastChange: number;
}

const trackers = new WeakMap<Page, RequestTracker>();

/** Counts the page's requests still waiting for their answer (from now on). */
function trackRequests(page: Page): RequestTracker {
  const known = trackers.get(page);
  if (known) return known;
  const tracker: RequestTracker = { inFlight: 0, lastChange: Date.now() };
  page.on('request', () => {
    tracker.inFlight += 1;
    tracker.lastChange = Date.now();
  });
  const done = () => {
    tracker.inFlight = Math.max(0, tracker.inFlight - 1);
    tracker.lastChange = Date.now();
  };
  page.on('requestfinished', done);
  page.on('requestfailed', done);
  trackers.set(page, tracker);
  return tracker;
}

/** How long no request may be open before the page counts as loaded (Playwright's "networkidle" waits 500 ms). */
const QUIET_MS = 250;

/** Waits until none of the page's requests has been open for QUIET_MS (30 s at most, as "networkidle"). */
async function requestsQuiet(page: Page): Promise<void> {
  const tracker = trackers.get(page);
  if (!tracker) {
    await page.waitForLoadState('networkidle');
    return;
  }
  await page.waitForLoadState('load');
  const deadline = Date.now() + 30_000;
  while (tracker.inFlight > 0 || Date.now() - tracker.lastChange < QUIET_MS) {
    if (Date.now() > deadline) throw new Error(`${page.url()}: ${tracker.inFlight} request(s) still open after 30 s`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** Waits until the page's requests are answered and no load spinner is left. */
export async function settled(page: Page): Promise<void> {
  await requestsQuiet(page);
  await page.waitForSelector('main');
  await page.waitForFunction(() => !document.querySelector('[data-test$="-loading"], .q-table__linear-progress'), null, { timeout: 15_000 });
}

/** The document's horizontal overflow: how far its scroll width goes beyond the viewport, and the widest culprits. */
export async function overflowOf(page: Page): Promise<{ scrollWidth: number; clientWidth: number; culprits: string[] }> {
  return page.evaluate(() => {
    const root = document.documentElement;
    const limit = root.clientWidth;
    const culprits: string[] = [];
    for (const el of Array.from(document.querySelectorAll('body *'))) {
      const box = el.getBoundingClientRect();
      if (box.width > 0 && box.right > limit + 1 && culprits.length < 8) {
        const parent = el.parentElement?.closest('[data-test]');
        culprits.push(`${el.tagName.toLowerCase()}${el.getAttribute('data-test') ? `[data-test=${el.getAttribute('data-test')}]` : ''}.${String(el.className).split(' ').slice(0, 2).join('.')} right=${Math.round(box.right)} in ${parent?.getAttribute('data-test') ?? 'page'}`);
      }
    }
    return { scrollWidth: root.scrollWidth, clientWidth: limit, culprits };
  });
}

// Invented readings of a 40 MVA 132/33 kV two-winding unit, as in the server's screening tests.
export const factorySet = { kind: 'factory', takenAt: '2019-05-02T00:00:00Z', temperatureC: 28, tapPosition: '9b', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } };

/** A unit of the demo's first site and design, with a factory set: a place for a test's own events. */
export async function makeTestUnit(api: ReturnType<typeof demoApi>, serial: string): Promise<number> {
  const sites = await api.call<{ id: number }[]>('admin', 'GET', '/sites');
  const designs = await api.call<{ id: number }[]>('admin', 'GET', '/designs');
  const unit = await api.call<{ id: number }>('admin', 'POST', '/units', { serial, position: 'T9', siteId: sites[0].id, designId: designs[0].id, year: 2010, phases: 3, hvKV: 132, lvKV: 33, ratedKVA: 40000, impedancePercent: 10.5 });
  await api.call('tester', 'POST', `/units/${unit.id}/reading-sets`, factorySet);
  return unit.id;
}

/** A fault on the unit `hoursAgo` hours before now (tripped, 1 kA three-phase on the LV side). */
export async function logFault(api: ReturnType<typeof demoApi>, unitId: number, hoursAgo: number): Promise<number> {
  const occurredAt = new Date(Date.now() - hoursAgo * 3600_000).toISOString();
  const ev = await api.call<{ id: number }>('protection', 'POST', '/events', { unitId, occurredAt, type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }], notes: 'Feeder 4 cable fault (browser layout test)' });
  return ev.id;
}

/** A post-fault session an hour after the fault, then a screening: the event is screened and awaits the decision. */
export async function screenEvent(api: ReturnType<typeof demoApi>, eventId: number, hoursAgo: number): Promise<void> {
  const takenAt = new Date(Date.now() - hoursAgo * 3600_000).toISOString();
  await api.call('tester', 'POST', `/events/${eventId}/sessions`, { takenAt, temperatureC: 28, tapPosition: '9b', humidityPercent: 40, instrument: 'M4100', capacitancePF: { CH: 3120, CL: 9870, CHL: 5210 }, reactance: { A: { percent: 11.62 }, B: { percent: 11.58 }, C: { percent: 11.66 } } });
  await api.call('tester', 'POST', `/events/${eventId}/screenings`, {});
}

/** Boxes inside the page that scroll sideways on their own (a table wider than its card): what a reader cannot see. */
export async function innerScrollersOf(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    Array.from(document.querySelectorAll('main *'))
      .filter((e) => e.scrollWidth > e.clientWidth + 2 && ['auto', 'scroll'].includes(getComputedStyle(e).overflowX))
      .map((e) => `${e.tagName.toLowerCase()}.${String(e.className).split(' ')[0]} in [data-test=${e.closest('[data-test]')?.getAttribute('data-test') ?? '?'}] (${e.scrollWidth} px in ${e.clientWidth} px)`),
  );
}
