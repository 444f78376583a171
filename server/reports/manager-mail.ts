// The operations manager's e-mail for one screening: subject, plain text and simple inline-styled HTML with the same
// content. Pure: no I/O. Written for a tired manager at 3 a.m.: verdict first, short lines.
import type { ScreeningReportData } from './report-data.js';
import {
  BASIS_LEGEND,
  PALETTE,
  PDF_ATTACHED_LINE,
  agreementInWords,
  cautionsOf,
  caveatsInWords,
  dutyInWords,
  dutyOnlyWithoutTests,
  engineRevisionOf,
  faultInWords,
  followUpTimingNote,
  headlineOf,
  onDutyOnlyPath,
  protectionSummary,
  proposedRestrictions,
  recommendationColour,
  recommendationMeaning,
  rulesInWords,
  shortReason,
  shotsInWords,
  stayedInService,
  testsInWords,
  windingCurrentInWords,
} from './report-text.js';
import { RECOMMENDATION_WORD, codesInWords } from '../../shared/vocabulary.js';
import { formatInstant } from '../../shared/format.js';
import { sessionName } from '../../shared/session-name.js';

export interface ManagerMail {
  subject: string;
  text: string;
  html: string;
}

/** A section of the mail: a heading and its lines (each line one short statement; `items` are bulleted). */
interface Section {
  title: string;
  lines?: string[];
  items?: string[];
  /** Heading drawn as a warning (the proposal label). */
  note?: string;
  /** Lines after the items (a legend, a timing note). */
  after?: string[];
}

const oneLine = (s: string) => s.replace(/[\r\n\t]+/g, ' ').replace(/\s{2,}/g, ' ').trim();

/** HTML-escape text (element content and attribute values). */
export function escapeHtml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

const GLYPH = { go: '✓', conditional: '▲', 'no-go': '✕' } as const;

/** The subject: "[Gapsight] CONDITIONAL — KVP-HX-T2 (Harrow Cross): CHL capacitance shifted +3.42 %…" (a unit in service:
 * "NO-GO, take out of service for tests — …", "GO (in service) — …"). */
export function managerMailSubject(d: ScreeningReportData): string {
  const h = headlineOf(d);
  const prefix = d.screening.comparison ? '[Gapsight] Comparison run, not for decision: ' : '[Gapsight] ';
  return oneLine(codesInWords(`${prefix}${h.headWord} — ${d.unit.serial} (${d.site.name}): ${shortReason(h.reason)}`));
}

/**
 * The post-fault session as people name it ("Tests of 29 Nov 2026 12:12 by Theo Tester"). The report data knows who
 * entered the event's sessions, not who entered which: the tester is named when there is exactly one.
 */
function postFaultSessionName(d: ScreeningReportData, takenAt: string): string {
  const only = d.testers.length === 1 ? d.testers[0].name : null;
  return sessionName({ takenAt, createdById: only ? 0 : null }, d.site.timeZone, () => only);
}

function sections(d: ScreeningReportData): { headline: string; meaning: string; reason: string; body: Section[] } {
  const r = d.result;
  const tz = d.site.timeZone;
  // The one headline of the screening: the same as the screen's verdict banner and the PDF.
  const h = headlineOf(d);
  const headline = h.title;
  const meaning = `${RECOMMENDATION_WORD[r.recommendation]}: ${recommendationMeaning(d)}.`;
  const reason = `Why: ${h.reason}`;
  const body: Section[] = [];

  if (d.screening.comparison) {
    body.push({
      title: 'Comparison run',
      lines: [`Computed under ${rulesInWords(d)} for comparison — not the basis of a decision.`],
    });
  }

  const prot = protectionSummary(d);
  body.push({ title: 'Protection', lines: [prot.line] });

  const tf = r.throughFault;
  const faultLines = [`${faultInWords(d)}`, `${shotsInWords(d.case)}.`];
  const winding = windingCurrentInWords(tf);
  if (winding) faultLines.push(winding);
  const duty = dutyInWords(r, d.case);
  if (duty) faultLines.push(duty);
  if (tf?.beyondCurve) faultLines.push('The fault went beyond the through-fault withstand curve.');
  if (d.event.faultedPhases) faultLines.push(`Faulted phases: ${d.event.faultedPhases}.`);
  if (d.event.notes) faultLines.push(`Notes: ${oneLine(d.event.notes)}`);
  body.push({ title: 'The fault', lines: faultLines });

  const computedBy = d.screening.computedBy ? ` by ${d.screening.computedBy.name}` : '';
  const timeLines = [
    `Fault: ${formatInstant(d.event.occurredAt, tz)}`,
    ...(d.case.postFault?.takenAt ? [`Post-fault tests: ${postFaultSessionName(d, d.case.postFault.takenAt)} (${formatInstant(d.case.postFault.takenAt, tz)})`] : []),
    `Screened: ${formatInstant(d.screening.computedAt, tz)}${computedBy}, ${rulesInWords(d)}${engineRevisionOf(r) < 2 ? ' (stored before rules revision 2)' : ''}`,
  ];
  body.push({ title: 'Times', lines: timeLines });

  const tests = testsInWords(d);
  const dutyOnly = onDutyOnlyPath(d);
  const noneOutstanding = dutyOnly
    ? 'none required — the unit stayed in service and the fault was below the high-duty threshold (duty-only path)'
    : 'none — the required set is complete';
  const testLines = [
    `Done: ${tests.done.length ? tests.done.join('; ') : 'no post-fault tests yet'}.`,
    `Outstanding: ${tests.outstanding.length ? tests.outstanding.join('; ') : noneOutstanding}.`,
  ];
  if (dutyOnlyWithoutTests(d)) testLines.push('This go rests on the duty figures alone, with no post-fault tests.');
  body.push({ title: 'Tests', lines: testLines });

  const agree = agreementInWords(r, d.criteria);
  const basisKnown = r.indicators.some((i) => i.basis !== undefined);
  body.push({
    title: 'Where independent methods agree',
    lines: [agree.summary],
    items: agree.groups.map((g) => `${g.method}: ${g.items.join('; ')}`),
    after: agree.groups.length && basisKnown ? [BASIS_LEGEND] : undefined,
  });

  body.push({ title: 'Data caveats', items: caveatsInWords(d) });
  body.push({ title: 'All reasons', items: r.reasons.length ? r.reasons : ['No reason recorded.'] });

  body.push({
    title: 'Proposed restrictions',
    note: 'PROPOSAL for your decision — not a decision; restrictions are yours to set under your procedures.',
    items: proposedRestrictions(r.recommendation, stayedInService(d)),
  });
  const timing = followUpTimingNote(d);
  body.push({ title: 'Follow-ups (proposed)', items: r.followUps.length ? r.followUps : ['None proposed.'], after: timing ? [timing] : undefined });

  const testers = d.testers.length ? d.testers.map((t) => `${t.name} <${t.email}>`) : ['No tester recorded on the post-fault sessions.'];
  if (d.screening.computedBy && !d.testers.some((t) => t.email === d.screening.computedBy?.email)) {
    testers.push(`Screening run by ${d.screening.computedBy.name} <${d.screening.computedBy.email}>`);
  }
  body.push({ title: 'Who tested — how to reach them', items: testers });

  body.push({ title: 'Cautions', lines: cautionsOf(r) });
  body.push({ title: 'Open the event', lines: [d.eventUrl, 'Sign the decision off in Gapsight.', PDF_ATTACHED_LINE] });

  // Engine reasons and follow-ups quote protection codes ("buchholz-trip"): the mail says them in words, like the screen.
  const words = (l: string) => (l === d.eventUrl ? l : codesInWords(l));
  const worded = body.map((sec) => ({ ...sec, lines: sec.lines?.map(words), items: sec.items?.map(words), after: sec.after?.map(words) }));
  return { headline, meaning: codesInWords(meaning), reason: codesInWords(reason), body: worded };
}

function renderText(s: ReturnType<typeof sections>): string {
  const out: string[] = [s.headline, s.meaning, s.reason, ''];
  for (const sec of s.body) {
    out.push(sec.title.toUpperCase());
    if (sec.note) out.push(sec.note);
    for (const l of sec.lines ?? []) out.push(l);
    for (const i of sec.items ?? []) out.push(`- ${i}`);
    for (const l of sec.after ?? []) out.push(l);
    out.push('');
  }
  out.push('— Gapsight');
  return out.join('\n');
}

const isHttpUrl = (u: string) => /^https?:\/\//i.test(u);

function renderHtml(d: ScreeningReportData, s: ReturnType<typeof sections>): string {
  const rec = d.result.recommendation;
  const colour = recommendationColour(rec);
  const e = escapeHtml;
  const p = (t: string) => `<p style="margin:2px 0;">${e(t)}</p>`;
  const parts: string[] = [];
  parts.push(
    `<div style="font-family:Roboto,'Segoe UI',Arial,sans-serif;font-size:14px;line-height:1.4;color:${PALETTE.graphite};max-width:720px;">`,
  );
  parts.push(
    `<div style="background:${colour};color:#ffffff;padding:12px 16px;border-radius:4px;">` +
      `<div style="font-size:22px;font-weight:bold;">${e(GLYPH[rec])} ${e(s.headline)}</div>` +
      `<div style="font-size:15px;margin-top:4px;">${e(s.meaning)}</div>` +
      `<div style="font-size:15px;margin-top:4px;">${e(s.reason)}</div>` +
      `</div>`,
  );
  for (const sec of s.body) {
    const caution = sec.title === 'Cautions';
    const box = caution
      ? `border:1px solid ${PALETTE.slate};background:${PALETTE.paper};padding:8px 12px;margin-top:14px;`
      : 'margin-top:14px;';
    parts.push(`<div style="${box}">`);
    parts.push(`<h3 style="margin:0 0 4px 0;font-size:15px;color:${PALETTE.slate};">${e(sec.title)}</h3>`);
    if (sec.note) parts.push(`<p style="margin:2px 0;font-weight:bold;color:${PALETTE.watch};">${e(sec.note)}</p>`);
    for (const l of sec.lines ?? []) {
      if (l === d.eventUrl && isHttpUrl(l)) parts.push(`<p style="margin:2px 0;"><a href="${e(l)}" style="color:${PALETTE.ok};">${e(l)}</a></p>`);
      else parts.push(p(l));
    }
    if (sec.items?.length) {
      parts.push(`<ul style="margin:2px 0;padding-left:20px;">`);
      for (const i of sec.items) parts.push(`<li>${e(i)}</li>`);
      parts.push('</ul>');
    }
    for (const l of sec.after ?? []) parts.push(`<p style="margin:2px 0;color:${PALETTE.muted};font-size:12px;">${e(l)}</p>`);
    parts.push('</div>');
  }
  parts.push(`<p style="margin-top:16px;color:${PALETTE.muted};font-size:12px;">— Gapsight</p>`);
  parts.push('</div>');
  return `<!DOCTYPE html><html><head><meta charset="utf-8"><title>${e(managerMailSubject(d))}</title></head><body>${parts.join('')}</body></html>`;
}

/** The manager's e-mail for a stored screening: subject, plain text and HTML with the same content. Pure. */
export function buildManagerMail(d: ScreeningReportData): ManagerMail {
  const s = sections(d);
  return { subject: managerMailSubject(d), text: renderText(s), html: renderHtml(d, s) };
}
