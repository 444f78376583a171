// The mail of a signed decision, for the site's control room and the testers: outcome first, then restrictions,
// reason, who signed and when (site time), the recommendation it followed or went against, and the cautions. Pure.
import type { ScreeningReportData } from './report-data.js';
import { PALETTE, PDF_ATTACHED_LINE, cautionsOf, decisiveReason } from './report-text.js';
import { escapeHtml, type ManagerMail } from './manager-mail.js';
import { OUTCOME_LABELS, RECOMMENDATION_WORD, codesInWords } from '../../shared/vocabulary.js';
import { formatInstant } from '../../shared/format.js';
import type { DecisionOutcome } from '../../shared/schemas/enums.js';

export interface DecisionMailFacts {
  outcome: DecisionOutcome;
  restrictions: string | null;
  reason: string;
  againstRecommendation: boolean;
  signedAt: string;
  signedBy: { name: string; email: string } | null;
}

const oneLine = (s: string) => s.replace(/[\r\n\t]+/g, ' ').replace(/\s{2,}/g, ' ').trim();

/** "[Gapsight] Decision: RELEASE WITH RESTRICTIONS — KVP-HX-T2 (Harrow Cross)". */
export function decisionMailSubject(d: ScreeningReportData, f: DecisionMailFacts): string {
  return oneLine(`[Gapsight] Decision: ${OUTCOME_LABELS[f.outcome].word.toUpperCase()} — ${d.unit.serial} (${d.site.name})`).slice(0, 500);
}

function sections(d: ScreeningReportData, f: DecisionMailFacts): { title: string; lines: string[] }[] {
  const tz = d.site.timeZone;
  const rec = RECOMMENDATION_WORD[d.result.recommendation];
  const signer = f.signedBy ? `${f.signedBy.name} <${f.signedBy.email}>` : 'unknown';
  return [
    { title: 'Decision', lines: [`${OUTCOME_LABELS[f.outcome].word} — ${d.unit.serial} (${d.site.name}${d.unit.position ? `, ${d.unit.position}` : ''})`] },
    { title: 'Restrictions', lines: [f.restrictions ? oneLine(f.restrictions) : 'None.'] },
    { title: 'Reason', lines: [oneLine(f.reason)] },
    { title: 'Signed', lines: [`By ${signer} at ${formatInstant(f.signedAt, tz)}`] },
    {
      title: 'Recommendation',
      lines: [
        f.againstRecommendation
          ? `This decision goes AGAINST the screening's ${rec} recommendation.`
          : `This decision follows the screening's ${rec} recommendation.`,
        `Screening's reason: ${codesInWords(decisiveReason(d.result))}`,
        `Screened: ${formatInstant(d.screening.computedAt, tz)}; fault: ${formatInstant(d.event.occurredAt, tz)}`,
      ],
    },
    { title: 'Cautions', lines: cautionsOf(d.result) },
    { title: 'Open the event', lines: [d.eventUrl, PDF_ATTACHED_LINE] },
  ];
}

/** The decision's mail: subject, plain text and HTML with the same content. */
export function buildDecisionMail(d: ScreeningReportData, f: DecisionMailFacts): ManagerMail {
  const subject = decisionMailSubject(d, f);
  const secs = sections(d, f);
  const text = [...secs.flatMap((s) => [s.title.toUpperCase(), ...s.lines, '']), '— Gapsight'].join('\n');
  const e = escapeHtml;
  const body = secs
    .map((s) => {
      const box = s.title === 'Cautions' ? `border:1px solid ${PALETTE.slate};background:${PALETTE.paper};padding:8px 12px;` : '';
      return (
        `<div style="margin-top:14px;${box}"><h3 style="margin:0 0 4px 0;font-size:15px;color:${PALETTE.slate};">${e(s.title)}</h3>` +
        s.lines.map((l) => `<p style="margin:2px 0;">${e(l)}</p>`).join('') +
        '</div>'
      );
    })
    .join('');
  const html =
    `<!DOCTYPE html><html><head><meta charset="utf-8"><title>${e(subject)}</title></head><body>` +
    `<div style="font-family:Roboto,'Segoe UI',Arial,sans-serif;font-size:14px;line-height:1.4;color:${PALETTE.graphite};max-width:720px;">${body}` +
    `<p style="margin-top:16px;color:${PALETTE.muted};font-size:12px;">— Gapsight</p></div></body></html>`;
  return { subject, text, html };
}
