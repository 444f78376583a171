// Every character the PDF report prints exists in the font it is printed in (issue 10, item 5): the definition's runs
// are checked code point by code point with fontkit (pdfkit's own font library) against the very files pdf.ts embeds —
// Roboto's four faces for the text, the symbol font for the arrows and marks Roboto lacks.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseCase, type GapsightCase } from '../../../shared/schemas/case.js';
import { criteriaV2, screenCase } from '../../../shared/screening/index.js';
import { bundledPdfFonts, bundledRobotoFonts, bundledSymbolFont, renderPdf } from '../../../server/reports/pdf.js';
import { PDF_SYMBOL_CHARACTERS, PDF_SYMBOL_FONT } from '../../../server/reports/report-text.js';
import { buildReportDocDefinition } from '../../../server/reports/screening-report.js';
import type { ScreeningReportData } from '../../../server/reports/report-data.js';
import {
  caseReport,
  doubtsReport,
  exampleCaseReport,
  inServiceNoGoReport,
  internalFaultReport,
  recentEventReport,
  storedRevision1InServiceReport,
  storedRevision1Report,
  thermalRegionReport,
} from './report-fixtures.js';
import { pdfRuns, pdfText, renderedRuns } from './pdf-text.js';
import { headlineOf } from '../../../server/reports/report-text.js';

interface Font {
  hasGlyphForCodePoint(cp: number): boolean;
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

async function openFont(file: string): Promise<Font> {
  const fontkitModule = (await import('fontkit')) as unknown as { openSync?: (p: string) => unknown; default?: { openSync(p: string): unknown } };
  const openSync = fontkitModule.openSync ?? fontkitModule.default!.openSync;
  return openSync(file) as Font;
}

/** Every face of every font pdf.ts registers, opened with fontkit, by font name. */
async function embeddedFaces(): Promise<Map<string, Font[]>> {
  const out = new Map<string, Font[]>();
  for (const [name, faces] of Object.entries(bundledPdfFonts())) out.set(name, await Promise.all([...new Set(Object.values(faces))].map(openFont)));
  return out;
}

/** The demo's recent event (examples/demo/recent-event.case.json) as the engine screens it today. */
function demoRecentEventScreened(): ScreeningReportData {
  const parsed = parseCase(JSON.parse(readFileSync(path.join(root, 'examples/demo/recent-event.case.json'), 'utf8')));
  if (!parsed.ok) throw new Error('the demo case does not validate');
  const c: GapsightCase = parsed.value;
  const d = caseReport(c, screenCase(c, criteriaV2));
  return { ...d, screening: { ...d.screening, criteriaVersion: 2 }, criteria: criteriaV2 };
}

/** Rich cases: the demo's recent event screened now, a no-go, a revision-1 result, doubts, in service, sweeps. */
const RICH: [string, () => ScreeningReportData][] = [
  ['the demo recent event screened now', demoRecentEventScreened],
  ['the demo recent event as stored (revision 1)', recentEventReport],
  ['an internal-fault no-go', internalFaultReport],
  ['a no-go in service', inServiceNoGoReport],
  ['a revision-1 result', storedRevision1Report],
  ['a revision-1 result in service', storedRevision1InServiceReport],
  ['doubts (tap mismatch, remanence, implausible)', doubtsReport],
  ['a thermal-region event', thermalRegionReport],
  ['sweeps', () => exampleCaseReport('sweeps')],
  ['no baseline, sisters', () => exampleCaseReport('sisters-no-baseline')],
];

/** Code points of a text that a font lacks. */
const missingIn = (text: string, faces: Font[]) => [...new Set([...text])].filter((ch) => faces.some((f) => !f.hasGlyphForCodePoint(ch.codePointAt(0)!)));

/** Every non-ASCII character of a source file outside its comments (what its words can print). */
function nonAscii(rel: string): string[] {
  const code = readFileSync(path.join(root, rel), 'utf8')
    .replace(/\/\*[\s\S]*?\*\//g, '')
    .replace(/^\s*\/\/.*$/gm, '')
    .replace(/\s\/\/ .*$/gm, '');
  return [...new Set([...code].filter((ch) => ch.codePointAt(0)! > 127))];
}

describe('PDF glyphs: every printed character exists in the embedded font it is printed in', () => {
  for (const [name, make] of RICH) {
    it(`${name}: every run's characters are in every face of its font`, async () => {
      const faces = await embeddedFaces();
      const def = buildReportDocDefinition(make());
      const runs = pdfRuns(def);
      expect(runs.length).toBeGreaterThan(100);
      const missing: string[] = [];
      for (const run of runs) {
        const f = faces.get(run.font);
        if (!f) {
          missing.push(`font ${run.font} is not embedded`);
          continue;
        }
        for (const ch of missingIn(run.text, f)) missing.push(`${ch} (U+${ch.codePointAt(0)!.toString(16).toUpperCase()}) in ${run.font}: "${run.text}"`);
      }
      expect(missing).toEqual([]);
    });
  }

  it('prints the arrows as written, in the symbol font (no stand-in character)', async () => {
    const def = buildReportDocDefinition(demoRecentEventScreened());
    const text = pdfText(def);
    expect(text).toMatch(/≥ [\d.]+ % → (watch|investigate|critical)/); // a rule, arrow included
    expect(text).not.toContain('›');
    const arrowRuns = pdfRuns(def).filter((r) => r.text.includes('→'));
    expect(arrowRuns.length).toBeGreaterThan(0);
    for (const r of arrowRuns) {
      expect(r.font).toBe(PDF_SYMBOL_FONT);
      expect([...r.text].every((ch) => PDF_SYMBOL_CHARACTERS.includes(ch))).toBe(true);
    }
  });

  it('the symbol font has every symbol character, and Roboto lacks each one (else it would print in Roboto)', async () => {
    const roboto = await Promise.all(Object.values(bundledRobotoFonts().Roboto).map(openFont));
    const symbols = await Promise.all([...new Set(Object.values(bundledSymbolFont()[PDF_SYMBOL_FONT]))].map(openFont));
    for (const ch of PDF_SYMBOL_CHARACTERS) {
      expect(missingIn(ch, symbols), ch).toEqual([]);
      expect(roboto.every((f) => f.hasGlyphForCodePoint(ch.codePointAt(0)!)), ch).toBe(false);
    }
    // The arrows the issue names are among them.
    for (const ch of '→↑↓') expect(PDF_SYMBOL_CHARACTERS).toContain(ch);
  });

  it('every symbol the vocabulary, the criteria sets, the cautions and the report words use can be printed', async () => {
    const roboto = await Promise.all(Object.values(bundledRobotoFonts().Roboto).map(openFont));
    const named = [...'→↑↓δ°²·—−≥≤×Ωµ‰±…“”’‘–√≈']; // the list and what the rules write
    const sources = ['shared/vocabulary.ts', 'shared/screening/criteria-sets.ts', 'shared/screening/verdict.ts', 'shared/screening/cautions.ts', 'server/reports/report-text.ts', 'server/reports/screening-report.ts'];
    const chars = new Set([...named, ...sources.flatMap(nonAscii)]);
    const unprintable = [...chars].filter((ch) => !PDF_SYMBOL_CHARACTERS.includes(ch) && missingIn(ch, roboto).length > 0);
    expect(unprintable).toEqual([]);
  });

  it('a character drawn in a font that lacks it is seen in the rendered PDF (the check below can fail)', async () => {
    const pdf = await renderPdf({ content: [{ text: 'PF20 ≥ 1 % → watch' }], defaultStyle: { font: 'Roboto' } });
    const runs = renderedRuns(pdf);
    expect(runs.map((r) => r.text).join('')).toContain('PF20');
    expect(runs.reduce((n, r) => n + r.notdef, 0)).toBe(1); // the arrow, in Roboto
  });

  for (const [name, make] of RICH.slice(0, 5)) {
    it(`${name}: the rendered PDF draws every character with a glyph of its font, the arrows in the symbol font`, async () => {
      const d = make();
      const runs = renderedRuns(await renderPdf(buildReportDocDefinition(d)));
      expect(runs.length).toBeGreaterThan(100);
      expect(runs.filter((r) => r.notdef > 0)).toEqual([]);
      const text = runs.map((r) => r.text).join('');
      expect(text).not.toContain('\uFFFD');
      expect(text.replace(/\s+/g, '')).toContain(headlineOf(d).title.replace(/\s+/g, ''));
      for (const r of runs.filter((x) => /[→↑↓]/.test(x.text))) expect(r.font).toBe('FontAwesome7Free-Solid');
      if (pdfText(buildReportDocDefinition(d)).includes('→')) expect(runs.some((r) => r.text.includes('→'))).toBe(true);
    });
  }

  it('embeds the symbol font in the rendered PDF beside Roboto', async () => {
    const pdf = (await renderPdf(buildReportDocDefinition(demoRecentEventScreened()))).toString('latin1');
    expect(pdf).toMatch(/\/BaseFont \/[A-Z]{6}\+Roboto-Regular/);
    expect(pdf).toMatch(/\/BaseFont \/[A-Z]{6}\+FontAwesome7Free-Solid/);
  });
});
