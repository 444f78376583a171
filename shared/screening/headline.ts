// The one headline of a screening, read the same on the screen's verdict banner, in the PDF and in the manager's mail:
// "CONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)" and the reason that decides it. Pure.
import type { GapsightResult, Recommendation } from '../schemas/result.js';
import { RECOMMENDATION_WORD, protectionWord } from '../vocabulary.js';
import { decisiveReason } from './reasons.js';

/**
 * The recommendation word, with what it means for a unit that stayed in service (it was never de-energised, so a no-go
 * never reads "do not re-energise"): "NO-GO, take out of service for tests", "GO (in service)", "CONDITIONAL (in service)".
 * A unit that tripped: the word alone ("CONDITIONAL").
 */
export function recommendationHeadWord(recommendation: Recommendation, inService: boolean): string {
  const word = RECOMMENDATION_WORD[recommendation];
  if (!inService) return word;
  return recommendation === 'no-go' ? `${word}, take out of service for tests` : `${word} (in service)`;
}

/** The unit as the headline names it: "KVP-HX-T2 (Harrow Cross, T2)" (no position: "KVP-HX-T2 (Harrow Cross)"). */
export function unitInHeadline(unit: { serial: string; position?: string | null }, siteName: string): string {
  const position = unit.position ? `, ${unit.position}` : '';
  return `${unit.serial} (${siteName}${position})`;
}

export interface HeadlineInput {
  result: Pick<GapsightResult, 'recommendation' | 'reasons' | 'indicators' | 'overallLevel'>;
  unit: { serial: string; position?: string | null };
  siteName: string;
  /** The unit stayed in service through the event (the event's `transformerTripped` is false). */
  inService: boolean;
}

export interface Headline {
  /** "CONDITIONAL", "NO-GO, take out of service for tests", "GO (in service)". */
  headWord: string;
  /** "KVP-HX-T2 (Harrow Cross, T2)". */
  unit: string;
  /** "CONDITIONAL — KVP-HX-T2 (Harrow Cross, T2)". */
  title: string;
  /** The reason that decides the recommendation, as the result words it (protections named in words). */
  reason: string;
}

/**
 * A reason as a person reads it: the engine names the protections that operated by their codes ("Internal protection
 * operated (differential, buchholz-trip): …"); here they are words ("(differential, Buchholz trip)"). Other reasons as
 * they are written.
 */
export function reasonInWords(reason: string): string {
  return reason.replace(/^(Internal protection operated \()([^)]*)(\))/, (_, open: string, list: string, close: string) =>
    `${open}${list.split(/,\s*/).map(protectionWord).join(', ')}${close}`,
  );
}

/** The headline of one screening: head word, unit, and the decisive reason. */
export function screeningHeadline(h: HeadlineInput): Headline {
  const headWord = recommendationHeadWord(h.result.recommendation, h.inService);
  const unit = unitInHeadline(h.unit, h.siteName);
  return { headWord, unit, title: `${headWord} — ${unit}`, reason: reasonInWords(decisiveReason(h.result as GapsightResult)) };
}
