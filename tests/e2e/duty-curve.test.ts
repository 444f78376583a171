import { randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';
import { demoApi, makeTestUnit, openAs } from '../helpers/browser-pages.js';

// The duty curve on the event file in Chromium: a unit with an earlier fault and a new one; the chart draws the curves
// and both faults' shots (log10 axes with decade ticks), the cumulative duty beside it, the table of the same numbers.
// A picture goes to test-output/charts/duty-curve-prior.png.

const SHOTS = path.resolve('test-output/charts');

let running: Running;
let browser: Browser;
let api: ReturnType<typeof demoApi>;
let eventId: number;

beforeAll(async () => {
  ({ running } = await startTestServer());
  api = demoApi(running.url);
  const unitId = await makeTestUnit(api, `DC-${randomUUID().slice(0, 6).toUpperCase()}`);
  const at = (hoursAgo: number) => new Date(Date.now() - hoursAgo * 3600_000).toISOString();
  // 40 MVA, 33 kV LV: rated line current 699.8 A; 4.2 kA = 6.0 × rated, 6.3 kA = 9.0 × rated (three-phase: winding = line).
  await api.call('protection', 'POST', '/events', { unitId, occurredAt: at(24 * 200), type: 'three-phase', side: 'lv', shots: [{ currentKA: 4.2, durationS: 0.3 }] });
  const ev = await api.call<{ id: number }>('protection', 'POST', '/events', { unitId, occurredAt: at(5), type: 'three-phase', side: 'lv', shots: [{ currentKA: 6.3, durationS: 0.12 }, { currentKA: 6.1, durationS: 0.08 }] });
  eventId = ev.id;
  mkdirSync(SHOTS, { recursive: true });
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

describe('the duty curve on the event file', () => {
  it("draws both faults' shots with the curves, the cumulative duty beside them and a table", async () => {
    const page = await openAs(browser, running.url, api, 'engineer', `/events/${eventId}`, 1280);
    const chart = page.locator('[data-test="duty-curve"]');
    await chart.waitFor({ timeout: 20_000 });
    await chart.scrollIntoViewIfNeeded();
    await chart.locator('svg.apexcharts-svg').first().waitFor({ timeout: 20_000 });
    await page.waitForTimeout(300);
    const drawn = await chart.evaluate((el) => ({
      titles: Array.from(el.querySelectorAll('.apexcharts-xaxis-title-text, .apexcharts-yaxis-title-text')).map((t) => (t.textContent ?? '').trim()),
      legend: Array.from(el.querySelectorAll('.apexcharts-legend-text')).map((t) => (t.textContent ?? '').trim()),
      xTicks: Array.from(el.querySelectorAll('.apexcharts-xaxis-label tspan')).map((t) => (t.textContent ?? '').trim()),
      markers: el.querySelectorAll('.apexcharts-series-markers path, .apexcharts-series-markers circle, .apexcharts-scatter .apexcharts-marker').length,
      lines: Array.from(el.querySelectorAll('.apexcharts-line-series path.apexcharts-line')).filter((p) => (p as SVGGraphicsElement).getBBox().width > 0).length,
    }));
    expect([...drawn.titles].sort()).toEqual(['Current (per unit of rated)', 'Time (s)']);
    expect(drawn.legend.some((l) => l.startsWith('Earlier fault '))).toBe(true);
    expect(drawn.legend.some((l) => l.startsWith('This fault '))).toBe(true);
    expect(drawn.xTicks).toEqual(['1', '10', '100']);
    expect(drawn.markers).toBeGreaterThanOrEqual(3); // two shots of this fault, one of the earlier
    expect(drawn.lines).toBeGreaterThanOrEqual(2); // thermal curve and mechanical segment

    // computed: (6.3/0.69982)²·0.12 + (6.1/0.69982)²·0.08 = 9.725 + 6.078 = 15.80; earlier (4.2/0.69982)²·0.3 = 10.81;
    // cumulative 26.6 per-unit² · s of K = 2·(100/10.5)² = 181.4 → 14.7 %.
    const summary = await page.locator('[data-test="duty-curve-summary"]').innerText();
    expect(summary).toContain('26.6 per-unit² · s');
    expect(summary).toContain('14.7 %');
    await chart.screenshot({ path: path.join(SHOTS, 'duty-curve-prior.png') });

    await page.click('[data-test="duty-curve-table-toggle"]');
    const rows = await page.locator('[data-test="duty-curve-table"] tbody tr').allInnerTexts();
    expect(rows.filter((r) => r.startsWith('This fault'))).toHaveLength(2);
    expect(rows.filter((r) => r.startsWith('Earlier fault'))).toHaveLength(1);
    await page.close();
  });
});
