// Words and numbers shared by the manager's e-mail and the PDF report: pure functions, no I/O.
// The result JSON keeps full precision; everything here rounds for display the way the UI does.
import type { GapsightCase } from '../../shared/schemas/case.js';
import type { GapsightResult, Indicator, Level, Method, Recommendation } from '../../shared/schemas/result.js';
import { corroboratingMethods, describeRequired } from '../../shared/screening/verdict.js';
import { criteriaV1, type Criteria } from '../../shared/screening/criteria.js';
import { levelRank } from '../../shared/screening/levels.js';
import { decisiveReason } from '../../shared/screening/reasons.js';

export { decisiveReason };
import type { ScreeningReportData } from './report-data.js';
import { formatSignificant, offsetText, pad2 as pad, validZone, wallClock, zoneOffsetMinutes } from '../../shared/format.js';

export { formatSignificant };

// ---------------------------------------------------------------------------------------------------------------------
// Numbers

/** A percentage or similar figure for reading: 89 · 8.7 · 0.29 (and a sign when asked: +3.42 is kept at 3 digits). */
export function formatFigure(value: number | null | undefined, signed = false): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const abs = Math.abs(value);
  const text = abs >= 100 ? value.toFixed(0) : formatSignificant(value, 3);
  return signed && value > 0 ? `+${text}` : text;
}

/** A coarse percentage for plain words: 89 · 8.7 · 0.99 (whole numbers from 10, one decimal from 1). */
export function formatCoarse(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const abs = Math.abs(value);
  if (abs >= 10) return value.toFixed(0);
  if (abs >= 1) return value.toFixed(1);
  return formatSignificant(value, 2);
}

/** A multiple of rated current with one decimal ("9.0"). */
export function formatPerUnit(value: number): string {
  return value.toFixed(1);
}

/** "1st", "2nd", "3rd", "4th", "11th", "22nd". */
export function ordinal(n: number): string {
  const mod100 = n % 100;
  if (mod100 >= 11 && mod100 <= 13) return `${n}th`;
  const suffix = ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th';
  return `${n}${suffix}`;
}

// ---------------------------------------------------------------------------------------------------------------------
// Times (ISO form on the site's wall clock, zone named)

/** "2026-11-28 03:12 Europe/London (UTC+00:00)"; a date-only string stays as it is; empty → "—". */
export function formatInstant(iso: string | null | undefined, timeZone: string | null | undefined): string {
  if (!iso) return '—';
  if (/^\d{4}-\d{2}-\d{2}$/.test(iso)) return iso;
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const zone = validZone(timeZone);
  const w = wallClock(date, zone);
  return `${w.year}-${pad(w.month)}-${pad(w.day)} ${pad(w.hour)}:${pad(w.minute)} ${zone} (UTC${offsetText(zoneOffsetMinutes(date, zone))})`;
}

/** The date part on the site's wall clock ("2026-11-28"); a date-only string stays as it is. */
export function formatDay(iso: string | null | undefined, timeZone: string | null | undefined): string {
  if (!iso) return '—';
  if (/^\d{4}-\d{2}-\d{2}$/.test(iso)) return iso;
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const w = wallClock(date, validZone(timeZone));
  return `${w.year}-${pad(w.month)}-${pad(w.day)}`;
}

/** Whole years from `from` to `to` (completed years; null when either is not a date). */
export function wholeYears(from: string, to: string): number | null {
  const a = new Date(from);
  const b = new Date(to);
  if (Number.isNaN(a.getTime()) || Number.isNaN(b.getTime())) return null;
  let years = b.getUTCFullYear() - a.getUTCFullYear();
  const beforeAnniversary =
    b.getUTCMonth() < a.getUTCMonth() || (b.getUTCMonth() === a.getUTCMonth() && b.getUTCDate() < a.getUTCDate());
  if (beforeAnniversary) years--;
  return Math.max(0, years);
}

// ---------------------------------------------------------------------------------------------------------------------
// Words

export const RECOMMENDATION_WORD: Record<Recommendation, string> = { go: 'GO', conditional: 'CONDITIONAL', 'no-go': 'NO-GO' };
export const LEVEL_WORD: Record<Level, string> = { ok: 'OK', watch: 'WATCH', investigate: 'INVESTIGATE', critical: 'CRITICAL' };
export const levelAtLeast = (l: Level, min: Level) => levelRank(l) >= levelRank(min);

/** What each recommendation means, in one line. */
export const RECOMMENDATION_MEANING: Record<Recommendation, string> = {
  go: 'may be re-energised (with the follow-ups below)',
  conditional: 'release only with restrictions and the follow-ups below, or hold — your decision',
  'no-go': 'hold: do not re-energise',
};

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

/** Protections whose operation means an internal fault is suspected (case format). */
export const INTERNAL_PROTECTIONS: readonly string[] = [
  'differential',
  'restricted-earth-fault',
  'buchholz-trip',
  'sudden-pressure',
  'pressure-relief',
];

const PROTECTION_WORDS: Record<string, string> = {
  differential: 'differential',
  'restricted-earth-fault': 'restricted earth fault',
  'buchholz-alarm': 'Buchholz alarm',
  'buchholz-trip': 'Buchholz trip',
  'sudden-pressure': 'sudden pressure',
  'pressure-relief': 'pressure relief',
  overcurrent: 'overcurrent',
};
export const protectionWord = (p: string) => PROTECTION_WORDS[p] ?? p;

const FAULT_TYPE_WORDS: Record<string, string> = {
  'three-phase': 'three-phase',
  'phase-to-phase': 'phase-to-phase',
  'phase-to-phase-to-ground': 'phase-to-phase-to-ground',
  'phase-to-ground': 'phase-to-ground',
};

const METHOD_WORDS: Record<Method, string> = {
  capacitance: 'capacitance',
  'power-factor': 'power factor',
  reactance: 'leakage reactance',
  sweep: 'frequency-response sweep',
  excitation: 'excitation current',
  resistance: 'winding resistance',
  ratio: 'turns ratio',
  gas: 'dissolved gases',
  bushing: 'bushings',
  sisters: 'sister-unit statistics',
  duty: 'through-fault duty',
};
export const methodWord = (m: string) => METHOD_WORDS[m as Method] ?? m;


/** A short label for an indicator key ("CHL capacitance shift vs baseline"); unknown keys are returned as they are. */
export function indicatorLabel(key: string): string {
  const p = key.split('.');
  const last = p[p.length - 1];
  const [head, a, b] = p;
  switch (head) {
    case 'capacitance':
      if (last === 'shiftPercent') return `${a} capacitance shift vs baseline`;
      if (last === 'shiftFromPreviousPercent') return `${a} capacitance shift vs previous test`;
      if (last === 'consistencyPercent') return `${a} GST/UST consistency`;
      break;
    case 'powerFactor':
      if (last === 'pf20Percent') return `${a} power factor at 20 °C`;
      if (last === 'riseFromBaselinePercent') return `${a} power factor rise vs baseline`;
      break;
    case 'reactance':
      if (a === 'phaseSpreadPercent') return 'Reactance per-phase spread';
      if (a === 'phaseSpreadChangePoints') return 'Reactance spread change vs baseline';
      if (a === 'threePhase' && last === 'percent') return 'Three-phase equivalent impedance';
      if (a === 'threePhase') return 'Three-phase impedance vs nameplate';
      if (last === 'percent') return `Phase ${a} leakage reactance`;
      if (last === 'shiftPercent') return `Phase ${a} reactance shift vs baseline`;
      if (last === 'shiftFromPreviousPercent') return `Phase ${a} reactance shift vs previous test`;
      break;
    case 'sweep': {
      const label = p.slice(1, -1).join('.');
      const words: Record<string, string> = {
        correlation: 'correlation',
        rLF: 'relative factor, low band',
        rMF: 'relative factor, mid band',
        rHF: 'relative factor, high band',
        asleDb: 'ASLE',
        class: 'DL/T 911 class',
      };
      return `Sweep ${label} ${words[last] ?? last}`;
    }
    case 'duty': {
      const words: Record<string, string> = {
        eventDutyPercent: 'Event duty (of mechanical limit)',
        forceRatioPercent: 'Force ratio (of design force)',
        shotsAboveSegment: 'Shots at or above segment start',
        cumulativeDutyPercent: 'Cumulative duty (Gapsight tally)',
      };
      if (words[a]) return words[a];
      break;
    }
    case 'gas':
      if (a === 'duvalZone') return 'Duval triangle 1 zone';
      if (last === 'risePPM') return `${a === 'C2H2' ? 'Acetylene (C2H2)' : a === 'H2' ? 'Hydrogen (H2)' : a} rise`;
      break;
    case 'excitation':
      if (a === 'outerPhaseDifferencePercent') return 'Excitation current, outer phases differ';
      if (last === 'changePercent') return `Phase ${a} excitation current change`;
      break;
    case 'resistance':
      if (a === 'phaseImbalancePercent') return 'Winding resistance phase imbalance';
      if (last === 'changePercent') return `Phase ${a} winding resistance change`;
      break;
    case 'ratio':
      if (last === 'changePercent') return `Phase ${a} turns ratio change`;
      if (last === 'deviationFromNameplatePercent') return `Phase ${a} turns ratio vs nameplate`;
      break;
    case 'sisters': {
      const what = a === 'capacitance' ? `${b} capacitance` : a === 'reactance' ? `phase ${b} reactance` : `${a} ${b}`;
      const words: Record<string, string> = {
        modifiedZ: 'modified z among sisters',
        deviationFromMedianPercent: "deviation from sisters' median",
        grubbsG: 'Grubbs G among sisters',
        dixonQ: "Dixon's Q among sisters",
      };
      return `${what[0].toUpperCase()}${what.slice(1)} ${words[last] ?? last}`;
    }
    case 'dfFrequency':
      return `${a} dissipation over frequency: ${last}`;
  }
  return key;
}

/** The unit of an indicator's value, where known ("%", "points", "ppm", "dB"; "" for ratios, scores and classes). */
export function indicatorUnit(key: string): string {
  const last = key.split('.').pop() ?? '';
  if (/Points$/.test(last)) return 'points';
  if (/PPM$/.test(last)) return 'ppm';
  if (/Db$/.test(last)) return 'dB';
  if (/Percent$/.test(last) || last === 'percent') return '%';
  return '';
}

/** An indicator's value for display: rounded, with its unit; a null value shows its note. */
export function indicatorValueText(i: Indicator): string {
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
  const internal = operated.filter((p) => INTERNAL_PROTECTIONS.includes(p));
  const tripped = d.event.transformerTripped ? 'the unit tripped' : 'the unit stayed in service';
  let line: string;
  if (internal.length) {
    line = `Internal fault suspected: internal protection operated (${internal.map(protectionWord).join(', ')}); ${tripped}.`;
    const others = operated.filter((p) => !internal.includes(p));
    if (others.length) line += ` Also operated: ${others.map(protectionWord).join(', ')}.`;
  } else if (operated.length) {
    line = `Protection operated: ${operated.map(protectionWord).join(', ')} — no internal protection (differential, restricted earth fault, Buchholz trip, sudden pressure, pressure relief) operated; ${tripped}.`;
  } else {
    line = `No transformer protection recorded as operated; ${tripped}.`;
  }
  return { operated, internal, internalSuspected: internal.length > 0, line };
}

/** The fault in plain words: "9.0 × rated, 89 % of the design force (IEEE category IV), the 2nd such fault since 2024". */
export function faultInWords(d: ScreeningReportData): string {
  const tf = d.result.throughFault;
  const type = FAULT_TYPE_WORDS[d.event.type] ?? d.event.type;
  const where = `${type} fault, current measured on the ${d.event.side.toUpperCase()} side`;
  if (!tf) return `${where}; no fault current recorded, so no duty figures.`;
  let s = `${formatPerUnit(tf.currentPerUnit)} × rated, ${formatCoarse(tf.forceRatioPercent)} % of the design force (IEEE category ${tf.category})`;
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

/** The shots of the event ("6.3 kA for 0.12 s, 6.1 kA for 0.08 s"). */
export function shotsInWords(c: GapsightCase): string {
  const shots = c.fault?.shots ?? [];
  if (!shots.length) return 'no shots recorded';
  const list = shots.map((s) => `${formatSignificant(s.currentKA, 3)} kA for ${formatSignificant(s.durationS, 3)} s`).join(', ');
  return `${shots.length} shot${shots.length === 1 ? '' : 's'}: ${list}`;
}

/** Duty in one line: event duty, curve, Gapsight tally. */
export function dutyInWords(result: GapsightResult): string | null {
  const tf = result.throughFault;
  if (!tf) return null;
  const curve = tf.beyondCurve ? 'BEYOND the through-fault curve' : 'within the through-fault curve';
  return `Event duty ${formatCoarse(tf.eventDutyPercent)} % of the mechanical limit, ${curve}; cumulative ${formatCoarse(tf.cumulativeDutyPercent)} % (Gapsight tally, not an IEEE figure); ${tf.shotsAboveSegment} shot${tf.shotsAboveSegment === 1 ? '' : 's'} at or above the segment start.`;
}

const SECTION_WORDS: [string, string][] = [
  ['capacitancePF', 'capacitance'],
  ['dissipationPercent', 'dissipation / power factor'],
  ['reactance', 'leakage reactance'],
  ['threePhaseEquivalent', 'three-phase equivalent impedance'],
  ['excitationCurrentMA', 'excitation current'],
  ['windingResistanceOhm', 'winding resistance'],
  ['turnsRatio', 'turns ratio'],
  ['dissolvedGasPPM', 'dissolved gases (oil sample)'],
  ['dissipationByFrequency', 'dissipation over frequency'],
];

/** Tests done (post-fault sections present) and outstanding (missing and unreliable required items), in words. */
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
    ...d.result.missing.map((m) => `${describeRequired(m)} (missing)`),
    ...d.result.unreliable.map((u) => `${describeRequired(u)} (unreliable: repeat)`),
  ];
  return { done, outstanding };
}

/** Where independent methods agree: flagged indicators grouped by method, plus the corroboration reason if any. */
export function agreementInWords(result: GapsightResult, criteria: Criteria = criteriaV1): { groups: { method: string; items: string[] }[]; summary: string } {
  const flagged = result.indicators.filter((i) => levelAtLeast(i.level, 'watch'));
  const byMethod = new Map<string, Indicator[]>();
  for (const i of flagged) byMethod.set(i.method, [...(byMethod.get(i.method) ?? []), i]);
  const groups = [...byMethod.entries()].map(([method, list]) => ({
    method: methodWord(method),
    items: list.map((i) => `${indicatorLabel(i.key)} ${indicatorValueText(i)} (${LEVEL_WORD[i.level]})`),
  }));
  const corroboration = result.reasons.find((r) => /^Independent methods agree/.test(r));
  // Which methods count as independent (and which are one test) is the criteria set's, as in the verdict.
  const vc = criteria.verdict;
  const independentFlagging = new Set<string>(corroboratingMethods(result.indicators, criteria));
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
  return { groups, summary };
}

/** Data caveats: baseline age and source, sisters standing in, tap or temperature mismatch, unreliable items, notes. */
export function caveatsInWords(d: ScreeningReportData): string[] {
  const out: string[] = [];
  const c = d.case;
  const tz = d.site.timeZone;
  const source = d.baselineSource ?? 'factory or commissioning test';
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
  const sisterRef = d.result.indicators.filter((i) => i.note?.includes("sisters' median as reference"));
  if (sisterRef.length) {
    out.push(`Sisters' median stands in as the reference for: ${sisterRef.map((i) => indicatorLabel(i.key)).join(', ')} (such findings capped at investigate).`);
  }
  const bt = c.baseline?.tapPosition;
  const pt = c.postFault?.tapPosition;
  if (bt !== undefined && pt !== undefined && String(bt) !== String(pt)) {
    out.push(`Tap position differs: baseline ${String(bt)}, post-fault ${String(pt)} — the post-fault reactance is not comparable.`);
  }
  const btC = c.baseline?.temperatureC;
  const ptC = c.postFault?.temperatureC;
  if (btC !== undefined && ptC !== undefined && Math.abs(btC - ptC) >= 10) {
    out.push(`Insulation temperature differs: baseline ${formatSignificant(btC, 3)} °C, post-fault ${formatSignificant(ptC, 3)} °C (power factor corrected to 20 °C).`);
  } else if (c.postFault && ptC === undefined) {
    out.push('Post-fault insulation temperature not recorded: power factor cannot be corrected to 20 °C.');
  }
  for (const u of d.result.unreliable) out.push(`${describeRequired(u)}: unreliable — treated as missing; repeat the test.`);
  const notes = new Set<string>();
  for (const i of d.result.indicators) {
    if (!i.note || i.note.includes("sisters' median as reference")) continue;
    if (i.method === 'sisters') continue;
    if (i.value === null || /tap|temperature|like with like|unreliable|repeat|demagneti/i.test(i.note)) notes.add(`${indicatorLabel(i.key)}: ${i.note}`);
  }
  out.push(...notes);
  return out;
}

/** Restrictions proposed to the manager (a proposal only; conservative and generic). */
export function proposedRestrictions(rec: Recommendation): string[] {
  if (rec === 'go') return ['None proposed beyond the follow-ups below.'];
  if (rec === 'conditional') {
    return [
      'If you release, release with restrictions, for example:',
      'reduced load (a limit set under your own procedures) until the follow-up results are in;',
      'auto-reclosing blocked on the circuits that can feed a fault through this unit;',
      'closer watch on the unit (gas-in-oil and temperature alarms) after re-energising.',
      'Or hold the unit until the open points are cleared.',
    ];
  }
  return ['Hold: do not re-energise until the reasons above are cleared and the unit is re-screened.'];
}

export const PDF_ATTACHED_LINE = 'The PDF screening report is attached.';
