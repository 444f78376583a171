// Design families (sister units) — GET /api/designs, GET /api/designs/:id.
import type { DesignDetail, DesignListItem, DesignView } from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses.
export type { DesignDetail, DesignListItem };
/** A design family's own record. */
export type Design = DesignView;

// GET /api/designs — every design with its number of units.
export function listDesigns(signal?: AbortSignal): Promise<DesignListItem[]> {
  return api.get<DesignListItem[]>('/designs', { signal });
}

// GET /api/designs/:id — one design with its sister units.
export function getDesign(id: number): Promise<DesignDetail> {
  return api.get<DesignDetail>(`/designs/${id}`);
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
