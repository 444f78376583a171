// Verdict: internal-protection gate, indicator levels, required quantities, corroboration, reasons and follow-ups.
import type { GapsightCase } from '../schemas/case.js';
import type { Indicator, Level, Method, Recommendation, ThroughFault } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { levelRank, maxLevel, raiseOneStep } from './levels.js';
import { preFaultGas } from './gas.js';
import { analyseSweep } from './sweep.js';

/** Cautions text (product brief, "Cautions"), reused by the screens, the PDF and the e-mail. */
export const CAUTIONS: readonly string[] = [
  'The recommendation is decision support for qualified staff.',
  "Re-energising a transformer after a fault is a safety decision governed by the utility's own procedures, local codes and licensed practice; criteria defaults come from published guidance and common practice and must be reviewed by the user's engineers.",
  "High-voltage tests must follow the test equipment's and the utility's safety rules (isolation, earthing, permits).",
  'A go cannot rule out deformation that the tests taken cannot see.',
  'DC tests (winding resistance) leave the core magnetised: take excitation current and sweeps first, or demagnetise before them.',
];

export const AXIAL_MOVEMENT_NOTE =
  'Capacitance is the only evidence and it is ok: an ok capacitance does not rule out axial movement (add leakage reactance or a sweep)';

export const FOLLOW_UPS = {
  gas24h: 'Dissolved-gas sample 24 h after re-energising',
  gas1w: 'Dissolved-gas sample 1 week after re-energising',
  gas1m: 'Dissolved-gas sample 1 month after re-energising',
  sweepNextOutage: 'Frequency-response sweep at the next outage',
} as const;

/** Words for a required item named by its case field. */
export function describeRequired(item: string): string {
  const m = /^capacitance\.(.+)$/.exec(item);
  if (m) return `${m[1]} capacitance`;
  const r = /^reactance\.(.+)$/.exec(item);
  if (r) return `reactance phase ${r[1]}`;
  const words: Record<string, string> = {
    reactance: 'reactance',
    sweep: 'sweep',
    dissolvedGasPPM: 'dissolved gases',
    excitationCurrentMA: 'excitation current',
    windingResistanceOhm: 'winding resistance',
  };
  return words[item] ?? item;
}

/** Capacitance configurations the case must have (unit.requiredCapacitance, else by windings). */
export function requiredCapacitance(c: GapsightCase, criteria: Criteria): string[] {
  return c.unit.requiredCapacitance ?? criteria.capacitance.requiredByWindings[c.unit.windings ?? 'two-winding'];
}

/** Whether the unit stays on the duty-only path: it stayed in service and the fault was not high duty. */
export function isDutyOnlyPath(c: GapsightCase, tf: ThroughFault | null): boolean {
  return !!c.fault && c.fault.transformerTripped === false && !(tf?.highDuty ?? false);
}

/** Required quantities that are missing (post-fault value or reference lacking), named by their case field. */
export function missingRequired(c: GapsightCase, tf: ThroughFault | null, criteria: Criteria): string[] {
  if (isDutyOnlyPath(c, tf)) return [];
  const minSisters = criteria.sisters.minSistersDeviation;
  const sisters = c.sisters ?? [];
  const missing: string[] = [];
  const post = c.postFault;
  for (const cfg of requiredCapacitance(c, criteria)) {
    const hasPost = post?.capacitancePF?.[cfg] !== undefined;
    const hasRef = c.baseline?.capacitancePF?.[cfg] !== undefined || sisters.filter((s) => s.capacitancePF?.[cfg] !== undefined).length >= minSisters;
    if (!hasPost || !hasRef) missing.push(`capacitance.${cfg}`);
  }
  const hasReactanceRef = (phase: string) =>
    c.baseline?.reactance?.[phase] !== undefined || sisters.filter((s) => s.reactance?.[phase] !== undefined).length >= minSisters;
  if (c.unit.phases === 3) {
    for (const phase of ['A', 'B', 'C']) if (!post?.reactance?.[phase] || !hasReactanceRef(phase)) missing.push(`reactance.${phase}`);
  } else {
    const ok = Object.keys(post?.reactance ?? {}).some(hasReactanceRef);
    if (!ok) missing.push('reactance');
  }
  if (tf?.highDuty) {
    // A trace counts when it can be compared with its baseline trace (it has a DL/T 911 class).
    const sweepOk = (c.sweeps ?? []).some((s) => (analyseSweep(s, criteria)?.class ?? null) !== null);
    if (!sweepOk) missing.push('sweep');
    if (!post?.dissolvedGasPPM || !preFaultGas(c)) missing.push('dissolvedGasPPM');
    const phaseSection = (field: 'excitationCurrentMA' | 'windingResistanceOhm') => {
      const p = post?.[field];
      if (!p) return false;
      return Object.keys(p).some(
        (ph) => c.baseline?.[field]?.[ph] !== undefined || sisters.filter((s) => s[field]?.[ph] !== undefined).length >= minSisters,
      );
    };
    if (!phaseSection('excitationCurrentMA')) missing.push('excitationCurrentMA');
    if (!phaseSection('windingResistanceOhm')) missing.push('windingResistanceOhm');
  }
  return missing;
}

/** Whether an unreliable item makes a required item unusable. */
function unreliableRequired(unreliable: readonly string[], c: GapsightCase, tf: ThroughFault | null, criteria: Criteria): string[] {
  if (isDutyOnlyPath(c, tf)) return [];
  const required = new Set<string>([
    ...requiredCapacitance(c, criteria).map((x) => `capacitance.${x}`),
    ...(c.unit.phases === 3 ? ['reactance.A', 'reactance.B', 'reactance.C'] : Object.keys(c.postFault?.reactance ?? {}).map((p) => `reactance.${p}`)),
    ...(tf?.highDuty ? ['excitationCurrentMA', 'windingResistanceOhm'] : []),
  ]);
  return unreliable.filter((u) => required.has(u));
}

/** Methods (after merging same-test methods) with an indicator at watch or above that count for corroboration. */
export function corroboratingMethods(indicators: readonly Indicator[], criteria: Criteria): Method[] {
  const vc = criteria.verdict;
  const methods = new Set<Method>();
  for (const i of indicators) {
    if (levelRank(i.level) < levelRank('watch')) continue;
    const m = (vc.sameTestAs[i.method] ?? i.method) as Method;
    if (vc.independentMethods.includes(m)) methods.add(m);
  }
  return [...methods];
}

/** Overall level: the highest indicator level, raised one step when enough independent methods flag. */
export function overallLevel(indicators: readonly Indicator[], criteria: Criteria): { level: Level; raised: boolean; methods: Method[] } {
  const highest = indicators.reduce<Level>((l, i) => maxLevel(l, i.level), 'ok');
  const methods = corroboratingMethods(indicators, criteria);
  const raised = methods.length >= criteria.verdict.corroborationMinMethods;
  return { level: raised ? raiseOneStep(highest) : highest, raised, methods };
}

/** Recommendation of a level: critical → no-go, investigate → conditional, else go. */
export function recommendationOf(level: Level): Recommendation {
  return level === 'critical' ? 'no-go' : level === 'investigate' ? 'conditional' : 'go';
}

const REC_RANK: Record<Recommendation, number> = { go: 0, conditional: 1, 'no-go': 2 };
const stricter = (a: Recommendation, b: Recommendation): Recommendation => (REC_RANK[a] >= REC_RANK[b] ? a : b);

/** Format a number for reasons (the JSON keeps full precision). */
export function formatNumber(v: number, signed = false): string {
  const abs = Math.abs(v);
  const text = abs >= 100 ? v.toFixed(0) : abs >= 10 ? v.toFixed(1) : abs >= 0.1 ? v.toFixed(2) : Number(v.toPrecision(3)).toString();
  return signed && v > 0 ? `+${text}` : text;
}

type Phrase = { subject: string; verb: string; unit: string; signed: boolean };

function phraseFor(key: string): Phrase | null {
  const p = key.split('.');
  const last = p[p.length - 1];
  if (p[0] === 'capacitance' && (last === 'shiftPercent' || last === 'shiftFromPreviousPercent'))
    return { subject: `${p[1]} capacitance`, verb: 'shifted', unit: ' %', signed: true };
  if (p[0] === 'powerFactor' && last === 'pf20Percent') return { subject: `${p[1]} power factor at 20 °C`, verb: 'is', unit: ' %', signed: false };
  if (p[0] === 'powerFactor' && last === 'riseFromBaselinePercent') return { subject: `${p[1]} power factor at 20 °C`, verb: 'changed by', unit: ' %', signed: true };
  if (p[0] === 'reactance' && p[1] === 'phaseSpreadChangePoints') return { subject: 'Per-phase reactance spread', verb: 'changed by', unit: ' points', signed: true };
  if (p[0] === 'reactance' && p[1] === 'threePhase') return { subject: 'Three-phase equivalent impedance', verb: 'deviates from nameplate by', unit: ' %', signed: true };
  if (p[0] === 'reactance') return { subject: `Phase ${p[1]} leakage reactance`, verb: 'shifted', unit: ' %', signed: true };
  if (p[0] === 'sisters' && last === 'modifiedZ') return { subject: `${p[2]} ${p[1]} among sister units`, verb: 'has modified z', unit: '', signed: true };
  if (p[0] === 'gas') return { subject: p[1] === 'C2H2' ? 'Acetylene' : 'Hydrogen', verb: 'rose by', unit: ' ppm', signed: false };
  if (p[0] === 'excitation' && p[1] === 'outerPhaseDifferencePercent') return { subject: 'Outer-phase excitation currents', verb: 'differ by', unit: ' %', signed: false };
  if (p[0] === 'excitation') return { subject: `Phase ${p[1]} excitation current`, verb: 'changed by', unit: ' %', signed: true };
  if (p[0] === 'resistance' && p[1] === 'phaseImbalancePercent') return { subject: 'Winding resistance phase imbalance', verb: 'is', unit: ' %', signed: false };
  if (p[0] === 'resistance') return { subject: `Phase ${p[1]} winding resistance (corrected)`, verb: 'changed by', unit: ' %', signed: true };
  if (p[0] === 'ratio' && last === 'deviationFromNameplatePercent') return { subject: `Phase ${p[1]} turns ratio`, verb: 'deviates from nameplate by', unit: ' %', signed: true };
  if (p[0] === 'ratio') return { subject: `Phase ${p[1]} turns ratio`, verb: 'changed by', unit: ' %', signed: true };
  if (p[0] === 'dfFrequency') return { subject: `${p[1]} DF(f) conductive term (A/f)`, verb: 'changed by', unit: ' %', signed: true };
  return null;
}

/** One reason sentence for a flagged indicator: quantity, value, reference (date), threshold. */
export function indicatorReason(i: Indicator): string {
  if (i.method === 'sweep' && i.key.endsWith('.class')) {
    const label = i.key.slice('sweep.'.length, -'.class'.length);
    return `Sweep ${label} is DL/T 911 class "${String(i.value)}" against its baseline trace (${i.level})${i.note ? `: ${i.note}` : ''}`;
  }
  if (i.key === 'duty.eventDutyPercent') return `Fault beyond the through-fault curve (event duty ${formatNumber(i.value as number)} % of K) (${i.level})`;
  if (i.key === 'duty.forceRatioPercent') return `Fault current above the design maximum (force ratio ${formatNumber(i.value as number)} %): check the impedances (${i.level})`;
  if (i.key === 'duty.shotsAboveSegment') return `Frequent-fault duty: ${String(i.value)} shots at or above the segment start (${i.level}; ${i.rule})`;
  const ph = phraseFor(i.key);
  const value = typeof i.value === 'number' ? i.value : null;
  const threshold = new RegExp(`${i.level} ≥ ([^,()]+)`).exec(i.rule)?.[1]?.trim();
  const judged = threshold ? `${i.level} from ${threshold}` : `${i.level}; ${i.rule}`;
  const ref = i.reference ? ` against the ${i.reference}` : '';
  const note = i.note ? ` — ${i.note}` : '';
  if (!ph || value === null) return `${i.key} = ${String(i.value)}${ref} (${judged})${note}`;
  return `${ph.subject} ${ph.verb} ${formatNumber(value, ph.signed)}${ph.unit}${ref} (${judged})${note}`;
}

export type Verdict = {
  recommendation: Recommendation;
  overallLevel: Level;
  reasons: string[];
  missing: string[];
  unreliable: string[];
  followUps: string[];
};

/** Apply the verdict order of the case format to computed indicators. */
export function decideVerdict(
  c: GapsightCase,
  indicators: readonly Indicator[],
  tf: ThroughFault | null,
  unreliableItems: readonly string[],
  criteria: Criteria,
  hints: readonly string[] = [],
): Verdict {
  const reasons: string[] = [];
  const followUps: string[] = [];
  const unreliable = [...new Set(unreliableItems)];
  const dutyOnly = isDutyOnlyPath(c, tf);
  const missing = missingRequired(c, tf, criteria);
  const blocking = [...missing, ...unreliableRequired(unreliable, c, tf, criteria)];

  // (1) internal-protection gate
  const internal = (c.fault?.protectionOperated ?? []).filter((p) => criteria.verdict.internalProtections.includes(p));
  if (internal.length) reasons.push(`Internal protection operated (${internal.join(', ')}): investigate as an internal fault`);

  // (3) missing / unreliable required quantities (reason first: it explains a hold)
  const dutyWords = tf ? `${tf.currentPerUnit.toFixed(1)} × rated, ${tf.forceRatioPercent.toFixed(0)} % of the design force` : '';
  if (blocking.length) {
    const list = blocking.map((b) => (unreliable.includes(b) ? `${describeRequired(b)} (unreliable: repeat)` : describeRequired(b))).join(', ');
    if (tf?.highDuty) reasons.push(`High-duty fault (${dutyWords}): hold pending tests: ${list}`);
    else reasons.push(`Complete: ${list}`);
  } else if (tf?.highDuty) {
    reasons.push(`High-duty fault (${dutyWords}): full post-fault test set required and present`);
  }
  if (dutyOnly) reasons.push(`Unit stayed in service and the fault was not high duty${tf ? ` (${dutyWords})` : ''}: duty-only path, dissolved-gas follow-ups`);

  // (2) + (4) levels and corroboration
  const { level, raised, methods } = overallLevel(indicators, criteria);
  const flagged = [...indicators].filter((i) => i.level !== 'ok').sort((a, b) => levelRank(b.level) - levelRank(a.level));
  for (const i of flagged) reasons.push(indicatorReason(i));
  if (raised) {
    const highest = indicators.reduce<Level>((l, i) => maxLevel(l, i.level), 'ok');
    const byLocation = new Map<string, Set<string>>();
    for (const i of indicators) {
      if (levelRank(i.level) < levelRank('watch') || !i.location) continue;
      const m = criteria.verdict.sameTestAs[i.method] ?? i.method;
      if (!criteria.verdict.independentMethods.includes(m as Method)) continue;
      byLocation.set(i.location, (byLocation.get(i.location) ?? new Set()).add(m));
    }
    const agree = [...byLocation.entries()].filter(([, s]) => s.size >= 2).map(([loc]) => loc);
    reasons.push(
      `Independent methods agree (${methods.join(', ')})${agree.length ? ` at ${agree.join(', ')}` : ''}: level raised from ${highest} to ${level}`,
    );
  }
  for (const h of hints) reasons.push(h);

  // capacitance as the only evidence
  const evidence = indicators.filter((i) => i.value !== null && criteria.verdict.independentMethods.includes((criteria.verdict.sameTestAs[i.method] ?? i.method) as Method));
  const capShifts = indicators.filter((i) => i.method === 'capacitance' && /\.shift(FromPrevious)?Percent$/.test(i.key));
  if (capShifts.length && evidence.every((i) => i.method === 'capacitance' || i.method === 'power-factor') && capShifts.every((i) => i.level === 'ok')) {
    reasons.push(AXIAL_MOVEMENT_NOTE);
  }
  if (indicators.some((i) => i.note?.includes("sisters' median as reference"))) {
    reasons.push("No own baseline for some quantities: sisters' median as reference (such findings capped at investigate)");
  }

  // (5) recommendation, then the missing rule can only make it stricter; the internal gate overrides
  let recommendation = recommendationOf(level);
  if (blocking.length) recommendation = stricter(recommendation, tf?.highDuty ? 'no-go' : 'conditional');
  if (internal.length) recommendation = 'no-go';
  if (!flagged.length && !blocking.length && !internal.length && recommendation === 'go') reasons.push('No indicator at watch or above');

  // follow-ups
  if (internal.length) followUps.push('Investigate as an internal fault (internal inspection) before re-energising');
  if (blocking.length) followUps.push(`Complete the tests and re-screen: ${blocking.map(describeRequired).join(', ')}`);
  for (const u of unreliable) {
    if (u.startsWith('capacitance.')) followUps.push(`Repeat the ${u.slice('capacitance.'.length)} capacitance test (GST/UST consistency)`);
  }
  if (unreliable.some((u) => u.startsWith('reactance'))) followUps.push(`Repeat the leakage-reactance test at the baseline tap position${c.baseline?.tapPosition !== undefined ? ` ${String(c.baseline.tapPosition)}` : ''}`);
  if (unreliable.includes('excitationCurrentMA')) followUps.push('Repeat the excitation-current test at the baseline test voltage');
  for (const i of indicators) if (i.method === 'sweep' && i.key.endsWith('.class') && i.note?.includes('demagnetise')) followUps.push(`Demagnetise and repeat sweep ${i.key.slice(6, -6)}`);
  followUps.push(FOLLOW_UPS.gas24h, FOLLOW_UPS.gas1w, FOLLOW_UPS.gas1m);
  const sweepDone = indicators.some((i) => i.method === 'sweep' && i.key.endsWith('.class') && i.value !== null);
  if (!sweepDone) followUps.push(FOLLOW_UPS.sweepNextOutage);

  return { recommendation, overallLevel: level, reasons, missing, unreliable, followUps };
}
