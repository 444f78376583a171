import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mergeReadingSets } from '../../../shared/readings/merge.js';
import { readingSetToRows, ROW_KEYS, rowsToReadingSet, SET_LEVEL_KEYS } from '../../../shared/readings/rows.js';
import { readingSetSchema, type ReadingSet } from '../../../shared/schemas/case.js';

// Rules revision 2 fields in storage: bushings as rows, the set-level doubts as columns. Invented demo values
// (Kestrel Valley Power style), not check values: these tests are about storage, not physics.

const bushings: NonNullable<ReadingSet['bushings']> = {
  H1: { c1PF: 412.5, c1DissipationPercent: 0.31, c2PF: 3880, c2DissipationPercent: 0.42, winding: 'hv' },
  H2: { c1PF: 409.8, c1DissipationPercent: 0.3 },
  '1U': { c1PF: 398, c2PF: 3701 },
  X1: { c1PF: 655.1, winding: 'lv' },
};

describe('bushing rows', () => {
  it('store every bushing reading as its own row: terminal in configuration, winding in mode', () => {
    const rows = readingSetToRows({ bushings });
    expect(rows.map((r) => [r.quantity, r.configuration, r.mode, r.value, r.unit])).toEqual([
      ['bushing-c1', 'H1', 'hv', 412.5, 'pF'],
      ['bushing-c1-dissipation', 'H1', 'hv', 0.31, '%'],
      ['bushing-c2', 'H1', 'hv', 3880, 'pF'],
      ['bushing-c2-dissipation', 'H1', 'hv', 0.42, '%'],
      ['bushing-c1', 'H2', null, 409.8, 'pF'],
      ['bushing-c1-dissipation', 'H2', null, 0.3, '%'],
      ['bushing-c1', '1U', null, 398, 'pF'],
      ['bushing-c2', '1U', null, 3701, 'pF'],
      ['bushing-c1', 'X1', 'lv', 655.1, 'pF'],
    ]);
    expect(rows.every((r) => r.phase === null && r.frequencyHz === null)).toBe(true);
  });

  it('come back as the same bushings (with the winding), alongside the other sections', () => {
    const set: ReadingSet = { capacitancePF: { CH: 3131 }, dissipationPercent: { CH: 0.3 }, bushings };
    expect(rowsToReadingSet(readingSetToRows(set))).toEqual(set);
  });

  it('round-trip any terminals and readings', () => {
    const terminal = fc.constantFrom('H1', 'H2', 'H3', 'H0', 'X1', 'X2', '1U', '1V', '2W', 'Y1');
    const pf = fc.double({ min: 1, max: 1e5, noNaN: true });
    const df = fc.double({ min: 0, max: 10, noNaN: true });
    const entry = fc.record(
      { c1PF: pf, c1DissipationPercent: df, c2PF: pf, c2DissipationPercent: df, winding: fc.constantFrom('hv', 'lv', 'tv') },
      { requiredKeys: ['c1PF'] },
    );
    fc.assert(
      fc.property(fc.dictionary(terminal, entry, { minKeys: 1 }), (b) => {
        const set = { bushings: b } as ReadingSet;
        expect(rowsToReadingSet(readingSetToRows(set))).toEqual(set);
        expect(readingSetSchema.safeParse(rowsToReadingSet(readingSetToRows(set))).success).toBe(true);
      }),
    );
  });

  it('keep the set-level doubts out of the rows (they are reading-set columns)', () => {
    for (const key of ['demagnetised', 'hoursDeEnergised', 'windingTemperatureC']) {
      expect(SET_LEVEL_KEYS as readonly string[]).toContain(key);
      expect(ROW_KEYS as readonly string[]).not.toContain(key);
    }
    expect(ROW_KEYS as readonly string[]).toContain('bushings');
    const rows = readingSetToRows({ demagnetised: true, hoursDeEnergised: 9, windingTemperatureC: 21.5, windingResistanceOhm: { A: 0.32 } });
    expect(rows.map((r) => r.quantity)).toEqual(['winding-resistance']);
  });
});

describe('mergeReadingSets, revision 2', () => {
  it('takes each bushing terminal whole from the newest set that tested it', () => {
    const a: ReadingSet = { takenAt: '2026-11-29T08:00:00Z', bushings: { H1: { c1PF: 410, c1DissipationPercent: 0.3, c2PF: 3800 }, H2: { c1PF: 409 } } };
    const b: ReadingSet = { takenAt: '2026-11-30T08:00:00Z', bushings: { H1: { c1PF: 415 } } };
    for (const order of [[a, b], [b, a]]) {
      expect(mergeReadingSets(order)!.bushings).toEqual({ H1: { c1PF: 415 }, H2: { c1PF: 409 } });
    }
  });

  it('keeps demagnetised with the excitation test and the winding temperature and hours with the resistance test', () => {
    const morning: ReadingSet = { takenAt: '2026-11-29T08:00:00Z', demagnetised: true, hoursDeEnergised: 5, windingTemperatureC: 30, excitationCurrentMA: { A: 21 }, windingResistanceOhm: { A: 0.32 } };
    const later: ReadingSet = { takenAt: '2026-11-30T08:00:00Z', demagnetised: false, hoursDeEnergised: 29, capacitancePF: { CH: 3131 } };
    const m = mergeReadingSets([later, morning])!;
    expect(m.demagnetised).toBe(true);
    expect(m.hoursDeEnergised).toBe(5);
    expect(m.windingTemperatureC).toBe(30);

    // A newer resistance test without a winding temperature does not borrow the older test's.
    const retest: ReadingSet = { takenAt: '2026-12-01T08:00:00Z', hoursDeEnergised: 50, windingResistanceOhm: { A: 0.321 } };
    const m2 = mergeReadingSets([morning, later, retest])!;
    expect(m2.windingTemperatureC).toBeUndefined();
    expect(m2.hoursDeEnergised).toBe(50);
    expect(m2.demagnetised).toBe(true);
  });

  it('takes the doubts from the newest set that has them when no set gave the values they qualify', () => {
    const a: ReadingSet = { takenAt: '2026-11-29T08:00:00Z', hoursDeEnergised: 5, demagnetised: false, capacitancePF: { CH: 1 } };
    const b: ReadingSet = { takenAt: '2026-11-30T08:00:00Z', hoursDeEnergised: 29, capacitancePF: { CL: 2 } };
    const m = mergeReadingSets([a, b])!;
    expect(m.hoursDeEnergised).toBe(29);
    expect(m.demagnetised).toBe(false);
    expect(m.windingTemperatureC).toBeUndefined();
  });
});
