// The one headline of a screening (shared/screening/headline.ts), against the stored example results in examples/cases
// and the wording of the case format ("Wording": a unit in service never reads "do not re-energise").
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { GapsightResult } from '../../shared/schemas/result.js';
import { reasonInWords, recommendationHeadWord, screeningHeadline, unitInHeadline } from '../../shared/screening/headline.js';
import { decisiveReason } from '../../shared/screening/reasons.js';

const result = (name: string) => JSON.parse(readFileSync(join(process.cwd(), 'examples/cases', `${name}.result.json`), 'utf8')) as GapsightResult;

describe('recommendationHeadWord', () => {
  it('is the word alone for a unit that tripped', () => {
    expect(recommendationHeadWord('go', false)).toBe('GO');
    expect(recommendationHeadWord('conditional', false)).toBe('CONDITIONAL');
    expect(recommendationHeadWord('no-go', false)).toBe('NO-GO');
  });
  it('says what it means for a unit in service: a no-go takes it out of service, never "do not re-energise"', () => {
    expect(recommendationHeadWord('no-go', true)).toBe('NO-GO, take out of service for tests');
    expect(recommendationHeadWord('go', true)).toBe('GO (in service)');
    expect(recommendationHeadWord('conditional', true)).toBe('CONDITIONAL (in service)');
  });
});

describe('screeningHeadline', () => {
  it('names the word, the unit with its site and position, and the decisive reason', () => {
    const r = result('conditional');
    const h = screeningHeadline({ result: r, unit: { serial: 'KVP-HX-T2', position: 'T2' }, siteName: 'Harrow Cross', inService: false });
    expect(h.title).toBe('CONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)');
    expect(h.headWord).toBe('CONDITIONAL');
    expect(h.unit).toBe('KVP-HX-T2 (Harrow Cross, T2)');
    expect(h.reason).toBe(decisiveReason(r));
    expect(h.reason).not.toBe('No reason recorded');
  });

  it('leaves the position out when there is none', () => {
    expect(unitInHeadline({ serial: 'KVP-QL-T1', position: '' }, 'Quarry Lane')).toBe('KVP-QL-T1 (Quarry Lane)');
    expect(unitInHeadline({ serial: 'KVP-QL-T1', position: null }, 'Quarry Lane')).toBe('KVP-QL-T1 (Quarry Lane)');
  });

  it('names the protections of an internal fault in words, not codes', () => {
    const r = result('no-go-internal');
    expect(decisiveReason(r)).toContain('buchholz-trip'); // the engine's wording names the code
    const h = screeningHeadline({ result: r, unit: { serial: 'KVP-QL-T1', position: 'T1' }, siteName: 'Quarry Lane', inService: false });
    expect(h.title).toBe('NO-GO — KVP-QL-T1 (Quarry Lane, T1)');
    expect(h.reason).toBe('Internal protection operated (differential, Buchholz trip): investigate as an internal fault');
    expect(h.reason).not.toMatch(/buchholz-trip/);
  });

  it('a unit in service with a no-go reads "take out of service for tests"', () => {
    const h = screeningHeadline({ result: result('no-go-readings'), unit: { serial: 'X1', position: 'T3' }, siteName: 'Millbrook', inService: true });
    expect(h.title).toBe('NO-GO, take out of service for tests — X1 (Millbrook, T3)');
  });

  it('leaves every other reason as the result words it', () => {
    expect(reasonInWords('CHL capacitance shifted +3.42 % against the 2009-03-18 baseline (investigate from 3 %)')).toBe(
      'CHL capacitance shifted +3.42 % against the 2009-03-18 baseline (investigate from 3 %)',
    );
    expect(reasonInWords('Internal protection operated (restricted-earth-fault, sudden-pressure): investigate')).toBe(
      'Internal protection operated (restricted earth fault, sudden pressure): investigate',
    );
  });
});
