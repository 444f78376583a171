// The PDF screening report as a pdfmake document definition. Pure: no I/O (rendering is in ./pdf.ts).
// Verdict first (banner with word, icon and one-line reason), then reasons, then the evidence, then the data.
// Levels and recommendations are never shown by colour alone: the word is always printed.
import type { CanvasElement, Column, Content, TDocumentDefinitions, TableCell } from 'pdfmake/interfaces.js';
import type { Indicator, Level, ThroughFault } from '../../shared/schemas/result.js';
import type { ScreeningReportData } from './report-data.js';
import { dutyCurveContent } from './pdf-charts.js';
import {
  BASIS_LEGEND,
  PALETTE,
  RECOMMENDATION_LEVEL,
  THERMAL_REGION_DUTY,
  basisWords,
  cautionsOf,
  caveatsInWords,
  codesInWords,
  dutyInWords,
  dutyOnlyWithoutTests,
  engineRevisionOf,
  faultInWords,
  fieldInWords,
  followUpTimingNote,
  headlineOf,
  indicatorValueText,
  itemWords,
  levelColour,
  onDutyOnlyPath,
  protectionSummary,
  PDF_SYMBOL_CHARACTERS,
  PDF_SYMBOL_FONT,
  recommendationMeaning,
  rulesInWords,
  shotsInWords,
  sourceInTable,
  sourcesInDetail,
  testsInWords,
  unreliableItems,
  windingCurrentInWords,
} from './report-text.js';
import { faultTypeWord, indicatorLabel, LEVEL_WORD, methodWord, RECOMMENDATION_WORD, STATUS_LABELS } from '../../shared/vocabulary.js';
import { reasonInWords } from '../../shared/screening/headline.js';
import { lacksBaselineTrace } from '../../shared/screening/verdict.js';
import { formatInstant, formatSignificant } from '../../shared/format.js';
import { frequencyResponseOf } from './pdf-sweep.js';

const LEVEL_ORDER: Record<Level, number> = { critical: 0, investigate: 1, watch: 2, ok: 3 };

/**
 * An icon-like glyph drawn as vector shapes (Roboto lacks ✓ ▲ ✕): ok a circle with a tick, watch an outlined triangle
 * with "!", investigate a filled triangle with "!", critical a filled octagon with a cross. `fg` is the shape's colour,
 * `mark` the colour of the mark inside filled shapes.
 */
export function levelIcon(level: Level, size: number, fg: string, mark = '#ffffff'): Column {
  const s = size;
  const lw = Math.max(0.8, s / 10);
  let shapes: CanvasElement[];
  const bang = (colour: string): CanvasElement[] => [
    { type: 'line', x1: s / 2, y1: s * 0.38, x2: s / 2, y2: s * 0.68, lineWidth: lw * 1.3, lineColor: colour, lineCap: 'round' },
    { type: 'ellipse', x: s / 2, y: s * 0.82, r1: lw * 0.75, color: colour },
  ];
  const triangle = [
    { x: s / 2, y: 0.5 },
    { x: s - 0.5, y: s - 0.5 },
    { x: 0.5, y: s - 0.5 },
  ];
  switch (level) {
    case 'ok':
      shapes = [
        { type: 'ellipse', x: s / 2, y: s / 2, r1: s / 2 - lw / 2, lineWidth: lw, lineColor: fg },
        {
          type: 'polyline',
          points: [
            { x: s * 0.28, y: s * 0.52 },
            { x: s * 0.44, y: s * 0.68 },
            { x: s * 0.73, y: s * 0.34 },
          ],
          lineWidth: lw * 1.3,
          lineColor: fg,
          lineCap: 'round',
        },
      ];
      break;
    case 'watch':
      shapes = [{ type: 'polyline', points: triangle, closePath: true, lineWidth: lw, lineColor: fg }, ...bang(fg)];
      break;
    case 'investigate':
      shapes = [{ type: 'polyline', points: triangle, closePath: true, color: fg, lineColor: fg }, ...bang(mark)];
      break;
    case 'critical': {
      const c = s / 2;
      const r = s / 2;
      const points = Array.from({ length: 8 }, (_, k) => {
        const a = Math.PI / 8 + (k * Math.PI) / 4;
        return { x: c + r * Math.cos(a), y: c + r * Math.sin(a) };
      });
      shapes = [
        { type: 'polyline', points, closePath: true, color: fg, lineColor: fg },
        { type: 'line', x1: s * 0.32, y1: s * 0.32, x2: s * 0.68, y2: s * 0.68, lineWidth: lw * 1.4, lineColor: mark, lineCap: 'round' },
        { type: 'line', x1: s * 0.68, y1: s * 0.32, x2: s * 0.32, y2: s * 0.68, lineWidth: lw * 1.4, lineColor: mark, lineCap: 'round' },
      ];
      break;
    }
  }
  return { canvas: shapes, width: s };
}

/** Level cell: icon + word, in the level's colour. */
function levelCell(level: Level): TableCell {
  return {
    columns: [levelIcon(level, 7, levelColour(level)), { text: LEVEL_WORD[level], color: levelColour(level), bold: level !== 'ok', margin: [3, 0, 0, 0] }],
    columnGap: 0,
  };
}

const tableLayout = {
  hLineWidth: (i: number) => (i === 0 ? 0 : 0.5),
  vLineWidth: () => 0,
  hLineColor: () => PALETTE.rule,
  paddingLeft: () => 3,
  paddingRight: () => 3,
  paddingTop: () => 2,
  paddingBottom: () => 2,
};

const heading = (text: string): Content => ({ text, style: 'h2' });

/** An event status in words, in a sentence ("screened"); an unknown status as it is. */
const statusWord = (status: string): string => STATUS_LABELS[status as keyof typeof STATUS_LABELS]?.word.toLowerCase() ?? status;

/** The current basis in the value column, in short words (the code, e.g. "line-converted", is never printed). */
const CURRENT_BASIS_VALUE: Record<string, string> = { winding: 'winding', 'line-converted': 'converted', 'line-assumed': 'line as winding' };

const CURRENT_BASIS_WORDS: Record<string, string> = {
  winding: 'given as winding current',
  'line-converted': 'line current converted by the vector group',
  'line-assumed': 'line current used as it is (winding current not derived)',
};

/** Labels and units of the through-fault fields (every field printed; unknown extra fields after these). */
function throughFaultFields(tf: ThroughFault): { key: keyof ThroughFault & string; label: string; unit: string; value?: string }[] {
  const revision2 = tf.currentBasis !== undefined;
  const current = !revision2
    ? 'Largest shot current (line current, rules revision 1)'
    : tf.currentBasis === 'line-assumed'
      ? 'Largest shot current (line current taken as winding current)'
      : 'Largest shot current (winding current)';
  return [
    { key: 'category', label: 'IEEE C57.109 / C57.12.00 category', unit: '' },
    { key: 'ratedCurrentA', label: 'Rated line current (side measured)', unit: 'A' },
    { key: 'currentPerUnit', label: current, unit: '× rated' },
    {
      key: 'windingCurrentFactor',
      label: 'Winding-current factor (winding = factor × line per unit)',
      unit: '',
      value: !revision2 ? '— (rules revision 1)' : tf.windingCurrentFactor === null || tf.windingCurrentFactor === undefined ? '— (unknown)' : undefined,
    },
    {
      key: 'currentBasis',
      label: `Current basis: ${!revision2 ? 'line current (rules revision 1)' : CURRENT_BASIS_WORDS[tf.currentBasis ?? ''] ?? String(tf.currentBasis)}`,
      unit: '',
      value: !revision2 ? '—' : CURRENT_BASIS_VALUE[tf.currentBasis ?? ''] ?? String(tf.currentBasis),
    },
    { key: 'maxCurrentPerUnit', label: 'Design maximum current', unit: '× rated' },
    { key: 'forceRatioPercent', label: 'Force ratio (of the design force)', unit: '%' },
    { key: 'segmentStartPerUnit', label: 'Mechanical segment start', unit: '× rated' },
    { key: 'highDuty', label: 'High duty (at or above the segment start)', unit: '' },
    { key: 'i2t', label: 'Event I²t', unit: '(× rated)²·s' },
    { key: 'thermalLimitI2t', label: 'Thermal limit I²t', unit: '(× rated)²·s' },
    { key: 'mechanicalLimitI2t', label: 'Mechanical limit I²t (K)', unit: '(× rated)²·s' },
    {
      key: 'eventDutyPercent',
      label: 'Event duty (of the mechanical limit; high-duty events only)',
      unit: tf.highDuty ? '%' : '',
      value: tf.highDuty ? undefined : 'not applied',
    },
    {
      key: 'thermalDurationPercent',
      label: "Shot time (of the thermal curve's allowed time; below the high-duty threshold)",
      unit: !tf.highDuty && typeof tf.thermalDurationPercent === 'number' ? '%' : '',
      value: tf.highDuty ? '— (high duty)' : !revision2 && tf.thermalDurationPercent === undefined ? '— (rules revision 1)' : undefined,
    },
    { key: 'beyondCurve', label: 'Beyond the through-fault curve', unit: '' },
    { key: 'cumulativeI2t', label: 'Cumulative I²t — Gapsight tally (not an IEEE figure)', unit: '(× rated)²·s' },
    { key: 'cumulativeDutyPercent', label: 'Cumulative duty — Gapsight tally (not an IEEE figure)', unit: '%' },
    { key: 'shotsAboveSegment', label: 'Shots at or above the segment start (this and prior faults)', unit: 'shots' },
  ];
}

function fieldValue(v: unknown): string {
  if (typeof v === 'boolean') return v ? 'YES' : 'no';
  if (typeof v === 'number') return Number.isInteger(v) ? String(v) : formatSignificant(v, 4);
  if (v === null || v === undefined) return '—';
  return typeof v === 'object' ? JSON.stringify(v) : String(v);
}

/** The through-fault figures as the PDF's table words them (label, value, unit), every field, unknown ones spelt out. */
export function throughFaultInWords(tf: ThroughFault): { label: string; value: string; unit: string }[] {
  const fields = throughFaultFields(tf);
  const known = new Set<string>(fields.map((f) => f.key));
  const record = tf as Record<string, unknown>;
  return [
    ...fields.map((f) => ({ label: f.label, value: f.value ?? fieldValue(record[f.key]), unit: f.unit })),
    ...Object.entries(record)
      .filter(([k]) => !known.has(k))
      .map(([k, v]) => ({ label: fieldInWords(k), value: fieldValue(v), unit: '' })),
  ];
}

function throughFaultTable(tf: ThroughFault): Content {
  const fields = throughFaultFields(tf);
  const known = new Set<string>(fields.map((f) => f.key));
  const rows: TableCell[][] = [
    [
      { text: 'Quantity', style: 'th' },
      { text: 'Value', style: 'th', alignment: 'right' },
      { text: 'Unit', style: 'th' },
    ],
  ];
  const record = tf as Record<string, unknown>;
  for (const f of fields) {
    rows.push([f.label, { text: f.value ?? fieldValue(record[f.key]), alignment: 'right' }, f.unit]);
  }
  for (const [k, v] of Object.entries(record)) {
    if (known.has(k)) continue;
    rows.push([fieldInWords(k), { text: fieldValue(v), alignment: 'right' }, '']);
  }
  return { table: { headerRows: 1, widths: ['*', 80, 70], body: rows }, layout: tableLayout, style: 'table' };
}

function indicatorTable(indicators: readonly Indicator[], tf: ThroughFault | null): Content {
  const sorted = indicators
    .map((i, n) => ({ i, n }))
    .sort((a, b) => LEVEL_ORDER[a.i.level] - LEVEL_ORDER[b.i.level] || a.n - b.n)
    .map((x) => x.i);
  const rows: TableCell[][] = [
    [
      { text: 'Indicator', style: 'th' },
      { text: 'Value', style: 'th', alignment: 'right' },
      { text: 'Level', style: 'th' },
      { text: 'Rule', style: 'th' },
      { text: 'Source', style: 'th' },
      { text: 'Method / basis', style: 'th' },
    ],
  ];
  for (const i of sorted) {
    const valueText = codesInWords(indicatorValueText(i, tf));
    const asWords = i.value === null || valueText === THERMAL_REGION_DUTY;
    const extra = [i.reference ? `vs ${codesInWords(i.reference)}` : '', i.value !== null && i.note && !i.lowConfidence ? codesInWords(i.note) : ''].filter(Boolean).join(' · ');
    const low = i.lowConfidence ? [{ text: `LOW CONFIDENCE: ${i.note ? codesInWords(i.note) : 'judged under a known doubt'}`, style: 'small', bold: true, color: PALETTE.watch }] : [];
    const basis = basisWords(i);
    rows.push([
      { text: indicatorLabel(i.key), bold: i.level !== 'ok' },
      { stack: [{ text: valueText, alignment: asWords ? 'left' : 'right', ...(asWords ? { style: 'small' } : {}) }, ...(extra ? [{ text: extra, style: 'small' }] : []), ...low] },
      levelCell(i.level),
      { text: codesInWords(i.rule), style: 'small' },
      { text: sourceInTable(i.source), style: 'small' },
      { stack: [{ text: methodWord(i.method), style: 'small' }, ...(basis ? [{ text: basis, style: 'small', italics: true, color: PALETTE.slate }] : [])] },
    ]);
  }
  return {
    table: { headerRows: 1, dontBreakRows: true, widths: [108, 72, 54, '*', '*', 54], body: rows },
    layout: tableLayout,
    style: 'indicatorTable',
  };
}

const SYMBOL_RUN = new RegExp(`([${PDF_SYMBOL_CHARACTERS}]+)`, 'u');

/** A text split into runs: the symbols Roboto lacks in the symbol font, the rest as it is ("a → b": "a ", →, " b"). */
function symbolRuns(text: string): (string | { text: string; font: string })[] {
  return text
    .split(SYMBOL_RUN)
    .map((part, k) => (k % 2 === 1 ? { text: part, font: PDF_SYMBOL_FONT } : part))
    .filter((part) => part !== '');
}

const hasSymbol = (v: unknown): v is string => typeof v === 'string' && [...v].some((ch) => PDF_SYMBOL_CHARACTERS.includes(ch));

/**
 * Copies a definition's content, printing every symbol Roboto lacks (arrows, ticks) in the symbol font, as written: a
 * string that holds one becomes inline runs (a `text` value becomes an array, any other string a `{ text: [...] }`
 * node). Strings without such a symbol, and functions (the footer), are kept as they are.
 */
function withSymbolFont<T>(v: T, key?: string): T {
  if (hasSymbol(v)) return (key === 'text' ? symbolRuns(v) : { text: symbolRuns(v) }) as T;
  if (Array.isArray(v)) return v.map((x) => withSymbolFont(x)) as T;
  if (v && typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype) {
    return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, withSymbolFont(x, k)])) as T;
  }
  return v;
}

/** The document definition of the screening report for one stored screening. Pure. */
export function buildReportDocDefinition(d: ScreeningReportData): TDocumentDefinitions {
  const def = reportDocDefinition(d);
  return { ...def, content: withSymbolFont(def.content) };
}

function reportDocDefinition(d: ScreeningReportData): TDocumentDefinitions {
  const r = d.result;
  const tz = d.site.timeZone;
  const rec = r.recommendation;
  const recLevel = RECOMMENDATION_LEVEL[rec];
  const recColour = levelColour(recLevel);
  const word = RECOMMENDATION_WORD[rec];
  const headline = headlineOf(d);
  const position = d.unit.position ? ` · ${d.unit.position}` : '';
  const content: Content[] = [];

  content.push({ text: 'Gapsight screening report', style: 'title', margin: [0, 0, 0, 4] });
  if (d.screening.comparison) {
    content.push({
      table: {
        widths: ['*'],
        body: [[{ text: `COMPARISON RUN — not the basis of a decision (${rulesInWords(d)}).`, bold: true, color: PALETTE.watch, margin: [6, 4, 6, 4] }]],
      },
      layout: { hLineColor: () => PALETTE.watch, vLineColor: () => PALETTE.watch },
      margin: [0, 0, 0, 6],
    });
  }

  // Verdict banner, the same headline as the screen's banner and the mail (shared/screening/headline.ts): icon, word,
  // unit, what the word means, and the decisive reason, white on the recommendation's colour.
  content.push({
    table: {
      widths: [34, '*'],
      body: [
        [
          { stack: [levelIcon(recLevel, 28, '#ffffff', recColour)], fillColor: recColour, margin: [6, 8, 0, 6] },
          {
            fillColor: recColour,
            color: '#ffffff',
            margin: [4, 5, 6, 6],
            stack: [
              { text: 'RECOMMENDATION', fontSize: 7 },
              { text: headline.title, fontSize: headline.title.length > 48 ? 14 : 17, bold: true },
              { text: `${word}: ${recommendationMeaning(d)}.`, fontSize: 10, margin: [0, 2, 0, 0] },
              { text: headline.reason, fontSize: 10, bold: true, margin: [0, 2, 0, 0] },
            ],
          },
        ],
      ],
    },
    layout: 'noBorders',
    margin: [0, 2, 0, 6],
  });

  // Title block
  const computedBy = d.screening.computedBy ? `${d.screening.computedBy.name} <${d.screening.computedBy.email}>` : '—';
  const mva = d.unit.ratedKVA / 1000;
  const titleRows: [string, string][] = [
    ['Unit', `${d.unit.serial}${position} — design ${d.unit.designReference}; ${formatSignificant(mva, 4)} MVA ${formatSignificant(d.unit.hvKV, 4)}/${formatSignificant(d.unit.lvKV, 4)} kV, ${formatSignificant(d.unit.impedancePercent, 4)} % Z`],
    ['Site', `${d.site.name} (time zone ${d.site.timeZone})`],
    ['Event', `#${d.event.id}: ${faultTypeWord(d.event.type)} fault, ${d.event.side.toUpperCase()} side, ${formatInstant(d.event.occurredAt, tz)} — status ${statusWord(d.event.status)}`],
    ['Computed', `${formatInstant(d.screening.computedAt, tz)} by ${computedBy}`],
    ['Computed with', `${rulesInWords(d)}${engineRevisionOf(r) < 2 ? ' — stored before rules revision 2 (line currents, no basis per finding); re-screen to apply it' : ''}`],
    ['Screening', `#${d.screening.id}${d.screening.comparison ? ' (comparison run)' : ''}`],
    ['Event file', d.eventUrl],
  ];
  content.push({
    table: { widths: [80, '*'], body: titleRows.map(([k, v]) => [{ text: k, style: 'label' }, { text: v }]) },
    layout: 'noBorders',
    margin: [0, 0, 0, 4],
  });

  // Protection and fault
  const prot = protectionSummary(d);
  content.push(heading('Protection and fault'));
  content.push({ text: prot.line, bold: prot.internalSuspected, color: prot.internalSuspected ? PALETTE.critical : PALETTE.graphite });
  content.push({ text: faultInWords(d) });
  content.push({ text: `${shotsInWords(d.case)}.`, margin: [0, 0, 0, 4] });
  if (d.event.faultedPhases) content.push({ text: `Faulted phases: ${d.event.faultedPhases}.` });
  if (d.event.notes) content.push({ text: `Notes: ${d.event.notes}` });
  content.push(heading('Through-fault duty (IEEE C57.109)'));
  const winding = windingCurrentInWords(r.throughFault);
  if (winding) content.push({ text: winding, bold: r.throughFault?.currentBasis === 'line-assumed', color: r.throughFault?.currentBasis === 'line-assumed' ? PALETTE.watch : PALETTE.graphite });
  const duty = dutyInWords(r, d.case);
  if (duty) content.push({ text: duty, margin: [0, 0, 0, 4] });
  if (r.throughFault) content.push(throughFaultTable(r.throughFault), ...dutyCurveContent(d));
  else content.push({ text: 'No fault current recorded: no duty figures.', italics: true });

  // Reasons
  content.push(heading('Reasons'));
  content.push(r.reasons.length ? { ol: r.reasons.map((x) => codesInWords(reasonInWords(x))) } : { text: 'No reason recorded.', italics: true });

  // Missing and unreliable
  content.push(heading('Missing and unreliable items'));
  if (!r.missing.length && !r.unreliable.length) {
    content.push({
      text: onDutyOnlyPath(d)
        ? 'None required: the unit stayed in service and the fault was below the high-duty threshold (duty-only path).'
        : 'None: the required set is complete and consistent.',
    });
  }
  // A sweep without a baseline trace is not missing: it is not judged ("… (no baseline trace to compare with)"), as on the screen.
  const missing = r.missing.filter((m) => !lacksBaselineTrace(m));
  const notJudged = r.missing.filter(lacksBaselineTrace);
  if (missing.length) content.push({ text: [{ text: 'Missing: ', bold: true }, missing.map(itemWords).join(', ')] });
  if (notJudged.length) content.push({ text: [{ text: 'Not judged: ', bold: true }, notJudged.map(itemWords).join(', ')] });
  if (r.unreliable.length) {
    content.push({ text: 'Unreliable (not judged; a required one counts as missing) — repeat as stated:', bold: true, margin: [0, 2, 0, 0] });
    content.push({ ul: unreliableItems(d).map((u) => ({ text: [{ text: u.words, bold: true }, `: ${codesInWords(u.instruction)}`] })) });
  }
  const tests = testsInWords(d);
  content.push({ text: [{ text: 'Tests done: ', bold: true }, tests.done.length ? tests.done.join('; ') : 'no post-fault tests yet'], margin: [0, 2, 0, 0] });
  if (dutyOnlyWithoutTests(d)) content.push({ text: 'This go rests on the duty figures alone, with no post-fault tests.', bold: true });

  // Data caveats
  content.push(heading('Data caveats'));
  content.push({ ul: caveatsInWords(d) });

  // Indicators
  content.push(heading('Indicators'));
  content.push({ text: 'Flagged indicators first. Values rounded for reading; the stored result keeps full precision.', style: 'small', margin: [0, 0, 0, 1] });
  if (r.indicators.some((i) => i.basis !== undefined)) content.push({ text: BASIS_LEGEND, style: 'small', color: PALETTE.muted, margin: [0, 0, 0, 3] });
  else content.push({ text: `Basis per indicator not recorded: ${rulesInWords(d)}.`, style: 'small', color: PALETTE.muted, margin: [0, 0, 0, 3] });
  content.push(r.indicators.length ? indicatorTable(r.indicators, r.throughFault) : { text: 'No indicators computed.', italics: true });
  const detail = sourcesInDetail(r.indicators);
  if (detail.length) {
    content.push({ text: 'Criteria detail: the sources as the criteria set words them', bold: true, margin: [0, 6, 0, 1] });
    content.push({
      text: 'The table names the published documents; "from memory" means the figure was cited as remembered, not checked against the document’s text.',
      style: 'small',
      color: PALETTE.muted,
      margin: [0, 0, 0, 2],
    });
    content.push({ ul: detail.map((x) => ({ text: x, style: 'small' })) });
  }

  content.push(...frequencyResponseOf(d));

  // Follow-ups
  content.push(heading('Follow-ups (proposed)'));
  content.push(r.followUps.length ? { ul: [...r.followUps] } : { text: 'None proposed.' });
  const timing = followUpTimingNote(d);
  if (timing) content.push({ text: timing, italics: true, margin: [0, 2, 0, 0] });

  // Testers
  content.push(heading('Tested by'));
  content.push(d.testers.length ? { ul: d.testers.map((t) => `${t.name} <${t.email}>`) } : { text: 'No tester recorded on the post-fault sessions.' });

  // Cautions, boxed, every sentence verbatim
  content.push(heading('Cautions'));
  content.push({
    table: {
      widths: ['*'],
      body: [[{ stack: cautionsOf(r).map((c) => ({ text: c, margin: [0, 1, 0, 1] })), margin: [6, 4, 6, 4] }]],
    },
    layout: { hLineColor: () => PALETTE.slate, vLineColor: () => PALETTE.slate, hLineWidth: () => 1, vLineWidth: () => 1 },
    unbreakable: true,
  });

  const footerLeft = `Gapsight screening #${d.screening.id} · ${d.unit.serial} · event #${d.event.id}`;
  return {
    pageSize: 'A4',
    pageMargins: [40, 40, 40, 44],
    info: {
      title: `Gapsight screening report — ${headline.title}`,
      author: 'Gapsight',
      subject: `Screening #${d.screening.id}, event #${d.event.id}`,
      keywords: `screening ${d.screening.id}`,
    },
    content,
    footer: (currentPage: number, pageCount: number): Content => ({
      columns: [
        { text: footerLeft, alignment: 'left' },
        { text: `Page ${currentPage} / ${pageCount}`, alignment: 'right', width: 80 },
      ],
      margin: [40, 14, 40, 0],
      fontSize: 7,
      color: PALETTE.muted,
    }),
    defaultStyle: { font: 'Roboto', fontSize: 9, color: PALETTE.graphite, lineHeight: 1.15 },
    styles: {
      title: { fontSize: 18, bold: true, color: PALETTE.slate },
      subtitle: { fontSize: 12, color: PALETTE.copper, margin: [0, 2, 0, 0] },
      h2: { fontSize: 11, bold: true, color: PALETTE.slate, margin: [0, 10, 0, 3] },
      label: { bold: true, color: PALETTE.slate },
      th: { bold: true, color: PALETTE.slate, fillColor: '#e2e8f0' },
      mono: { fontSize: 6.5, color: PALETTE.muted },
      small: { fontSize: 7 },
      table: { fontSize: 8 },
      indicatorTable: { fontSize: 7.5 },
    },
  };
}
