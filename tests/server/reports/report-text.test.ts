import { describe, expect, it } from 'vitest';
import type { Indicator, ThroughFault } from '../../../shared/schemas/result.js';
import { CAUTIONS } from '../../../shared/screening/verdict.js';
import {
  basisWords,
  cautionsOf,
  rulesInWords,
  thermalTimeInWords,
  unreliableItems,
  windingCurrentInWords,
} from '../../../server/reports/report-text.js';
import { storedRevision1Report, thermalRegionReport } from './report-fixtures.js';

const tfOf = (over: Partial<ThroughFault>): ThroughFault => ({ ...thermalRegionReport().result.throughFault!, ...over });
const ind = (over: Partial<Indicator>): Indicator => ({ key: 'capacitance.CHL.shiftPercent', value: 1, level: 'watch', rule: 'r', source: 's', method: 'capacitance', ...over });

describe('report text: thermal-region duty as time against the allowed time', () => {
  it('reads the brief\'s example: 0.35 s of the 14.2 s the curve allows (2.5 %)', () => {
    const c = thermalRegionReport().case; // shots 0.2 s + 0.15 s
    const tf = tfOf({ highDuty: false, thermalDurationPercent: (100 * 0.35) / 14.2 });
    expect(thermalTimeInWords(tf, c)).toBe('0.35 s of the 14.2 s the curve allows (2.5 %)');
  });

  it('says nothing in time for a high-duty event, and says when a revision-1 result did not store the allowed time', () => {
    const c = thermalRegionReport().case;
    expect(thermalTimeInWords(tfOf({ highDuty: true, thermalDurationPercent: null }), c)).toBeNull();
    const old = { ...tfOf({ highDuty: false }) } as Record<string, unknown>;
    delete old.thermalDurationPercent;
    expect(thermalTimeInWords(old as ThroughFault, c)).toBe(
      '0.35 s of shots in total (the time the thermal curve allows was not stored with this result: rules revision 1)',
    );
  });

  it('below the curve\'s lowest current (no time limit, stored as 0 %) it does not divide by zero', () => {
    const text = thermalTimeInWords(tfOf({ highDuty: false, thermalDurationPercent: 0 }), thermalRegionReport().case);
    expect(text).toBe('0.35 s of shots; the thermal curve sets no time limit at this current (0 % of the allowed time)');
  });
});

describe('report text: winding current, basis, revision, cautions, unreliable items', () => {
  it('words each current basis', () => {
    expect(windingCurrentInWords(tfOf({ currentBasis: 'line-converted', windingCurrentFactor: 2 / Math.sqrt(3) }))).toBe(
      'Winding current: line current converted by the vector group, factor 1.155.',
    );
    expect(windingCurrentInWords(tfOf({ currentBasis: 'line-converted', windingCurrentFactor: 1 }))).toBe('Winding current: line current converted by the vector group, factor 1.');
    expect(windingCurrentInWords(tfOf({ currentBasis: 'winding', windingCurrentFactor: 1 }))).toBe('Winding current: given as winding current.');
    expect(windingCurrentInWords(tfOf({ currentBasis: 'line-assumed', windingCurrentFactor: null }))).toBe(
      'Winding current: line current used as it is — the winding current could not be derived; enter it or attach the relay record.',
    );
    expect(windingCurrentInWords(null)).toBeNull();
  });

  it('words each basis: own baseline, own previous test, sister units, phase A vs C, state, duty; none before revision 2', () => {
    expect(basisWords(ind({ basis: 'change', reference: '2009-03-18 baseline' }))).toBe('against own baseline');
    expect(basisWords(ind({ key: 'capacitance.CHL.shiftFromPreviousPercent', basis: 'change', reference: '2026-04-12 previous test' }))).toBe('against own previous test');
    expect(basisWords(ind({ key: 'gas.C2H2.risePPM', method: 'gas', basis: 'change', reference: '2024-09-02 pre-fault sample' }))).toBe('against own pre-fault sample');
    expect(basisWords(ind({ basis: 'sisters' }))).toBe('against sister units');
    expect(basisWords(ind({ key: 'sweep.hv.AC.class', basis: 'phase-comparison' }))).toBe('phase A vs C');
    expect(basisWords(ind({ basis: 'state' }))).toBe('state (absolute value)');
    expect(basisWords(ind({ basis: 'duty' }))).toBe('duty');
    expect(basisWords(ind({}))).toBeNull();
  });

  it('names criteria set and rules revision; a result without engineRevision is revision 1', () => {
    expect(rulesInWords(storedRevision1Report())).toBe('criteria set 1, rules revision 1');
    expect(rulesInWords(thermalRegionReport())).toBe('criteria set 2, rules revision 2');
  });

  it('prints the stored cautions and adds the current ones an older result lacks, without repeating any', () => {
    const old = storedRevision1Report().result;
    expect(cautionsOf(old)).toEqual([...CAUTIONS]);
    expect(cautionsOf({ ...old, cautions: [...CAUTIONS] })).toEqual([...CAUTIONS]);
    const extra = 'A utility-specific caution kept with the stored result.';
    expect(cautionsOf({ ...old, cautions: [...old.cautions, extra] })).toEqual([...old.cautions, extra, ...CAUTIONS.slice(3)]);
  });

  it('takes a repeat instruction written after the field name, else falls back to "repeat the test"', () => {
    const d = storedRevision1Report();
    d.result = { ...d.result, unreliable: ['turnsRatio: tap mismatch (baseline at tap 9b, post-fault at 11): repeat at tap 9b', 'windingResistanceOhm'] };
    expect(unreliableItems(d)).toEqual([
      { item: 'turnsRatio', words: 'turns ratio', instruction: 'tap mismatch (baseline at tap 9b, post-fault at 11): repeat at tap 9b' },
      { item: 'windingResistanceOhm', words: 'winding resistance', instruction: 'repeat the test' },
    ]);
  });
});
