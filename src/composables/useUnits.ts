// The fleet list: one page of units from the server with its filters, sort and paging, and a CSV-export fetch of
// every page of the same filter (up to a limit).
import { computed, reactive, ref, shallowRef } from 'vue';
import { listUnits, type UnitListItem, type UnitListQuery, type UnitSort } from '../api/units';
import type { Recommendation } from '../../shared/schemas/result';
import { toApiError } from './useAsync';
import type { ApiError } from '../api/client';

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

// State and loaders of the fleet table.
export function useUnits(initial: Partial<UnitFilters> = {}) {
  const filters = reactive<UnitFilters>({ q: '', siteId: null, designId: null, recommendation: null, ...initial });
  const sort = ref<UnitSort>('serial');
  const page = ref(1);
  const pageSize = ref(25);
  const items = shallowRef<UnitListItem[]>([]);
  const total = ref(0);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  let calls = 0;
  let controller: AbortController | null = null;

  const filterQuery = computed<UnitListQuery>(() => ({
    q: (filters.q ?? '').trim() || undefined,
    siteId: filters.siteId ?? undefined,
    designId: filters.designId ?? undefined,
    recommendation: filters.recommendation ?? undefined,
  }));

  const filtered = computed(() => Object.values(filterQuery.value).some((v) => v !== undefined));

  // Load the current page; an older request still in flight is aborted.
  async function load(): Promise<void> {
    const call = ++calls;
    controller?.abort();
    controller = new AbortController();
    loading.value = true;
    error.value = null;
    try {
      const answer = await listUnits({ ...filterQuery.value, sort: sort.value, page: page.value, pageSize: pageSize.value }, controller.signal);
      if (call !== calls) return;
      items.value = answer.items;
      total.value = answer.total;
    } catch (caught) {
      if (call !== calls) return;
      items.value = [];
      total.value = 0;
      error.value = toApiError(caught);
    } finally {
      if (call === calls) loading.value = false;
    }
  }

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

  return { filters, sort, page, pageSize, items, total, loading, error, filtered, filterQuery, load, fetchAll };
}
