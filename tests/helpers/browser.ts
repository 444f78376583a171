// Debian's Chromium driven by playwright-core (no browser download), launched as the bench launches it.
export { launchChromium } from '../../server/scripts/chromium.js';
