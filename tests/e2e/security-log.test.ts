import type { Browser } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';
import { demoApi, openAs, settled } from '../helpers/browser-pages.js';

// The security log as an administrator sees it, the password policy under the field as it is typed, and a sign-out
// that ends the person's other tokens too.

let running: Running;
let browser: Browser;
let api: ReturnType<typeof demoApi>;
const SHOTS = path.resolve('test-output/auth');

beforeAll(async () => {
  ({ running } = await startTestServer());
  browser = await launchChromium();
  api = demoApi(running.url);
  mkdirSync(SHOTS, { recursive: true });
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

const signInBody = (email: string, password: string) => ({ method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) });

describe('security in the browser', () => {
  it('shows a failed sign-in and a refused request in the Security log, in words', async () => {
    const wrong = await fetch(`${running.url}/api/auth/login`, signInBody('tester@kestrel-valley.example', 'certainly not the password'));
    expect(wrong.status).toBe(401);
    const refused = await fetch(`${running.url}/api/users`, { headers: { authorization: `Bearer ${await api.token('tester')}` } });
    expect(refused.status).toBe(403);

    const page = await openAs(browser, running.url, api, 'admin', '/admin/people');
    await page.waitForSelector('[data-test="security-log-table"] tbody tr[data-test^="security-event-"]');
    const text = (await page.textContent('[data-test="security-log"]')) ?? '';
    expect(text).toContain('Security log');
    expect(text).toContain('Sign-in failed');
    expect(text).toContain('Access refused: role not held');
    expect(text).toContain('GET /api/users');
    expect(text).not.toMatch(/sign_in_failed|access_refused/);
    await page.locator('[data-test="security-log"]').screenshot({ path: `${SHOTS}/security-log.png` });
    await page.close();
  });

  it('says under the new password why a common one is refused, as it is typed', async () => {
    const page = await openAs(browser, running.url, api, 'protection', '/password');
    await page.fill('[data-test="password-new"]', '123456789012');
    const field = page.locator('.q-field', { has: page.locator('[data-test="password-new"]') });
    await field.getByText('this is one of the most common passwords; choose a longer phrase').waitFor({ state: 'visible' });
    await page.waitForTimeout(400); // the message's slide-in transition, for the picture
    await page.screenshot({ path: `${SHOTS}/password-policy-common.png` });
    await page.fill('[data-test="password-new"]', 'seven lanterns over the quiet harbour');
    await field.getByText('Hard to guess: good.').waitFor({ state: 'visible' });
    await page.waitForTimeout(400); // the message's slide-in transition, for the picture
    await page.screenshot({ path: `${SHOTS}/password-policy.png` });
    await page.close();
  });

  it('ends every token of the person on Sign out, not only the page’s', async () => {
    const other = await fetch(`${running.url}/api/auth/login`, signInBody('engineer@kestrel-valley.example', DEMO_PASSWORD));
    const otherToken = ((await other.json()) as { token: string }).token;
    const me = () => fetch(`${running.url}/api/auth/me`, { headers: { authorization: `Bearer ${otherToken}` } });
    expect((await me()).status).toBe(200);

    const page = await openAs(browser, running.url, api, 'engineer', '/');
    await page.click('[data-test="signout"]');
    await page.waitForURL(/\/sign-in/);
    await settled(page);
    await expect.poll(async () => (await me()).status, { timeout: 5000 }).toBe(401);
    await page.close();
  });
});
