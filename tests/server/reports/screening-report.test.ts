import { describe, expect, it } from 'vitest';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js';
import { renderPdf } from '../../../server/reports/pdf.js';
import { buildReportDocDefinition, PDF_GLYPH_SUBSTITUTES } from '../../../server/reports/screening-report.js';

// What the PDF prints for a text: characters the bundled font lacks are substituted.
const printed = (s: string) => [...s].map((ch) => PDF_GLYPH_SUBSTITUTES[ch] ?? ch).join('');
import { exampleCaseReport, internalFaultReport, recentEventReport } from './report-fixtures.js';

const PRESENTATION_KEYS = new Set(['style', 'color', 'fillColor', 'alignment', 'lineColor', 'lineCap', 'type', 'widths', 'layout', 'font']);

/** Every string in a document definition (text nodes, table cells, lists, footer of page 2 of 7). */
function allText(def: TDocumentDefinitions): string {
  const out: string[] = [];
  const walk = (v: unknown): void => {
    if (typeof v === 'string') out.push(v);
    else if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) if (!PRESENTATION_KEYS.has(k)) walk(x);
    }
  };
  walk(def.content);
  if (typeof def.footer === 'function') walk(def.footer(2, 7, { width: 595, height: 842, orientation: 'portrait' }) as Content);
  return out.join('\n');
}

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
    expect(text).toContain('KVP-HX-T2 · T2 · Harrow Cross');
    expect(text).toMatch(/#318: three-phase fault, LV side, 2026-11-28 03:12 Europe\/London \(UTC\+00:00\)/);
    expect(text).toContain('2026-11-29 14:05 Europe/London (UTC+00:00) by Priya Natarajan <priya.natarajan@kestrel-valley.example>');
    expect(text).toMatch(/Criteria version\n1\n/);
    expect(text).not.toContain('COMPARISON RUN');
  });

  it('says a comparison run is not the basis of a decision', () => {
    const d = recentEventReport();
    d.screening = { ...d.screening, comparison: true, criteriaVersion: 2 };
    expect(allText(buildReportDocDefinition(d))).toContain('COMPARISON RUN — not the basis of a decision (criteria version 2).');
  });

  it('has a verdict banner with the recommendation word (never colour alone) and the one-line reason', () => {
    const def = buildReportDocDefinition(recentEventReport());
    const text = allText(def);
    expect(text).toContain('Recommendation: CONDITIONAL');
    expect(text).toContain('CHL capacitance shifted +3.42 % against the 2009-03-18 baseline (investigate from 3 %)');
    expect(JSON.stringify(def.content)).toContain('"canvas"');
    const noGo = allText(buildReportDocDefinition(internalFaultReport()));
    expect(noGo).toContain('Recommendation: NO-GO');
    expect(noGo).toContain('Internal fault suspected');
  });

  it('prints every through-fault field with its unit, the cumulative I²t labelled as a Gapsight tally', () => {
    const d = recentEventReport();
    const text = allText(buildReportDocDefinition(d));
    for (const field of Object.keys(d.result.throughFault!)) expect(text).toContain(field);
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
    for (const r of d.result.reasons) expect(text).toContain(printed(r));
    for (const f of d.result.followUps) expect(text).toContain(f);
    expect(text).toContain('sweep (sweep)');
    expect(text).toContain('reactance phase B (reactance.B)');
  });

  it('has every indicator key in the indicator table, with the level word, rule, source and method; a null value shows its note', () => {
    const d = recentEventReport();
    const text = allText(buildReportDocDefinition(d));
    for (const i of d.result.indicators) {
      expect(text).toContain(i.key);
      expect(text).toContain(printed(i.rule));
      expect(text).toContain(i.source);
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

describe('the report text and the bundled Roboto font', () => {
  it('uses only characters the font can draw', async () => {
    const fontkitModule = (await import('fontkit')) as unknown as { openSync?: (p: string) => unknown; default?: { openSync(p: string): unknown } };
    const fontkit = { openSync: (p: string) => (fontkitModule.openSync ?? fontkitModule.default!.openSync)(p) };
    const { createRequire } = await import('node:module');
    const require = createRequire(import.meta.url);
    // The TTF pdfmake ships (pdfmake's package exports do not list it, so resolve its folder from package.json).
    const fontPath = require.resolve('pdfmake/package.json').replace(/package\.json$/, 'fonts/Roboto/Roboto-Regular.ttf');
    const font = fontkit.openSync(fontPath) as unknown as { hasGlyphForCodePoint(cp: number): boolean };
    const strings: string[] = [];
    const walk = (v: unknown) => {
      if (typeof v === 'string') strings.push(v);
      else if (Array.isArray(v)) v.forEach(walk);
      else if (v && typeof v === 'object') Object.values(v).forEach(walk);
    };
    const cases = ['clean-go', 'conditional', 'duty-only-go', 'high-duty-missing', 'no-go-internal', 'no-go-readings', 'sisters-no-baseline', 'sweeps'];
    for (const data of [recentEventReport(), internalFaultReport(), ...cases.map(exampleCaseReport)]) walk(buildReportDocDefinition(data));
    const missing = new Set([...strings.join('')].filter((ch) => ch.charCodeAt(0) > 127 && !font.hasGlyphForCodePoint(ch.codePointAt(0)!)));
    expect([...missing]).toEqual([]);
  });
});
