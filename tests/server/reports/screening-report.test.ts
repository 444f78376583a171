import { describe, expect, it } from 'vitest';
import type { Content } from 'pdfmake/interfaces.js';
import { bundledPdfFonts, renderPdf } from '../../../server/reports/pdf.js';
import { codesInWords, sourceInTable } from '../../../server/reports/report-text.js';
import { buildReportDocDefinition } from '../../../server/reports/screening-report.js';
import { CAUTIONS } from '../../../shared/screening/verdict.js';
import { indicatorLabel } from '../../../shared/vocabulary.js';
import { pdfRuns, pdfText as allText } from './pdf-text.js';

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
import {
  deltaMeasuredReport,
  doubtsReport,
  dutyOnlyGoReport,
  exampleCaseReport,
  inServiceNoGoReport,
  internalFaultReport,
  lineAssumedReport,
  recentEventReport,
  storedRevision1InServiceReport,
  storedRevision1Report,
  thermalRegionReport,
} from './report-fixtures.js';

describe('PDF screening report (buildReportDocDefinition + renderPdf)', () => {
  it('renders to a PDF Buffer with the bundled Roboto', async () => {
    const pdf = await renderPdf(buildReportDocDefinition(recentEventReport()));
    expect(Buffer.isBuffer(pdf)).toBe(true);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.length).toBeGreaterThan(10_000);
    expect(pdf.toString('latin1')).toMatch(/Roboto/);
  });

  it('renders the no-go, comparison and sister-reference cases too, and twice from the same definition', async () => {
    const def = buildReportDocDefinition({ ...internalFaultReport(), screening: { ...internalFaultReport().screening, comparison: true } });
    const a = await renderPdf(def);
    const b = await renderPdf(def);
    expect(a.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(b.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const s = await renderPdf(buildReportDocDefinition(exampleCaseReport('sisters-no-baseline')));
    expect(s.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });

  it('has the title block: report name, unit, site, event, computed at and by, criteria version', () => {
    const text = allText(buildReportDocDefinition(recentEventReport()));
    expect(text).toContain('Gapsight screening report');
    expect(text).toContain('CONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)');
    expect(text).toMatch(/#318: three-phase fault, LV side, 2026-11-28 03:12 \+00:00 Europe\/London/);
    expect(text).toContain('2026-11-29 14:05 +00:00 Europe/London by Priya Natarajan <priya.natarajan@kestrel-valley.example>');
    expect(text).toMatch(/Computed with\ncriteria set 1, rules revision \d/);
    expect(text).not.toContain('COMPARISON RUN');
  });

  it('says a comparison run is not the basis of a decision', () => {
    const d = recentEventReport();
    d.screening = { ...d.screening, comparison: true, criteriaVersion: 2 };
    expect(allText(buildReportDocDefinition(d))).toMatch(/COMPARISON RUN — not the basis of a decision \(criteria set 2, rules revision \d\)\./);
  });

  it('has a verdict banner with the recommendation word (never colour alone) and the one-line reason', () => {
    const def = buildReportDocDefinition(recentEventReport());
    const text = allText(def);
    expect(text).toContain('RECOMMENDATION\nCONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)\n');
    expect(text).toContain('CHL capacitance shifted +3.42 % against the 2009-03-18 baseline (investigate from 3 %)');
    expect(JSON.stringify(def.content)).toContain('"canvas"');
    const noGo = allText(buildReportDocDefinition(internalFaultReport()));
    expect(noGo).toMatch(/RECOMMENDATION\nNO-GO — \S+ \(Quarry Lane, T1\)\n/);
    expect(noGo).toContain('Internal fault suspected');
  });

  it('prints every through-fault field with its unit in words (no column of field names), the cumulative I²t labelled as a Gapsight tally', () => {
    const d = recentEventReport();
    const def = buildReportDocDefinition(d);
    const text = allText(def);
    const lines = text.split('\n');
    for (const field of Object.keys(d.result.throughFault!)) expect(lines).not.toContain(field);
    expect(lines).not.toContain('Field');
    const table = (def.content as Content[]).find((c) => typeof c === 'object' && c !== null && 'table' in c && JSON.stringify(c).includes('Mechanical segment start')) as { table: { body: unknown[][] } };
    expect(table.table.body.length - 1).toBeGreaterThanOrEqual(Object.keys(d.result.throughFault!).length);
    expect(table.table.body[0]).toHaveLength(3);
    expect(text).toContain('Cumulative I²t — Gapsight tally (not an IEEE figure)');
    expect(text).toContain('× rated');
    expect(text).toContain('(× rated)²·s');
    expect(text).toContain('9.002'); // currentPerUnit, rounded for reading
    expect(text).toContain('89.35'); // forceRatioPercent
  });

  it('lists the reasons, missing and unreliable items, and the follow-ups', () => {
    const d = recentEventReport();
    d.result = { ...d.result, missing: ['sweep'], unreliable: ['reactance.B'] };
    const text = allText(buildReportDocDefinition(d));
    for (const r of d.result.reasons) expect(text).toContain(r);
    for (const f of d.result.followUps) expect(text).toContain(f);
    expect(text).toContain('Missing: sweep\n');
    expect(text).toContain('reactance phase B: ');
    expect(text).not.toContain('(reactance.B)');
  });

  it('lists a sweep without a baseline trace as not judged (no baseline trace to compare with), apart from the missing items', () => {
    const d = recentEventReport();
    d.result = { ...d.result, missing: ['sweep.hv.B.no-baseline', 'dissolvedGasPPM'], unreliable: [] };
    const text = allText(buildReportDocDefinition(d));
    expect(text).toContain('Missing: dissolved gases\n');
    expect(text).toContain('Not judged: sweep of HV phase B (no baseline trace to compare with)\n');
    expect(text).not.toMatch(/Missing: [^\n]*sweep/);
  });

  it('has every indicator in the indicator table by its name, with the level word, rule, source and method; a null value shows its note', () => {
    const d = recentEventReport();
    const text = allText(buildReportDocDefinition(d));
    for (const i of d.result.indicators) {
      expect(text).toContain(indicatorLabel(i.key));
      expect(text.split('\n')).not.toContain(i.key);
      expect(text).toContain(codesInWords(i.rule));
      expect(text).toContain(sourceInTable(i.source));
    }
    expect(text).toContain('INVESTIGATE');
    expect(text).toContain('OK');
    expect(text).toContain('+3.42 %');
    const nullOne = d.result.indicators.find((i) => i.value === null)!;
    expect(text).toContain(`— (${nullOne.note})`);
  });

  it('prints the cautions verbatim, every sentence, in a box', () => {
    const d = recentEventReport();
    const def = buildReportDocDefinition(d);
    const text = allText(def);
    for (const c of d.result.cautions) expect(text).toContain(c);
    for (const c of CAUTIONS) expect(text).toContain(c);
    const box = (def.content as Content[]).find(
      (c) => typeof c === 'object' && c !== null && 'table' in c && JSON.stringify(c).includes(d.result.cautions[0]),
    );
    expect(box).toBeDefined();
  });

  it('has a footer with page x / y and the screening id', () => {
    const def = buildReportDocDefinition(recentEventReport());
    expect(typeof def.footer).toBe('function');
    const footer = JSON.stringify((def.footer as (p: number, n: number) => unknown)(2, 7));
    expect(footer).toContain('Page 2 / 7');
    expect(footer).toContain('screening #4711');
  });

  it('is pure: the input is not changed, and rendering leaves the definition as it was built', async () => {
    const d = recentEventReport();
    const before = JSON.stringify(d);
    const def = buildReportDocDefinition(d);
    expect(JSON.stringify(d)).toBe(before);
    const defBefore = JSON.stringify(def);
    await renderPdf(def);
    expect(JSON.stringify(def)).toBe(defBefore);
    expect(JSON.stringify(buildReportDocDefinition(d))).toBe(defBefore);
  });
});

describe('PDF screening report under rules revision 2', () => {
  it('renders every revision-2 fixture and the stored revision-1 results', async () => {
    const all = [lineAssumedReport, deltaMeasuredReport, thermalRegionReport, inServiceNoGoReport, dutyOnlyGoReport, doubtsReport, storedRevision1Report, storedRevision1InServiceReport];
    for (const make of all) {
      const pdf = await renderPdf(buildReportDocDefinition(make()));
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    }
  });

  it('names the criteria set and rules revision in the title block; a revision-1 result says it predates revision 2', () => {
    expect(allText(buildReportDocDefinition(thermalRegionReport()))).toContain('Computed with\ncriteria set 2, rules revision 2\n');
    expect(allText(buildReportDocDefinition(storedRevision1Report()))).toContain(
      'Computed with\ncriteria set 1, rules revision 1 — stored before rules revision 2 (line currents, no basis per finding); re-screen to apply it',
    );
  });

  it('prints the winding current with its factor and basis, in words and in the through-fault table', () => {
    const text = allText(buildReportDocDefinition(deltaMeasuredReport()));
    expect(text).toContain('5.8 × rated winding current, 28 % of the design force');
    expect(text).toContain('Winding current: line current converted by the vector group, factor 1.732.');
    expect(text).toContain('Largest shot current (winding current)\n5.775\n× rated\n');
    expect(text).toContain('Winding-current factor (winding = factor × line per unit)\n1.732\n\n');
    expect(text).toContain('Current basis: line current converted by the vector group\nconverted\n\n');
    expect(text.split('\n')).not.toContain('line-converted');

    const assumed = allText(buildReportDocDefinition(lineAssumedReport()));
    expect(assumed).toContain('Winding current: line current used as it is — the winding current could not be derived; enter it or attach the relay record.');
    expect(assumed).toContain('Winding-current factor (winding = factor × line per unit)\n— (unknown)\n');
    expect(assumed).toContain('Largest shot current (line current taken as winding current)');
  });

  it('tells thermal-region duty as time against the allowed time; the share of K is not applied', () => {
    const d = thermalRegionReport();
    const text = allText(buildReportDocDefinition(d));
    expect(text).toContain('0.35 s of the 85.9 s the curve allows (0.41 %), within the thermal curve');
    expect(text).toContain('Event duty (of the mechanical limit; high-duty events only)\nnot applied\n\n');
    expect(text).toContain("Shot time (of the thermal curve's allowed time; below the high-duty threshold)\n0.4072\n%\n");
    expect(text).toContain('not applied: thermal region (below the high-duty threshold), see the time against the curve'); // duty.eventDutyPercent row
    expect(text).not.toMatch(/(?<![\d.])3\.35(?!\d)/); // eventDutyPercent, not told for a thermal-region event (a sweep's R 3.357 is another figure)
    expect(text).not.toContain('of the mechanical limit (I²t');

    const high = allText(buildReportDocDefinition(deltaMeasuredReport()));
    expect(high).toContain('Event duty 4.4 % of the mechanical limit (I²t 10.3 of K = 236 (× rated)²·s)');
    expect(high).toContain('Event duty (of the mechanical limit; high-duty events only)\n4.378\n%\n');
    expect(high).toContain("Shot time (of the thermal curve's allowed time; below the high-duty threshold)\n— (high duty)\n\n");
  });

  it('gives every indicator its basis in words, marks low-confidence items with their note, and explains the words', () => {
    const text = allText(buildReportDocDefinition(doubtsReport()));
    expect(text).toContain('Method / basis');
    const row = (key: string, method: string, basis: string) => new RegExp(`${escapeRe(indicatorLabel(key))}\\n[^]*?${escapeRe(method)}\\n${escapeRe(basis)}\\n`);
    expect(text).toMatch(row('capacitance.CHL.shiftPercent', 'capacitance', 'against own baseline'));
    expect(text).toMatch(row('capacitance.CHL.shiftFromPreviousPercent', 'capacitance', 'against own previous test'));
    expect(text).toMatch(row('ratio.A.deviationFromNameplatePercent', 'turns ratio', 'state (absolute value)'));
    expect(text).toMatch(row('duty.eventDutyPercent', 'through-fault duty', 'duty'));
    expect(text).toContain('LOW CONFIDENCE: temperature correction uncertain (insulation 12 °C and 31 °C)');
    expect(text).toContain('Basis: against own baseline / previous test = a change of this unit');
    expect(allText(buildReportDocDefinition(thermalRegionReport()))).toMatch(row('sweep.hv.AC.class', 'frequency-response sweep', 'phase A vs C'));
    expect(allText(buildReportDocDefinition(thermalRegionReport()))).toContain('Sweep HV phase A vs C DL/T 911 class');
    // Revision 1: no basis recorded, said once above the table.
    expect(allText(buildReportDocDefinition(storedRevision1Report()))).toContain('Basis per indicator not recorded: criteria set 1, rules revision 1.');
  });

  it('lists the unreliable items with their repeat instructions', () => {
    const text = allText(buildReportDocDefinition(doubtsReport()));
    expect(text).toContain('reactance phase A: tap mismatch (baseline at tap 9b, post-fault at 11): repeat at tap 9b');
    expect(text).toContain(
      'excitation current: all phases moved the same way on a core not demagnetised (residual magnetism likely): demagnetise and repeat; take excitation and sweeps before DC tests',
    );
    expect(text).toContain('CL capacitance: implausible against the reference — check the unit of measure and the connection');
    expect(text).toContain('sweep HV-B-short: tap mismatch (baseline trace 9b, post-fault 11): repeat at tap 9b');
  });

  it('a unit in service with a no-go reads "take out of service for tests", never "do not re-energise"', () => {
    const text = allText(buildReportDocDefinition(inServiceNoGoReport()));
    expect(text).toMatch(/RECOMMENDATION\nNO-GO, take out of service for tests — \S+ \(/);
    expect(text).toContain('NO-GO: take out of service for tests.');
    expect(text).not.toMatch(/do not re-?energi[sz]e/i);
    // A unit that tripped keeps the hold wording.
    expect(allText(buildReportDocDefinition(internalFaultReport()))).toContain('NO-GO: hold: do not re-energise.');
  });

  it('a duty-only go says it rests on the duty figures alone, with no post-fault tests', () => {
    const text = allText(buildReportDocDefinition(dutyOnlyGoReport()));
    expect(text).toMatch(/RECOMMENDATION\nGO \(in service\) — \S+ \(/);
    expect(text).toContain('GO: may stay in service (with the follow-ups below) — this go rests on the duty figures alone, with no post-fault tests.');
    expect(text).toContain('None required: the unit stayed in service and the fault was below the high-duty threshold (duty-only path).');
    expect(text).toContain('This go rests on the duty figures alone, with no post-fault tests.');
    expect(text).not.toContain('may be re-energised');
  });

  it('an older in-service result: follow-ups counted from the event', () => {
    const text = allText(buildReportDocDefinition(storedRevision1InServiceReport()));
    expect(text).toContain('The unit stayed in service: count these from the event (2026-11-12)');
    expect(allText(buildReportDocDefinition(storedRevision1Report()))).not.toContain('count these from the event');
  });

  it('prints all five cautions verbatim, once each, for revision-1 and revision-2 results', () => {
    for (const d of [storedRevision1Report(), storedRevision1InServiceReport(), thermalRegionReport(), dutyOnlyGoReport()]) {
      const text = allText(buildReportDocDefinition(d));
      for (const c of CAUTIONS) expect(text.split(c).length - 1).toBe(1);
    }
  });
});

describe('the report text and the embedded fonts', () => {
  it('uses only characters the font of each run can draw, on every example and revision-2 fixture', async () => {
    const fontkitModule = (await import('fontkit')) as unknown as { openSync?: (p: string) => unknown; default?: { openSync(p: string): unknown } };
    const openSync = fontkitModule.openSync ?? fontkitModule.default!.openSync;
    const faces = new Map(
      Object.entries(bundledPdfFonts()).map(([name, f]) => [name, [...new Set(Object.values(f))].map((p) => openSync(p) as { hasGlyphForCodePoint(cp: number): boolean })]),
    );
    const cases = ['clean-go', 'conditional', 'duty-only-go', 'high-duty-missing', 'no-go-internal', 'no-go-readings', 'sisters-no-baseline', 'sweeps'];
    const revision2 = [lineAssumedReport(), deltaMeasuredReport(), thermalRegionReport(), inServiceNoGoReport(), dutyOnlyGoReport(), doubtsReport()];
    const stored = [storedRevision1Report(), storedRevision1InServiceReport()];
    const runs = [recentEventReport(), internalFaultReport(), ...cases.map(exampleCaseReport), ...revision2, ...stored].flatMap((d) => pdfRuns(buildReportDocDefinition(d)));
    // The new wording itself (× ² · —) is among the strings checked.
    expect(runs.map((r) => r.text).join('\n')).toContain('× rated winding current');
    const missing = new Set(runs.flatMap((r) => [...r.text].filter((ch) => !(faces.get(r.font) ?? []).length || faces.get(r.font)!.some((f) => !f.hasGlyphForCodePoint(ch.codePointAt(0)!))).map((ch) => `${ch} in ${r.font}`)));
    expect([...missing]).toEqual([]);
  });
});
