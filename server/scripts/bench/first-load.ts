import { chromiumMissing as missing, launchChromium } from '../chromium.js';

// First load: bytes on the wire per page visit, as Chromium (playwright-core, Debian's binary) receives them with
// `Accept-Encoding: br, gzip`: the sum of Network.loadingFinished encodedDataLength (headers and body as transferred)
// of every response of the visit, split by resource type. Each visit is a fresh browser context (empty cache), signed
// in by a token in local storage as the client keeps it.

export interface PageBytes {
  page: string;
  path: string;
  total: number;
  js: number;
  css: number;
  fonts: number;
  api: number;
  other: number;
  encodings: string[];
  /** Every response of the visit: its URL, resource type and bytes on the wire. */
  items: { url: string; type: string; bytes: number }[];
}

/** Why the first-load figures cannot be measured, or null. */
export function chromiumMissing(): string | null {
  const why = missing();
  return why && `${why}; the first-load figures are skipped.`;
}

export async function measureFirstLoad(base: string, token: string, pages: { page: string; path: string }[]): Promise<{ pages: PageBytes[]; signInDeskJs: number }> {
  const browser = await launchChromium();
  try {
    type Ctx = Awaited<ReturnType<typeof browser.newContext>>;
    const visit = async (ctx: Ctx, page: string, path: string): Promise<PageBytes> => {
      const p = await ctx.newPage();
      const cdp = await ctx.newCDPSession(p);
      await cdp.send('Network.enable');
      await cdp.send('Network.setExtraHTTPHeaders', { headers: { 'Accept-Encoding': 'br, gzip' } });
      const types = new Map<string, { type: string; encoding: string; url: string }>();
      const out: PageBytes = { page, path, total: 0, js: 0, css: 0, fonts: 0, api: 0, other: 0, encodings: [], items: [] };
      const enc = new Set<string>();
      cdp.on('Network.responseReceived', (e) => {
        const h = Object.fromEntries(Object.entries(e.response.headers).map(([k, v]) => [k.toLowerCase(), String(v)]));
        types.set(e.requestId, { type: e.type, encoding: h['content-encoding'] ?? 'identity', url: e.response.url });
      });
      cdp.on('Network.loadingFinished', (e) => {
        const t = types.get(e.requestId);
        const n = e.encodedDataLength;
        out.total += n;
        out.items.push({ url: t?.url ?? '', type: t?.type ?? 'Other', bytes: n });
        if (t?.type === 'Script') out.js += n;
        else if (t?.type === 'Stylesheet') out.css += n;
        else if (t?.type === 'Font') out.fonts += n;
        else if (t?.type === 'Fetch' || t?.type === 'XHR') out.api += n;
        else out.other += n;
        if (t && (t.type === 'Script' || t.type === 'Stylesheet')) enc.add(t.encoding);
      });
      await p.goto(`${base}${path}`, { waitUntil: 'networkidle' });
      await p.waitForSelector('main', { timeout: 15000 }).catch(() => undefined);
      await p.waitForLoadState('networkidle');
      await p.waitForTimeout(300);
      await p.close();
      out.encodings = [...enc];
      return out;
    };
    const signedIn = async () => {
      const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
      await ctx.addInitScript((t) => localStorage.setItem('gapsight.token', t), token);
      return ctx;
    };
    const results: PageBytes[] = [];
    // Sign-in page (not signed in), then the desk in the same context (its cache holds what the sign-in page loaded).
    const first = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const signIn = await visit(first, 'sign-in', '/sign-in');
    results.push(signIn);
    await first.addInitScript((t) => localStorage.setItem('gapsight.token', t), token);
    const deskAfter = await visit(first, 'desk after sign-in (cache warm)', '/');
    results.push(deskAfter);
    await first.close();
    for (const pg of pages) {
      const ctx = await signedIn();
      results.push(await visit(ctx, pg.page, pg.path));
      await ctx.close();
    }
    return { pages: results, signInDeskJs: signIn.js + deskAfter.js };
  } finally {
    await browser.close();
  }
}
