import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import type { BenchReport } from '../../../server/scripts/bench/report.js';

// `npm run bench -- --quick` as a child process (its own throw-away MariaDB on a free port, its own servers on free
// ports): every step runs and every figure comes out with a positive value, floor and ratio, in the table and the JSON.
// No timing goal is checked here: the figures of a smoke run on a busy machine mean nothing.

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
const dir = mkdtempSync(path.join(os.tmpdir(), 'gs-bench-quick-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function runQuickBench(jsonPath: string): Promise<{ code: number | null; out: string }> {
  // The suite's own client build when it made one (else the bench uses dist/ when fresh or builds its own).
  const dist = process.env.E2E_DIST && existsSync(path.join(process.env.E2E_DIST, 'index.html')) ? ['--dist', process.env.E2E_DIST] : [];
  const tsx = path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs');
  const child = spawn(process.execPath, [tsx, '--tsconfig', 'server/tsconfig.json', 'server/scripts/bench.ts', '--quick', '--json', jsonPath, ...dist], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: { ...process.env, LOG_LEVEL: 'warn' },
  });
  let out = '';
  child.stdout.on('data', (d) => (out += d));
  child.stderr.on('data', (d) => (out += d));
  return new Promise((resolve) => child.on('close', (code) => resolve({ code, out })));
}

describe('npm run bench -- --quick', () => {
  it('runs every step and prints and writes every figure with a positive value, floor and ratio', { timeout: 300_000 }, async () => {
    const jsonPath = path.join(dir, 'results.quick.json');
    const { code, out } = await runQuickBench(jsonPath);
    expect(code, out.slice(-3000)).toBe(0);
    expect(out).toMatch(/figure\s+\| value\s+\| floor\s+\| ratio\s+\| goal\s+\| holds\?/);

    const report = JSON.parse(readFileSync(jsonPath, 'utf8')) as BenchReport;
    expect(report.mode).toBe('quick');
    expect(report.machine.cpuCount).toBeGreaterThan(0);
    expect(report.machine.node).toBe(process.version);
    const ids = report.figures.map((f) => f.id);
    const expected = [
      'engine',
      'engine.screenOnly',
      ...['units', 'events', 'event', 'case'].flatMap((u) => [2, 5].flatMap((c) => [`load.${u}.${c}.rps`, `load.${u}.${c}.p95`])),
      'import.readings',
      'import.sweep',
      'screening',
    ];
    const chromiumSkipped = report.skipped.some((s) => s.startsWith('first load'));
    if (!chromiumSkipped) expected.push('firstLoad.signInDeskJs', 'firstLoad.sign-in', 'firstLoad.desk', 'firstLoad.event-file');
    for (const id of expected) expect(ids, id).toContain(id);
    for (const f of report.figures) {
      for (const x of [f.value, f.floor, f.ratio]) {
        expect(Number.isFinite(x), `${f.id}: ${x}`).toBe(true);
        expect(x, f.id).toBeGreaterThan(0);
      }
      expect(f.ratio).toBeCloseTo(f.value / f.floor, 6);
      expect(f.goal.length).toBeGreaterThan(0);
      // The printed table has the figure's row.
      expect(out).toContain(f.figure);
    }
    // Each read-API floor answered the same keys as the app (besides the figures the app computes from the same rows).
    const shapes = report.setup.shapes as Record<string, { missingInFloor: string[] }>;
    for (const key of ['units', 'events', 'event', 'case']) expect(shapes[key].missingInFloor, key).toEqual([]);
  });
});
