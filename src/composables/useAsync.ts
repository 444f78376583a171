// One server call's state for a page: data, loading, error; `run` again to reload. Later answers win only if newer.
import { ref, shallowRef, type Ref, type ShallowRef } from 'vue';
import { ApiError } from '../api/client';

export interface AsyncState<T, A extends unknown[]> {
  data: ShallowRef<T | null>;
  loading: Ref<boolean>;
  error: ShallowRef<ApiError | null>;
  run: (...args: A) => Promise<T | null>;
}

/** Turn anything thrown into an ApiError the page can show. */
export function toApiError(error: unknown): ApiError {
  return error instanceof ApiError ? error : new ApiError(0, 'client_error', error instanceof Error ? error.message : String(error));
}

// Wrap a loader; only the newest call's answer is kept (a slow old answer cannot overwrite a newer one).
export function useAsync<T, A extends unknown[]>(loader: (...args: A) => Promise<T>): AsyncState<T, A> {
  const data = shallowRef<T | null>(null);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  let calls = 0;

  async function run(...args: A): Promise<T | null> {
    const call = ++calls;
    loading.value = true;
    error.value = null;
    try {
      const answer = await loader(...args);
      if (call === calls) data.value = answer;
      return answer;
    } catch (caught) {
      if (call === calls) error.value = toApiError(caught);
      return null;
    } finally {
      if (call === calls) loading.value = false;
    }
  }

  return { data, loading, error, run };
}
