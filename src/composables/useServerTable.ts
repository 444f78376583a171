// A QTable in server mode over a paged list: the pager follows the server's total once an answer is in (not while the
// next page loads), sorting or paging asks the list for that page, and a new filter starts again at page 1 and is kept
// in the URL (so the page can be shared or reloaded).
import { ref, watch, type Ref, type WatchSource } from 'vue';
import { useRouter, type LocationQueryRaw } from 'vue-router';
import type { QTableProps } from 'quasar';

interface PagedList<S> {
  resource: { data: Readonly<Ref<{ total: number } | null>>; error: Readonly<Ref<unknown>> };
  sort: Ref<S>;
  page: Ref<number>;
  pageSize: Ref<number>;
  total: Readonly<Ref<number>>;
  filterQuery: Readonly<Ref<object>>;
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
  const pagination = ref<NonNullable<QTableProps['pagination']>>({
    sortBy: options.sortBy,
    descending: options.descending,
    page: 1,
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
    void router.replace({ query: { ...list.filterQuery.value } as LocationQueryRaw }).catch(() => undefined);
  });

  return { pagination, onRequest };
}
