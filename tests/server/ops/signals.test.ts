import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

// SIGTERM and SIGINT on a real process: the request in flight finishes, the process logs "stopped" and exits 0.

const child = path.join(path.dirname(fileURLToPath(import.meta.url)), 'serve-child.ts');

async function stopWith(signal: 'SIGTERM' | 'SIGINT') {
  const p = spawn(process.execPath, ['--import', 'tsx', child], {
    env: { ...process.env, TSX_TSCONFIG_PATH: 'server/tsconfig.json' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  p.stdout.on('data', (d: Buffer) => void (out += d.toString()));
  const waitFor = (re: RegExp) =>
    new Promise<RegExpMatchArray>((resolve, reject) => {
      const check = () => {
        const m = out.match(re);
        if (m) resolve(m);
      };
      p.stdout.on('data', check);
      p.once('exit', () => reject(new Error(`the app exited early:\n${out}`)));
      check();
    });
  const exited = new Promise<number | null>((r) => p.once('exit', (code) => r(code)));
  const [, url] = await waitFor(/"url":"(http:\/\/[^"]+)"/);
  const inFlight = fetch(`${url}/api/slow`);
  await waitFor(/^entered$/m);
  p.kill(signal);
  const res = await inFlight;
  return { status: res.status, body: await res.json(), code: await exited, out };
}

describe('the served app on a signal', () => {
  for (const signal of ['SIGTERM', 'SIGINT'] as const) {
    it(`${signal}: lets the request in flight answer 200, logs "stopped" and exits 0`, async () => {
      const r = await stopWith(signal);
      expect(r.status).toBe(200);
      expect(r.body).toEqual({ finished: true });
      expect(r.code).toBe(0);
      expect(r.out).toContain(`"signal":"${signal}"`);
      expect(r.out).toContain('"msg":"stopped"');
      // Starting the app through tsx takes seconds, more while the browser tests run beside the API tests.
    }, 90_000);
  }
});
