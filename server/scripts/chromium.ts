import { existsSync } from 'node:fs';
import type { Browser } from 'playwright-core';

// Debian's Chromium driven by playwright-core (no browser download): the browser tests and the bench's first-load
// figures. CHROMIUM_PATH overrides the binary.

/** The Chromium binary to launch. */
export const chromiumPath = (): string => process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Why Chromium cannot be launched (with how to install it), or null when it is there. */
export function chromiumMissing(): string | null {
  if (existsSync(chromiumPath())) return null;
  return `Chromium not found at ${chromiumPath()}: install it (Debian/Ubuntu: sudo apt-get install chromium) or set CHROMIUM_PATH`;
}

export async function launchChromium(): Promise<Browser> {
  const { chromium } = await import('playwright-core');
  return chromium.launch({
    executablePath: chromiumPath(),
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}
