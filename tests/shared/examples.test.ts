// REGRESSION CHECK, not a correctness check: every example case re-screens to the result stored beside it
// (examples/cases/NAME.json → NAME.result.json). The stored results were produced by this engine, so they only guard
// against unintended change. Every number that matters here has a sourced or hand-computed check elsewhere:
// tests/shared/formulas.test.ts, through-fault.test.ts, sweep.test.ts, sisters.test.ts, verdict.test.ts and
// revision2.test.ts (which also names, for each revision-2 example, what revision 1 decided).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCase } from '../../shared/schemas/case.js';
import { screenCase } from '../../shared/screening/index.js';

const dir = join(import.meta.dirname, '../../examples/cases');
const names = readdirSync(dir).filter((f) => f.endsWith('.json') && !f.endsWith('.result.json'));
/** The recommendation each example is there to show (examples/cases/README.md). */
const expected: Record<string, string> = {
  'clean-go.json': 'go',
  'duty-only-go.json': 'go',
  'conditional.json': 'conditional',
  'no-go-readings.json': 'no-go',
  'no-go-internal.json': 'no-go',
  'high-duty-missing.json': 'no-go',
  'sweeps.json': 'conditional',
  'sisters-no-baseline.json': 'conditional',
  'rev2-aged-insulation.json': 'conditional',
  'rev2-auto.json': 'go',
  'rev2-buchholz-alarm.json': 'conditional',
  'rev2-bushings.json': 'conditional',
  'rev2-implausible-nf.json': 'conditional',
  'rev2-phase-comparison.json': 'go',
  'rev2-remanence.json': 'go',
  'rev2-tap-mismatch.json': 'conditional',
  'rev2-winding-current-dyn11.json': 'no-go',
};

describe('example cases (regression check against stored results)', () => {
  it('has every scenario of the demo', () => {
    expect(names.sort()).toEqual(Object.keys(expected).sort());
  });

  for (const name of names) {
    it(`re-screens ${name} to its stored result (${expected[name]})`, () => {
      const parsed = parseCase(JSON.parse(readFileSync(join(dir, name), 'utf8')));
      expect(parsed.ok).toBe(true);
      if (!parsed.ok) return;
      const stored = JSON.parse(readFileSync(join(dir, name.replace(/\.json$/, '.result.json')), 'utf8'));
      const result = JSON.parse(JSON.stringify(screenCase(parsed.value)));
      expect(result).toEqual(stored);
      expect(result.recommendation).toBe(expected[name]);
      expect(result.engineRevision).toBe(2);
    });
  }
});
