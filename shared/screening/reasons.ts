// The one-line reason of a result, for banners, subjects and lists: the reason that decides the recommendation.
// It reads the engine's own reason wording (verdict.ts), so it lives beside the engine.
import type { GapsightResult } from '../schemas/result.js';

const INFORMATIONAL = [
  /full post-fault test set required and present/i,
  /does not rule out axial movement/i,
  /^No own baseline for some quantities/i,
  /^Fault in the thermal region/,
  /^Winding current not derived/,
  /^Not judged \(unreliable\)/,
  /^Unit stayed in service and the fault was not high duty/,
];

/** The reason that decides the recommendation, as it is written in the result (first decisive one). */
export function decisiveReason(result: GapsightResult): string {
  const reasons = result.reasons;
  const find = (re: RegExp) => reasons.find((r) => re.test(r));
  const internal = find(/^Internal protection operated/);
  if (internal) return internal;
  const outOfService = find(/^Unit is still in service: take out of service for tests/);
  if (outOfService) return outOfService;
  const hold = find(/hold pending tests:|take out of service for tests:|^Complete:/);
  if (hold) return hold;
  const corroboration = find(/^Independent methods agree/);
  const overall = result.overallLevel;
  if (corroboration && overall && !result.indicators.some((i) => i.level === overall)) return corroboration;
  const decisive = reasons.find((r) => !INFORMATIONAL.some((re) => re.test(r)));
  return decisive ?? reasons[0] ?? 'No reason recorded';
}
