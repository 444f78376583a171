// Input bounds (shared/schemas/bounds.ts): each range at its edge — inside passes, outside fails with a message on the
// field's own path. Sources of the numbers: "common practice" (RANGES[…].source; the engine has no absolute ranges, its
// plausibility check is relative to the unit's own reference), the database columns for text, the sweep file's cap.
import { describe, expect, it } from 'vitest';
import { dateInRange, dateProblem, jsonDepth, LIST_MAX, RANGES, type QuantityName } from '../../../shared/schemas/bounds.js';
import { caseSchema, parseCase, readingSetSchema, shotSchema, sweepSchema, unitSchema } from '../../../shared/schemas/case.js';
import { designBodySchema, eventBodySchema, sessionBodySchema, unitBodySchema } from '../../../shared/schemas/fleet.js';
import { decisionBodySchema, energisedBodySchema } from '../../../shared/schemas/screening.js';
import { unitReadingSetImportFieldsSchema } from '../../../shared/schemas/units-io.js';
import { cleanCase } from '../case-builder.js';

type Schema = { safeParse(v: unknown): { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } } };

/** Issues on exactly this path (dotted). */
function issuesAt(schema: Schema, value: unknown, path: string): string[] {
  const r = schema.safeParse(value);
  return (r.error?.issues ?? []).filter((i) => i.path.map(String).join('.') === path).map((i) => i.message);
}

const unit = { serial: 'KVP-HX-T1', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5 };
const sweep = { label: 'HV-A-open', testType: 'open-circuit', postFault: [[1000, -42.3]] };

/** Where each quantity is used: a schema, a valid value around the field, and the field's path. */
const USES: [QuantityName, Schema, (v: number) => unknown, string][] = [
  ['kV', unitSchema, (v) => ({ ...unit, hvKV: v }), 'hvKV'],
  ['kVA', unitSchema, (v) => ({ ...unit, ratedKVA: v }), 'ratedKVA'],
  ['impedancePercent', unitSchema, (v) => ({ ...unit, impedancePercent: v }), 'impedancePercent'],
  ['systemImpedancePercent', unitSchema, (v) => ({ ...unit, systemImpedancePercent: v }), 'systemImpedancePercent'],
  ['ratio', unitSchema, (v) => ({ ...unit, nameplateTurnsRatio: v }), 'nameplateTurnsRatio'],
  ['faultKA', shotSchema, (v) => ({ currentKA: v, durationS: 0.1 }), 'currentKA'],
  ['shotS', shotSchema, (v) => ({ currentKA: 5, durationS: v }), 'durationS'],
  ['temperatureC', readingSetSchema, (v) => ({ temperatureC: v }), 'temperatureC'],
  ['windingTemperatureC', readingSetSchema, (v) => ({ windingTemperatureC: v }), 'windingTemperatureC'],
  ['hours', readingSetSchema, (v) => ({ hoursDeEnergised: v }), 'hoursDeEnergised'],
  ['capacitancePF', readingSetSchema, (v) => ({ capacitancePF: { CHL: v } }), 'capacitancePF.CHL'],
  ['dissipationPercent', readingSetSchema, (v) => ({ dissipationPercent: { CHL: v } }), 'dissipationPercent.CHL'],
  ['dissipationSweepPercent', readingSetSchema, (v) => ({ dissipationByFrequency: { CHL: [[50, v]] } }), 'dissipationByFrequency.CHL.0.1'],
  ['reactancePercent', readingSetSchema, (v) => ({ reactance: { A: { percent: v } } }), 'reactance.A.percent'],
  ['testVolts', readingSetSchema, (v) => ({ threePhaseEquivalent: { e12: v, e23: 180, e31: 180, amps: 2 } }), 'threePhaseEquivalent.e12'],
  ['testAmps', readingSetSchema, (v) => ({ threePhaseEquivalent: { e12: 180, e23: 180, e31: 180, amps: v } }), 'threePhaseEquivalent.amps'],
  ['excitationMA', readingSetSchema, (v) => ({ excitationCurrentMA: { A: v } }), 'excitationCurrentMA.A'],
  ['resistanceOhm', readingSetSchema, (v) => ({ windingResistanceOhm: { A: v } }), 'windingResistanceOhm.A'],
  ['gasPPM', readingSetSchema, (v) => ({ dissolvedGasPPM: { C2H2: v } }), 'dissolvedGasPPM.C2H2'],
  ['frequencyHz', sweepSchema, (v) => ({ ...sweep, postFault: [[v, -40]] }), 'postFault.0.0'],
  ['magnitudeDb', sweepSchema, (v) => ({ ...sweep, postFault: [[1000, v]] }), 'postFault.0.1'],
  ['phaseDeg', sweepSchema, (v) => ({ ...sweep, postFault: [[1000, -40, v]] }), 'postFault.0.2'],
  ['tapNumber', readingSetSchema, (v) => ({ tapPosition: v }), 'tapPosition'],
  ['testKV', sessionBodySchema, (v) => ({ takenAt: '2026-11-29', testKV: v }), 'testKV'],
  ['testFrequencyHz', sessionBodySchema, (v) => ({ takenAt: '2026-11-29', testFrequencyHz: v }), 'testFrequencyHz'],
];

/** The next double above / below x (an edge's first value outside). */
const above = (x: number) => (x === 0 ? Number.MIN_VALUE : x + Math.abs(x) * Number.EPSILON * 2);
const below = (x: number) => (x === 0 ? -Number.MIN_VALUE : x - Math.abs(x) * Number.EPSILON * 2);

describe('physical ranges (common practice)', () => {
  it('every range has a use checked here and a source', () => {
    expect(new Set(USES.map((u) => u[0]))).toEqual(new Set(Object.keys(RANGES).filter((k) => k !== 'testWatts' && k !== 'ohmBase' && k !== 'humidityPercent')));
    for (const r of Object.values(RANGES)) expect(r.source).toMatch(/common practice|physics/);
  });

  it.each(USES)('%s: the maximum passes, just above it fails on the field, with the unit in the message', (name, schema, make, path) => {
    const r = RANGES[name];
    expect(issuesAt(schema, make(r.max), path)).toEqual([]);
    const [message] = issuesAt(schema, make(above(r.max)), path);
    expect(message).toContain(r.unit);
    expect(issuesAt(schema, make(1e308), path).length).toBe(1);
    expect(issuesAt(schema, make(2 ** 64), path).length).toBe(name === 'kVA' || name === 'capacitancePF' ? 1 : 1);
  });

  it.each(USES)('%s: the minimum edge (inclusive or exclusive) holds', (name, schema, make, path) => {
    const r = RANGES[name] as { min: number; minExclusive?: boolean; unit: string };
    if (r.minExclusive) {
      expect(issuesAt(schema, make(r.min), path).length).toBe(1);
      expect(issuesAt(schema, make(above(r.min)), path)).toEqual([]);
    } else {
      expect(issuesAt(schema, make(r.min), path)).toEqual([]);
      expect(issuesAt(schema, make(below(r.min)), path)[0]).toContain(r.unit);
    }
    expect(issuesAt(schema, make(-1e308), path).length).toBe(1);
  });

  it('API bodies use the same ranges: 1e308 kV on a unit, ±1e308 °C on a session', () => {
    expect(issuesAt(unitBodySchema, { serial: 'X', siteId: 1, designId: 1, hvKV: 1e308 }, 'hvKV')).toEqual(['must be 1200 kV or less (check the unit)']);
    expect(issuesAt(designBodySchema, { hvKV: 2 ** 64 }, 'hvKV').length).toBe(1);
    expect(issuesAt(sessionBodySchema, { takenAt: '2026-11-29', temperatureC: -1e308 }, 'temperatureC')).toEqual(['must be -60 °C or more']);
    expect(issuesAt(sessionBodySchema, { takenAt: '2026-11-29', temperatureC: 1e308 }, 'temperatureC').length).toBe(1);
  });
});

describe('list caps (common practice; sweep points: the sweep file cap)', () => {
  const shots = (n: number) => Array.from({ length: n }, () => ({ currentKA: 5, durationS: 0.1 }));
  const configs = (n: number) => Object.fromEntries(Array.from({ length: n }, (_, i) => [`C${i}`, 3000]));
  it('shots: 20 pass, 21 fail on the list (case fault and event body)', () => {
    expect(LIST_MAX.shots).toBe(20);
    const fault = { occurredAt: '2026-11-28T03:12:00Z', type: 'three-phase', side: 'lv' };
    expect(issuesAt(caseSchema, { ...cleanCase(), fault: { ...fault, shots: shots(20) } }, 'fault.shots')).toEqual([]);
    expect(issuesAt(caseSchema, { ...cleanCase(), fault: { ...fault, shots: shots(21) } }, 'fault.shots')).toEqual(['at most 20 shots']);
    expect(issuesAt(eventBodySchema, { unitId: 1, ...fault, shots: shots(10_000) }, 'shots')).toEqual(['at most 20 shots']);
  });
  it('configurations: 50 pass, 51 fail', () => {
    expect(issuesAt(readingSetSchema, { capacitancePF: configs(50) }, 'capacitancePF')).toEqual([]);
    expect(issuesAt(readingSetSchema, { capacitancePF: configs(51) }, 'capacitancePF')).toEqual(['at most 50 configurations']);
    expect(issuesAt(sessionBodySchema, { takenAt: '2026-11-29', dissipationPercent: Object.fromEntries(Object.entries(configs(10_000)).map(([k]) => [k, 0.3])) }, 'dissipationPercent')).toEqual(['at most 50 configurations']);
  });
  it('phases: 6 pass, 7 fail; gases: 20 pass, 21 fail; sweep points: 20 000 pass, 20 001 fail', () => {
    const phases = (n: number) => Object.fromEntries(Array.from({ length: n }, (_, i) => [`P${i}`, 10]));
    expect(issuesAt(readingSetSchema, { windingResistanceOhm: phases(6) }, 'windingResistanceOhm')).toEqual([]);
    expect(issuesAt(readingSetSchema, { windingResistanceOhm: phases(7) }, 'windingResistanceOhm')).toEqual(['at most 6 phases']);
    const gases = (n: number) => Object.fromEntries(Array.from({ length: n }, (_, i) => [`G${i}`, 10]));
    expect(issuesAt(readingSetSchema, { dissolvedGasPPM: gases(20) }, 'dissolvedGasPPM')).toEqual([]);
    expect(issuesAt(readingSetSchema, { dissolvedGasPPM: gases(21) }, 'dissolvedGasPPM')).toEqual(['at most 20 gases']);
    const points = (n: number) => Array.from({ length: n }, (_, i) => [i + 1, -40]);
    expect(issuesAt(sweepSchema, { ...sweep, postFault: points(20_000) }, 'postFault')).toEqual([]);
    expect(issuesAt(sweepSchema, { ...sweep, postFault: points(20_001) }, 'postFault')).toEqual(['at most 20000 points']);
  });
  it('follow-ups of a decision: 20 pass, 21 fail', () => {
    const fu = (n: number) => Array.from({ length: n }, () => ({ task: 'Gas sample' }));
    expect(issuesAt(decisionBodySchema, { outcome: 'hold', reason: 'r', followUps: fu(20) }, 'followUps')).toEqual([]);
    expect(issuesAt(decisionBodySchema, { outcome: 'hold', reason: 'r', followUps: fu(21) }, 'followUps')).toEqual(['at most 20 follow-ups']);
  });
});

describe('text at its column length (the database column)', () => {
  it('configuration, gas and terminal labels 20, phase labels 8, serial 60, tap 20, sweep label 60', () => {
    expect(issuesAt(readingSetSchema, { capacitancePF: { ['C'.repeat(20)]: 3000 } }, `capacitancePF.${'C'.repeat(20)}`)).toEqual([]);
    expect(readingSetSchema.safeParse({ capacitancePF: { ['C'.repeat(21)]: 3000 } }).success).toBe(false);
    expect(readingSetSchema.safeParse({ dissolvedGasPPM: { ['G'.repeat(21)]: 3 } }).success).toBe(false);
    expect(readingSetSchema.safeParse({ bushings: { ['H'.repeat(21)]: { c1PF: 400 } } }).success).toBe(false);
    expect(readingSetSchema.safeParse({ reactance: { ['A'.repeat(8)]: { percent: 11 } } }).success).toBe(true);
    expect(readingSetSchema.safeParse({ reactance: { ['A'.repeat(9)]: { percent: 11 } } }).success).toBe(false);
    expect(issuesAt(unitSchema, { ...unit, serial: 'S'.repeat(60) }, 'serial')).toEqual([]);
    expect(issuesAt(unitSchema, { ...unit, serial: 'S'.repeat(61) }, 'serial')).toEqual(['at most 60 characters']);
    expect(issuesAt(readingSetSchema, { tapPosition: 'T'.repeat(21) }, 'tapPosition').length).toBe(1);
    expect(issuesAt(sweepSchema, { ...sweep, label: 'L'.repeat(61) }, 'label')).toEqual(['at most 60 characters']);
  });
});

describe('dates of events and tests: 1900-01-01 … a day after now', () => {
  const now = Date.parse('2026-12-03T08:00:00Z');
  const at = (s: string) => dateProblem(s, now + 86_400_000);
  it('accepts ISO dates and date-times inside the span, at both edges', () => {
    expect(at('1900-01-01')).toBeNull();
    expect(at('2026-11-28T03:12:00Z')).toBeNull();
    expect(at('2026-11-28T03:12:00.123+02:00')).toBeNull();
    expect(at('2026-12-04T08:00:00Z')).toBeNull();
  });
  it('refuses what is outside, not real or not ISO 8601', () => {
    expect(at('1899-12-31')).toBe('too-early');
    expect(at('0001-01-01')).toBe('too-early');
    expect(at('2026-12-04T08:00:01Z')).toBe('too-late');
    expect(at('2099-01-01')).toBe('too-late');
    expect(at('9999-12-31')).toBe('too-late');
    expect(at('10000-01-01')).toBe('format');
    expect(at('+010000-01-01')).toBe('format');
    expect(at('2026-02-30')).toBe('not-real');
    expect(at('2026-02-29')).toBe('not-real');
    expect(at('2024-02-29')).toBeNull();
    expect(at('2026-11-28T24:30:00Z')).toBe('not-real');
    expect(at('March 3 2026')).toBe('format');
    expect(at('yesterday')).toBe('format');
  });
  it('the schema reads the caller’s now (default Date.now()) and names the field', () => {
    const schema = dateInRange({ now: () => now });
    expect(schema.safeParse('2026-12-04').success).toBe(true);
    expect(schema.safeParse('2026-12-05').error?.issues[0].message).toBe('later than a day after now: check the year');
    expect(issuesAt(eventBodySchema, { occurredAt: '2099-01-01' }, 'occurredAt')).toEqual(['later than a day after now: check the year']);
    expect(issuesAt(eventBodySchema, { occurredAt: '0001-01-01' }, 'occurredAt')).toEqual(['before 1900-01-01: check the year']);
    expect(issuesAt(energisedBodySchema, { at: '2026-02-30T10:00:00Z' }, 'at')).toEqual(['not a real date or time (2026-02-30T10:00:00Z)']);
    expect(issuesAt(unitReadingSetImportFieldsSchema, { kind: 'routine', takenAt: '10000-01-01' }, 'takenAt')).toEqual(['not an ISO 8601 date or date-time']);
    const c = cleanCase();
    const bad = parseCase({ ...c, baseline: { ...c.baseline, takenAt: '1850-05-02' } });
    expect(bad.ok ? [] : bad.errors).toEqual([{ path: 'baseline.takenAt', message: 'before 1900-01-01: check the year' }]);
  });
});

describe('unknown fields and depth', () => {
  it('an unknown key is named by its own path, at any level', () => {
    const c = cleanCase();
    const r = parseCase({ ...c, postFault: { ...c.postFault, capacitanceModes: { CHL: { gstPF: 8536, gstGuardPF: 3131, ustPF: 5405, foo: 1 } } } });
    expect(r.ok ? [] : r.errors).toEqual([{ path: 'postFault.capacitanceModes.CHL.foo', message: 'unknown field' }]);
    expect(issuesAt(eventBodySchema, { unitId: 1, occurredAt: '2026-11-28', type: 'three-phase', side: 'lv', shots: [{ currentKA: 1, durationS: 0.1, extra: 1 }] }, 'shots.0').length).toBe(1);
  });
  it('a bad value inside a union (a reactance phase) is named by its own field, not the phase', () => {
    const r = parseCase({ ...cleanCase(), baseline: { reactance: { A: { percent: '11.6' }, B: { volts: 200 } } } });
    expect(r.ok ? [] : r.errors.map((e) => e.path)).toEqual(['baseline.reactance.A.percent', 'baseline.reactance.B.amps']);
  });
  it('jsonDepth counts levels without recursion (5 000 deep is fine)', () => {
    expect(jsonDepth(1, 32)).toBe(0);
    expect(jsonDepth({}, 32)).toBe(1);
    expect(jsonDepth({ a: [{ b: {} }] }, 32)).toBe(4);
    let deep: unknown = {};
    for (let i = 0; i < 5000; i += 1) deep = { a: deep };
    expect(jsonDepth(deep, 32)).toBe(33);
    expect(jsonDepth(deep, 1e9)).toBe(5001);
  });
});
