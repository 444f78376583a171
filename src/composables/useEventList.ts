// The events list: one page of events from the server with its filters, sort and paging (loaded through
// useRouteResource, keyed by the whole query). Days typed in the filters are days of the browser's own calendar.
import { computed, getCurrentInstance, reactive, ref } from 'vue';
import { useRoute } from 'vue-router';
import { listEvents, type EventListItem, type EventListQuery } from '../api/events';
import type { FaultType } from '../../shared/schemas/case';
import { EVENT_SORTS, type EventSort, type EventStatus } from '../../shared/schemas/enums';
import { zoneDayBound } from '../../shared/lists';
import { useRouteResource } from './useRouteResource';
import { tableStateFromQuery, type TableUrlState } from './useServerTable';

export interface EventFilters {
  /** Part of a unit serial. */
  q: string;
  siteId: number | null;
  statuses: EventStatus[];
  types: FaultType[];
  /** Days (YYYY-MM-DD), both inclusive. */
  from: string;
  to: string;
  withoutAttachments: boolean;
}

export const EMPTY_EVENT_FILTERS: EventFilters = { q: '', siteId: null, statuses: [], types: [], from: '', to: '', withoutAttachments: false };

/** The browser's time zone: the days of the date filters are its days. */
export function browserZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}

export const DEFAULT_EVENT_SORT: EventSort = '-occurredAt';

/**
 * The events list. It starts on the sort, page and page size kept in the page's URL (`?sort=status&page=2`, written
 * by useServerTable), so Back to the list or a shared link shows the same view; `table` overrides them.
 */
export function useEventList(initial: Partial<EventFilters> = {}, table?: Partial<TableUrlState<EventSort>>) {
  const route = getCurrentInstance() ? useRoute() : undefined;
  const start = { ...tableStateFromQuery(route?.query ?? {}, EVENT_SORTS, DEFAULT_EVENT_SORT), ...table };
  const filters = reactive<EventFilters>({ ...EMPTY_EVENT_FILTERS, ...initial });
  const sort = ref<EventSort>(start.sort);
  const page = ref(start.page);
  const pageSize = ref(start.pageSize);

  /** The filters as the page's URL keeps them (days as typed). */
  const filterQuery = computed<Record<string, string>>(() => {
    const out: Record<string, string> = {};
    const q = (filters.q ?? '').trim();
    if (q) out.q = q;
    if (filters.siteId) out.siteId = String(filters.siteId);
    if (filters.statuses.length) out.status = filters.statuses.join(',');
    if (filters.types.length) out.type = filters.types.join(',');
    if (filters.from) out.from = filters.from;
    if (filters.to) out.to = filters.to;
    if (filters.withoutAttachments) out.withoutAttachments = 'true';
    return out;
  });

  const filtered = computed(() => Object.keys(filterQuery.value).length > 0);

  /** The filters as the server takes them: days become the instants that bound them on the browser's calendar. */
  const apiQuery = computed<EventListQuery>(() => {
    const zone = browserZone();
    return {
      q: (filters.q ?? '').trim() || undefined,
      siteId: filters.siteId ?? undefined,
      status: filters.statuses.length ? [...filters.statuses] : undefined,
      type: filters.types.length ? [...filters.types] : undefined,
      from: (filters.from && zoneDayBound(filters.from, zone)?.toISOString()) || undefined,
      to: (filters.to && zoneDayBound(filters.to, zone, true)?.toISOString()) || undefined,
      withoutAttachments: filters.withoutAttachments || undefined,
    };
  });

  /** A from day after the to day asks for nothing (the page says so at the field). */
  const badDays = computed(() => Boolean(filters.from && filters.to && filters.from > filters.to));

  const resource = useRouteResource(
    () => (badDays.value ? null : { ...apiQuery.value, sort: sort.value, page: page.value, pageSize: pageSize.value }),
    (query, signal) => listEvents(query, signal),
  );
  const items = computed<EventListItem[]>(() => resource.data.value?.items ?? []);
  const total = computed(() => resource.data.value?.total ?? 0);

  return { filters, sort, page, pageSize, items, total, resource, loading: resource.loading, filtered, filterQuery, badDays, reload: resource.reload };
}
