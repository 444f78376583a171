// Every example case re-screens to its stored result (examples/cases/NAME.json → NAME.result.json).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCase } from '../../shared/schemas/case.js';
import { screenCase } from '../../shared/screening/index.js';

const dir = join(import.meta.dirname, '../../examples/cases');
const names = readdirSync(dir).filter((f) => f.endsWith('.json') && !f.endsWith('.result.json'));
const expected: Record<string, string> = {
  'clean-go.json': 'go',
  'duty-only-go.json': 'go',
  'conditional.json': 'conditional',
  'no-go-readings.json': 'no-go',
  'no-go-internal.json': 'no-go',
  'high-duty-missing.json': 'no-go',
  'sweeps.json': 'conditional',
  'sisters-no-baseline.json': 'conditional',
};

describe('example cases', () => {
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
    });
  }
});
