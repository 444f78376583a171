// Every code the engine emits on the example cases, and every code the criteria sets and the case schema name, has a
// label in the one vocabulary. The codes are read from the engine's outputs and the schemas, not from a copied list.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { currentIsSchema, faultTypeSchema, parseCase, protectionSchema } from '../../shared/schemas/case.js';
import { basisSchema, levelSchema, methodSchema, type GapsightResult } from '../../shared/schemas/result.js';
import { EVENT_STATUSES, READING_SET_KINDS, RECOMMENDATIONS } from '../../shared/schemas/enums.js';
import { BUILT_IN_CRITERIA, screenCase } from '../../shared/screening/index.js';
import { INTERNAL_PROTECTIONS } from '../../shared/screening/protections.js';
import {
  BASIS_LABELS,
  CURRENT_BASIS_LABELS,
  CURRENT_IS_LABELS,
  FAULT_TYPE_LABELS,
  KIND_LABELS,
  LEVEL_LABELS,
  LEVEL_WORD,
  METHOD_LABELS,
  PROTECTION_LABELS,
  QUANTITY_LABELS,
  RECOMMENDATION_LABELS,
  RECOMMENDATION_WORD,
  STATUS_LABELS,
  basisLabel,
  codesInWords,
  inSentence,
  indicatorLabel,
  protectionWord,
} from '../../shared/vocabulary.js';

const root = join(import.meta.dirname, '../../examples');
const caseFiles = [
  ...readdirSync(join(root, 'cases'))
    .filter((f) => f.endsWith('.json') && !f.endsWith('.result.json'))
    .map((f) => join(root, 'cases', f)),
  ...readdirSync(join(root, 'demo'))
    .filter((f) => f.endsWith('.case.json'))
    .map((f) => join(root, 'demo', f)),
];

/** Every example screened under every built-in criteria set. */
const results: GapsightResult[] = caseFiles.flatMap((file) => {
  const parsed = parseCase(JSON.parse(readFileSync(file, 'utf8')));
  if (!parsed.ok) throw new Error(`${file} is not a valid case`);
  return BUILT_IN_CRITERIA.map((criteria) => screenCase(parsed.value, criteria));
});

describe('shared vocabulary', () => {
  it('screens every example case under every built-in criteria set, so the checks below see real engine output', () => {
    expect(caseFiles.length).toBeGreaterThan(10);
    expect(results.length).toBe(caseFiles.length * BUILT_IN_CRITERIA.length);
    expect(results.flatMap((r) => r.indicators).length).toBeGreaterThan(100);
  });

  it('labels every indicator key the engine emits on the examples (no key falls through unlabelled)', () => {
    const keys = [...new Set(results.flatMap((r) => r.indicators.map((i) => i.key)))];
    const unlabelled = keys.filter((k) => indicatorLabel(k) === k || indicatorLabel(k).trim() === '');
    expect(unlabelled).toEqual([]);
  });

  it('labels every method, basis, level, recommendation and current basis the engine emits', () => {
    for (const r of results) {
      expect(RECOMMENDATION_LABELS[r.recommendation]).toBeTruthy();
      expect(RECOMMENDATION_WORD[r.recommendation]).toBeTruthy();
      if (r.throughFault?.currentBasis) expect(CURRENT_BASIS_LABELS[r.throughFault.currentBasis]).toBeTruthy();
      for (const i of r.indicators) {
        expect(METHOD_LABELS[i.method], i.method).toBeTruthy();
        expect(LEVEL_WORD[i.level]).toBeTruthy();
        if (i.basis) expect(basisLabel(i), i.key).toMatch(/\S/);
      }
    }
  });

  it('labels every code of the schemas and the criteria sets', () => {
    const missing = (labels: Record<string, unknown>, codes: readonly string[]) => codes.filter((c) => !labels[c]);
    expect(missing(METHOD_LABELS, methodSchema.options)).toEqual([]);
    expect(missing(BASIS_LABELS, basisSchema.options)).toEqual([]);
    expect(missing(LEVEL_LABELS, levelSchema.options)).toEqual([]);
    expect(missing(LEVEL_WORD, levelSchema.options)).toEqual([]);
    expect(missing(PROTECTION_LABELS, protectionSchema.options)).toEqual([]);
    expect(missing(FAULT_TYPE_LABELS, faultTypeSchema.options)).toEqual([]);
    expect(missing(CURRENT_IS_LABELS, currentIsSchema.options)).toEqual([]);
    expect(missing(STATUS_LABELS, EVENT_STATUSES)).toEqual([]);
    expect(missing(KIND_LABELS, READING_SET_KINDS)).toEqual([]);
    expect(missing(RECOMMENDATION_LABELS, RECOMMENDATIONS)).toEqual([]);
    for (const criteria of BUILT_IN_CRITERIA) {
      expect(missing(PROTECTION_LABELS, criteria.verdict.internalProtections)).toEqual([]);
      expect(missing(METHOD_LABELS, criteria.verdict.independentMethods)).toEqual([]);
    }
  });

  it('labels the reading-set quantities of the case format by their field names', () => {
    expect(QUANTITY_LABELS.dissolvedGasPPM).toBe('Dissolved gases (oil sample)');
    expect(QUANTITY_LABELS.capacitancePF).toBe('Capacitance');
  });

  it('writes labels inside a sentence in lower case, keeping names and abbreviations', () => {
    expect(protectionWord('buchholz-trip')).toBe('Buchholz trip');
    expect(protectionWord('pressure-relief')).toBe('pressure relief');
    expect(inSentence('HV phase A')).toBe('HV phase A');
    expect(inSentence('Frequency-response sweep')).toBe('frequency-response sweep');
    expect(protectionWord('not-a-protection')).toBe('not-a-protection');
  });

  it('names a few indicator keys the way the screen, the mail and the PDF show them', () => {
    expect(indicatorLabel('reactance.A.shiftPercent')).toBe('Phase A reactance shift vs baseline');
    expect(indicatorLabel('capacitance.CHL.shiftPercent')).toBe('CHL capacitance shift vs baseline');
    expect(indicatorLabel('sweep.hv.AC.class')).toBe('Sweep HV phase A vs C DL/T 911 class');
  });

  it('the built-in criteria sets list the same internal protections as the leaf module: the five of the case format', () => {
    for (const criteria of BUILT_IN_CRITERIA) expect(criteria.verdict.internalProtections).toEqual([...INTERNAL_PROTECTIONS]);
    expect(INTERNAL_PROTECTIONS).toEqual(['differential', 'restricted-earth-fault', 'buchholz-trip', 'sudden-pressure', 'pressure-relief']);
  });
});

describe('codes quoted in free text', () => {
  it('puts the protection codes an engine reason quotes in words, and leaves other hyphenated words alone', () => {
    expect(codesInWords('Internal protection operated (differential, buchholz-trip): investigate as an internal fault')).toBe(
      'Internal protection operated (differential, Buchholz trip): investigate as an internal fault',
    );
    expect(codesInWords('pressure-relief and restricted-earth-fault')).toBe('pressure relief and restricted earth fault');
    expect(codesInWords('phase-to-ground fault, post-fault tests, re-energising')).toBe('phase-to-ground fault, post-fault tests, re-energising');
  });

  it('leaves no protection code in the reason the engine gives for an internal fault', () => {
    // The engine's reason on a case whose internal protections all operated.
    const c = parseCase(JSON.parse(readFileSync(caseFiles[0], 'utf8')));
    if (!c.ok) throw new Error(`${caseFiles[0]} is not a valid case`);
    const internal = protectionSchema.options.filter((p) => INTERNAL_PROTECTIONS.includes(p as never));
    const result = screenCase({ ...c.value, fault: { ...c.value.fault!, protectionOperated: internal } });
    const reasons = result.reasons.join(' | ');
    expect(reasons).toMatch(/buchholz-trip/);
    for (const p of protectionSchema.options.filter((x) => x.includes('-'))) expect(codesInWords(reasons)).not.toMatch(new RegExp(`\\b${p}\\b`));
  });
});
