import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  ensureDatabaseAndUser,
  ensureMariaDbInstalled,
  freePort,
  mariaDbPaths,
  pingSocket,
  startMariaDb,
  stopMariaDb,
  type MariaDbPaths,
} from '../../../server/scripts/mariadb.js';
import { listeningAddresses } from '../../helpers/sockets.js';

const dirs: string[] = [];
const started: MariaDbPaths[] = [];
function tempDir(): string {
  const d = mkdtempSync(path.join(os.tmpdir(), 'gs-prov-'));
  dirs.push(d);
  return d;
}
const pidGone = async (pid: number) => {
  for (let i = 0; i < 100; i++) {
    try {
      process.kill(pid, 0);
    } catch {
      return true;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return false;
};

afterAll(async () => {
  for (const p of started) await stopMariaDb(p).catch(() => undefined);
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe('private MariaDB provisioning', () => {
  it('starts a server that listens on 127.0.0.1 only, and a second start reuses it', async () => {
    const p = mariaDbPaths(tempDir(), await freePort());
    started.push(p);
    const first = await startMariaDb(p);
    expect(first.alreadyRunning).toBe(false);
    expect(listeningAddresses(p.port)).toEqual(['127.0.0.1']);
    const second = await startMariaDb(p);
    expect(second.alreadyRunning).toBe(true);
    const pw = ensureDatabaseAndUser(p, 'gs_probe', 'gs_probe');
    expect(pw).toMatch(/^[0-9a-f]{48}$/);
    expect(readFileSync(path.join(p.baseDir, 'db-password'), 'utf8').trim()).toBe(pw);
    expect(ensureDatabaseAndUser(p, 'gs_probe', 'gs_probe')).toBe(pw);
    expect(await stopMariaDb(p)).toBe(true);
    expect(pingSocket(p)).toBe(false);
  });

  it('recovers from a killed server: the stale pid file is replaced and the server starts again', async () => {
    const p = mariaDbPaths(tempDir(), await freePort());
    started.push(p);
    const r = await startMariaDb(p);
    const pid = Number(readFileSync(p.pidFile, 'utf8'));
    expect(pid).toBeGreaterThan(0);
    expect(r.alreadyRunning).toBe(false);
    process.kill(pid, 'SIGKILL');
    expect(await pidGone(pid)).toBe(true);
    expect(existsSync(p.pidFile)).toBe(true); // left behind by the crash
    const again = await startMariaDb(p);
    expect(again.alreadyRunning).toBe(false);
    expect(pingSocket(p)).toBe(true);
    expect(Number(readFileSync(p.pidFile, 'utf8'))).not.toBe(pid);
    await stopMariaDb(p);
  });

  it('reports a port held by another program with a message naming the port and DB_PORT', async () => {
    const blocker = net.createServer();
    const port: number = await new Promise((resolve) => blocker.listen(0, '127.0.0.1', () => resolve((blocker.address() as net.AddressInfo).port)));
    try {
      const p = mariaDbPaths(tempDir(), port);
      await expect(startMariaDb(p)).rejects.toThrow(new RegExp(`Port ${port} on 127\\.0\\.0\\.1 is held by another program[\\s\\S]*DB_PORT`));
      expect(pingSocket(p)).toBe(false);
    } finally {
      await new Promise((r) => blocker.close(r));
    }
  });

  it('tells a non-root user the exact apt-get command when mariadbd is missing', () => {
    expect(() => ensureMariaDbInstalled({ env: { ...process.env, MARIADBD_BIN: '/nonexistent/mariadbd' }, isRoot: false, log: () => {} })).toThrow(
      /apt-get update && apt-get install -y mariadb-server/,
    );
  });

  it('installs mariadb-server with apt-get when root and mariadbd is missing', () => {
    const d = tempDir();
    const calls = path.join(d, 'calls.txt');
    const fakeApt = path.join(d, 'apt-get');
    writeFileSync(fakeApt, `#!/bin/sh\necho "$DEBIAN_FRONTEND $*" >> ${calls}\n`);
    chmodSync(fakeApt, 0o755);
    const env = { ...process.env, MARIADBD_BIN: '/nonexistent/mariadbd', APT_GET_BIN: fakeApt };
    // The fake installs nothing, so the binary is still missing afterwards: that is reported too.
    expect(() => ensureMariaDbInstalled({ env, isRoot: true, log: () => {} })).toThrow(/installed but mariadbd is still not found/);
    expect(readFileSync(calls, 'utf8').trim().split('\n')).toEqual(['noninteractive update', 'noninteractive install -y mariadb-server']);
  });
});
