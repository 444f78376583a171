import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Running } from '../../server/index.js';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seed/demo-users.js';
import { startTestServer } from '../helpers/app-server.js';
import { launchChromium } from '../helpers/browser.js';

let running: Running;
let browser: Browser;

beforeAll(async () => {
  ({ running } = await startTestServer());
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
  await running?.stop();
});

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto(`${running.url}/`);
  await page.waitForURL(/\/sign-in/);
  await page.fill('[data-test="signin-email"]', email);
  await page.fill('[data-test="signin-password"]', DEMO_PASSWORD);
  await page.click('[data-test="signin-submit"]');
  await page.waitForSelector('[data-test="desk-title"]');
}

describe('signing in with Chromium', () => {
  it('takes the manager from the sign-in page to the desk and back out on sign-out', async () => {
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    await signIn(page, 'manager@kestrel-valley.example');
    expect(new URL(page.url()).pathname).toBe('/');
    expect(await page.textContent('[data-test="user-name"]')).toContain('Morgan Manager');
    expect(await page.textContent('body')).toMatch(/manager/i);
    await page.click('[data-test="signout"]');
    await page.waitForURL(/\/sign-in/);
    expect(await page.isVisible('[data-test="signin-email"]')).toBe(true);
    // Signed out means signed out: the desk sends us back to sign-in.
    await page.goto(`${running.url}/`);
    await page.waitForURL(/\/sign-in/);
    expect(errors).toEqual([]);
    await page.close();
  });

  it.each(DEMO_USERS.filter((u) => u.roles[0] !== 'manager').map((u) => [u.roles[0], u.email] as const))(
    'signs in the demo %s account through the browser',
    async (_role, email) => {
      const page = await browser.newPage();
      await signIn(page, email);
      expect(await page.textContent('[data-test="user-name"]')).toBeTruthy();
      await page.close();
    },
  );

  it('shows an error next to the form for a wrong password and stays on the sign-in page', async () => {
    const page = await browser.newPage();
    await page.goto(`${running.url}/sign-in`);
    await page.fill('[data-test="signin-email"]', 'tester@kestrel-valley.example');
    await page.fill('[data-test="signin-password"]', 'not-the-password');
    await page.click('[data-test="signin-submit"]');
    await page.waitForSelector('text=E-mail or password is wrong');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });
});
