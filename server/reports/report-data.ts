import type { GapsightCase } from '../../shared/schemas/case.js';
import type { GapsightResult } from '../../shared/schemas/result.js';
import type { Criteria } from '../../shared/screening/criteria.js';

/** Everything the manager's e-mail and the PDF report say about one stored screening (assembled from the database). */
export interface ScreeningReportData {
  screening: {
    id: number;
    computedAt: string;
    criteriaVersion: number;
    comparison: boolean;
    computedBy: { name: string; email: string } | null;
  };
  event: {
    id: number;
    occurredAt: string;
    type: string;
    side: 'hv' | 'lv';
    faultedPhases: string | null;
    transformerTripped: boolean;
    protectionOperated: string[];
    notes: string | null;
    status: string;
    /** How many earlier faults of this unit reached the mechanical segment start, and since when (for "the 2nd such fault since 2024"). */
    priorHighDutyCount: number;
    priorHighDutySince: string | null;
  };
  unit: { id: number; serial: string; position: string; ratedKVA: number; hvKV: number; lvKV: number; impedancePercent: number; designReference: string };
  site: { name: string; timeZone: string };
  /** People who entered the post-fault sessions, with how to reach them. */
  testers: { name: string; email: string }[];
  /** The case the engine was given (dates of baseline/previous, tap and temperature for the caveats). */
  case: GapsightCase;
  result: GapsightResult;
  /** The criteria set the screening ran under (default: version 1); the mail explains corroboration with it. */
  criteria?: Criteria;
  /** Link to the event file in the app. */
  eventUrl: string;
  /** Optional: where the baseline comes from, in words ("factory test", "commissioning test 2009"); default "factory or commissioning test". */
  baselineSource?: string;
}
