// Sites (substations) with their time zones — GET /api/sites.
import type { SiteView } from '../../shared/schemas/responses';
import { api } from './client';

/** A site (its schema: shared/schemas/responses). */
export type Site = SiteView;

// GET /api/sites — every site by name.
export function listSites(signal?: AbortSignal): Promise<Site[]> {
  return api.get<Site[]>('/sites', { signal });
}
