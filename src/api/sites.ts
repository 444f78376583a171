// Sites (substations) with their time zones — GET /api/sites.
import { api } from './client';

export interface Site {
  id: number;
  name: string;
  /** IANA time zone, e.g. Europe/London: the site's dates are shown in it. */
  timeZone: string;
}

// GET /api/sites — every site by name.
export function listSites(): Promise<Site[]> {
  return api.get<Site[]>('/sites');
}
