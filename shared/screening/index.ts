// Screening engine entry: one case in, one result out (pure; shared by the server, the CLI and the client preview).
import type { GapsightCase } from '../schemas/case.js';
import type { GapsightResult, Indicator } from '../schemas/result.js';
import { capacitanceIndicators, capacitancePatternHints } from './capacitance.js';
import { criteriaV1, type Criteria } from './criteria.js';
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
export * from './sweep.js';
export * from './sisters.js';
export * from './gas.js';
export * from './excitation.js';
export * from './resistance.js';
export * from './ratio.js';
export * from './df-frequency.js';
export * from './verdict.js';

/** Screen one case against a criteria set (default: version 1) and return the `gapsight-result/1` document. */
export function screenCase(c: GapsightCase, criteria: Criteria = criteriaV1): GapsightResult {
  const throughFault = computeThroughFault(c.unit, c.fault, c.priorFaults ?? [], criteria);
  const cap = capacitanceIndicators(c, criteria);
  const reactance = reactanceIndicators(c, criteria);
  const excitation = excitationIndicators(c, criteria);
  const indicators: Indicator[] = [
    ...dutyIndicators(throughFault, criteria),
    ...cap.indicators,
    ...powerFactorIndicators(c, criteria, cap.unreliable),
    ...dfFrequencyIndicators(c, criteria),
    ...reactance.indicators,
    ...sweepIndicators(c.sweeps ?? [], criteria),
    ...gasIndicators(c, criteria),
    ...excitation.indicators,
    ...resistanceIndicators(c, criteria),
    ...ratioIndicators(c, criteria),
    ...sisterIndicators(c, criteria),
  ];
  const unreliable = [...cap.unreliable, ...reactance.unreliable, ...excitation.unreliable];
  const verdict = decideVerdict(c, indicators, throughFault, unreliable, criteria, capacitancePatternHints(indicators));
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
  };
}
export * from './reasons.js';
