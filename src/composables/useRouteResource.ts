// Server data as page state, keyed by what the page shows (an id, a filter). The one way pages and lists load:
// - a new key clears the data at once (the previous key's data is never shown under the new key) and aborts the
//   request still in flight;
// - `reload()` (after a change) keeps the loaded data while it runs; if it fails, the data stays and `refreshError`
//   says so (the page shows a "refresh failed" banner with a retry);
// - `notFound` when the server answers 404 for the key.
import { computed, getCurrentScope, onScopeDispose, ref, shallowRef, watch, type ComputedRef, type Ref, type ShallowRef } from 'vue';
import { ApiError, isAbort, toApiError } from '../api/client';

export interface RouteResource<T> {
  /** The key's data; null while the first load runs, after it failed, or when the key is null. */
  data: ShallowRef<T | null>;
  loading: Ref<boolean>;
  /** Why the key's data could not be loaded (there is no data to show). */
  error: ShallowRef<ApiError | null>;
  /** Why the last reload failed (the data shown is the one loaded before). */
  refreshError: ShallowRef<ApiError | null>;
  notFound: ComputedRef<boolean>;
  /** Load the current key again, keeping the data shown while it runs. */
  reload: () => Promise<void>;
}

export function useRouteResource<K, T>(
  key: () => K | null,
  loader: (key: K, signal: AbortSignal) => Promise<T>,
): RouteResource<T> {
  const data = shallowRef<T | null>(null);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  const refreshError = shallowRef<ApiError | null>(null);
  let controller: AbortController | null = null;
  let current: K | null = null;

  async function load(): Promise<void> {
    controller?.abort();
    const k = current;
    if (k === null) {
      loading.value = false;
      return;
    }
    const own = new AbortController();
    controller = own;
    loading.value = true;
    try {
      const answer = await loader(k, own.signal);
      if (controller !== own) return;
      data.value = answer;
      error.value = null;
      refreshError.value = null;
    } catch (caught) {
      if (controller !== own || isAbort(caught, own.signal)) return;
      const e = toApiError(caught);
      // Kept data stays on a failed reload, unless the server says the record is gone.
      if (data.value !== null && e.status !== 404) {
        refreshError.value = e;
      } else {
        data.value = null;
        refreshError.value = null;
        error.value = e;
      }
    } finally {
      if (controller === own) {
        loading.value = false;
        controller = null;
      }
    }
  }

  watch(
    () => JSON.stringify(key() ?? null),
    () => {
      current = key();
      data.value = null;
      error.value = null;
      refreshError.value = null;
      void load();
    },
    { immediate: true },
  );

  if (getCurrentScope()) onScopeDispose(() => controller?.abort());

  return {
    data,
    loading,
    error,
    refreshError,
    notFound: computed(() => error.value?.status === 404),
    reload: load,
  };
}
