// The fleet list: one page of units from the server with its filters, sort and paging (loaded through
// useRouteResource, keyed by the whole query), and a CSV-export fetch of every page of the same filter (up to a limit).
import { computed, reactive, ref } from 'vue';
import { listUnits, type UnitListItem, type UnitListQuery, type UnitSort } from '../api/units';
import type { Recommendation } from '../../shared/schemas/result';
import { useRouteResource } from './useRouteResource';

export interface UnitFilters {
  q: string;
  siteId: number | null;
  designId: number | null;
  recommendation: Recommendation | null;
}

/** Largest page the server allows (unitListQuerySchema). */
export const MAX_PAGE_SIZE = 500;
/** The CSV export stops after this many rows and says so. */
export const EXPORT_ROW_LIMIT = 5000;

// State and loaders of the fleet table: a change of filter, sort, page or page size loads that page.
export function useUnits(initial: Partial<UnitFilters> = {}) {
  const filters = reactive<UnitFilters>({ q: '', siteId: null, designId: null, recommendation: null, ...initial });
  const sort = ref<UnitSort>('serial');
  const page = ref(1);
  const pageSize = ref(25);

  const filterQuery = computed<UnitListQuery>(() => ({
    q: (filters.q ?? '').trim() || undefined,
    siteId: filters.siteId ?? undefined,
    designId: filters.designId ?? undefined,
    recommendation: filters.recommendation ?? undefined,
  }));

  const filtered = computed(() => Object.values(filterQuery.value).some((v) => v !== undefined));

  const resource = useRouteResource(
    () => ({ ...filterQuery.value, sort: sort.value, page: page.value, pageSize: pageSize.value }),
    (query, signal) => listUnits(query, signal),
  );
  const items = computed<UnitListItem[]>(() => resource.data.value?.items ?? []);
  const total = computed(() => resource.data.value?.total ?? 0);

  // Every unit of the current filter and sort, page by page (the export); `truncated` when the limit was reached.
  async function fetchAll(limit = EXPORT_ROW_LIMIT): Promise<{ items: UnitListItem[]; total: number; truncated: boolean }> {
    const all: UnitListItem[] = [];
    let total = 0;
    for (let p = 1; all.length < limit; p += 1) {
      const answer = await listUnits({ ...filterQuery.value, sort: sort.value, page: p, pageSize: MAX_PAGE_SIZE });
      total = answer.total;
      all.push(...answer.items);
      if (answer.items.length < MAX_PAGE_SIZE || all.length >= total) break;
    }
    return { items: all.slice(0, limit), total, truncated: total > limit };
  }

  return { filters, sort, page, pageSize, items, total, resource, loading: resource.loading, filtered, filterQuery, reload: resource.reload, fetchAll };
}
