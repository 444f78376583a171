// The frequency-response part of the PDF report: each sweep overlay drawn as an SVG node after the indicators, its axis
// titles and band labels drawn in the rendered PDF (in Roboto, every glyph present), R per band as the engine gives it.
import { describe, expect, it } from 'vitest';
import { renderPdf } from '../../../server/reports/pdf.js';
import { bandsInWords, frequencyResponseOf } from '../../../server/reports/pdf-sweep.js';
import { sweepMagnitudeSvg } from '../../../shared/charts/sweep-overlay-svg.js';
import { buildReportDocDefinition } from '../../../server/reports/screening-report.js';
import { criteriaV2 } from '../../../shared/screening/criteria-sets.js';
import { compareTraces } from '../../../shared/screening/sweep.js';
import { sweepOverlays } from '../../../shared/charts/sweep-overlay.js';
import { exampleCaseReport, recentEventReport } from './report-fixtures.js';
import { pdfText, renderedRuns } from './pdf-text.js';

/** Every `svg` string of a definition's content. */
function svgNodes(content: unknown): string[] {
  const out: string[] = [];
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') {
      const svg = (v as { svg?: unknown }).svg;
      if (typeof svg === 'string') out.push(svg);
      Object.values(v).forEach(walk);
    }
  };
  walk(content);
  return out;
}

const sweepsReport = () => {
  const d = exampleCaseReport('sweeps');
  return { ...d, screening: { ...d.screening, criteriaVersion: 2 }, criteria: criteriaV2 };
};

describe('frequency response in the PDF report', () => {
  it('draws one magnitude and one difference drawing per sweep, after the indicators and before the follow-ups', () => {
    const d = sweepsReport();
    const def = buildReportDocDefinition(d);
    const svgs = svgNodes(def.content).filter((s) => s.includes('>Magnitude (dB)</text>'));
    expect(svgs).toHaveLength(d.case.sweeps!.length);
    expect(svgNodes(def.content).filter((s) => s.includes('>Difference (dB)</text>'))).toHaveLength(d.case.sweeps!.length);
    for (const s of svgs) expect(s).toContain('>Frequency (Hz)</text>');
    const text = pdfText(def);
    const at = text.indexOf('\nFrequency response\n');
    expect(at).toBeGreaterThan(text.indexOf('\nIndicators\n'));
    expect(at).toBeLessThan(text.indexOf('\nFollow-ups (proposed)\n'));
    expect(text).toContain('HV winding, phase A, open circuit (HV-A-open): post-fault against baseline');
  });

  it('names each shaded band and gives its R (compareTraces) to 3 decimals and its class under the drawing', () => {
    const d = sweepsReport();
    const s = d.case.sweeps!.find((x) => x.label === 'HV-A-open')!;
    const engine = compareTraces(s.baseline!, s.postFault, criteriaV2);
    const o = sweepOverlays(d.case, criteriaV2).find((x) => x.id === 'HV-A-open')!;
    const svg = sweepMagnitudeSvg(o);
    for (const band of ['low', 'mid', 'high']) expect(svg).toContain(`>${band}</text>`);
    const line = bandsInWords(o);
    expect(line).toContain(`low: R ${engine.rLF!.toFixed(3)}, Severe deformation`);
    expect(line).toContain(`mid: R ${engine.rMF!.toFixed(3)}, Normal`);
    expect(line).toContain(`high: R ${engine.rHF!.toFixed(3)}, Normal`);
    // The stored example result (examples/cases/sweeps.result.json): R_LF 0.2229 → "0.223", class severe.
    expect(line).toContain('low: R 0.223, Severe deformation');
    expect(pdfText(buildReportDocDefinition(d))).toContain(line);
  });

  it('the rendered PDF draws the axis titles and band labels in Roboto, every glyph present', async () => {
    // The report's page, styles and footer with the frequency-response part as its content (the whole report has so many
    // glyphs that the in-process text decoder of pdf-text.ts mixes up some of its font subsets).
    const d = sweepsReport();
    const runs = renderedRuns(await renderPdf({ ...buildReportDocDefinition(d), content: frequencyResponseOf(d) }));
    const text = runs.map((r) => r.text).join('');
    expect(text).toContain('Frequency (Hz)');
    expect(text).toContain('Magnitude (dB)');
    expect(text).toContain('Difference (dB)');
    expect(text).toContain('Frequency response');
    expect(text).toContain('mid: R 3.357, Normal'); // R_MF 3.3569 of HV-A-open (examples/cases/sweeps.result.json)
    const drawn = runs.filter((r) => r.text.includes('Magnitude (dB)'));
    expect(drawn.length).toBe(4);
    for (const r of drawn) expect(r.font).toMatch(/^Roboto/);
    expect(runs.reduce((n, r) => n + r.notdef, 0)).toBe(0);
  });

  it('a report without sweeps has no frequency-response part', () => {
    const d = recentEventReport();
    expect(frequencyResponseOf({ ...d, case: { ...d.case, sweeps: [] } })).toEqual([]);
    expect(pdfText(buildReportDocDefinition({ ...d, case: { ...d.case, sweeps: undefined } }))).not.toContain('Frequency response');
  });
});
