import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readingSetToRows, rowsToReadingSet } from '../../../shared/readings/rows.js';
import { mergeReadingSets } from '../../../shared/readings/merge.js';
import type { ReadingSet } from '../../../shared/schemas/case.js';

// Invented demo values (Kestrel Valley Power), not check values: these tests are about storage, not physics.
const full: ReadingSet = {
  capacitancePF: { CH: 3131, CL: 9990, CHL: 5405 },
  capacitanceModes: { CHL: { gstPF: 8536, gstGuardPF: 3131, ustPF: 5405 } },
  dissipationPercent: { CH: 0.3, CL: 0.33, CHL: 0.27 },
  reactance: { A: { volts: 202.9, amps: 4.0, watts: 5.2 }, B: { percent: 11.6 }, C: { percent: 11.71, zBaseOhm: 435.6 } as never },
  threePhaseEquivalent: { e12: 182.95, e23: 182.95, e31: 182.95, amps: 2 },
  excitationCurrentMA: { A: 21.3, B: 14.2, C: 20.9 },
  excitationKV: 10,
  windingResistanceOhm: { A: 0.3215, B: 0.3221, C: 0.3218 },
  resistanceTemperatureC: 30,
  turnsRatio: { A: 4.001, B: 4.0, C: 4.002 },
  dissolvedGasPPM: { H2: 35, CH4: 12, C2H6: 4, C2H4: 6, C2H2: 0, CO: 210, CO2: 1800 },
  dissipationByFrequency: { CH: [[15, 0.41], [60, 0.3], [400, 0.36]] },
};

describe('reading rows', () => {
  it('store every section of a case-format reading set and give it back unchanged', () => {
    const rows = readingSetToRows(full);
    expect(rows.length).toBe(3 + 3 + 3 + 3 + 1 + 2 + 4 + 3 + 1 + 3 + 1 + 3 + 7 + 3);
    expect(rowsToReadingSet(rows)).toEqual(full);
  });

  it('give capacitance in pF with the configuration, and GST/GST-guard/UST as modes', () => {
    const rows = readingSetToRows({ capacitanceModes: { CHL: { gstPF: 1, gstGuardPF: 2, ustPF: 3 } } });
    expect(rows.map((r) => [r.quantity, r.configuration, r.mode, r.unit])).toEqual([
      ['capacitance', 'CHL', 'GST', 'pF'],
      ['capacitance', 'CHL', 'GST-guard', 'pF'],
      ['capacitance', 'CHL', 'UST', 'pF'],
    ]);
  });

  it('round-trip any capacitance and reactance percentages', () => {
    const cfg = fc.constantFrom('CH', 'CL', 'CHL', 'CT');
    const ph = fc.constantFrom('A', 'B', 'C');
    const val = fc.double({ min: 0.001, max: 1e6, noNaN: true });
    fc.assert(
      fc.property(fc.dictionary(cfg, val, { minKeys: 1 }), fc.dictionary(ph, val, { minKeys: 1 }), (cap, x) => {
        const set: ReadingSet = { capacitancePF: cap, reactance: Object.fromEntries(Object.entries(x).map(([k, v]) => [k, { percent: v }])) };
        expect(rowsToReadingSet(readingSetToRows(set))).toEqual(set);
      }),
    );
  });
});

describe('mergeReadingSets', () => {
  it('keeps the newest value of each quantity over several sessions, whatever the input order', () => {
    const s1: ReadingSet = { takenAt: '2026-11-29T08:00:00Z', temperatureC: 31, tapPosition: '9b', capacitancePF: { CH: 3131, CL: 9990 }, dissipationPercent: { CH: 0.3 }, reactance: { A: { percent: 11.6 }, B: { percent: 11.6 } } };
    const s2: ReadingSet = { takenAt: '2026-11-30T08:00:00Z', temperatureC: 25, tapPosition: '9b', capacitancePF: { CL: 9985 }, reactance: { B: { volts: 200, amps: 4 } } };
    for (const order of [[s1, s2], [s2, s1]]) {
      const m = mergeReadingSets(order)!;
      expect(m.capacitancePF).toEqual({ CH: 3131, CL: 9985 });
      expect(m.reactance).toEqual({ A: { percent: 11.6 }, B: { volts: 200, amps: 4 } });
      expect(m.takenAt).toBe('2026-11-30T08:00:00Z');
      // The dissipation factor was measured at 31 °C: its temperature goes with it.
      expect(m.temperatureC).toBe(31);
      expect(m.dissipationPercent).toEqual({ CH: 0.3 });
    }
  });

  it('takes a dissolved-gas analysis whole from the newest sample and the tap from the newest reactance test', () => {
    const a: ReadingSet = { takenAt: '2026-01-01', tapPosition: '9b', reactance: { A: { percent: 11 } }, dissolvedGasPPM: { H2: 10, C2H2: 1 } };
    const b: ReadingSet = { takenAt: '2026-02-01', tapPosition: '12', dissolvedGasPPM: { H2: 30 } };
    const m = mergeReadingSets([a, b])!;
    expect(m.dissolvedGasPPM).toEqual({ H2: 30 });
    expect(m.tapPosition).toBe('9b');
  });

  it('answers undefined for no sets', () => {
    expect(mergeReadingSets([])).toBeUndefined();
  });
});
