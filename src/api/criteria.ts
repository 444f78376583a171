// Criteria sets: every version of the engine's thresholds, drafts, publishing.
import type { Criteria } from '../../shared/screening/criteria';
import type { CriteriaSetView } from '../../shared/schemas/responses';
import { api } from './client';

/** A criteria set version (its schema: shared/schemas/responses/criteria.ts). */
export type CriteriaSet = CriteriaSetView;
export type { Criteria };

/** POST /api/criteria body: a new draft copied from a version. */
export interface NewDraftBody {
  fromVersion: number;
  name?: string;
  notes?: string | null;
}

/** PATCH /api/criteria/:version body (drafts only): any of thresholds (whole), name, notes. */
export interface DraftPatchBody {
  thresholds?: Criteria;
  name?: string;
  notes?: string | null;
}

// GET /api/criteria — every version, newest first.
export function listCriteria(signal?: AbortSignal): Promise<CriteriaSet[]> {
  return api.get<CriteriaSet[]>('/criteria', { signal });
}

// GET /api/criteria/:version — one version with its thresholds.
export function getCriteria(version: number, signal?: AbortSignal): Promise<CriteriaSet> {
  return api.get<CriteriaSet>(`/criteria/${version}`, { signal });
}

// The newest published version (what a normal screening uses); null when none is published.
export async function getActiveCriteria(signal?: AbortSignal): Promise<CriteriaSet | null> {
  const all = await listCriteria(signal);
  return all.filter((c) => c.status === 'published').sort((a, b) => b.version - a.version)[0] ?? null;
}

// POST /api/criteria — a new draft copied from a version (engineer, admin).
export function createDraft(body: NewDraftBody): Promise<CriteriaSet> {
  return api.post<CriteriaSet>('/criteria', body);
}

// PATCH /api/criteria/:version — change a draft (409 on a published version; 400 names the field path).
export function patchDraft(version: number, body: DraftPatchBody): Promise<CriteriaSet> {
  return api.patch<CriteriaSet>(`/criteria/${version}`, body);
}

// POST /api/criteria/:version/publish — the version becomes immutable and screenings use it (admin).
export function publishCriteria(version: number): Promise<CriteriaSet> {
  return api.post<CriteriaSet>(`/criteria/${version}/publish`);
}
