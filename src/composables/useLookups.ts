// Sites and designs for filters and labels: small lists, loaded once per page that needs them.
import { listDesigns } from '../api/designs';
import { listSites } from '../api/sites';
import { useRouteResource } from './useRouteResource';

// GET /api/sites as page state.
export function useSites() {
  return useRouteResource(
    () => 'sites',
    (_key, signal) => listSites(signal),
  );
}

// GET /api/designs as page state.
export function useDesigns() {
  return useRouteResource(
    () => 'designs',
    (_key, signal) => listDesigns(signal),
  );
}
