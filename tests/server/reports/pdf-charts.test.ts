// The duty curve in the PDF report: drawn as an SVG node after the through-fault table, its words and numbers in the
// rendered PDF (in Roboto, every glyph present), the tally agreeing with the engine's.
import { describe, expect, it } from 'vitest';
import type { Content } from 'pdfmake/interfaces.js';
import { renderPdf } from '../../../server/reports/pdf.js';
import { dutyCurveContent } from '../../../server/reports/pdf-charts.js';
import { buildReportDocDefinition } from '../../../server/reports/screening-report.js';
import { computeThroughFault } from '../../../shared/screening/through-fault.js';
import { formatSignificant } from '../../../shared/format.js';
import { recentEventReport } from './report-fixtures.js';
import { renderedRuns } from './pdf-text.js';

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

describe('duty curve in the PDF report', () => {
  it('the report of a screened event with a fault carries the duty curve after the through-fault table', () => {
    const def = buildReportDocDefinition(recentEventReport());
    const svgs = svgNodes(def.content).filter((s) => s.includes('Current (per unit of rated)'));
    expect(svgs).toHaveLength(1);
    expect(svgs[0]).toContain('>Time (s)</text>');
    expect(svgs[0]).toContain('>This fault 2026-11-28</text>');
    expect(svgs[0]).toContain('>Earlier fault 2024-12-12</text>');
  });

  it('the rendered PDF draws the axis titles and the legend in Roboto, every glyph present', async () => {
    const runs = renderedRuns(await renderPdf(buildReportDocDefinition(recentEventReport())));
    const text = runs.map((r) => r.text).join('');
    expect(text).toContain('Current (per unit of rated)');
    expect(text).toContain('Time (s)');
    expect(text).toContain('This fault 2026-11-28');
    expect(text).toContain('Mechanical segment');
    expect(runs.filter((r) => r.notdef > 0)).toEqual([]);
  });

  it("states the cumulative I²t the engine computes (this fault and the unit's earlier one)", () => {
    const d = recentEventReport();
    const tf = computeThroughFault(d.case.unit, d.case.fault, d.case.priorFaults ?? []);
    const texts = JSON.stringify(dutyCurveContent(d));
    expect(texts).toContain(`Cumulative I²t ${formatSignificant(tf!.cumulativeI2t, 3)} per-unit² · s`);
    expect(texts).toContain(`= ${formatSignificant(tf!.cumulativeDutyPercent, 3)} % of K = ${formatSignificant(tf!.mechanicalLimitI2t, 4)} per-unit² · s`);
    expect(texts).toContain('1 earlier fault');
  });

  it('a case without shots has no duty curve', () => {
    const d = recentEventReport();
    d.case = { ...d.case, fault: { ...d.case.fault!, shots: [] } };
    expect(dutyCurveContent(d)).toEqual([] as Content[]);
  });
});
