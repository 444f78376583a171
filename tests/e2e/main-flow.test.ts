import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Like, type DataSource } from 'typeorm';
import type { Running } from '../../server/index.js';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users.js';
import { FaultEvent } from '../../server/features/events/fault-event.entity.js';
import { SinkMessage } from '../../server/mail/sink-message.entity.js';
import { Unit } from '../../server/features/units/unit.entity.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';

// The demo's main flow in Chromium: the tester screens the recent fault on KVP-HX-T2, the manager gets the mail and
// signs a release with restrictions.

let running: Running;
let browser: Browser;
let db: DataSource;
let eventId: number;

beforeAll(async () => {
  ({ running } = await startTestServer());
  db = (await import('../../server/db/data-source.js')).default;
  const unit = await db.getRepository(Unit).findOneByOrFail({ serial: 'KVP-HX-T2' });
  eventId = (await db.getRepository(FaultEvent).findOneOrFail({ where: { unitId: unit.id }, order: { occurredAt: 'DESC' } })).id;
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

async function signedIn(email: string): Promise<Page> {
  const page = await browser.newPage({ viewport: { width: 1366, height: 900 } });
  await page.goto(`${running.url}/sign-in`);
  await page.fill('[data-test="signin-email"]', email);
  await page.fill('[data-test="signin-password"]', DEMO_PASSWORD);
  await page.click('[data-test="signin-submit"]');
  await page.waitForSelector('[data-test="desk-title"]');
  return page;
}

describe('screen and decide in the browser', () => {
  it('the tester runs the screening of the recent fault and sees the conditional verdict with its reasons and cautions', async () => {
    const page = await signedIn('tester@kestrel-valley.example');
    await page.goto(`${running.url}/events/${eventId}`);
    await page.click('[data-test="run-screening"]');
    await page.waitForSelector('[data-test="reasons"]');
    const panel = (await page.textContent('[data-test="screening-panel"]')) ?? '';
    expect(panel).toMatch(/conditional/i);
    expect(panel).toContain('CHL capacitance shifted +3.42 %');
    expect(panel).toContain('The recommendation is decision support for qualified staff.');
    expect(await page.locator('[data-test="indicator-row"]').count()).toBeGreaterThan(10);
    expect((await db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).status).toBe('screened');
    await page.close();
  });

  it('the manager receives the mail with the PDF and signs a release with restrictions', async () => {
    // The mail worker is kicked when the screening commits; give it a moment.
    let mail: SinkMessage | null = null;
    for (let i = 0; i < 50 && !mail; i++) {
      // This event's mail (other browser tests screen units of their own in the same database and may mail later).
      mail = await db.getRepository(SinkMessage).findOne({ where: { to: 'manager@kestrel-valley.example', subject: Like('%KVP-HX-T2%') }, order: { id: 'DESC' } });
      if (!mail) await new Promise((r) => setTimeout(r, 200));
    }
    expect(mail?.subject).toMatch(/CONDITIONAL — KVP-HX-T2/);
    expect(mail?.attachments[0]?.contentType).toBe('application/pdf');

    const page = await signedIn('manager@kestrel-valley.example');
    await page.goto(`${running.url}/events/${eventId}`);
    await page.waitForSelector('[data-test="decision-panel"]');
    await page.click('[data-test="outcome-release-with-restrictions"]');
    await page.fill('[data-test="decision-restrictions"]', 'Load limited to 70 % of ONAN rating; auto-reclose blocked on HX-F2.');
    await page.fill('[data-test="decision-reason"]', 'CHL shift alone; other methods ok. Gas samples as proposed.');
    await page.click('[data-test="decision-sign"]');
    await page.click('[data-test="confirm-ok"]');
    await page.waitForSelector('[data-test="decision-outcome"]');
    expect(await page.textContent('[data-test="decision-outcome"]')).toMatch(/restrictions/i);
    if (process.env.E2E_SHOTS) await page.screenshot({ path: `${process.env.E2E_SHOTS}/decided.png`, fullPage: true });
    expect((await db.getRepository(FaultEvent).findOneByOrFail({ id: eventId })).status).toBe('released');
    await page.close();
  });
});
