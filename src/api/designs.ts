// Design families (sister units) — GET /api/designs, GET /api/designs/:id.
import type { DesignDetail, DesignListItem, DesignSisterItem, DesignSisters, DesignView } from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses.
export type { DesignDetail, DesignListItem, DesignSisterItem, DesignSisters };
/** A design family's own record. */
export type Design = DesignView;

// GET /api/designs — every design with its number of units.
export function listDesigns(signal?: AbortSignal): Promise<DesignListItem[]> {
  return api.get<DesignListItem[]>('/designs', { signal });
}

// GET /api/designs/:id — one design with its sister units.
export function getDesign(id: number, signal?: AbortSignal): Promise<DesignDetail> {
  return api.get<DesignDetail>(`/designs/${id}`, { signal });
}

// GET /api/designs/:id/sisters?quantity= — the family compared on one quantity (default: the first it has).
export function getDesignSisters(designId: number, quantity?: string, signal?: AbortSignal): Promise<DesignSisters> {
  const query = quantity ? `?quantity=${encodeURIComponent(quantity)}` : '';
  return api.get<DesignSisters>(`/designs/${designId}/sisters${query}`, { signal });
}

/** POST/PATCH /api/designs bodies (the server's zod schemas' input). */
export type DesignBody = import('zod').input<typeof import('../../shared/schemas/fleet').designBodySchema>;

// POST /api/designs — add a design family (admin).
export function createDesign(body: DesignBody): Promise<Design> {
  return api.post<Design>('/designs', body);
}

// PATCH /api/designs/:id — change a design family (admin).
export function updateDesign(id: number, patch: Partial<DesignBody>): Promise<Design> {
  return api.patch<Design>(`/designs/${id}`, patch);
}
