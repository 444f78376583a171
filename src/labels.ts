// Words for the engine's and the API's codes: the one shared vocabulary (also used by the mail and the PDF), plus the
// screen-only helpers. Imports leaf modules only, so a page that needs a label loads no engine and no zod.
import type { Indicator } from '../shared/schemas/result';
import { basisLabel } from '../shared/vocabulary';

export {
  AUDIT_ACTION_LABELS,
  BASIS_LABELS,
  CURRENT_BASIS_LABELS,
  CURRENT_IS_LABELS,
  FAULT_TYPE_LABELS,
  FINDING_LABELS,
  GAS_LABELS,
  KIND_LABELS,
  LEVEL_LABELS,
  METHOD_LABELS,
  NOTIFICATION_STATUS_LABELS,
  OUTCOME_LABELS,
  PROTECTION_LABELS,
  QUANTITY_LABELS,
  RECOMMENDATION_LABELS,
  SIDE_LABELS,
  STATUS_LABELS,
  WINDING_LABELS,
  indicatorLabel,
  indicatorUnit,
  rulesText,
} from '../shared/vocabulary';
export { INTERNAL_PROTECTIONS } from '../shared/screening/protections';

/** An indicator's basis in words for a table cell ('—' when the result has none). */
export function basisText(i: Pick<Indicator, 'key' | 'basis' | 'reference'>): string {
  return basisLabel(i) ?? '—';
}
