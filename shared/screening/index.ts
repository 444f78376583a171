// Screening engine entry: one case in, one result out (pure; shared by the server, the CLI and the client preview).
import type { GapsightCase } from '../schemas/case.js';
import type { GapsightResult, Indicator } from '../schemas/result.js';
import { capacitanceIndicators, capacitancePatternHints } from './capacitance.js';
import { criteriaV2, ENGINE_REVISION, type Criteria } from './criteria.js';
import { bushingIndicators, noteBushingsOnCH } from './bushing.js';
import { addNote, capLevel } from './levels.js';
import { dfFrequencyIndicators } from './df-frequency.js';
import { excitationIndicators } from './excitation.js';
import { gasIndicators } from './gas.js';
import { powerFactorIndicators } from './power-factor.js';
import { ratioIndicators } from './ratio.js';
import { reactanceIndicators } from './reactance.js';
import { resistanceIndicators } from './resistance.js';
import { sisterIndicators } from './sisters.js';
import { sweepIndicators } from './sweep.js';
import { computeThroughFault, dutyIndicators } from './through-fault.js';
import { CAUTIONS, decideVerdict } from './verdict.js';

export * from './criteria.js';
export * from './levels.js';
export * from './reference.js';
export * from './capacitance.js';
export * from './power-factor.js';
export * from './reactance.js';
export * from './through-fault.js';
export * from './duty-history.js';
export * from './sweep.js';
export * from './sisters.js';
export * from './gas.js';
export * from './excitation.js';
export * from './resistance.js';
export * from './ratio.js';
export * from './df-frequency.js';
export * from './bushing.js';
export * from './verdict.js';

/** Screen one case against a criteria set (default: version 2) and return the `gapsight-result/1` document. */
export function screenCase(c: GapsightCase, criteria: Criteria = criteriaV2): GapsightResult {
  const throughFault = computeThroughFault(c.unit, c.fault, c.priorFaults ?? [], criteria);
  const cap = capacitanceIndicators(c, criteria);
  const reactance = reactanceIndicators(c, criteria);
  const excitation = excitationIndicators(c, criteria);
  const sweeps = sweepIndicators(c.sweeps ?? [], criteria);
  const resistance = resistanceIndicators(c, criteria);
  const ratio = ratioIndicators(c, criteria);
  const indicators: Indicator[] = [
    ...dutyIndicators(throughFault, criteria),
    ...cap.indicators,
    ...powerFactorIndicators(c, criteria, cap.unreliable),
    ...dfFrequencyIndicators(c, criteria),
    ...bushingIndicators(c, criteria),
    ...reactance.indicators,
    ...sweeps.indicators,
    ...gasIndicators(c, criteria),
    ...excitation.indicators,
    ...resistance.indicators,
    ...ratio.indicators,
    ...sisterIndicators(c, criteria),
  ];
  // Step 2 of the verdict: every state item is at most the state cap (an absolute value is not a new deformation).
  const stateCap = criteria.stateCap ?? 'watch';
  for (const i of indicators) if (i.basis === 'state') i.level = capLevel(i.level, stateCap);
  const bushingNote = noteBushingsOnCH(c, indicators, criteria);
  const unreliable = [...cap.unreliable, ...reactance.unreliable, ...excitation.unreliable, ...resistance.unreliable, ...ratio.unreliable, ...sweeps.unreliable];
  // A sister statistic of an unreliable reading says nothing about the unit.
  for (const i of indicators) {
    const m = /^sisters\.((?:capacitance|reactance)\.[^.]+)\./.exec(i.key);
    if (m && unreliable.includes(m[1]) && i.level !== 'ok') {
      i.level = 'ok';
      addNote(i, 'reading unreliable: not judged');
    }
  }
  const hints = [...capacitancePatternHints(indicators), ...(bushingNote ? [bushingNote] : [])];
  const verdict = decideVerdict(c, indicators, throughFault, unreliable, criteria, hints);
  return {
    format: 'gapsight-result/1',
    recommendation: verdict.recommendation,
    reasons: verdict.reasons,
    missing: verdict.missing,
    unreliable: verdict.unreliable,
    followUps: verdict.followUps,
    cautions: [...CAUTIONS],
    throughFault,
    indicators,
    overallLevel: verdict.overallLevel,
    criteriaVersion: criteria.version,
    engineRevision: ENGINE_REVISION,
  };
}
export * from './reasons.js';
