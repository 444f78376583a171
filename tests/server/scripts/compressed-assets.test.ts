import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app.js';
import type { AppContext } from '../../../server/context.js';
import { buildClient } from '../../../server/scripts/build-client.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

// The built client as the server sends it: the build's brotli or gzip copy when the browser accepts one, the same bytes
// once decompressed, long caching on hashed files and none on the page shell; and the first page's chunks, read from the
// build's own record of which modules each chunk holds, free of the heavy libraries and the screening engine.

const root = path.resolve(import.meta.dirname, '../../..');
let dist: string;
let ownBuild: string | null = null;
let env: TestEnv;
let server: http.Server;
let base: string;

interface ManifestChunk {
  file: string;
  css?: string[];
  imports?: string[];
  dynamicImports?: string[];
}
let manifest: Record<string, ManifestChunk>;
let chunkModules: Record<string, string[]>;

beforeAll(async () => {
  // The build of `npm test` (E2E_DIST) when there is one, else a build of our own.
  const given = process.env.E2E_DIST;
  if (given && existsSync(path.join(given, 'index.html'))) dist = given;
  else {
    ownBuild = mkdtempSync(path.join(os.tmpdir(), 'gs-dist-'));
    dist = path.join(ownBuild, 'dist');
    // As `npm run build` makes it: Vitest sets NODE_ENV=test, which the build would inherit (Vue's development build).
    const nodeEnv = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    try {
      if (!buildClient(root, dist, true)) throw new Error('the client build failed');
    } finally {
      if (nodeEnv === undefined) delete process.env.NODE_ENV;
      else process.env.NODE_ENV = nodeEnv;
    }
  }
  manifest = JSON.parse(readFileSync(path.join(dist, '.vite/manifest.json'), 'utf8'));
  chunkModules = JSON.parse(readFileSync(path.join(dist, '.vite/chunk-modules.json'), 'utf8'));
  env = await openTestEnv();
  const app = createApp(env.app.locals.ctx as AppContext, { staticDir: dist });
  server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}, 180_000);

afterAll(async () => {
  await new Promise((resolve) => server?.close(resolve));
  await env?.db.destroy();
  if (ownBuild) rmSync(ownBuild, { recursive: true, force: true });
});

interface Raw {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
}

// A plain GET that leaves the body as sent (supertest and fetch would decompress it).
function get(urlPath: string, acceptEncoding?: string): Promise<Raw> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = acceptEncoding === undefined ? {} : { 'Accept-Encoding': acceptEncoding };
    http
      .get(`${base}${urlPath}`, { headers }, (res) => {
        const parts: Buffer[] = [];
        res.on('data', (c: Buffer) => parts.push(c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(parts) }));
      })
      .on('error', reject);
  });
}

const entry = () => manifest['index.html'];
const onDisk = (file: string) => readFileSync(path.join(dist, file));

describe('the client files as served', () => {
  const cases = [
    ['script', () => entry().file, /^(text|application)\/javascript/],
    ['style sheet', () => entry().css![0], /^text\/css/],
  ] as const;

  it.each(cases)('the first %s: brotli when the browser takes it, gzip when only that, plain when asked for nothing', async (_kind, file, type) => {
    const url = `/${file()}`;
    const plain = onDisk(file());
    expect(plain.length, 'large enough to be worth compressing').toBeGreaterThan(10_000);

    const br = await get(url, 'gzip, deflate, br');
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers['content-type']).toMatch(type);
    expect(br.headers.vary).toMatch(/Accept-Encoding/i);
    expect(br.body.length).toBeLessThan(plain.length / 2);
    expect(brotliDecompressSync(br.body).equals(plain)).toBe(true);

    const gz = await get(url, 'gzip');
    expect(gz.status).toBe(200);
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.headers['content-type']).toMatch(type);
    expect(gz.headers.vary).toMatch(/Accept-Encoding/i);
    expect(gunzipSync(gz.body).equals(plain)).toBe(true);

    for (const asked of [undefined, 'identity']) {
      const none = await get(url, asked);
      expect(none.status).toBe(200);
      expect(none.headers['content-encoding'], `Accept-Encoding: ${asked ?? '(none)'}`).toBeUndefined();
      expect(none.headers['content-type']).toMatch(type);
      expect(none.body.equals(plain)).toBe(true);
    }
  });

  it('caches hashed files for a year and makes the browser revalidate the page shell', async () => {
    for (const [url, accept] of [
      [`/${entry().file}`, 'br'],
      [`/${entry().file}`, undefined],
      [`/${entry().css![0]}`, 'gzip'],
    ] as const) {
      const res = await get(url, accept);
      expect(res.headers['cache-control'], url).toBe('public, max-age=31536000, immutable');
    }
    const font = Object.values(manifest)
      .flatMap((c) => (c as { assets?: string[] }).assets ?? [])
      .find((f) => f.endsWith('.woff2'));
    expect(font).toBeDefined();
    const fontAnswer = await get(`/${font}`, 'br, gzip');
    expect(fontAnswer.status).toBe(200);
    expect(fontAnswer.headers['content-encoding'], 'a font is compressed already').toBeUndefined();
    expect(fontAnswer.headers['cache-control']).toBe('public, max-age=31536000, immutable');

    const shell = readFileSync(path.join(dist, 'index.html'));
    for (const url of ['/', '/units/42', '/events/new', '/index.html']) {
      const res = await get(url, 'br, gzip');
      expect(res.status, url).toBe(200);
      expect(res.headers['cache-control'], url).toBe('no-cache');
      const body = res.headers['content-encoding'] === 'br' ? brotliDecompressSync(res.body) : res.headers['content-encoding'] === 'gzip' ? gunzipSync(res.body) : res.body;
      expect(body.equals(shell), url).toBe(true);
    }
  });

  it('does not serve the build records (.vite/)', async () => {
    const res = await get('/.vite/manifest.json');
    expect(res.body.toString()).not.toContain('"isEntry"');
  });
});

// ---- what the first page loads ---------------------------------------------------------------------------------------

/**
 * The chunks a page needs before it can show: its own chunk and everything it imports statically, with their CSS; with
 * `follow`, also the chunks it loads later (dynamic imports) that `follow` picks, and what they import.
 */
function firstLoad(keys: string[], follow: (key: string) => boolean = () => false): { js: string[]; css: string[] } {
  const seen = new Set<string>();
  const visit = (key: string) => {
    if (seen.has(key)) return;
    seen.add(key);
    for (const i of manifest[key].imports ?? []) visit(i);
    for (const i of manifest[key].dynamicImports ?? []) if (follow(i)) visit(i);
  };
  keys.forEach(visit);
  const js = [...seen].map((k) => manifest[k].file);
  const css = [...new Set([...seen].flatMap((k) => manifest[k].css ?? []))];
  return { js, css };
}

// A file the build did not compress (the brotli copy would not have been smaller) goes as it is.
const brotliSize = (file: string) => {
  const br = path.join(dist, `${file}.br`);
  return statSync(existsSync(br) ? br : path.join(dist, file)).size;
};

const SIGN_IN = ['index.html', 'src/pages/SignInPage.vue'];
const DESK = ['index.html', 'src/layouts/AppShellLayout.vue', 'src/pages/DeskPage.vue'];
const EVENT_FILE = ['index.html', 'src/layouts/AppShellLayout.vue', 'src/pages/EventFilePage.vue'];
const UNIT_FILE = ['index.html', 'src/layouts/AppShellLayout.vue', 'src/pages/UnitFilePage.vue'];
/** The parts a page loads once it shows a chart: the chart components, the screening's chart parts, the chart library. */
const CHART_PART = /^(src\/components\/charts\/|src\/components\/screening\/Screening(SweepCharts|SisterComparison)\.vue$|node_modules\/(apexcharts|vue3-apexcharts)\/)/;

/** A module of the engine's folder that imports nothing (texts and constants, such as the cautions) is no engine. */
const engineLeaf = (module: string) => !/^\s*(import|export)\b[^;]*\bfrom\s/m.test(readFileSync(path.join(root, module), 'utf8'));
const HEAVY: readonly (readonly [string, (module: string) => boolean])[] = [
  ['zod', (m) => m.startsWith('node_modules/zod/')],
  ['papaparse', (m) => m.startsWith('node_modules/papaparse/')],
  ['the chart library', (m) => /^node_modules\/(apexcharts|vue3-apexcharts)\//.test(m)],
  ['the password strength dictionary', (m) => m.startsWith('node_modules/@zxcvbn-ts/')],
  ['the screening engine', (m) => m.startsWith('shared/screening/') && !engineLeaf(m)],
];

describe('the first page', () => {
  it('knows the modules of every chunk of the build', () => {
    const { js } = firstLoad(SIGN_IN);
    for (const file of js) expect(chunkModules[file], file).toBeDefined();
    // The record is real: the entry holds Vue, and some chunk holds each heavy library.
    expect(chunkModules[entry().file].some((m) => m.startsWith('node_modules/@vue/runtime-core/'))).toBe(true);
    const all = Object.values(chunkModules).flat();
    for (const [name, holds] of HEAVY) expect(all.some(holds), `${name} is in the build`).toBe(true);
    expect(engineLeaf('shared/screening/cautions.ts')).toBe(true);
    expect(engineLeaf('shared/screening/verdict.ts')).toBe(false);
  });

  // The sign-in form checks its fields with the shared login schema (the server's own rules), so zod may load with
  // sign-in; nothing else heavy may, and the desk's own chunks may not hold zod either. The event file's decision,
  // findings and follow-up forms need zod, its figures the engine; its session, sweep and readings import forms (and the
  // CSV parser) load when opened. The unit file's reading set forms load when opened, so it needs no zod; the chart
  // library loads only when a chart shows.
  it.each([
    ['sign-in', SIGN_IN, ['zod']],
    ['desk', DESK, []],
    ['event file', EVENT_FILE, ['zod', 'the screening engine']],
    ['unit file', UNIT_FILE, ['the screening engine']],
  ])('%s: its chunks hold no heavy library and no screening engine', (_page, keys, allowed) => {
    for (const key of keys) expect(manifest[key], key).toBeDefined();
    const { js } = firstLoad(keys);
    for (const file of js) {
      for (const [name, holds] of HEAVY) {
        if (allowed.includes(name)) continue;
        expect(chunkModules[file].filter(holds), `${file} holds ${name}`).toEqual([]);
      }
    }
  });

  // A page's first visit: its script and style sheets and, once they show, its charts with the chart library (fonts
  // not counted). The goal is 350 kB; the event file misses it (about 405 kB with every chart: the chart library alone
  // is about 125 kB, the decision, findings and follow-up forms bring zod, and the app's icons are SVG paths in the entry
  // chunk — about 10 kB that replaced a 128 kB icon font not counted here), so its ceiling here only stops growth.
  it.each([
    { page: 'unit file', keys: UNIT_FILE, limitKb: 350 },
    { page: 'event file', keys: EVENT_FILE, limitKb: 420 },
  ])('$page: the first visit with its charts moves at most $limitKb kB, brotli-compressed', ({ keys, limitKb }) => {
    const plain = firstLoad(keys);
    const { js, css } = firstLoad(keys, (key) => CHART_PART.test(key));
    expect(js.some((f) => chunkModules[f].some((m) => m.startsWith('node_modules/vue3-apexcharts/'))), 'the chart library is counted').toBe(true);
    expect(js.length).toBeGreaterThan(plain.js.length);
    const total = [...js, ...css].reduce((sum, f) => sum + brotliSize(f), 0);
    expect(total).toBeGreaterThan(150 * 1024); // the sizes are real
    expect(total).toBeLessThanOrEqual(limitKb * 1024);
  });

  it('sign-in and then the desk move at most 200 kB of script, brotli-compressed', () => {
    const { js } = firstLoad([...SIGN_IN, ...DESK]);
    const total = js.reduce((sum, f) => sum + brotliSize(f), 0);
    expect(total).toBeGreaterThan(20_000); // the sizes are real
    expect(total).toBeLessThanOrEqual(200 * 1024);
  });
});
