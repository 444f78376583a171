// Verdict (rules revision 2): internal-protection gate, indicator levels, required quantities, corroboration by
// changes against the unit's own readings, the sister / phase-comparison cap, reasons and follow-ups.
import type { GapsightCase, Sweep } from '../schemas/case.js';
import type { Indicator, Level, Method, Recommendation, ThroughFault } from '../schemas/result.js';
import type { Criteria } from './criteria.js';
import { capLevel, levelRank, maxLevel, raiseOneStep } from './levels.js';
import { preFaultGas } from './gas.js';
import { analyseSweep, compareTraces, NO_BASELINE_TRACE_NOTE, phaseComparisons, sweepTapMismatch, sweepWinding } from './sweep.js';
import { thermalCurveTimeS } from './through-fault.js';
import { CAUTIONS } from './cautions.js';

export { CAUTIONS };

export const AXIAL_MOVEMENT_NOTE =
  'Capacitance is the only evidence and it is ok: an ok capacitance does not rule out axial movement (add leakage reactance or a sweep)';

export const FOLLOW_UPS = {
  gas24h: 'Dissolved-gas sample 24 h after re-energising',
  gas1w: 'Dissolved-gas sample 1 week after re-energising',
  gas1m: 'Dissolved-gas sample 1 month after re-energising',
  sweepNextOutage: 'Frequency-response sweep at the next outage',
  /** A unit that stayed in service: the samples count from the event. */
  gasNow: 'Dissolved-gas sample now (the unit stayed in service)',
  gas24hEvent: 'Dissolved-gas sample again 24 h after the event',
  gas1wEvent: 'Dissolved-gas sample 1 week after the event',
  gas1mEvent: 'Dissolved-gas sample 1 month after the event',
} as const;

/** Whether the unit stayed in service through the event (it was not de-energised). */
export const stayedInService = (c: GapsightCase): boolean => !!c.fault && c.fault.transformerTripped === false;

/** Whether a required item is a sweep that was taken but has no baseline trace to compare with (so it is not judged). */
export const lacksBaselineTrace = (item: string): boolean => /^sweep\.(hv|lv|tv)(\.[ABC])?\.no-baseline$/.test(item);

/** Words for a required item named by its case field. */
export function describeRequired(item: string): string {
  const m = /^capacitance\.(.+)$/.exec(item);
  if (m) return `${m[1]} capacitance`;
  const r = /^reactance\.(.+)$/.exec(item);
  if (r) return `reactance phase ${r[1]}`;
  const sw = /^sweep\.(hv|lv|tv)(?:\.([ABC]))?$/.exec(item);
  if (sw) return sw[2] ? `sweep of ${sw[1].toUpperCase()} phase ${sw[2]}` : `${sw[1].toUpperCase()} open-circuit sweep`;
  // A phase whose traces are there but have no baseline trace: not missing, not judged.
  const nb = /^sweep\.(hv|lv|tv)(?:\.([ABC]))?\.no-baseline$/.exec(item);
  if (nb) return `${nb[2] ? `sweep of ${nb[1].toUpperCase()} phase ${nb[2]}` : `${nb[1].toUpperCase()} open-circuit sweep`} (${NO_BASELINE_TRACE_NOTE})`;
  const label = /^sweep\.(.+)$/.exec(item);
  if (label) return `sweep ${label[1]}`;
  const words: Record<string, string> = {
    reactance: 'reactance',
    sweep: 'sweep',
    dissolvedGasPPM: 'dissolved gases',
    excitationCurrentMA: 'excitation current',
    windingResistanceOhm: 'winding resistance',
    turnsRatio: 'turns ratio',
  };
  return words[item] ?? item;
}

const joinAnd = (xs: readonly string[]) => (xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`);

/** Words for a list of required items, per-phase sweeps of one winding grouped ("sweeps of HV phases B and C"). */
export function describeRequiredList(items: readonly string[], unreliable: readonly string[] = []): string {
  const out: string[] = [];
  const sweepPhases = new Map<string, string[]>();
  for (const item of items) {
    const sw = /^sweep\.(hv|lv|tv)\.([ABC])$/.exec(item);
    if (sw && !unreliable.includes(item)) {
      if (!sweepPhases.has(sw[1])) {
        sweepPhases.set(sw[1], []);
        out.push(`@sweeps:${sw[1]}`);
      }
      sweepPhases.get(sw[1])!.push(sw[2]);
      continue;
    }
    out.push(unreliable.includes(item) ? `${describeRequired(item)} (unreliable: repeat)` : describeRequired(item));
  }
  return out
    .map((x) => {
      if (!x.startsWith('@sweeps:')) return x;
      const w = x.slice(8);
      const ph = sweepPhases.get(w)!;
      return ph.length === 1 ? `sweep of ${w.toUpperCase()} phase ${ph[0]}` : `sweeps of ${w.toUpperCase()} phases ${joinAnd(ph)}`;
    })
    .join(', ');
}

/** Capacitance configurations the case must have (unit.requiredCapacitance, else by windings). */
export function requiredCapacitance(c: GapsightCase, criteria: Criteria): string[] {
  return c.unit.requiredCapacitance ?? criteria.capacitance.requiredByWindings[c.unit.windings ?? 'two-winding'];
}

/** Whether the unit stays on the duty-only path: it stayed in service and the fault was not high duty. */
export function isDutyOnlyPath(c: GapsightCase, tf: ThroughFault | null): boolean {
  return stayedInService(c) && !(tf?.highDuty ?? false);
}

/** Methods after merging same-test methods (power factor is measured with capacitance). */
const methodOf = (i: Indicator, criteria: Criteria): Method => (criteria.verdict.sameTestAs[i.method] ?? i.method) as Method;

/** Whether an indicator counts as evidence of a new deformation: a change, sister or phase comparison, not low-confidence. */
export function countsForCorroboration(i: Indicator, criteria: Criteria): boolean {
  if (levelRank(i.level) < levelRank('watch') || i.lowConfidence) return false;
  if (i.basis !== 'change' && i.basis !== 'sisters' && i.basis !== 'phase-comparison') return false;
  return criteria.verdict.independentMethods.includes(methodOf(i, criteria));
}

/** A `change` finding at investigate or above in capacitance or reactance (it asks for the sweeps: a second method). */
const findingAsksForSweeps = (indicators: readonly Indicator[]) =>
  indicators.some((i) => i.basis === 'change' && !i.lowConfidence && (i.method === 'capacitance' || i.method === 'reactance') && levelRank(i.level) >= levelRank('investigate'));

type SweepNeed = { missing: string[]; unreliable: string[] };

/**
 * Required sweeps (revision 2): for a three-phase unit an open-circuit trace of the HV winding for each of A, B, C with
 * its own baseline trace — or, without baseline traces, phases A and C compared with each other and B present; for a
 * single-phase unit one open-circuit trace with a baseline. A phase whose only trace is unreliable (tap mismatch) is
 * blocked by that trace, listed as unreliable, not as missing.
 */
export function requiredSweeps(c: GapsightCase, criteria: Criteria): SweepNeed {
  const hvOc = (c.sweeps ?? []).filter((s) => s.testType === 'open-circuit' && sweepWinding(s) === 'hv');
  const judged = (s: Sweep) => (analyseSweep(s, criteria)?.class ?? null) !== null;
  if (c.unit.phases === 1) {
    if (hvOc.some((s) => judged(s) && !sweepTapMismatch(s))) return { missing: [], unreliable: [] };
    const bad = hvOc.filter((s) => judged(s) && sweepTapMismatch(s));
    if (bad.length) return { missing: [], unreliable: [`sweep.${bad[0].label}`] };
    return { missing: [hvOc.length > 0 && hvOc.every((s) => !s.baseline?.length) ? 'sweep.hv.no-baseline' : 'sweep.hv'], unreliable: [] };
  }
  const ac = phaseComparisons(c.sweeps ?? []).find((p) => p.winding === 'hv');
  const acJudged = !!ac && compareTraces(ac.a.postFault, ac.c.postFault, criteria, { bands: ['mid', 'high'] }).class !== null;
  const missing: string[] = [];
  const unreliable: string[] = [];
  for (const phase of ['A', 'B', 'C'] as const) {
    const traces = hvOc.filter((s) => s.phase === phase);
    if (traces.some((s) => judged(s) && !sweepTapMismatch(s))) continue;
    if (acJudged && (phase !== 'B' || traces.some((s) => !sweepTapMismatch(s)))) continue;
    const bad = traces.find((s) => sweepTapMismatch(s));
    if (bad) unreliable.push(`sweep.${bad.label}`);
    // Traces of the phase without a baseline trace are there but cannot be judged: said so, not "missing".
    else if (traces.length > 0 && traces.every((s) => !s.baseline?.length)) missing.push(`sweep.hv.${phase}.no-baseline`);
    else missing.push(`sweep.hv.${phase}`);
  }
  return { missing, unreliable };
}

export type RequiredItems = { missing: string[]; blockingUnreliable: string[]; sweepsAskedByFinding: boolean };

/** Required quantities that are missing (post-fault value or reference lacking) or unreliable, by their case field. */
export function requiredItems(
  c: GapsightCase,
  tf: ThroughFault | null,
  criteria: Criteria,
  indicators: readonly Indicator[] = [],
  unreliable: readonly string[] = [],
): RequiredItems {
  const buchholz = (c.fault?.protectionOperated ?? []).includes('buchholz-alarm');
  const missing: string[] = [];
  const blocking: string[] = [];
  const gasMissing = () => !c.postFault?.dissolvedGasPPM || !preFaultGas(c);
  if (isDutyOnlyPath(c, tf)) {
    if (buchholz && gasMissing()) missing.push('dissolvedGasPPM');
    return { missing, blockingUnreliable: [], sweepsAskedByFinding: false };
  }
  const minSisters = criteria.sisters.minSistersDeviation;
  const sisters = c.sisters ?? [];
  const post = c.postFault;
  const need = (item: string, present: boolean) => {
    if (unreliable.includes(item)) blocking.push(item);
    else if (!present) missing.push(item);
  };
  for (const cfg of requiredCapacitance(c, criteria)) {
    const hasPost = post?.capacitancePF?.[cfg] !== undefined;
    const hasRef = c.baseline?.capacitancePF?.[cfg] !== undefined || sisters.filter((s) => s.capacitancePF?.[cfg] !== undefined).length >= minSisters;
    need(`capacitance.${cfg}`, hasPost && hasRef);
  }
  const hasReactanceRef = (phase: string) =>
    c.baseline?.reactance?.[phase] !== undefined || sisters.filter((s) => s.reactance?.[phase] !== undefined).length >= minSisters;
  if (c.unit.phases === 3) {
    for (const phase of ['A', 'B', 'C']) need(`reactance.${phase}`, !!post?.reactance?.[phase] && hasReactanceRef(phase));
  } else {
    const phases = Object.keys(post?.reactance ?? {});
    const usable = phases.filter((p) => hasReactanceRef(p) && !unreliable.includes(`reactance.${p}`));
    if (!usable.length) {
      const bad = phases.find((p) => unreliable.includes(`reactance.${p}`));
      if (bad) blocking.push(`reactance.${bad}`);
      else missing.push('reactance');
    }
  }
  const sweepsAskedByFinding = findingAsksForSweeps(indicators);
  if (tf?.highDuty || sweepsAskedByFinding) {
    const sw = requiredSweeps(c, criteria);
    missing.push(...sw.missing);
    blocking.push(...sw.unreliable);
  }
  if (tf?.highDuty || buchholz) need('dissolvedGasPPM', !gasMissing());
  if (tf?.highDuty) {
    const phaseSection = (field: 'excitationCurrentMA' | 'windingResistanceOhm') => {
      const p = post?.[field];
      if (!p) return false;
      return Object.keys(p).some(
        (ph) => c.baseline?.[field]?.[ph] !== undefined || sisters.filter((s) => s[field]?.[ph] !== undefined).length >= minSisters,
      );
    };
    need('excitationCurrentMA', phaseSection('excitationCurrentMA'));
    need('windingResistanceOhm', phaseSection('windingResistanceOhm'));
  }
  return { missing, blockingUnreliable: blocking, sweepsAskedByFinding };
}

/** Required quantities that are missing (not unreliable ones: those are listed in `unreliable`). */
export function missingRequired(c: GapsightCase, tf: ThroughFault | null, criteria: Criteria, indicators: readonly Indicator[] = [], unreliable: readonly string[] = []): string[] {
  return requiredItems(c, tf, criteria, indicators, unreliable).missing;
}

/** Independent methods (same-test methods merged) with an indicator that counts for corroboration. */
export function corroboratingMethods(indicators: readonly Indicator[], criteria: Criteria): Method[] {
  const methods = new Set<Method>();
  for (const i of indicators) if (countsForCorroboration(i, criteria)) methods.add(methodOf(i, criteria));
  return [...methods];
}

export type Overall = { level: Level; highest: Level; raised: boolean; capped: boolean; methods: Method[] };

/**
 * Overall level: the highest indicator level, raised one step when enough independent methods have an indicator that
 * counts; then, when no `change` indicator (not low-confidence) is at watch or above, capped at the sister cap
 * (sister and phase comparisons, duty or state alone never give no-go).
 */
export function overallLevel(indicators: readonly Indicator[], criteria: Criteria): Overall {
  const highest = indicators.reduce<Level>((l, i) => maxLevel(l, i.level), 'ok');
  const methods = corroboratingMethods(indicators, criteria);
  const raised = methods.length >= criteria.verdict.corroborationMinMethods;
  let level = raised ? raiseOneStep(highest) : highest;
  const changeFinding = indicators.some((i) => i.basis === 'change' && !i.lowConfidence && levelRank(i.level) >= levelRank('watch'));
  let capped = false;
  if (!changeFinding) {
    const cap = criteria.sisters.referenceCap;
    capped = levelRank(level) > levelRank(cap);
    level = capLevel(level, cap);
  }
  return { level, highest, raised, capped, methods };
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
  if (p[0] === 'reactance' && last === 'deviationFromAveragePercent') return { subject: `Phase ${p[1]} leakage reactance`, verb: "deviates from the phases' mean by", unit: ' %', signed: true };
  if (p[0] === 'reactance') return { subject: `Phase ${p[1]} leakage reactance`, verb: 'shifted', unit: ' %', signed: true };
  if (p[0] === 'bushing' && last === 'c1ShiftPercent') return { subject: `Bushing ${p[1]} C1`, verb: 'shifted', unit: ' %', signed: true };
  if (p[0] === 'bushing' && last === 'c1Pf20RisePercent') return { subject: `Bushing ${p[1]} C1 power factor at 20 °C`, verb: 'changed by', unit: ' %', signed: true };
  if (p[0] === 'sisters' && last === 'modifiedZ') return { subject: `${p[2]} ${p[1]} among sister units (a state)`, verb: 'has modified z', unit: '', signed: true };
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
  const doubt = i.lowConfidence ? ' [low confidence]' : '';
  if (i.method === 'sweep' && i.key.endsWith('.class')) {
    const label = i.key.slice('sweep.'.length, -'.class'.length);
    if (i.basis === 'phase-comparison') {
      return `Sweeps of ${label.replace(/\.AC$/, '').toUpperCase()} phases A and C differ: DL/T 911 class "${String(i.value)}" (${i.level}, phase comparison without a baseline trace)`;
    }
    return `Sweep ${label} is DL/T 911 class "${String(i.value)}" against its baseline trace (${i.level})${doubt}${i.note ? `: ${i.note}` : ''}`;
  }
  if (i.key === 'duty.eventDutyPercent') return `Fault beyond the through-fault curve (event I²t ${formatNumber(i.value as number)} % of K) (${i.level})`;
  if (i.key === 'duty.thermalDurationPercent') return `Fault lasted longer than the thermal curve allows (${formatNumber(i.value as number)} % of the allowed time) (${i.level})`;
  if (i.key === 'duty.forceRatioPercent') return `Fault current above the design maximum (force ratio ${formatNumber(i.value as number)} %): check the impedances (${i.level})`;
  if (i.key === 'duty.shotsAboveSegment') return `Frequent-fault duty: ${String(i.value)} shots at or above the segment start (${i.level}; ${i.rule})`;
  const ph = phraseFor(i.key);
  const value = typeof i.value === 'number' ? i.value : null;
  const threshold = new RegExp(`${i.level} ≥ ([^,()]+)`).exec(i.rule)?.[1]?.trim();
  const judged = threshold ? `${i.level} from ${threshold}` : `${i.level}; ${i.rule}`;
  const ref = i.reference ? ` against the ${i.reference}` : '';
  const note = i.note ? ` — ${i.note}` : '';
  if (!ph || value === null) return `${i.key} = ${String(i.value)}${ref} (${judged})${doubt}${note}`;
  return `${ph.subject} ${ph.verb} ${formatNumber(value, ph.signed)}${ph.unit}${ref} (${judged})${doubt}${note}`;
}

export type Verdict = {
  recommendation: Recommendation;
  overallLevel: Level;
  reasons: string[];
  missing: string[];
  unreliable: string[];
  followUps: string[];
};

/** The fault's duty in words: winding current, force or (thermal region) time against the allowed time. */
export function dutyWords(tf: ThroughFault, criteria: Criteria): string {
  const current = tf.currentBasis === 'line-assumed' ? 'rated line current (winding current not derived)' : 'rated winding current';
  const head = `${tf.currentPerUnit.toFixed(1)} × ${current}`;
  if (tf.highDuty) return `${head}, ${tf.forceRatioPercent.toFixed(0)} % of the design force`;
  const allowed = thermalCurveTimeS(tf.currentPerUnit, criteria);
  if (!Number.isFinite(allowed) || tf.thermalDurationPercent === null || tf.thermalDurationPercent === undefined) return `${head}, below the thermal curve`;
  const lasted = (tf.thermalDurationPercent / 100) * allowed;
  return `${head}, ${formatNumber(lasted)} s of the ${formatNumber(allowed)} s the thermal curve allows`;
}

/** The repeat instruction of an unreliable item, read from the notes of its indicators. */
function repeatInstruction(item: string, indicators: readonly Indicator[], c: GapsightCase): string {
  const prefix = item.startsWith('capacitance.') || item.startsWith('reactance.') || item.startsWith('sweep.')
    ? `${item}.`
    : item === 'turnsRatio' ? 'ratio.' : item === 'windingResistanceOhm' ? 'resistance.' : item === 'excitationCurrentMA' ? 'excitation.' : `${item}.`;
  const notes = indicators.filter((i) => i.key.startsWith(prefix) && i.note).map((i) => i.note as string);
  const what = describeRequired(item);
  const tap = notes.find((n) => n.includes('tap mismatch'));
  if (tap) return `Repeat ${what} at the reference tap (${/repeat at tap ([^;]+)/.exec(tap)?.[1] ?? String(c.baseline?.tapPosition ?? '')})`;
  if (notes.some((n) => n.includes('implausible'))) return `Check the unit of measure and the connection, then repeat ${what} (implausible against the reference)`;
  if (notes.some((n) => n.includes('residual magnetism'))) return 'Demagnetise the core and repeat the excitation current (and sweeps) before any DC test';
  if (notes.some((n) => n.includes('test voltage differs'))) return 'Repeat the excitation-current test at the baseline test voltage';
  if (notes.some((n) => n.includes('GST'))) return `Repeat the ${item.slice('capacitance.'.length)} capacitance test (GST/UST consistency)`;
  return `Repeat ${what}`;
}

/** Apply the verdict order of the case format (revision 2) to computed indicators. */
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
  const inService = stayedInService(c);
  const dutyOnly = isDutyOnlyPath(c, tf);
  const buchholz = (c.fault?.protectionOperated ?? []).includes('buchholz-alarm');
  const req = requiredItems(c, tf, criteria, indicators, unreliable);
  const missing = req.missing;
  const blocking = [...missing, ...req.blockingUnreliable];
  const duty = tf ? dutyWords(tf, criteria) : '';

  // (1) internal-protection gate
  const internal = (c.fault?.protectionOperated ?? []).filter((p) => criteria.verdict.internalProtections.includes(p));
  if (internal.length) {
    reasons.push(`Internal protection operated (${internal.join(', ')}): investigate as an internal fault${inService ? ' — take the unit out of service' : ''}`);
  }

  // (3) missing / unreliable required quantities (reason first: it explains a hold)
  const hold = inService ? 'take out of service for tests' : 'hold pending tests';
  if (blocking.length) {
    const list = describeRequiredList(blocking, req.blockingUnreliable);
    if (tf?.highDuty) reasons.push(`High-duty fault (${duty}): ${hold}: ${list}`);
    else reasons.push(`Complete: ${list}${req.sweepsAskedByFinding && missing.some((m) => m.startsWith('sweep')) ? ' (a capacitance or reactance finding needs a second method)' : ''}`);
  } else if (tf?.highDuty) {
    reasons.push(`High-duty fault (${duty}): full post-fault test set required and present`);
  }
  if (dutyOnly) {
    reasons.push(
      `Unit stayed in service and the fault was not high duty${tf ? ` (${duty})` : ''}: the recommendation rests on the duty figures${c.postFault ? ' and the readings given' : ' alone, with no post-fault tests'}; dissolved-gas samples now and again at 24 h`,
    );
  } else if (tf && !tf.highDuty) {
    reasons.push(`Fault in the thermal region of the through-fault curve (${duty})`);
  }
  if (tf?.currentBasis === 'line-assumed') {
    reasons.push('Winding current not derived (the vector group or the fault does not fix it): the line current was used as it is — enter the winding current or attach the relay record');
  }
  if (buchholz) reasons.push('Buchholz alarm: gas collected in the relay must be analysed (dissolved gases) before a go');

  // (2) + (4) levels, corroboration and the sister / phase-comparison cap
  const overall = overallLevel(indicators, criteria);
  const level = overall.level;
  const flagged = [...indicators].filter((i) => i.level !== 'ok').sort((a, b) => levelRank(b.level) - levelRank(a.level));
  for (const i of flagged) reasons.push(indicatorReason(i));
  if (overall.raised) {
    const byLocation = new Map<string, Set<string>>();
    for (const i of indicators) {
      if (!countsForCorroboration(i, criteria) || !i.location) continue;
      byLocation.set(i.location, (byLocation.get(i.location) ?? new Set()).add(methodOf(i, criteria)));
    }
    const agree = [...byLocation.entries()].filter(([, m]) => m.size >= 2).map(([loc]) => loc);
    const raisedTo = raiseOneStep(overall.highest);
    const effect = raisedTo === overall.highest ? `${overall.highest} stands` : `level raised from ${overall.highest} to ${raisedTo}`;
    reasons.push(`Independent methods agree (${overall.methods.join(', ')})${agree.length ? ` at ${agree.join(', ')}` : ''}: ${effect}`);
  }
  if (overall.capped) {
    reasons.push(`No change against the unit's own readings: the level rests on sister or phase comparisons, duty or state alone and is capped at ${level}`);
  }
  for (const h of hints) reasons.push(h);

  // capacitance as the only evidence
  const evidence = indicators.filter((i) => i.value !== null && criteria.verdict.independentMethods.includes(methodOf(i, criteria)));
  const capShifts = indicators.filter((i) => i.method === 'capacitance' && /\.shift(FromPrevious)?Percent$/.test(i.key));
  if (capShifts.length && evidence.every((i) => i.method === 'capacitance' || i.method === 'power-factor') && capShifts.every((i) => i.level === 'ok')) {
    reasons.push(AXIAL_MOVEMENT_NOTE);
  }
  if (indicators.some((i) => i.note?.includes("sisters' median as reference"))) {
    reasons.push("No own baseline for some quantities: sisters' median as reference (such findings capped at investigate)");
  }
  const notBlocking = unreliable.filter((u) => !blocking.includes(u));
  if (notBlocking.length) reasons.push(`Not judged (unreliable): ${notBlocking.map((u) => repeatInstruction(u, indicators, c)).join('; ')}`);

  // (5) recommendation; the missing rule can only make it stricter; Buchholz alarm and an assumed current on the
  // duty-only path keep a go conditional; the internal gate overrides.
  let recommendation = recommendationOf(level);
  if (blocking.length) recommendation = stricter(recommendation, tf?.highDuty ? 'no-go' : 'conditional');
  if (recommendation === 'go' && (buchholz || (dutyOnly && tf?.currentBasis === 'line-assumed'))) recommendation = 'conditional';
  if (internal.length) recommendation = 'no-go';
  if (!flagged.length && !blocking.length && !internal.length && recommendation === 'go') reasons.push('No indicator at watch or above');
  if (inService && recommendation === 'no-go' && !internal.length && !(blocking.length && tf?.highDuty)) {
    reasons.unshift(`Unit is still in service: take out of service for tests (${flagged[0] ? indicatorReason(flagged[0]) : 'see the reasons below'})`);
  }
  if (dutyOnly && recommendation === 'go' && !c.postFault) {
    reasons.unshift('Go rests on the duty figures alone, with no post-fault tests: the unit stayed in service through a fault below the high-duty current');
  }

  // follow-ups
  if (internal.length) followUps.push(inService ? 'Take the unit out of service and investigate as an internal fault (internal inspection)' : 'Investigate as an internal fault (internal inspection) before re-energising');
  if (blocking.length) followUps.push(`Complete the tests and re-screen: ${describeRequiredList(blocking, req.blockingUnreliable)}`);
  for (const u of unreliable) followUps.push(repeatInstruction(u, indicators, c));
  for (const i of indicators) if (i.method === 'sweep' && i.key.endsWith('.class') && i.note?.includes('demagnetise')) followUps.push(`Demagnetise and repeat sweep ${i.key.slice(6, -6)}`);
  if (buchholz) followUps.push('Analyse the gas collected in the Buchholz relay and an oil sample before re-energising');
  if (inService) followUps.push(FOLLOW_UPS.gasNow, FOLLOW_UPS.gas24hEvent, FOLLOW_UPS.gas1wEvent, FOLLOW_UPS.gas1mEvent);
  else followUps.push(FOLLOW_UPS.gas24h, FOLLOW_UPS.gas1w, FOLLOW_UPS.gas1m);
  const sweepDone = indicators.some((i) => i.method === 'sweep' && i.key.endsWith('.class') && i.value !== null);
  if (!sweepDone) followUps.push(FOLLOW_UPS.sweepNextOutage);

  return { recommendation, overallLevel: level, reasons, missing, unreliable, followUps: [...new Set(followUps)] };
}
