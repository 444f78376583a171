import { randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seed/demo-users.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';
import { demoApi, factorySet, logFault, openAs, type DemoRole } from '../helpers/browser-pages.js';

// The charts in Chromium, on the demo scenario: the chart library is fetched only by pages that draw a chart (never by
// the desk); every chart draws its series with axis titles that name their unit, beside a table of the same numbers.
// A picture of each chart goes to test-output/charts/<name>.png.

const SHOTS = path.resolve('test-output/charts');

let running: Running;
let browser: Browser;
let api: ReturnType<typeof demoApi>;
/** The demo unit with the most history (reading sets over the years, two faults). */
let historyUnitId: number;
/** The demo's repaired unit's event: screened twice (sweeps, shifts, sisters, a high-duty fault). */
let historyEventId: number;
/** The large demo family (the one with the CHL outlier). */
let largeDesignId: number;
/** An event of this file's own unit with dissipation at several frequencies, before and after the fault, screened. */
let dfEventId: number;

interface DemoUnit {
  id: number;
  serial: string;
  designId: number;
}

async function demoUnit(serial: string): Promise<DemoUnit> {
  const { items } = await api.call<{ items: DemoUnit[] }>('engineer', 'GET', `/units?q=${encodeURIComponent(serial)}`);
  const unit = items.find((u) => u.serial === serial);
  if (!unit) throw new Error(`the demo has no unit ${serial}`);
  return unit;
}

// Invented DF (%) at six frequencies: a U-shaped curve (A/f low down, B·f high up). After the fault the A/f term
// roughly doubles (as moisture would make it), the rest unchanged.
const dfCurve = (a: number) => [15, 30, 50, 100, 200, 400].map((f) => [f, Number((a / f + 0.0002 * f + 0.25).toFixed(4))] as [number, number]);

beforeAll(async () => {
  ({ running } = await startTestServer());
  api = demoApi(running.url);
  const history = await demoUnit('KVP-MB-T1');
  historyUnitId = (await demoUnit('KVP-HX-T2')).id;
  largeDesignId = (await demoUnit('KVP-QL-T1')).designId;
  const smallDesignId = (await demoUnit('KVP-HX-T4')).designId;
  const events = await api.call<{ items: { id: number; status: string }[] }>('engineer', 'GET', `/events?unitId=${history.id}`);
  const screened = events.items.filter((e) => e.status !== 'logged' && e.status !== 'testing');
  if (screened.length === 0) throw new Error('the demo unit KVP-MB-T1 has no screened event');
  historyEventId = screened[0].id;

  // A unit with DF over frequency in its factory set and in the post-fault session; in the small family (its readings
  // are a large unit's), so that the large family's comparison stays the demo's own.
  const tag = randomUUID().slice(0, 6).toUpperCase();
  const sites = await api.call<{ id: number }[]>('admin', 'GET', '/sites');
  const unit = await api.call<{ id: number }>('admin', 'POST', '/units', { serial: `C-${tag}`, position: 'T9', siteId: sites[0].id, designId: smallDesignId, year: 2010, phases: 3, hvKV: 132, lvKV: 33, ratedKVA: 40000, impedancePercent: 10.5 });
  await api.call('tester', 'POST', `/units/${unit.id}/reading-sets`, { ...factorySet, dissipationPercent: { CH: 0.3, CL: 0.31, CHL: 0.26 }, dissipationByFrequency: { CH: dfCurve(1.2), CHL: dfCurve(1.0) } });
  dfEventId = await logFault(api, unit.id, 30);
  await api.call('tester', 'POST', `/events/${dfEventId}/sessions`, {
    takenAt: new Date(Date.now() - 28 * 3600_000).toISOString(),
    temperatureC: 28,
    tapPosition: '9b',
    capacitancePF: { CH: 3121, CL: 9874, CHL: 5212 },
    dissipationPercent: { CH: 0.31, CL: 0.31, CHL: 0.27 },
    dissipationByFrequency: { CH: dfCurve(2.4), CHL: dfCurve(1.1) },
    reactance: { A: { percent: 11.63 }, B: { percent: 11.57 }, C: { percent: 11.66 } },
  });
  await api.call('tester', 'POST', `/events/${dfEventId}/screenings`, {});
  mkdirSync(SHOTS, { recursive: true });
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  // Leave no mail queued: another browser test's server would deliver it after its own (the e2e files share a database).
  for (let i = 0; i < 50 && dfEventId; i++) {
    const { notifications } = await api.call<{ notifications: { status: string }[] }>('manager', 'GET', `/events/${dfEventId}`);
    if (!notifications.some((n) => n.status === 'queued')) break;
    await new Promise((r) => setTimeout(r, 200));
  }
  await running?.stop();
});

// ---- the chart library's chunk ---------------------------------------------------------------------------------------

/**
 * The built files that hold the chart library, found by their content (not by a name the bundler may change): the
 * library's own class names for its root element and its drawing group, in a file of its size (over half a megabyte;
 * a component that names one of those classes is a few kB).
 */
function chartLibraryFiles(): string[] {
  const dist = process.env.E2E_DIST;
  if (!dist) throw new Error('Browser tests need the client built by `npm test` (E2E_DIST).');
  const assets = path.join(dist, 'assets');
  return readdirSync(assets)
    .filter((f) => f.endsWith('.js'))
    .filter((f) => {
      const file = path.join(assets, f);
      if (statSync(file).size < 150_000) return false;
      const text = readFileSync(file, 'utf8');
      return text.includes('apexcharts-canvas') && text.includes('apexcharts-inner');
    });
}

/** The paths of the scripts a page fetched (each request's URL path). */
function recordScripts(page: Page): string[] {
  const paths: string[] = [];
  page.on('request', (r) => {
    const u = new URL(r.url());
    paths.push(u.pathname);
  });
  return paths;
}

const fetchedOneOf = (requested: string[], files: string[]) => requested.filter((p) => files.some((f) => p.endsWith(`/assets/${f}`)));

describe("the chart library's chunk", () => {
  it('is a file of its own in the build, apart from the first page\'s scripts', () => {
    const files = chartLibraryFiles();
    expect(files.length, 'the build holds the chart library').toBeGreaterThan(0);
    const index = readFileSync(path.join(process.env.E2E_DIST!, 'index.html'), 'utf8');
    for (const f of files) expect(index, `index.html loads or preloads ${f}`).not.toContain(f);
  });

  // The five people side by side (a context each; most of each case is waiting for the desk and the quiet second after it).
  it.concurrent.for(DEMO_USERS.map((u) => [u.roles[0], u.email] as const))('is not requested when the %s signs in and the desk loads', async ([_role, email], { expect }) => {
    const files = chartLibraryFiles();
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    const requested = recordScripts(page);
    await page.goto(`${running.url}/`);
    await page.waitForURL(/\/sign-in/);
    await page.fill('[data-test="signin-email"]', email);
    await page.fill('[data-test="signin-password"]', DEMO_PASSWORD);
    await page.click('[data-test="signin-submit"]');
    await page.waitForSelector('[data-test="desk-title"]');
    expect(new URL(page.url()).pathname).toBe('/');
    await page.waitForLoadState('networkidle');
    await page.waitForFunction(() => !document.querySelector('[data-test$="-loading"], .q-table__linear-progress'), null, { timeout: 15_000 });
    // A moment for anything fetched after the lists arrive (prefetch on idle, a lazy component).
    await page.waitForTimeout(1000);
    expect(requested.some((p) => p.startsWith('/assets/')), 'the desk loaded its scripts').toBe(true);
    expect(fetchedOneOf(requested, files), `the desk fetched the chart library (${files.join(', ')})`).toEqual([]);
    await context.close();
  });

  it('is requested by the unit file, which draws a trend', async () => {
    const files = chartLibraryFiles();
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    const requested = recordScripts(page);
    await context.addInitScript((t) => localStorage.setItem('gapsight.token', t), await api.token('engineer'));
    await page.goto(`${running.url}/units/${historyUnitId}`);
    await page.waitForSelector('svg.apexcharts-svg');
    expect(fetchedOneOf(requested, files).length, `the unit file fetched the chart library (${files.join(', ')})`).toBeGreaterThan(0);
    await context.close();
  });
});

// ---- the charts --------------------------------------------------------------------------------------------------------

/** Unfolds every folded section of the event file (the charts in the screening evidence start folded for some). */
async function unfoldAll(page: Page): Promise<void> {
  const folded = page.locator('[data-test^="section-toggle-"][aria-expanded="false"]');
  for (let n = await folded.count(), guard = 0; n > 0 && guard < 20; n = await folded.count(), guard++) await folded.first().click();
}

/** What a drawn chart shows: its series marks with a size (paths, points, bars), its axis titles and its sizes. */
async function drawnChart(chart: Locator): Promise<{ marks: number; titles: string[]; svgWidth: number; plotWidth: number }> {
  await chart.scrollIntoViewIfNeeded();
  await chart.locator('svg.apexcharts-svg').first().waitFor({ timeout: 20_000 });
  // The library draws in the next frames after its svg appears: wait for a series mark with a size (5 s at most; the
  // count below says whether one came), then two more frames for the rest of the drawing.
  await chart.evaluate(
    (el) =>
      new Promise<void>((resolve) => {
        const until = Date.now() + 5_000;
        const drawn = () =>
          Array.from(el.querySelectorAll('svg.apexcharts-svg .apexcharts-series path, svg.apexcharts-svg .apexcharts-series circle, svg.apexcharts-svg .apexcharts-series rect, svg.apexcharts-svg .apexcharts-series-markers path, svg.apexcharts-svg .apexcharts-series-markers circle')).some((m) => {
            const box = (m as SVGGraphicsElement).getBBox();
            return box.width > 0 || box.height > 0;
          });
        const frame = (n: number) => requestAnimationFrame(() => (n > 1 ? frame(n - 1) : resolve()));
        const check = () => (drawn() || Date.now() > until ? frame(2) : setTimeout(check, 25));
        check();
      }),
  );
  return chart.evaluate((el) => {
    const marks = Array.from(el.querySelectorAll('svg.apexcharts-svg .apexcharts-series path, svg.apexcharts-svg .apexcharts-series circle, svg.apexcharts-svg .apexcharts-series rect, svg.apexcharts-svg .apexcharts-series-markers path, svg.apexcharts-svg .apexcharts-series-markers circle')).filter((m) => {
      const box = (m as SVGGraphicsElement).getBBox();
      return box.width > 0 || box.height > 0;
    }).length;
    const titles = Array.from(el.querySelectorAll('.apexcharts-xaxis-title-text, .apexcharts-yaxis-title-text')).map((t) => (t.textContent ?? '').trim());
    // The narrowest of the chart's drawings and of their plot areas (the rectangle the library clips the series to,
    // as wide as its grid, shown or not).
    const svgs = Array.from(el.querySelectorAll('svg.apexcharts-svg'));
    const svgWidth = Math.min(...svgs.map((s) => s.getBoundingClientRect().width));
    const plotWidth = Math.min(...svgs.map((s) => Number(s.querySelector('clipPath[id^="gridRectMask"] > rect')?.getAttribute('width') ?? 0)));
    return { marks, titles, svgWidth, plotWidth };
  });
}

/** A drawing a person can read at 1440 px: not squeezed into a sliver, its plot area most of it. */
function expectRoom(name: string, d: { svgWidth: number; plotWidth: number }): void {
  expect(d.svgWidth, `${name}: the chart is drawn ${Math.round(d.svgWidth)} px wide`).toBeGreaterThanOrEqual(280);
  expect(d.plotWidth, `${name}: the plot area is ${Math.round(d.plotWidth)} px of ${Math.round(d.svgWidth)} px`).toBeGreaterThanOrEqual(0.4 * d.svgWidth);
}

/** Element pictures without the page's sticky bars drawn over them. */
const SHOT_STYLE = '.q-header, .q-footer, [data-test="event-page-menu"] { visibility: hidden !important; }';

/** The rows of a chart's table view, each row's cells' text. */
function tableRows(table: Locator): Promise<string[][]> {
  return table.evaluate((el) =>
    Array.from(el.querySelectorAll('tr'))
      .filter((tr) => tr.querySelector('td'))
      .map((tr) => Array.from(tr.querySelectorAll('td, th')).map((c) => (c.textContent ?? '').trim())),
  );
}

const NUMBER = /[-−+]?\d+(?:[.,]\d+)?/;

/**
 * A table view kept out of sight is shown from the keyboard: the control that names it (aria-controls on the table or
 * a box around it, or the summary of a <details> around it) is focused and Enter pressed; then the table is visible.
 */
async function showByKeyboard(page: Page, name: string, table: Locator): Promise<void> {
  if (await table.isVisible()) return;
  const controlSelector = await table.evaluate((el) => {
    for (let e: Element | null = el; e; e = e.parentElement) {
      if (e.tagName === 'DETAILS') return { details: true, id: null };
      if (e.id && document.querySelector(`[aria-controls="${e.id}"]`)) return { details: false, id: e.id };
    }
    return null;
  });
  expect(controlSelector, `${name}: the hidden table view has a control that shows it (aria-controls or <details>)`).not.toBeNull();
  const control = controlSelector!.details ? table.locator('xpath=ancestor::details[1]/summary') : page.locator(`[aria-controls="${controlSelector!.id}"]`).first();
  await control.focus();
  await page.keyboard.press('Enter');
  await expect.poll(() => table.isVisible(), { message: `${name}: Enter on the control shows the table view`, timeout: 5_000 }).toBe(true);
}

/**
 * Checks one chart: drawn with at least one series mark, every unit in `units` named in an axis title, a table view
 * (shown from the keyboard) with rows of numbers; saves a picture of it as `shot`.
 */
async function checkChart(page: Page, name: string, units: string[], shot: string, nth = 0): Promise<void> {
  const chart = page.locator(`[data-test="${name}"]`).nth(nth);
  await chart.waitFor({ state: 'attached', timeout: 15_000 });
  const drawn = await drawnChart(chart);
  const { marks, titles } = drawn;
  expect(marks, `${name}: series drawn`).toBeGreaterThan(0);
  expectRoom(name, drawn);
  for (const unit of units) expect(titles.join(' | '), `${name}: an axis title names ${unit}`).toContain(unit);

  const table = page.locator(`[data-test="${name}-table"]`).nth(nth);
  await table.waitFor({ state: 'attached', timeout: 5_000 });
  await showByKeyboard(page, name, table);
  const rows = await tableRows(table);
  expect(rows.length, `${name}: the table view has rows`).toBeGreaterThan(0);
  expect(rows.filter((cells) => cells.some((c) => NUMBER.test(c))).length, `${name}: the table view's rows hold numbers (${JSON.stringify(rows.slice(0, 3))})`).toBeGreaterThan(0);

  await chart.screenshot({ path: path.join(SHOTS, `${shot}.png`), style: SHOT_STYLE });
}

async function eventPage(role: DemoRole, eventId: number): Promise<Page> {
  const page = await openAs(browser, running.url, api, role, `/events/${eventId}`, 1440);
  await page.waitForSelector('[data-test="event-title"]');
  await unfoldAll(page);
  return page;
}

describe('the unit file', () => {
  it('draws the unit trends with a table, as values and as the change against the baseline', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', `/units/${historyUnitId}`, 1440);
    // Values first: capacitance in pF.
    await checkChart(page, 'unit-trends', ['(pF)'], 'unit-trends');
    const chart = page.locator('[data-test="unit-trends"]');
    const mode = page.locator('[data-test="unit-trends-mode"]');
    await mode.waitFor();
    await mode.getByRole('button', { name: /change/i }).click();
    await page.waitForFunction(
      () => Array.from(document.querySelectorAll('[data-test="unit-trends"] .apexcharts-yaxis-title-text')).some((t) => (t.textContent ?? '').includes('(%)')),
      null,
      { timeout: 10_000 },
    );
    const drawn = await drawnChart(chart);
    const { marks, titles } = drawn;
    expect(marks, 'unit-trends as change: series drawn').toBeGreaterThan(0);
    expectRoom('unit-trends as change', drawn);
    expect(titles.join(' | '), 'unit-trends as change: the axis says %').toContain('(%)');
    await chart.screenshot({ path: path.join(SHOTS, 'unit-trends-change.png'), style: SHOT_STYLE });
    await page.close();
  });
});

describe('the event file', () => {
  it('draws the duty curve with the fault, with a table', async () => {
    const page = await eventPage('manager', historyEventId);
    await checkChart(page, 'duty-curve', ['(s)', '(per unit of rated)'], 'duty-curve');
    await page.close();
  });

  it('draws the shift chart in the screening evidence, with a table', async () => {
    const page = await eventPage('manager', historyEventId);
    await checkChart(page, 'shift-chart', ['(%)'], 'shift-chart');
    await page.close();
  });

  it('draws the sister comparison in the screening evidence, with a table', async () => {
    const page = await eventPage('engineer', historyEventId);
    // CHL capacitance picked from the overview (the strip then says pF).
    const pick = page.locator('[data-test="sister-comparison-pick"]', { hasText: 'CHL capacitance' });
    await pick.waitFor({ timeout: 15_000 });
    await pick.click();
    await expect.poll(() => pick.getAttribute('aria-pressed')).toBe('true');
    await checkChart(page, 'sister-comparison', ['(pF)'], 'sister-comparison');
    await page.close();
  });

  it('draws every sweep overlay in the screening evidence, with a table', async () => {
    const page = await eventPage('engineer', historyEventId);
    await page.locator('[data-test="sweep-overlay"]').first().waitFor({ state: 'attached', timeout: 15_000 });
    const count = await page.locator('[data-test="sweep-overlay"]').count();
    expect(count, 'one overlay per swept trace').toBeGreaterThan(0);
    for (let i = 0; i < count; i++) await checkChart(page, 'sweep-overlay', ['(dB)', '(Hz)'], i === 0 ? 'sweep-overlay' : `sweep-overlay-${i + 1}`, i);
    await page.close();
  });

  it('draws dissipation over frequency in the screening evidence, with a table', async () => {
    const page = await eventPage('engineer', dfEventId);
    await checkChart(page, 'df-frequency', ['(Hz)', '(%)'], 'df-frequency');
    await page.close();
  });
});

describe('the event file on paper', () => {
  it('prints the duty curve and every sweep overlay as vector drawings (the PDF report\'s), folded sections too, and no screen chart', async () => {
    // Folded as the manager finds the page: paper shows every section anyway (event-print.css).
    const page = await openAs(browser, running.url, api, 'manager', `/events/${historyEventId}`, 1440);
    await page.waitForSelector('[data-test="event-title"]');
    await page.locator('[data-test="duty-curve-print"] svg').waitFor({ state: 'attached', timeout: 15_000 });
    await page.locator('[data-test="sweep-overlay-print"] svg').first().waitFor({ state: 'attached', timeout: 15_000 });
    expect(await page.locator('[data-test="duty-curve-print"]').isVisible(), 'no drawing on screen').toBe(false);
    await page.emulateMedia({ media: 'print' });
    const drawings = await page.evaluate(() =>
      Array.from(document.querySelectorAll('[data-test="duty-curve-print"], [data-test="sweep-overlay-print"]')).map((d) => {
        const svg = d.querySelector('svg');
        const box = svg?.getBoundingClientRect();
        return { name: d.getAttribute('data-test'), width: box?.width ?? 0, text: Array.from(d.querySelectorAll('text')).map((t) => t.textContent).join(' | ') };
      }),
    );
    const duty = drawings.filter((d) => d.name === 'duty-curve-print');
    const sweeps = drawings.filter((d) => d.name === 'sweep-overlay-print');
    expect(duty).toHaveLength(1);
    expect(sweeps.length, 'one drawing per sweep overlay').toBe(await page.locator('[data-test="sweep-overlay"]').count());
    for (const d of drawings) expect(d.width, `${d.name} is drawn on paper`).toBeGreaterThan(200);
    expect(duty[0].text).toContain('Current (per unit of rated)');
    expect(duty[0].text).toContain('Time (s)');
    for (const d of sweeps) expect(d.text).toContain('Frequency (Hz)');
    // The interactive charts stay off paper.
    const screenCharts = await page.evaluate(() => Array.from(document.querySelectorAll('.gs-screen-chart')).filter((e) => e.getBoundingClientRect().height > 0).length);
    expect(screenCharts).toBe(0);
    await page.close();
  });
});

describe('the design family page', () => {
  it('compares the family on CHL capacitance: the outlier named, the strip drawn, a table of every unit', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', `/designs/${largeDesignId}`, 1440);
    await page.waitForSelector('[data-test="design-family"]', { timeout: 15_000 });
    // The quantity picked as a person does: the picker's option.
    await page.click('[data-test="family-quantity"]');
    await page.getByRole('option', { name: /^CHL capacitance/ }).click();
    await page.waitForFunction(() => document.querySelector('[data-test="family-table"] caption')?.textContent?.includes('CHL capacitance'), null, { timeout: 15_000 });
    await page.waitForFunction(() => !document.querySelector('[data-test$="-loading"]'), null, { timeout: 15_000 });
    expect(await page.locator('[data-test="family-row"]').count(), 'the family\'s seven demo units (and any other file\'s own)').toBeGreaterThanOrEqual(7);
    const outliers = await page.locator('[data-test="family-row"]:has([data-test="family-outlier"])').allTextContents();
    expect(outliers.join(' | '), 'the CHL outlier is named').toContain('KVP-QL-T1');
    const strip = page.locator('[data-test="sister-strip"]').first();
    const drawn = await drawnChart(strip);
    const { marks, titles } = drawn;
    expect(marks, 'sister strip: points drawn').toBeGreaterThan(0);
    expectRoom('sister strip', drawn);
    expect(titles.join(' | '), 'sister strip: the value axis names pF').toContain('(pF)');
    const rows = await tableRows(page.locator('[data-test="family-table"]'));
    expect(rows.filter((cells) => cells.some((c) => /\d+(\.\d+)?\s*pF/.test(c))).length, 'the table gives each unit\'s value in pF').toBeGreaterThanOrEqual(7);
    await strip.screenshot({ path: path.join(SHOTS, 'sister-strip.png'), style: SHOT_STYLE });
    await page.locator('[data-test="design-family"]').screenshot({ path: path.join(SHOTS, 'design-family.png'), style: SHOT_STYLE });
    await page.close();
  });
});

describe('the criteria sets page', () => {
  it('lists the versions and compares two', async () => {
    const page = await openAs(browser, running.url, api, 'engineer', '/criteria', 1440);
    await page.waitForSelector('[data-test="criteria-page"]', { timeout: 15_000 });
    expect(await page.locator('[data-test="criteria-version-row"]').count(), 'versions 1 and 2 (published by the migrations)').toBeGreaterThanOrEqual(2);
    // "Compare versions" opens the comparison of the two newest versions.
    await page.click('[data-test="criteria-compare-toggle"]');
    await page.locator('[data-test="criteria-diff"]').waitFor({ timeout: 15_000 });
    await page.close();

    // Versions 1 and 2 by the page's own address (the drafts other files may add do not move it).
    const pinned = await openAs(browser, running.url, api, 'engineer', '/criteria?a=1&b=2', 1440);
    const diff = pinned.locator('[data-test="criteria-diff"]');
    await diff.waitFor({ timeout: 15_000 });
    const rows = await pinned.locator('[data-test="criteria-diff-row"]').allTextContents();
    expect(rows.length, 'the comparison lists what changed from version 1 to version 2').toBeGreaterThan(0);
    expect(rows.some((r) => NUMBER.test(r)), `the changes hold numbers (${rows.slice(0, 3).join(' | ')})`).toBe(true);
    await diff.screenshot({ path: path.join(SHOTS, 'criteria-diff.png'), style: SHOT_STYLE });
    await pinned.close();
  });
});
