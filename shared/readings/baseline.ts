// Which of a unit's reading sets make its baseline: a leaf module (type imports only) shared by the case export and the
// unit file.
import type { ReadingSetKind } from '../schemas/enums.js';

/** What decides whether a stored reading set is part of the baseline. */
export interface BaselineCandidate {
  kind: ReadingSetKind;
  /** Marked by a tester as a reference set (a routine set may be one). */
  isReference: boolean;
}

/**
 * A factory or commissioning set always counts as baseline; a routine set counts when marked as a reference; a
 * post-fault set never does.
 */
export function isBaselineSet(s: BaselineCandidate): boolean {
  if (s.kind === 'post-fault') return false;
  return s.kind === 'factory' || s.kind === 'commissioning' || s.isReference;
}
