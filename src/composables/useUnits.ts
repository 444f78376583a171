// The fleet list: one page of units from the server with its filters, sort and paging (loaded through
// useRouteResource, keyed by the whole query). The export of the same filter is made by the server (GET /api/units/export).
import { computed, reactive, ref } from 'vue';
import { listUnits, type UnitListItem, type UnitListQuery, type UnitSort } from '../api/units';
import type { Recommendation } from '../../shared/schemas/result';
import { useRouteResource } from './useRouteResource';
import { DEFAULT_PAGE_SIZE, type TableUrlState } from './useServerTable';

export interface UnitFilters {
  q: string;
  siteId: number | null;
  designId: number | null;
  recommendation: Recommendation | null;
}

export const DEFAULT_UNIT_SORT: UnitSort = 'serial';

// State and loaders of the fleet table: a change of filter, sort, page or page size loads that page. The fleet page
// starts from the view kept in its URL (`table`, see useServerTable).
export function useUnits(initial: Partial<UnitFilters> = {}, table: Partial<TableUrlState<UnitSort>> = {}) {
  const filters = reactive<UnitFilters>({ q: '', siteId: null, designId: null, recommendation: null, ...initial });
  const sort = ref<UnitSort>(table.sort ?? DEFAULT_UNIT_SORT);
  const page = ref(table.page ?? 1);
  const pageSize = ref(table.pageSize ?? DEFAULT_PAGE_SIZE);

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

  return { filters, sort, page, pageSize, items, total, resource, loading: resource.loading, filtered, filterQuery, reload: resource.reload };
}
