import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users.js';
import { makeUnit } from '../helpers/factories.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';

// In Chromium: the relay-record picker is filtered by the shared list of types, lists them once under it, and a Word
// document picked anyway is named as the wrong type at once, with nothing sent to the server.

let running: Running;
let browser: Browser;
let eventId: number;

beforeAll(async () => {
  ({ running } = await startTestServer());
  const db = (await import('../../server/db/data-source.js')).default;
  const unitId = (await makeUnit(db)).id;
  const login = await fetch(`${running.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'protection@kestrel-valley.example', password: DEMO_PASSWORD }),
  });
  const { token } = (await login.json()) as { token: string };
  const created = await fetch(`${running.url}/api/events`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` },
    body: JSON.stringify({ unitId, occurredAt: new Date(Date.now() - 3600_000).toISOString(), type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1 }], notes: 'Upload errors browser test' }),
  });
  expect(created.status).toBe(201);
  eventId = ((await created.json()) as { id: number }).id;
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

describe('relay-record picker', () => {
  it('is filtered by the relay-record types, lists them once, and names a Word document as the wrong type before any upload', async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    await page.goto(`${running.url}/sign-in`);
    await page.fill('[data-test="signin-email"]', 'protection@kestrel-valley.example');
    await page.fill('[data-test="signin-password"]', DEMO_PASSWORD);
    await page.click('[data-test="signin-submit"]');
    await page.waitForSelector('[data-test="desk-title"]');
    await page.goto(`${running.url}/events/${eventId}`);
    await page.waitForSelector('[data-test="event-title"]');
    const input = page.locator('input[type="file"][data-test="attachment-file"]');
    await input.waitFor({ state: 'attached' });
    expect(await input.getAttribute('accept')).toBe('.cfg,.dat,.cff,.csv,.txt,.pdf,text/csv,application/pdf');
    const body = (await page.textContent('body')) ?? '';
    expect(body.split('COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf)')).toHaveLength(2);

    const uploads: string[] = [];
    page.on('request', (r) => {
      if (r.method() === 'POST' && r.url().includes('/attachments')) uploads.push(r.url());
    });
    await input.setInputFiles({ name: 'notes.docx', mimeType: 'application/vnd.openxmlformats-officedocument.wordprocessingml.document', buffer: Buffer.from('PK\u0003\u0004') });
    await page.waitForSelector('[data-test="attachment-error"]');
    expect((await page.textContent('[data-test="attachment-error"]'))?.trim()).toBe(
      'notes.docx is not a relay record: pick a COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) file.',
    );
    expect(await page.locator('[data-test="attachment-upload"]').isDisabled()).toBe(true);
    expect(uploads).toEqual([]);
    await page.close();
  });
});
