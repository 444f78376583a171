// Charts of the PDF report as pdfmake content: the shared chart functions (shared/charts/*) give the numbers and the SVG;
// this file only wraps them in pdfmake nodes (an `svg` node, drawn by pdfmake's bundled svg-to-pdfkit in Roboto, with
// the same numbers in a small table beside it).
import type { Content, TableCell } from 'pdfmake/interfaces.js';
import { dutyCurveSeries, dutyCurveSvg, type DutyFaultShots } from '../../shared/charts/duty-curve.js';
import { formatSignificant } from '../../shared/format.js';
import { criteriaV1 } from '../../shared/screening/criteria-sets.js';
import type { ScreeningReportData } from './report-data.js';

/** Width of the chart on the A4 page (515 pt between the margins). */
export const DUTY_CURVE_WIDTH = 480;
const DUTY_CURVE_HEIGHT = 290;

const cell = (text: string, right = false): TableCell => ({ text, alignment: right ? 'right' : 'left' });
const seconds = (s: number) => (Number.isFinite(s) ? formatSignificant(s, 3) : 'no limit');

/**
 * The through-fault duty curve (IEEE C57.109 as the engine reads it) with this fault's and the unit's earlier faults'
 * shots, the shots in a table and the cumulative duty in words; empty when the case has no fault with shots.
 */
export function dutyCurveContent(d: ScreeningReportData): Content[] {
  const fault = d.case.fault;
  if (!fault || fault.shots.length === 0) return [];
  const curve = dutyCurveSeries({ unit: d.case.unit, fault, priorFaults: d.case.priorFaults ?? [], criteria: d.criteria ?? criteriaV1 });
  const s = curve.summary;
  const k = formatSignificant(curve.mechanicalLimitI2t, 4);
  const rows: TableCell[][] = [
    [
      { text: 'Fault', style: 'th' },
      { text: 'Current (× rated)', style: 'th', alignment: 'right' },
      { text: 'Duration (s)', style: 'th', alignment: 'right' },
      { text: `I²t (${s.unit})`, style: 'th', alignment: 'right' },
      { text: 'Allowed time (s)', style: 'th', alignment: 'right' },
    ],
  ];
  const addRows = (f: DutyFaultShots, name: string) => {
    for (const shot of f.shots) {
      rows.push([
        cell(name),
        cell(formatSignificant(shot.currentPerUnit, 3), true),
        cell(formatSignificant(shot.durationS, 3), true),
        cell(formatSignificant(shot.i2t, 3), true),
        cell(seconds(shot.allowedS), true),
      ]);
    }
  };
  if (curve.event) addRows(curve.event, `This fault, ${curve.event.label}`);
  for (const p of curve.prior) addRows(p, `Earlier fault, ${p.label}`);
  const earlier = curve.prior.length === 1 ? '1 earlier fault' : `${curve.prior.length} earlier faults`;
  const tally =
    `Cumulative I²t ${formatSignificant(s.cumulativeI2t, 3)} ${s.unit} (this fault ${formatSignificant(s.eventI2t, 3)}, ` +
    `${earlier} ${formatSignificant(s.priorI2t, 3)}) = ${formatSignificant(s.cumulativeDutyPercent, 3)} % of K = ${k} ${s.unit} (Gapsight tally).`;
  return [
    {
      stack: [
        { text: 'Duty curve: current and time of each shot against the withstand curve', bold: true, margin: [0, 8, 0, 2] },
        { svg: dutyCurveSvg(curve, { width: DUTY_CURVE_WIDTH, height: DUTY_CURVE_HEIGHT }), width: DUTY_CURVE_WIDTH },
        { text: tally, margin: [0, 2, 0, 4] },
      ],
      unbreakable: true,
    },
    { table: { headerRows: 1, widths: ['*', 70, 60, 80, 75], body: rows }, layout: 'lightHorizontalLines', style: 'table' },
  ];
}
