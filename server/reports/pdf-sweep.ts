// The PDF report's frequency-response part: each sweep overlay of the screened case (or A–C phase pair) as a vector
// drawing — magnitude traces on a log frequency axis with the three bands shaded and their R and DL/T 911 class, the
// difference trace below — and a small table of ρ, R and class per band. Series from shared/charts/sweep-overlay.ts
// (the engine's own functions), drawn with shared/charts/svg-plot.ts. Pure.
import type { Content } from 'pdfmake/interfaces.js';
import type { GapsightCase } from '../../shared/schemas/case.js';
import type { Criteria } from '../../shared/screening/criteria.js';
import { BUILT_IN_CRITERIA, criteriaV1 } from '../../shared/screening/criteria-sets.js';
import type { ScreeningReportData } from './report-data.js';
import { sweepOverlays, type SweepOverlay } from '../../shared/charts/sweep-overlay.js';
import { SWEEP_DRAWING_WIDTH, sweepDifferenceSvg, sweepMagnitudeSvg } from '../../shared/charts/sweep-overlay-svg.js';


/** The bands' R and class in one line: "Bands — low: R 0.223, Severe deformation · mid: R 3.357, Normal · …". */
export function bandsInWords(o: SweepOverlay): string {
  return `Bands (shaded) — ${o.bands.map((b) => (b.judged ? `${b.band}: R ${b.rText}, ${b.classText}` : `${b.band}: not judged`)).join(' · ')}`;
}

function bandTable(o: SweepOverlay): Content {
  const head = ['Band', 'ρ', 'R', 'Class from this band', 'Note'].map((t) => ({ text: t, style: 'th' }));
  const rows = o.bands.map((b) => [b.label, b.rhoText, b.rText, b.judged ? b.classText : 'not judged', b.note ?? '']);
  rows.push(['All bands', o.correlation === null ? '—' : o.correlation.toFixed(4), '', o.overallClassText, `${o.gridPoints} common grid points`]);
  return {
    table: { headerRows: 1, widths: ['auto', 'auto', 'auto', 'auto', '*'], body: [head, ...rows] },
    layout: 'lightHorizontalLines',
    style: 'table',
    margin: [0, 2, 0, 6],
  };
}

/** The frequency-response part of the report: a small heading, then per overlay its title, drawings and band table. */
export function frequencyResponseContent(c: GapsightCase, criteria: Criteria): Content[] {
  const overlays = sweepOverlays(c, criteria);
  if (!overlays.length) return [];
  const out: Content[] = [
    { text: 'Frequency response', bold: true, fontSize: 10, margin: [0, 8, 0, 1] },
    {
      text: 'Magnitude against frequency (log scale), the bands shaded with the relative factor R and DL/T 911 class the screening computed; the difference on the 1 kHz grid below.',
      style: 'small',
      margin: [0, 0, 0, 3],
    },
  ];
  for (const o of overlays) {
    const block: Content[] = [{ text: o.title, bold: true, margin: [0, 4, 0, 2] }];
    if (o.kind === 'single') {
      block.push({ svg: sweepMagnitudeSvg(o), width: SWEEP_DRAWING_WIDTH });
      block.push({ text: `Not judged: ${o.notes.join('; ')}.`, style: 'small', margin: [0, 2, 0, 6] });
    } else {
      block.push({ svg: sweepMagnitudeSvg(o), width: SWEEP_DRAWING_WIDTH });
      const diff = sweepDifferenceSvg(o);
      if (diff) block.push({ svg: diff, width: SWEEP_DRAWING_WIDTH });
      block.push({ text: bandsInWords(o), style: 'small', margin: [0, 2, 0, 1] });
      block.push({ text: `DL/T 911 class: ${o.overallClassText}${o.notes.length ? ` (${o.notes.join('; ')})` : ''}`, style: 'small', bold: true, margin: [0, 1, 0, 1] });
      block.push(bandTable(o));
    }
    out.push({ stack: block, unbreakable: true });
  }
  return out;
}

/** The frequency-response part of a screening's report, under the screening's own criteria set (else the built-in one of its version). */
export function frequencyResponseOf(d: ScreeningReportData): Content[] {
  const criteria = d.criteria ?? BUILT_IN_CRITERIA.find((c) => c.version === d.screening.criteriaVersion) ?? criteriaV1;
  return frequencyResponseContent(d.case, criteria);
}
