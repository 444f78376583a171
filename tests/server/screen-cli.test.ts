// CLI `npm run screen`: result JSON on stdout with exit 0; bad input named on stderr with exit 2.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '../..');
const example = join(root, 'examples/cases/conditional.json');
// As `npm run screen` runs it (tsx), started with node directly: npx would add a second or so to every run.
const tsxCli = join(root, 'node_modules/tsx/dist/cli.mjs');
const run = (...args: string[]) =>
  spawnSync(process.execPath, [tsxCli, '--tsconfig', 'server/tsconfig.json', 'server/scripts/screen.ts', ...args], { cwd: root, encoding: 'utf8' });
const tmp = mkdtempSync(join(tmpdir(), 'gapsight-cli-'));

describe('screen CLI', () => {
  it('prints the result JSON on stdout and exits 0 for a valid case', () => {
    const r = run(example);
    expect(r.status).toBe(0);
    const result = JSON.parse(r.stdout);
    expect(result.format).toBe('gapsight-result/1');
    expect(result).toEqual(JSON.parse(readFileSync(example.replace(/\.json$/, '.result.json'), 'utf8')));
  });

  it('prints a human-readable form with --pretty', () => {
    const r = run(example, '--pretty');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^Recommendation: CONDITIONAL/);
    expect(r.stdout).toContain('Reasons:');
  });

  it('--pretty prints words, not codes: levels, indicator names, missing items and the through-fault figures', () => {
    const r = run(example, '--pretty');
    expect(r.status).toBe(0);
    const words = r.stdout.slice(0, r.stdout.indexOf('Result JSON:'));
    expect(words).toMatch(/^ +INVESTIGATE +CHL capacitance shift vs baseline: 3\.19962 %$/m);
    expect(words).toContain('Missing: sweep of HV phase A, sweep of HV phase B, sweep of HV phase C');
    expect(words).toContain('Force ratio (of the design force): 20.44 %');
    // No case-field or indicator codes before the JSON.
    expect(words).not.toMatch(/capacitance\.CHL|sweep\.hv|forceRatioPercent/);
    expect(words).not.toMatch(/^ +(ok|watch|investigate|critical) /m);
  });

  it('--pretty says a sweep without a baseline trace is not judged, not missing', () => {
    const file = join(tmp, 'no-baseline.json');
    const c = JSON.parse(readFileSync(join(root, 'examples/cases/sweeps.json'), 'utf8'));
    for (const s of c.sweeps) if (s.phase === 'B') delete s.baseline;
    writeFileSync(file, JSON.stringify(c));
    const r = run(file, '--pretty');
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('Not judged: sweep of HV phase B (no baseline trace to compare with)');
    expect(r.stdout).not.toMatch(/^Missing: .*sweep of HV phase B/m);
  });

  it('names each bad field on stderr and exits 2 for an invalid case', () => {
    const file = join(tmp, 'bad.json');
    const c = JSON.parse(readFileSync(example, 'utf8'));
    c.fault.shots[0].currentKA = -2;
    c.unit.ratedKVA = 'forty';
    writeFileSync(file, JSON.stringify(c));
    const r = run(file);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('fault.shots.0.currentKA');
    expect(r.stderr).toContain('unit.ratedKVA');
  });

  it('exits 2 naming the path of a file that does not exist', () => {
    const missing = join(tmp, 'nope.json');
    const r = run(missing);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(missing);
  });

  it('exits 2 naming the path of a file that is not JSON', () => {
    const file = join(tmp, 'broken.json');
    writeFileSync(file, '{ "format": ');
    const r = run(file);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(file);
  });

  it('exits 2 with a usage line without a file argument', () => {
    const r = run();
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/usage/);
  });
});
