// What the manager's e-mail and the PDF report say: the narrative built from a stored screening. Pure functions, no I/O.
// Labels for codes come from the shared vocabulary, numbers and times from shared/format.ts; the result JSON keeps full
// precision and everything here rounds for display the way the UI does.
import type { GapsightCase } from '../../shared/schemas/case.js';
import type { GapsightResult, Indicator, Level, Method, Recommendation, ThroughFault } from '../../shared/schemas/result.js';
import { CAUTIONS, corroboratingMethods, describeRequired, isDutyOnlyPath, lacksBaselineTrace } from '../../shared/screening/verdict.js';
import { criteriaV1, type Criteria } from '../../shared/screening/criteria.js';
import { levelRank } from '../../shared/screening/levels.js';
import { decisiveReason } from '../../shared/screening/reasons.js';
import { screeningHeadline, type Headline } from '../../shared/screening/headline.js';
import { INTERNAL_PROTECTIONS, isInternalProtection } from '../../shared/screening/protections.js';
import {
  LEVEL_WORD,
  QUANTITY_LABELS,
  basisLabel,
  faultTypeWord,
  inSentence,
  indicatorLabel,
  indicatorUnit,
  methodWord,
  protectionWord,
} from '../../shared/vocabulary.js';
import { formatCoarse, formatDay, formatFigure, formatPerUnit, formatSignificant, ordinal, wholeYears } from '../../shared/format.js';
import type { ScreeningReportData } from './report-data.js';

export { decisiveReason };

// ---------------------------------------------------------------------------------------------------------------------
// Words

export const levelAtLeast = (l: Level, min: Level) => levelRank(l) >= levelRank(min);

/** What each recommendation means, in one line, for a unit that tripped (see `recommendationMeaning` for one in service). */
export const RECOMMENDATION_MEANING: Record<Recommendation, string> = {
  go: 'may be re-energised (with the follow-ups below)',
  conditional: 'release only with restrictions and the follow-ups below, or hold — your decision',
  'no-go': 'hold: do not re-energise',
};

/** The same for a unit that stayed in service (never "do not re-energise": it was never de-energised). */
export const IN_SERVICE_MEANING: Record<Recommendation, string> = {
  go: 'may stay in service (with the follow-ups below)',
  conditional: 'keep in service only with restrictions and the follow-ups below, or take out of service for tests — your decision',
  'no-go': 'take out of service for tests',
};

/** Words for a duty-only go that no post-fault test supports (case format, "Wording"). */
export const DUTY_FIGURES_ALONE = 'this go rests on the duty figures alone, with no post-fault tests';

/** Palette (levels never by colour alone: the word is always printed beside the colour). */
export const PALETTE = {
  ok: '#0f766e',
  watch: '#b45309',
  investigate: '#c2410c',
  critical: '#9f1239',
  slate: '#334155',
  graphite: '#1f2933',
  muted: '#64748b',
  rule: '#cbd5e1',
  paper: '#f8fafc',
  copper: '#b87333',
} as const;

export const RECOMMENDATION_LEVEL: Record<Recommendation, Level> = { go: 'ok', conditional: 'investigate', 'no-go': 'critical' };
export const recommendationColour = (r: Recommendation) => PALETTE[RECOMMENDATION_LEVEL[r]];
export const levelColour = (l: Level) => PALETTE[l];

/** The basis of one indicator in words; null before revision 2. */
export const basisWords = (i: Indicator): string | null => basisLabel(i);

/** Legend of the basis words, for the PDF and the mail. */
export const BASIS_LEGEND =
  'Basis: against own baseline / previous test = a change of this unit (only changes, not low-confidence ones, count as agreement); against sister units = no own baseline (capped at investigate); phase A vs C = one phase against another, no baseline trace (capped at investigate); state (absolute value) = an absolute or nameplate value (informs, watch at most); duty = the through-fault duty. LOW CONFIDENCE = a change judged under a known doubt, named beside it.';

/** An indicator as the corroboration rule reads it: a stored revision-1 indicator (no basis) counted as a change, as the
 * revision-1 verdict that stored it did. */
const asJudged = (i: Indicator): Indicator => (i.basis === undefined ? { ...i, basis: 'change' } : i);

/** The rules revision a stored result was computed with (results without `engineRevision` are revision 1). */
export const engineRevisionOf = (r: GapsightResult): number => r.engineRevision ?? 1;

/** "criteria set 2, rules revision 2" — what the stored screening was computed with. */
export function rulesInWords(d: ScreeningReportData): string {
  return `criteria set ${d.screening.criteriaVersion}, rules revision ${engineRevisionOf(d.result)}`;
}

/** Whether the unit stayed in service through the event (`transformerTripped: false`; default tripped). */
export function stayedInService(d: ScreeningReportData): boolean {
  const tripped = d.case.fault?.transformerTripped ?? d.event.transformerTripped;
  return tripped === false;
}

/** The duty-only path of the verdict: the unit stayed in service and the fault was not high duty (no tests required). */
export function onDutyOnlyPath(d: ScreeningReportData): boolean {
  return stayedInService(d) && isDutyOnlyPath(d.case, d.result.throughFault);
}

/** A duty-only go: on the duty-only path, go, and no post-fault reading set in the case. */
export function dutyOnlyWithoutTests(d: ScreeningReportData): boolean {
  // As the engine words it: no post-fault reading set at all (with one, the go rests on "the readings given" too).
  return d.result.recommendation === 'go' && onDutyOnlyPath(d) && !d.case.postFault;
}

/** What the recommendation means for this unit, in one line (tripped or in service). */
export function recommendationMeaning(d: ScreeningReportData): string {
  const rec = d.result.recommendation;
  if (!stayedInService(d)) return RECOMMENDATION_MEANING[rec];
  if (dutyOnlyWithoutTests(d)) return `may stay in service (with the follow-ups below) — ${DUTY_FIGURES_ALONE}`;
  return IN_SERVICE_MEANING[rec];
}

/** The one headline of this screening (shared/screening/headline.ts: the same on the screen's banner, the PDF and the mail). */
export function headlineOf(d: ScreeningReportData): Headline {
  return screeningHeadline({ result: d.result, unit: d.unit, siteName: d.site.name, inService: stayedInService(d) });
}

/** The cautions to print: the stored result's sentences, then any current caution they lack (older results stored fewer). */
export function cautionsOf(r: GapsightResult): string[] {
  const stored = r.cautions ?? [];
  return [...stored, ...CAUTIONS.filter((c) => !stored.includes(c))];
}


/** Words in place of the event duty's percentage of K for a thermal-region event (never told as a share of K). */
export const THERMAL_REGION_DUTY = 'not applied: thermal region (below the high-duty threshold), see the time against the curve';

/** An indicator's value for display: rounded, with its unit; a null value shows its note. With the through-fault
 * figures given, a thermal-region event's `duty.eventDutyPercent` is not told as a share of the mechanical K. */
export function indicatorValueText(i: Indicator, tf?: ThroughFault | null): string {
  if (i.key === 'duty.eventDutyPercent' && tf && !tf.highDuty) return THERMAL_REGION_DUTY;
  if (i.value === null) return `— (${i.note ?? 'not computed'})`;
  if (typeof i.value === 'number') {
    const unit = indicatorUnit(i.key);
    const last = i.key.split('.').pop() ?? '';
    const signed = /shift|change|rise|deviation|modifiedZ/i.test(last) || /ChangePoints$/.test(last);
    const digits = last === 'correlation' ? 6 : undefined;
    const text = digits ? formatSignificant(i.value, digits) : Number.isInteger(i.value) ? String(i.value) : formatFigure(i.value, signed);
    return unit ? `${text} ${unit}` : text;
  }
  return String(i.value);
}

// ---------------------------------------------------------------------------------------------------------------------
// What the report says

/** The decisive reason shortened for a subject line: the reference and the threshold in brackets are left off. */
export function shortReason(reason: string, max = 90): string {
  let s = reason.replace(/[\r\n]+/g, ' ').trim();
  let cut = false;
  // The subject's head word already says "take out of service for tests": keep the finding itself.
  const inService = /^Unit is still in service: take out of service for tests \((.*)\)$/.exec(s);
  if (inService) s = inService[1];
  const internal = /^Internal protection operated \(([^)]*)\)/.exec(s);
  if (internal) {
    const names = internal[1].split(/,\s*/).map(protectionWord).join(', ');
    return `Internal protection operated (${names}): internal fault suspected`;
  }
  const against = s.search(/ against (the|its) /);
  if (against > 0) {
    s = s.slice(0, against);
    cut = true;
  }
  const trailingBracket = /\s*\([^()]*\)\s*$/.exec(s);
  if (trailingBracket && trailingBracket.index > 0) {
    s = s.slice(0, trailingBracket.index);
    cut = true;
  }
  if (s.length > max) {
    const space = s.lastIndexOf(' ', max - 1);
    s = s.slice(0, space > max / 2 ? space : max - 1).replace(/[\s,;:—-]+$/, '');
    cut = true;
  }
  return cut ? `${s}…` : s;
}

export interface ProtectionSummary {
  operated: string[];
  internal: string[];
  internalSuspected: boolean;
  line: string;
}

/** Whether a transformer protection operated, and whether it is an internal one. */
export function protectionSummary(d: ScreeningReportData): ProtectionSummary {
  const operated = [...new Set([...(d.event.protectionOperated ?? []), ...(d.case.fault?.protectionOperated ?? [])])];
  // The screening's own criteria set says which protections are internal.
  const internalList = d.criteria?.verdict.internalProtections ?? INTERNAL_PROTECTIONS;
  const internal = operated.filter((p) => isInternalProtection(p, internalList));
  const tripped = stayedInService(d) ? 'the unit stayed in service' : 'the unit tripped';
  let line: string;
  if (internal.length) {
    line = `Internal fault suspected: internal protection operated (${internal.map(protectionWord).join(', ')}); ${tripped}.`;
    const others = operated.filter((p) => !internal.includes(p));
    if (others.length) line += ` Also operated: ${others.map(protectionWord).join(', ')}.`;
  } else if (operated.length) {
    line = `Protection operated: ${operated.map(protectionWord).join(', ')} — no internal protection (${internalList.map(protectionWord).join(', ')}) operated; ${tripped}.`;
  } else {
    line = `No transformer protection recorded as operated; ${tripped}.`;
  }
  return { operated, internal, internalSuspected: internal.length > 0, line };
}

/** What the per-unit current is a multiple of: the winding current (revision 2) or the line current (revision 1, or line-assumed). */
export function currentWords(tf: ThroughFault): string {
  if (tf.currentBasis === undefined) return 'rated line current';
  if (tf.currentBasis === 'line-assumed') return 'rated line current, taken as the winding current';
  return 'rated winding current';
}

/** The fault in plain words: "9.0 × rated winding current, 89 % of the design force (IEEE category IV), the 2nd such fault since 2024". */
export function faultInWords(d: ScreeningReportData): string {
  const tf = d.result.throughFault;
  const type = faultTypeWord(d.event.type);
  const location = d.case.fault?.location;
  const onOther = location !== undefined && location !== d.event.side ? `, fault on the ${location.toUpperCase()} side` : '';
  const where = `${type} fault, current measured on the ${d.event.side.toUpperCase()} side${onOther}`;
  if (!tf) return `${where}; no fault current recorded, so no duty figures.`;
  let s = `${formatPerUnit(tf.currentPerUnit)} × ${currentWords(tf)}, ${formatCoarse(tf.forceRatioPercent)} % of the design force (IEEE category ${tf.category})`;
  const since = d.event.priorHighDutySince ? new Date(d.event.priorHighDutySince) : null;
  const sinceYear = since && !Number.isNaN(since.getTime()) ? ` since ${since.getUTCFullYear()}` : '';
  const prior = d.event.priorHighDutyCount;
  if (tf.highDuty) {
    s += prior > 0 ? `, the ${ordinal(prior + 1)} such fault${sinceYear}` : ', the first such fault on record';
    s += ` — HIGH DUTY (at or above ${formatSignificant(tf.segmentStartPerUnit, 3)} × rated)`;
  } else {
    s += ` — below the high-duty threshold of ${formatSignificant(tf.segmentStartPerUnit, 3)} × rated`;
    if (prior > 0) s += `; ${prior} earlier high-duty fault${prior === 1 ? '' : 's'}${sinceYear}`;
  }
  return `${s}; ${where}.`;
}

/** How the winding current was obtained: the factor used and its basis (revision 2), or that revision 1 used the line current. */
export function windingCurrentInWords(tf: ThroughFault | null): string | null {
  if (!tf) return null;
  const k = tf.windingCurrentFactor;
  switch (tf.currentBasis) {
    case undefined:
      return 'Current: line current as measured — this result is from rules revision 1, before the winding-current conversion by the vector group; re-screen to apply it.';
    case 'line-converted':
      return `Winding current: line current converted by the vector group, factor ${k === null || k === undefined ? 'not recorded' : formatSignificant(k, 4)}.`;
    case 'winding':
      return `Winding current: given as winding current${typeof k === 'number' && formatSignificant(k, 4) !== '1' ? ` (factor ${formatSignificant(k, 4)} to per unit of the winding's own rated current)` : ''}.`;
    case 'line-assumed':
      return 'Winding current: line current used as it is — the winding current could not be derived; enter it or attach the relay record.';
  }
  return null;
}

/** The shots of the event ("6.3 kA for 0.12 s, 6.1 kA for 0.08 s"). */
export function shotsInWords(c: GapsightCase): string {
  const shots = c.fault?.shots ?? [];
  if (!shots.length) return 'no shots recorded';
  const list = shots.map((s) => `${formatSignificant(s.currentKA, 3)} kA for ${formatSignificant(s.durationS, 3)} s`).join(', ');
  return `${shots.length} shot${shots.length === 1 ? '' : 's'}: ${list}`;
}

/**
 * Thermal-region duty as time against the allowed time: "0.35 s of the 14.2 s the curve allows (2.5 %)". The allowed
 * time is read back from the stored `thermalDurationPercent` and the event's shot durations (no second computation).
 * Null for a high-duty event (judged on I²t against K).
 */
export function thermalTimeInWords(tf: ThroughFault | null, c: GapsightCase): string | null {
  if (!tf || tf.highDuty) return null;
  const totalS = (c.fault?.shots ?? []).reduce((sum, s) => sum + s.durationS, 0);
  const total = `${formatSignificant(totalS, 3)} s`;
  const pct = tf.thermalDurationPercent;
  if (typeof pct !== 'number') {
    return `${total} of shots in total (the time the thermal curve allows was not stored with this result: rules revision 1)`;
  }
  if (pct === 0) return `${total} of shots; the thermal curve sets no time limit at this current (0 % of the allowed time)`;
  if (totalS <= 0) return `${formatCoarse(pct)} % of the time the thermal curve allows`;
  const allowedS = (100 * totalS) / pct;
  return `${total} of the ${formatSignificant(allowedS, 3)} s the curve allows (${formatCoarse(pct)} %)`;
}

/** Duty in one line: high duty as I²t against K; thermal region as time against the allowed time; the Gapsight tally. */
export function dutyInWords(result: GapsightResult, c: GapsightCase): string | null {
  const tf = result.throughFault;
  if (!tf) return null;
  const tally = `cumulative ${formatCoarse(tf.cumulativeDutyPercent)} % (Gapsight tally over this and prior faults, not an IEEE figure); ${tf.shotsAboveSegment} shot${tf.shotsAboveSegment === 1 ? '' : 's'} at or above the segment start.`;
  if (tf.highDuty) {
    const curve = tf.beyondCurve ? 'BEYOND the through-fault curve' : 'within the through-fault curve';
    return `Event duty ${formatCoarse(tf.eventDutyPercent)} % of the mechanical limit (I²t ${formatSignificant(tf.i2t, 3)} of K = ${formatSignificant(tf.mechanicalLimitI2t, 3)} (× rated)²·s), ${curve}; ${tally}`;
  }
  const curve = tf.beyondCurve ? 'BEYOND the thermal curve' : 'within the thermal curve';
  return `Thermal region (below the high-duty threshold): ${thermalTimeInWords(tf, c)}, ${curve}; ${tally}`;
}

/** The post-fault sections listed as tests done, in this order, with their words. */
const SECTION_WORDS: [string, string][] = [
  'capacitancePF',
  'dissipationPercent',
  'reactance',
  'threePhaseEquivalent',
  'excitationCurrentMA',
  'windingResistanceOhm',
  'turnsRatio',
  'dissolvedGasPPM',
  'dissipationByFrequency',
].map((field) => [field, inSentence(QUANTITY_LABELS[field])]);

/** Words for a required or unreliable item named by its case field (`sweep.hv.B`, `sweep.<label>`, `turnsRatio`, …). */
export function itemWords(item: string): string {
  const bushing = /^bushings?\.(.+)$/.exec(item);
  if (bushing) return `bushing ${bushing[1]}`;
  return describeRequired(item);
}

/** Indicator key prefixes that belong to an item named by its case field. */
function indicatorPrefixes(item: string): string[] {
  if (item === 'turnsRatio') return ['ratio.'];
  if (item === 'windingResistanceOhm') return ['resistance.'];
  if (item === 'excitationCurrentMA') return ['excitation.'];
  if (item === 'dissolvedGasPPM') return ['gas.'];
  const bushing = /^bushings?\.(.+)$/.exec(item);
  if (bushing) return [`bushing.${bushing[1]}.`];
  const cap = /^capacitance\.(.+)$/.exec(item);
  if (cap) return [`capacitance.${cap[1]}.`, `powerFactor.${cap[1]}.`];
  return [`${item}.`];
}

const INSTRUCTION_NOTE = /repeat|implausible|demagneti|check the unit|check the connection/i;

/** The part of an indicator note that says what to do (its "not judged" and data-quality parts left off). */
function instructionFromNote(note: string): string {
  return note
    .split(/;\s+/)
    .map((part) => part.replace(/:\s*not judged$/i, '').trim())
    .filter((part) => part && !/^not judged$/i.test(part) && !/^data quality/i.test(part))
    .filter((part, k, all) => INSTRUCTION_NOTE.test(part) || (k > 0 && INSTRUCTION_NOTE.test(all[k - 1])))
    .join('; ');
}

export interface UnreliableItem {
  /** The case field (`reactance.A`, `excitationCurrentMA`, `sweep.HV-B-open`). */
  item: string;
  words: string;
  /** What to do: "repeat at tap 9b", "demagnetise and repeat; …", "check the unit of measure and the connection", … */
  instruction: string;
}

/**
 * Every unreliable item with its repeat instruction. The instruction is, in order: text the engine wrote after the field
 * name in the list ("reactance.A: tap mismatch: repeat at tap 9b"), the item's own indicator note when it says what to
 * do, what the case shows (tap positions, test voltage, a core not demagnetised), or "repeat the test".
 */
export function unreliableItems(d: ScreeningReportData): UnreliableItem[] {
  const c = d.case;
  return d.result.unreliable.map((entry) => {
    const split = /^(\S+?):\s+(.+)$/.exec(entry);
    const item = split ? split[1] : entry;
    const words = itemWords(item);
    if (split) return { item, words, instruction: split[2] };
    const prefixes = indicatorPrefixes(item);
    const note = d.result.indicators.find((i) => prefixes.some((p) => i.key.startsWith(p)) && i.note && INSTRUCTION_NOTE.test(i.note))?.note;
    const instruction = note ? instructionFromNote(note) : '';
    if (instruction) return { item, words, instruction };
    const tap = (x: string | number | undefined) => (x === undefined ? undefined : String(x));
    const bt = tap(c.baseline?.tapPosition);
    const pt = tap(c.postFault?.tapPosition);
    if (/^(reactance|turnsRatio|windingResistanceOhm)/.test(item) && bt !== undefined && pt !== undefined && bt !== pt) {
      return { item, words, instruction: `tap mismatch (baseline ${bt}, post-fault ${pt}): repeat at tap ${bt}` };
    }
    if (item.startsWith('sweep.')) {
      const trace = (c.sweeps ?? []).find((s) => s.label === item.slice('sweep.'.length));
      const tt = tap(trace?.tapPosition);
      const btt = tap(trace?.baselineTapPosition) ?? tt;
      if (tt !== undefined && btt !== undefined && tt !== btt) return { item, words, instruction: `tap mismatch (baseline trace ${btt}, post-fault ${tt}): repeat at tap ${btt}` };
      if (trace && trace.testType === 'open-circuit' && !trace.demagnetised) return { item, words, instruction: 'demagnetise and repeat' };
    }
    if (item === 'excitationCurrentMA') {
      const pkv = c.postFault?.excitationKV;
      const bkv = c.baseline?.excitationKV;
      if (pkv !== undefined && bkv !== undefined && pkv !== bkv) return { item, words, instruction: `test voltage differs (baseline ${bkv} kV, post-fault ${pkv} kV): repeat at ${bkv} kV` };
      if (!c.postFault?.demagnetised) return { item, words, instruction: 'demagnetise and repeat; take excitation and sweeps before DC tests' };
    }
    if (item.startsWith('capacitance.')) return { item, words, instruction: 'GST − GST-guard does not match UST: repeat the test' };
    return { item, words, instruction: 'repeat the test' };
  });
}

/** Tests done (post-fault sections present) and outstanding (missing, not judged and unreliable required items), in words. */
export function testsInWords(d: ScreeningReportData): { done: string[]; outstanding: string[] } {
  const post = (d.case.postFault ?? {}) as Record<string, unknown>;
  const done: string[] = [];
  for (const [field, words] of SECTION_WORDS) {
    const v = post[field];
    if (v === undefined || v === null) continue;
    const keys = typeof v === 'object' && !Array.isArray(v) && field !== 'threePhaseEquivalent' && field !== 'dissolvedGasPPM' ? Object.keys(v) : [];
    done.push(keys.length ? `${words} (${keys.join(', ')})` : words);
  }
  const sweeps = (d.case.sweeps ?? []).filter((s) => s.postFault?.length);
  if (sweeps.length) done.push(`frequency-response sweep (${sweeps.length} trace${sweeps.length === 1 ? '' : 's'}: ${sweeps.map((s) => s.label).join(', ')})`);
  const outstanding = [
    // A sweep taken without a baseline trace to compare with is not missing: it is not judged (as the screen says).
    ...d.result.missing.map((m) => (lacksBaselineTrace(m) ? `${itemWords(m)}, not judged` : `${itemWords(m)} (missing)`)),
    ...unreliableItems(d).map((u) => `${u.words} (unreliable: ${u.instruction})`),
  ];
  return { done, outstanding };
}

/** A flagged indicator for a findings list: label, value, level, basis; low-confidence items marked with their doubt. */
export function findingInWords(i: Indicator, tf?: ThroughFault | null): string {
  const basis = basisWords(i);
  const low = i.lowConfidence ? ` — LOW CONFIDENCE: ${i.note ?? 'judged under a known doubt'}` : '';
  return `${indicatorLabel(i.key)} ${indicatorValueText(i, tf)} (${LEVEL_WORD[i.level]}${basis ? `, ${basis}` : ''})${low}`;
}

/** Where independent methods agree: flagged indicators grouped by method, plus the corroboration reason if any. */
export function agreementInWords(result: GapsightResult, criteria: Criteria = criteriaV1): { groups: { method: string; items: string[] }[]; summary: string } {
  const flagged = result.indicators.filter((i) => levelAtLeast(i.level, 'watch'));
  const byMethod = new Map<string, Indicator[]>();
  for (const i of flagged) byMethod.set(i.method, [...(byMethod.get(i.method) ?? []), i]);
  const groups = [...byMethod.entries()].map(([method, list]) => ({
    method: methodWord(method),
    items: list.map((i) => findingInWords(i, result.throughFault)),
  }));
  const corroboration = result.reasons.find((r) => /^Independent methods agree/.test(r));
  // Which methods count as independent (and which are one test) is the criteria set's, as in the verdict; from rules
  // revision 2 only changes that are not low-confidence count (state, duty and low-confidence items inform).
  const vc = criteria.verdict;
  const independentFlagging = new Set<string>(corroboratingMethods(result.indicators.map(asJudged), criteria));
  const tested = new Set(result.indicators.map((i) => vc.sameTestAs[i.method] ?? i.method).filter((m) => vc.independentMethods.includes(m as Method)));
  const quiet = [...tested].filter((m) => !independentFlagging.has(m)).map(methodWord);
  let summary: string;
  if (corroboration) summary = corroboration;
  else if (independentFlagging.size === 1) {
    summary = `Only one independent method flags (${[...independentFlagging].map(methodWord).join('')})${quiet.length ? `; ok: ${quiet.join(', ')}` : ''}. Sister statistics and duty restate or frame the same evidence.`;
  } else if (independentFlagging.size === 0) {
    summary = `No independent method flags at watch or above${quiet.length ? ` (tested: ${quiet.join(', ')})` : ''}.`;
  } else {
    summary = `Independent methods flag: ${[...independentFlagging].map(methodWord).join(', ')}.`;
  }
  if (flagged.some((i) => i.basis === 'state' || i.lowConfidence)) {
    summary = `${summary.replace(/[.\s]+$/, '')}. State and low-confidence items inform but do not count as agreement.`;
  }
  return { groups, summary };
}

/** Data caveats: rules revision, baseline age and source, sisters standing in, tap or temperature mismatch, low confidence, notes. */
export function caveatsInWords(d: ScreeningReportData): string[] {
  const out: string[] = [];
  const c = d.case;
  const tz = d.site.timeZone;
  const source = d.baselineSource ?? 'factory or commissioning test';
  if (engineRevisionOf(d.result) < 2) {
    out.push(
      `Stored result from rules revision ${engineRevisionOf(d.result)} (${rulesInWords(d)}): currents are line currents, findings carry no basis; re-screen to apply rules revision 2.`,
    );
  }
  if (c.baseline?.takenAt) {
    const years = wholeYears(c.baseline.takenAt, d.event.occurredAt);
    const age = years === null ? '' : years === 0 ? ', less than a year old' : `, ${years} year${years === 1 ? '' : 's'} old`;
    out.push(`Baseline from ${formatDay(c.baseline.takenAt, tz)}${age} (${source}).`);
  } else if (c.baseline) {
    out.push(`Baseline date not recorded (${source}).`);
  } else {
    out.push("No baseline of its own: sister units' median stands in where at least 3 sisters have the quantity.");
  }
  if (c.previous?.takenAt) out.push(`Previous routine test: ${formatDay(c.previous.takenAt, tz)}.`);
  const sisterRef = d.result.indicators.filter((i) => i.note?.includes("sisters' median as reference") || i.basis === 'sisters');
  if (sisterRef.length) {
    out.push(`Sisters' median stands in as the reference for: ${sisterRef.map((i) => indicatorLabel(i.key)).join(', ')} (such findings capped at investigate).`);
  }
  const bt = c.baseline?.tapPosition;
  const pt = c.postFault?.tapPosition;
  if (bt !== undefined && pt !== undefined && String(bt) !== String(pt)) {
    out.push(`Tap position differs: baseline ${String(bt)}, post-fault ${String(pt)} — the post-fault reactance, turns ratio and winding resistance are not comparable.`);
  }
  const btC = c.baseline?.temperatureC;
  const ptC = c.postFault?.temperatureC;
  if (btC !== undefined && ptC !== undefined && Math.abs(btC - ptC) >= 10) {
    out.push(`Insulation temperature differs: baseline ${formatSignificant(btC, 3)} °C, post-fault ${formatSignificant(ptC, 3)} °C (power factor corrected to 20 °C).`);
  } else if (c.postFault && ptC === undefined) {
    out.push('Post-fault insulation temperature not recorded: power factor cannot be corrected to 20 °C.');
  }
  // Unreliable items are listed with their instructions where the tests are (outstanding / missing and unreliable);
  // an indicator note that only repeats such an instruction is not said again here.
  const unreliable = unreliableItems(d);
  const said = new Set(unreliable.map((u) => u.instruction));
  const notes = new Set<string>();
  for (const i of d.result.indicators) {
    if (i.lowConfidence) {
      notes.add(`${indicatorLabel(i.key)}: low confidence — ${i.note ?? 'judged under a known doubt'}`);
      continue;
    }
    if (!i.note || i.note.includes("sisters' median as reference")) continue;
    if (i.method === 'sisters') continue;
    if (said.has(instructionFromNote(i.note))) continue;
    if (i.value === null || /tap|temperature|like with like|unreliable|\brepeat\b|demagneti|implausible/i.test(i.note)) notes.add(`${indicatorLabel(i.key)}: ${i.note}`);
  }
  out.push(...notes);
  return out;
}

/** Restrictions proposed to the manager (a proposal only; conservative and generic), for a unit tripped or in service. */
export function proposedRestrictions(rec: Recommendation, inService = false): string[] {
  if (rec === 'go') return ['None proposed beyond the follow-ups below.'];
  if (rec === 'conditional') {
    if (inService) {
      return [
        'If you keep the unit in service, keep it with restrictions, for example:',
        'reduced load (a limit set under your own procedures) until the follow-up results are in;',
        'auto-reclosing blocked on the circuits that can feed a fault through this unit;',
        'closer watch on the unit (gas-in-oil and temperature alarms) from now on.',
        'Or take it out of service for tests until the open points are cleared.',
      ];
    }
    return [
      'If you release, release with restrictions, for example:',
      'reduced load (a limit set under your own procedures) until the follow-up results are in;',
      'auto-reclosing blocked on the circuits that can feed a fault through this unit;',
      'closer watch on the unit (gas-in-oil and temperature alarms) after re-energising.',
      'Or hold the unit until the open points are cleared.',
    ];
  }
  if (inService) return ['Take out of service for tests; return it to service only when the reasons above are cleared and the unit is re-screened.'];
  return ['Hold: do not re-energise until the reasons above are cleared and the unit is re-screened.'];
}

/** For a unit that stayed in service whose stored follow-ups count from a re-energising (older results): count them from the event. */
export function followUpTimingNote(d: ScreeningReportData): string | null {
  if (!stayedInService(d)) return null;
  if (!d.result.followUps.some((f) => /re-?energi/i.test(f))) return null;
  return `The unit stayed in service: count these from the event (${formatDay(d.event.occurredAt, d.site.timeZone)}), not from a later switching — the first oil sample is due now.`;
}

export const PDF_ATTACHED_LINE = 'The PDF screening report is attached.';

// ---------------------------------------------------------------------------------------------------------------------
// The PDF's words: sources, code names, symbols

/** A source that cites a published document by its number (IEEE C57.152, IEEE 62, IEC 60076-18, IEC 60599, DL/T 911, …). */
const PUBLISHED_CLAUSE = /\b(?:IEEE|IEC|DL\/T|CIGRE|ANSI|IEC\/IEEE)\s*C?\d/;
const FROM_MEMORY = /\s*\(from memory\)/g;

/**
 * A source as the PDF's indicator table names it: each part (split at "; ") that cites a published document is named
 * without the qualifier "(from memory)"; parts that cite none (utility or common practice) keep it. The full wording,
 * qualifier included, is printed in the report's criteria detail (`sourcesInDetail`).
 */
export function sourceInTable(source: string): string {
  return source
    .split(/;\s+/)
    .map((part) => (PUBLISHED_CLAUSE.test(part) ? part.replace(FROM_MEMORY, '') : part))
    .join('; ');
}

/** The sources the table shortened (a qualifier taken off), each once, in their full wording, in the order met. */
export function sourcesInDetail(indicators: readonly Indicator[]): string[] {
  const out = new Set<string>();
  for (const i of indicators) if (sourceInTable(i.source) !== i.source) out.add(i.source);
  return [...out];
}

const DOTTED_CODE = /\b[a-z][A-Za-z0-9]*(?:\.[A-Za-z0-9-]+)+/g;

/** Indicator keys written in an engine text ("judged on its duration: duty.thermalDurationPercent") put in words, and
 * the nameplate voltages a formula names by their fields ("hvKV/(√3·lvKV)": "HV kV/(√3·LV kV)"). */
export function codesInWords(text: string): string {
  return text
    .replace(DOTTED_CODE, (code) => {
      const label = indicatorLabel(code);
      return label === code ? code : inSentence(label);
    })
    .replace(/\b(hv|lv|tv)KV\b/g, (_, side: string) => `${side.toUpperCase()} kV`);
}

/** A field name the PDF has no label for ("someNewField"), in words ("some new field"). */
export function fieldInWords(field: string): string {
  const words = field
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[._-]+/g, ' ')
    .trim()
    .toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** The font pdf.ts registers for the symbols Roboto lacks (Font Awesome Free Solid, SIL OFL 1.1, from @quasar/extras). */
export const PDF_SYMBOL_FONT = 'GapsightSymbols';

/** The characters printed in `PDF_SYMBOL_FONT` (arrows and marks Roboto has no glyph for; checked with fontkit in a test). */
export const PDF_SYMBOL_CHARACTERS = '←↑→↓↔↕✓✔✕✖⚠';
