// The mail and the PDF on results the engine computes now (rules revision 2, criteria set 2) for every example case,
// as tripped and as stayed in service: the wording rules hold whatever the readings say.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCase, type GapsightCase } from '../../../shared/schemas/case.js';
import { criteriaV2, screenCase } from '../../../shared/screening/index.js';
import { CAUTIONS } from '../../../shared/screening/verdict.js';
import { buildManagerMail } from '../../../server/reports/manager-mail.js';
import { buildReportDocDefinition } from '../../../server/reports/screening-report.js';
import type { ScreeningReportData } from '../../../server/reports/report-data.js';
import { caseReport } from './report-fixtures.js';
import { pdfRuns, pdfText } from './pdf-text.js';
import { itemWords } from '../../../server/reports/report-text.js';
import { bundledPdfFonts } from '../../../server/reports/pdf.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const casesDir = path.join(root, 'examples/cases');
const caseFiles = [
  ...readdirSync(casesDir)
    .filter((f) => f.endsWith('.json') && !f.endsWith('.result.json'))
    .sort()
    .map((f) => `cases/${f}`),
  'demo/recent-event.case.json',
];

function loadCase(file: string): GapsightCase {
  const parsed = parseCase(JSON.parse(readFileSync(path.join(root, 'examples', file), 'utf8')));
  if (!parsed.ok) throw new Error(`${file} does not validate`);
  return parsed.value;
}

/** A stored screening of the case as the engine screens it today. */
function screened(c: GapsightCase): ScreeningReportData {
  const stored = caseReport(c, screenCase(c, criteriaV2));
  return { ...stored, screening: { ...stored.screening, criteriaVersion: 2 }, criteria: criteriaV2 };
}

const inService = (c: GapsightCase): GapsightCase => (c.fault ? { ...c, fault: { ...c.fault, transformerTripped: false } } : c);
function withoutTests(c: GapsightCase): GapsightCase {
  const { postFault: _dropped, sweeps: _sweeps, ...rest } = inService(c);
  void _dropped;
  void _sweeps;
  return rest;
}
const VARIANTS = { 'as recorded': (c: GapsightCase) => c, 'stayed in service': inService, 'stayed in service, no post-fault tests': withoutTests } as const;

const occurrences = (text: string, part: string) => text.split(part).length - 1;

describe('mail and PDF on the results the engine computes now (every example case, tripped and in service)', () => {
  it('finds the example cases, and at least one duty-only go among the variants', () => {
    expect(caseFiles.length).toBeGreaterThanOrEqual(8);
    const dutyOnlyGo = caseFiles.map((f) => screened(withoutTests(loadCase(f)))).filter((d) => d.result.recommendation === 'go' && d.result.throughFault && !d.result.throughFault.highDuty);
    expect(dutyOnlyGo.length).toBeGreaterThan(0);
  });

  for (const file of caseFiles) {
    for (const variant of Object.keys(VARIANTS) as (keyof typeof VARIANTS)[]) {
      it(`${file}, ${variant}`, () => {
        const c = VARIANTS[variant](loadCase(file));
        const d = screened(c);
        const r = d.result;
        const mail = buildManagerMail(d);
        const pdf = pdfText(buildReportDocDefinition(d));

        for (const out of [mail.text, pdf]) {
          expect(out).toContain('criteria set 2, rules revision 2');
          for (const caution of CAUTIONS) expect(occurrences(out, caution)).toBe(1);
        }

        const tf = r.throughFault;
        if (tf) {
          expect(mail.text).toMatch(/^Winding current: /m);
          if (tf.highDuty) expect(mail.text).toMatch(/Event duty [\d.]+ % of the mechanical limit/);
          else {
            expect(mail.text).toMatch(/Thermal region \(below the high-duty threshold\): [\d.]+ s (of the [\d.]+ s the curve allows \([\d.]+ %\)|of shots; the thermal curve sets no time limit)/);
            expect(mail.text).not.toMatch(/of the mechanical limit/);
          }
        }

        // Findings carry their basis in words; low-confidence ones their doubt.
        for (const i of r.indicators.filter((x) => x.level !== 'ok' && x.method !== 'duty')) {
          expect(i.basis).toBeDefined();
          const words = { change: /against own (baseline|previous test|pre-fault sample)\)/, sisters: /against sister units\)/, 'phase-comparison': /phase A vs C\)/, state: /, state \(absolute value\)\)/, duty: /, duty\)/ }[i.basis!];
          expect(mail.text).toMatch(words);
          if (i.lowConfidence) expect(mail.text).toContain(`LOW CONFIDENCE: ${i.note}`);
        }
        for (const u of r.unreliable) {
          expect(u).toMatch(/^\S+$/); // named by its case field
          expect(mail.text).toMatch(/^Outstanding: .*\(unreliable: \S/m);
          expect(pdf).toContain(`${itemWords(u)}: `); // in words, with its instruction
          expect(pdf).not.toContain(`(${u})`);
        }

        if (variant !== 'as recorded' && c.fault) {
          for (const out of [mail.subject, mail.text, mail.html, pdf]) expect(out).not.toMatch(/do not re-?energi[sz]e/i);
          if (r.recommendation === 'no-go') {
            expect(mail.subject).toContain('NO-GO, take out of service for tests');
            expect(pdf).toContain('NO-GO: take out of service for tests.');
          }
          if (r.recommendation === 'go' && !tf?.highDuty && !c.postFault) {
            expect(mail.text).toContain('this go rests on the duty figures alone, with no post-fault tests');
          }
        }
      });
    }
  }

  it('prints only characters the embedded fonts can draw (each run in its own font), for every example and variant', async () => {
    const fontkitModule = (await import('fontkit')) as unknown as { openSync?: (p: string) => unknown; default?: { openSync(p: string): unknown } };
    const openSync = fontkitModule.openSync ?? fontkitModule.default!.openSync;
    const faces = new Map(
      Object.entries(bundledPdfFonts()).map(([name, f]) => [name, [...new Set(Object.values(f))].map((p) => openSync(p) as { hasGlyphForCodePoint(cp: number): boolean })]),
    );
    const runs = caseFiles.flatMap((f) => Object.values(VARIANTS).flatMap((v) => pdfRuns(buildReportDocDefinition(screened(v(loadCase(f)))))));
    const missing = new Set(runs.flatMap((r) => [...r.text].filter((ch) => !(faces.get(r.font) ?? []).length || faces.get(r.font)!.some((f) => !f.hasGlyphForCodePoint(ch.codePointAt(0)!))).map((ch) => `${ch} in ${r.font}`)));
    expect([...missing]).toEqual([]);
    expect(runs.map((r) => r.text).join('\n')).toContain('× rated winding current');
    expect(runs.some((r) => r.text.includes('→'))).toBe(true); // arrows printed, in the symbol font
  });
});
