// Sites and designs for filters and labels: small lists, loaded once per page that needs them.
import { listDesigns, type DesignListItem } from '../api/designs';
import { listSites, type Site } from '../api/sites';
import { useAsync } from './useAsync';

// GET /api/sites as page state.
export function useSites() {
  return useAsync<Site[], []>(listSites);
}

// GET /api/designs as page state.
export function useDesigns() {
  return useAsync<DesignListItem[], []>(listDesigns);
}
