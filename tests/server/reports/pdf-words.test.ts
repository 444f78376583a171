// The PDF report in words (issue 10, item 5): the same headline as the screen's banner (shared/screening/headline.ts),
// no code names where a person reads, and sources that cite a published document named without "from memory" in the
// indicator table (the full wording, qualifier kept, in the criteria detail below it).
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js';
import { parseCase, type GapsightCase } from '../../../shared/schemas/case.js';
import { criteriaV2, screenCase } from '../../../shared/screening/index.js';
import { screeningHeadline } from '../../../shared/screening/headline.js';
import { codesInWords, fieldInWords, sourceInTable, sourcesInDetail, stayedInService } from '../../../server/reports/report-text.js';
import { buildReportDocDefinition } from '../../../server/reports/screening-report.js';
import type { ScreeningReportData } from '../../../server/reports/report-data.js';
import {
  caseReport,
  deltaMeasuredReport,
  doubtsReport,
  dutyOnlyGoReport,
  inServiceNoGoReport,
  internalFaultReport,
  lineAssumedReport,
  recentEventReport,
  storedRevision1InServiceReport,
  storedRevision1Report,
  thermalRegionReport,
} from './report-fixtures.js';
import { pdfText } from './pdf-text.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

function screenedExample(file: string): ScreeningReportData {
  const parsed = parseCase(JSON.parse(readFileSync(path.join(root, 'examples', file), 'utf8')));
  if (!parsed.ok) throw new Error(`${file} does not validate`);
  const c: GapsightCase = parsed.value;
  const d = caseReport(c, screenCase(c, criteriaV2));
  return { ...d, screening: { ...d.screening, criteriaVersion: 2 }, criteria: criteriaV2 };
}

const exampleFiles = [
  ...readdirSync(path.join(root, 'examples/cases'))
    .filter((f) => f.endsWith('.json') && !f.endsWith('.result.json'))
    .sort()
    .map((f) => `cases/${f}`),
  'demo/recent-event.case.json',
];

const FIXTURES: [string, () => ScreeningReportData][] = [
  ['the demo recent event as stored', recentEventReport],
  ['an internal-fault no-go', internalFaultReport],
  ['a no-go in service', inServiceNoGoReport],
  ['a duty-only go', dutyOnlyGoReport],
  ['doubts', doubtsReport],
  ['line current assumed', lineAssumedReport],
  ['delta measured', deltaMeasuredReport],
  ['thermal region', thermalRegionReport],
  ['a revision-1 result', storedRevision1Report],
  ['a revision-1 result in service', storedRevision1InServiceReport],
];
const ALL: [string, () => ScreeningReportData][] = [...FIXTURES, ...exampleFiles.map((f): [string, () => ScreeningReportData] => [`${f} screened now`, () => screenedExample(f)])];

/** Code names the issue found in the PDF, and the case fields behind the tests-done list. */
const KNOWN_CODES = [
  'dissolvedGasPPM',
  'reactance.A.shiftPercent',
  'buchholz-trip',
  'excitationCurrentMA',
  'windingResistanceOhm',
  'currentPerUnit',
  'thermalDurationPercent',
  'duty.thermalDurationPercent',
  'duty.eventDutyPercent',
  'capacitance.CHL.shiftPercent',
  'line-converted',
  'line-assumed',
  'hvKV',
  'lvKV',
];

/** A code, not a word: dotted, camelCase or hyphenated lower-case ("reactance.A", "highDuty", "buchholz-trip"). */
const isCode = (s: string) => /\./.test(s) || /[a-z][A-Z]/.test(s) || /^[a-z]+(-[a-z]+)+$/.test(s);

/** Every code a report's data holds: indicator keys, through-fault fields, missing and unreliable items, protections. */
function codesOf(d: ScreeningReportData): string[] {
  const r = d.result;
  const codes = [
    ...r.indicators.map((i) => i.key),
    ...Object.keys(r.throughFault ?? {}),
    ...r.missing,
    ...r.unreliable.map((u) => u.split(':')[0]),
    ...d.event.protectionOperated,
    ...(d.case.fault?.protectionOperated ?? []),
  ];
  return [...new Set([...KNOWN_CODES, ...codes.filter(isCode)])];
}

/** The indicator table's rows (the node styled "indicatorTable"), header left off. */
function indicatorRows(def: TDocumentDefinitions): unknown[][] {
  const table = (def.content as Content[]).find((c) => typeof c === 'object' && c !== null && (c as { style?: string }).style === 'indicatorTable') as { table: { body: unknown[][] } };
  return table.table.body.slice(1);
}
const cellText = (cell: unknown) => pdfText({ content: cell as Content });

describe('the PDF headline is the banner headline', () => {
  for (const [name, make] of ALL) {
    it(`${name}: word, unit and decisive reason first, as shared/screening/headline.ts words them`, () => {
      const d = make();
      const h = screeningHeadline({ result: d.result, unit: d.unit, siteName: d.site.name, inService: stayedInService(d) });
      const text = pdfText(buildReportDocDefinition(d));
      const lines = text.split('\n');
      const at = lines.indexOf(h.title);
      expect(at).toBeGreaterThan(0);
      expect(lines[at - 1]).toBe('RECOMMENDATION');
      expect(lines.slice(at + 1, at + 3)).toContain(h.reason);
      expect(at).toBeLessThan(lines.indexOf('Unit')); // before the title block: the verdict first
      expect(h.title).toContain(d.unit.serial);
      expect(h.title).toContain(d.site.name);
    });
  }

  it('names the protections of an internal fault in words in the banner and the reasons', () => {
    const text = pdfText(buildReportDocDefinition(internalFaultReport()));
    expect(text).toMatch(/^NO-GO — \S+ \(Quarry Lane, T1\)$/m);
    expect(text).toContain('Internal protection operated (differential, Buchholz trip): investigate as an internal fault');
  });
});

describe('the PDF names things in words, not codes', () => {
  for (const [name, make] of ALL) {
    it(`${name}: no indicator key, field name, item code or protection code is printed`, () => {
      const d = make();
      const text = pdfText(buildReportDocDefinition(d));
      const printed = codesOf(d).filter((code) => text.includes(code));
      expect(printed).toEqual([]);
      expect(text.split('\n')).not.toContain('Field');
    });
  }

  it('puts indicator keys written in an engine text into words', () => {
    expect(codesInWords('informative for a thermal-region event (judged on its duration: duty.thermalDurationPercent)')).toBe(
      "informative for a thermal-region event (judged on its duration: shot time (of the thermal curve's allowed time))",
    );
    expect(codesInWords('nameplate ratio 2.30940 = hvKV/(√3·lvKV) (YNd1)')).toBe('nameplate ratio 2.30940 = HV kV/(√3·LV kV) (YNd1)');
    // Not a key: left as it is (addresses, version numbers).
    expect(codesInWords('priya.natarajan@kestrel-valley.example, IEEE C57.12.90, e.g. 0.35 s')).toBe('priya.natarajan@kestrel-valley.example, IEEE C57.12.90, e.g. 0.35 s');
  });

  it('an unknown through-fault field is printed in words', () => {
    expect(fieldInWords('someNewFieldPercent')).toBe('Some new field percent');
    const d = recentEventReport();
    d.result = { ...d.result, throughFault: { ...d.result.throughFault!, peakAsymmetryFactor: 1.8 } as typeof d.result.throughFault };
    const text = pdfText(buildReportDocDefinition(d));
    expect(text).toContain('Peak asymmetry factor\n1.8\n');
    expect(text).not.toContain('peakAsymmetryFactor');
  });
});

describe('sources in the PDF', () => {
  it('names a cited published document without "from memory"; parts citing none keep it', () => {
    expect(sourceInTable('IEEE C57.152 practice (from memory): three-phase equivalent within ±3 % of nameplate')).toBe(
      'IEEE C57.152 practice: three-phase equivalent within ±3 % of nameplate',
    );
    expect(sourceInTable('IEC 60076-5:2006 clause 4.2.7 (from memory): 2 % categories I and II, 1 % category III; IEEE 62-1995 / IEEE C57.152: Z = V/I')).toBe(
      'IEC 60076-5:2006 clause 4.2.7: 2 % categories I and II, 1 % category III; IEEE 62-1995 / IEEE C57.152: Z = V/I',
    );
    expect(sourceInTable('Duval triangle 1, IEC 60599 annex (from memory)')).toBe('Duval triangle 1, IEC 60599 annex');
    expect(sourceInTable('DL/T 911 thresholds assume a linear sweep about 1 kHz apart (from memory): fixed grid')).toBe('DL/T 911 thresholds assume a linear sweep about 1 kHz apart: fixed grid');
    // No published clause: the qualifier stays.
    expect(sourceInTable('common practice (from memory): rise against the baseline 50 % watch')).toBe('common practice (from memory): rise against the baseline 50 % watch');
    expect(sourceInTable('no IEEE/IEC limit for winding capacitance; 3 % warning: utility practice (from memory)')).toBe(
      'no IEEE/IEC limit for winding capacitance; 3 % warning: utility practice (from memory)',
    );
    expect(sourceInTable('common practice (from memory): PF20 above 1 %; IEEE C57.12.90-style correction table (from memory), linear interpolation')).toBe(
      'common practice (from memory): PF20 above 1 %; IEEE C57.12.90-style correction table, linear interpolation',
    );
  });

  for (const [name, make] of [['the demo recent event as stored', recentEventReport], ['the demo recent event screened now', () => screenedExample('demo/recent-event.case.json')]] as const) {
    it(`${name}: the table's source column cites the clauses without the qualifier, the criteria detail keeps it`, () => {
      const d = make();
      const def = buildReportDocDefinition(d);
      const sources = indicatorRows(def).map((row) => cellText(row[4]));
      expect(sources.length).toBe(d.result.indicators.length);
      for (const s of sources) for (const part of s.split('; ')) if (/\b(IEEE|IEC|DL\/T)\s*C?\d/.test(part)) expect(part).not.toContain('from memory');
      expect(sources).toContain('IEEE C57.152 practice: three-phase equivalent within ±3 % of nameplate');
      const text = pdfText(def);
      const detail = text.slice(text.indexOf('Criteria detail'));
      expect(detail).toContain('IEEE C57.152 practice (from memory): three-phase equivalent within ±3 % of nameplate');
      for (const full of sourcesInDetail(d.result.indicators)) expect(detail).toContain(full);
      expect(text.indexOf('Criteria detail')).toBeGreaterThan(text.indexOf('Indicator\nValue\nLevel'));
    });
  }
});
