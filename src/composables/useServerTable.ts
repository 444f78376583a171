// A QTable in server mode over a paged list: the pager follows the server's total once an answer is in (not while the
// next page loads), sorting or paging asks the list for that page, and a new filter starts again at page 1.
// The filters, the sort and the page are kept in the URL query (`?q=…&siteId=…&sort=-lastEventAt&page=3`), replaced
// in place (no history entry per click), so Back from a row's page returns to the same view, and a link can be shared.
import { computed, ref, watch, type Ref, type WatchSource } from 'vue';
import { useRoute, useRouter, type LocationQuery, type LocationQueryRaw } from 'vue-router';
import type { QTableProps } from 'quasar';

interface PagedList<S> {
  resource: { data: Readonly<Ref<{ total: number } | null>>; error: Readonly<Ref<unknown>> };
  sort: Ref<S>;
  page: Ref<number>;
  pageSize: Ref<number>;
  total: Readonly<Ref<number>>;
  filterQuery: Readonly<Ref<object>>;
}

/** The page sizes a list offers; any other size in a URL is ignored. */
export const PAGE_SIZES = [25, 50, 100] as const;
export const DEFAULT_PAGE_SIZE = 25;

export interface TableUrlState<S extends string> {
  sort: S;
  page: number;
  pageSize: number;
}

function one(value: unknown): string {
  return String(Array.isArray(value) ? (value[0] ?? '') : (value ?? ''));
}

/**
 * The sort, page and page size a URL query asks for, each checked (a sort the list does not know, a page that is not a
 * positive whole number or a page size not offered falls back to the default).
 */
export function tableStateFromQuery<S extends string>(query: LocationQuery, sorts: readonly S[], defaultSort: S): TableUrlState<S> {
  const sort = one(query.sort);
  const page = Number(one(query.page));
  const pageSize = Number(one(query.pageSize));
  return {
    sort: (sorts as readonly string[]).includes(sort) ? (sort as S) : defaultSort,
    page: Number.isInteger(page) && page > 0 ? page : 1,
    pageSize: (PAGE_SIZES as readonly number[]).includes(pageSize) ? pageSize : DEFAULT_PAGE_SIZE,
  };
}

/** The query a list's view is kept in: its filters, then sort, page and page size where they differ from the defaults. */
export function tableQuery(filterQuery: object, state: { sort: string; page: number; pageSize: number }, defaultSort: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of Object.entries(filterQuery)) {
    if (value === undefined || value === null || value === '') continue;
    out[key] = Array.isArray(value) ? value.join(',') : String(value);
  }
  if (state.sort !== defaultSort) out.sort = state.sort;
  if (state.page > 1) out.page = String(state.page);
  if (state.pageSize !== DEFAULT_PAGE_SIZE) out.pageSize = String(state.pageSize);
  return out;
}

function sameQuery(a: LocationQuery, b: Record<string, string>): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  for (const key of keys) if (one(a[key]) !== (b[key] ?? '') || (a[key] === undefined) !== (b[key] === undefined)) return false;
  return true;
}

export function useServerTable<S>(
  list: PagedList<S>,
  options: {
    sortBy: string;
    descending: boolean;
    /** The list's sort for the table's column and direction. */
    sortOf: (sortBy: string | null | undefined, descending: boolean | undefined) => S;
    /** What a new filter is (watched deeply enough to see each change). */
    filters: WatchSource<unknown>;
  },
) {
  const router = useRouter();
  const route = useRoute();
  const defaultSort = String(options.sortOf(options.sortBy, options.descending));
  // The list may start on a sort and page read from the URL: the table shows them.
  const startSort = String(list.sort.value);
  const startDescending = startSort.startsWith('-');
  const startSortBy = startDescending ? startSort.slice(1) : startSort;
  const known = String(options.sortOf(startSortBy, startDescending)) === startSort;
  const pagination = ref<NonNullable<QTableProps['pagination']>>({
    sortBy: known ? startSortBy : options.sortBy,
    descending: known ? startDescending : options.descending,
    page: list.page.value,
    rowsPerPage: list.pageSize.value,
    rowsNumber: 0,
  });

  watch(
    () => [list.resource.data.value, list.resource.error.value] as const,
    ([answer, failed]) => {
      if (answer || failed) pagination.value = { ...pagination.value, rowsNumber: answer?.total ?? 0 };
    },
  );

  const onRequest: QTableProps['onRequest'] = (props) => {
    const p = props.pagination;
    list.sort.value = options.sortOf(p.sortBy, p.descending);
    list.page.value = p.page ?? 1;
    list.pageSize.value = p.rowsPerPage || list.pageSize.value;
    pagination.value = { ...p, rowsNumber: list.total.value };
  };

  watch(options.filters, () => {
    list.page.value = 1;
    pagination.value = { ...pagination.value, page: 1 };
  });

  // The view into the URL, replacing the current entry (Back leaves the list rather than undoing a sort).
  const urlQuery = computed(() =>
    tableQuery(list.filterQuery.value, { sort: String(list.sort.value), page: list.page.value, pageSize: list.pageSize.value }, defaultSort),
  );
  watch(urlQuery, (query) => {
    if (route && sameQuery(route.query, query)) return;
    void router.replace({ query: query as LocationQueryRaw }).catch(() => undefined);
  });

  return { pagination, onRequest };
}
