import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../../server/config.js';

// Configuration checked once at start: JWT_SECRET set but empty or short, or missing with no usable data-folder secret.

const dirs: string[] = [];
function dataDir(secret?: string): string {
  const d = mkdtempSync(path.join(os.tmpdir(), 'gs-config-'));
  dirs.push(d);
  if (secret !== undefined) writeFileSync(path.join(d, 'jwt-secret'), secret + '\n');
  return d;
}
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

const good = 'x'.repeat(32);

describe('loadConfig and JWT_SECRET', () => {
  it('refuses an empty JWT_SECRET with a message naming the variable', () => {
    expect(() => loadConfig({ DATA_DIR: dataDir(), JWT_SECRET: '' })).toThrow(ConfigError);
    expect(() => loadConfig({ DATA_DIR: dataDir(), JWT_SECRET: '' })).toThrow(/JWT_SECRET: set but empty/);
  });

  it('refuses a JWT_SECRET of 31 characters, even when the data folder has a good secret', () => {
    expect(() => loadConfig({ DATA_DIR: dataDir(good), JWT_SECRET: 'y'.repeat(31) })).toThrow(/JWT_SECRET: 31 characters; it needs at least 32/);
  });

  it('refuses a JWT_SECRET of only spaces', () => {
    expect(() => loadConfig({ DATA_DIR: dataDir(), JWT_SECRET: ' '.repeat(40) })).toThrow(/JWT_SECRET: set but empty/);
  });

  it('takes a JWT_SECRET of 32 characters as it is', () => {
    expect(loadConfig({ DATA_DIR: dataDir(), JWT_SECRET: good }, { requireJwtSecret: true }).jwtSecret).toBe(good);
  });

  it('uses the data folder secret when JWT_SECRET is not set', () => {
    const secret = 'f'.repeat(96);
    expect(loadConfig({ DATA_DIR: dataDir(secret) }, { requireJwtSecret: true }).jwtSecret).toBe(secret);
  });

  it('refuses a server start when JWT_SECRET is not set and the data folder secret is missing or short', () => {
    const missing = dataDir();
    expect(() => loadConfig({ DATA_DIR: missing }, { requireJwtSecret: true })).toThrow(
      `JWT_SECRET: not set, and ${path.join(missing, 'jwt-secret')} is missing`,
    );
    expect(() => loadConfig({ DATA_DIR: dataDir('short') }, { requireJwtSecret: true })).toThrow(/JWT_SECRET: not set, and .* is shorter than 32 characters/);
  });

  it('lets database tools (no requireJwtSecret) run without any secret', () => {
    expect(loadConfig({ DATA_DIR: dataDir() }).jwtSecret).toBe('');
  });

  it('names every bad variable at once', () => {
    let message = '';
    try {
      loadConfig({ DATA_DIR: dataDir(), JWT_SECRET: 'short', PORT: 'eighty', LOG_LEVEL: 'loud' });
    } catch (err) {
      message = (err as Error).message;
    }
    expect(message).toMatch(/PORT:/);
    expect(message).toMatch(/LOG_LEVEL:/);
    expect(message).toMatch(/JWT_SECRET: 5 characters/);
  });
});

describe('npm start with a bad JWT_SECRET', () => {
  it('exits 1 before starting anything, with a message naming JWT_SECRET', () => {
    const dir = dataDir();
    const env: NodeJS.ProcessEnv = { PATH: process.env.PATH, HOME: process.env.HOME, DATA_DIR: dir, JWT_SECRET: '' };
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/scripts/start.ts'], {
      env: { ...env, TSX_TSCONFIG_PATH: 'server/tsconfig.json' },
      encoding: 'utf8',
      timeout: 60_000,
    });
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('Gapsight could not start: Invalid environment:');
    expect(r.stderr).toContain('JWT_SECRET: set but empty');
    expect(r.stdout).not.toContain('MariaDB');
  });
});
