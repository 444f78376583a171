import net from 'node:net';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config.js';
import { serve } from '../../../server/index.js';
import { createLogger } from '../../../server/logger.js';
import type { RouteDef } from '../../../server/route-def.js';

// stop() (what SIGTERM and Ctrl-C call): no new connections, requests in flight finish, then everything closes.

const config = loadConfig({ ...process.env, PORT: '0', MAIL_SINK_PORT: '0' });
const silent = createLogger('silent');

/** A route that signals when it has started and answers after `ms` (or never when ms is null). */
function slowRoute(ms: number | null) {
  let entered!: () => void;
  const started = new Promise<void>((r) => (entered = r));
  const route: RouteDef = {
    method: 'get',
    path: '/slow',
    access: 'public',
    handlers: [
      async (_req, res) => {
        entered();
        if (ms === null) return; // never answers
        await new Promise((r) => setTimeout(r, ms));
        res.json({ finished: true });
      },
    ],
  };
  return { route, started };
}

function connectError(port: number): Promise<string | null> {
  return new Promise((resolve) => {
    const s = net.connect(port, '127.0.0.1');
    s.once('connect', () => {
      s.destroy();
      resolve(null);
    });
    s.once('error', (err: NodeJS.ErrnoException) => resolve(err.code ?? err.message));
  });
}

async function openDb() {
  const { default: db } = await import('../../../server/db/data-source.js');
  if (!db.isInitialized) await db.initialize();
  return db;
}

describe('graceful shutdown', () => {
  it('lets a request in flight finish with 200, refuses new connections, then closes the database', async () => {
    const db = await openDb();
    const slow = slowRoute(300);
    const running = await serve(db, config, { routes: [slow.route], logger: silent });
    const inFlight = fetch(`${running.url}/api/slow`);
    await slow.started;
    const stopped = running.stop();
    expect(await connectError(running.port)).toBe('ECONNREFUSED');
    const res = await inFlight;
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ finished: true });
    expect(res.headers.get('x-request-id')).toBeTruthy();
    await stopped;
    expect(db.isInitialized).toBe(false);
    expect(await connectError(running.port)).toBe('ECONNREFUSED');
  });

  it('closes a request that is still open when the grace time is over', async () => {
    const db = await openDb();
    const hanging = slowRoute(null);
    const running = await serve(db, config, { routes: [hanging.route], logger: silent, shutdownGraceMs: 200 });
    const inFlight = fetch(`${running.url}/api/slow`).then(
      (r) => `answered ${r.status}`,
      (err: Error) => `failed: ${err.message}`,
    );
    await hanging.started;
    await running.stop();
    expect(await inFlight).toBe('failed: fetch failed');
    expect(db.isInitialized).toBe(false);
  });
});
