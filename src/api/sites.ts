// Sites (substations) with their time zones — GET /api/sites.
import type { SiteView } from '../../shared/schemas/responses';
import { api } from './client';

/** A site (its schema: shared/schemas/responses). */
export type Site = SiteView;

// GET /api/sites — every site by name.
export function listSites(signal?: AbortSignal): Promise<Site[]> {
  return api.get<Site[]>('/sites', { signal });
}

/** POST/PATCH /api/sites bodies (the server's zod schemas' input). */
export type SiteBody = import('zod').input<typeof import('../../shared/schemas/fleet').siteBodySchema>;

// POST /api/sites — add a site (admin).
export function createSite(body: SiteBody): Promise<Site> {
  return api.post<Site>('/sites', body);
}

// PATCH /api/sites/:id — rename a site or change its time zone (admin).
export function updateSite(id: number, patch: Partial<SiteBody>): Promise<Site> {
  return api.patch<Site>(`/sites/${id}`, patch);
}
