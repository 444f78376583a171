// The one way pages and components change something on the server: `saving` while it runs, the failure as an
// ApiError, and a notification — the success text when given, the failure unless the component shows it in place.
import { ref, shallowRef, type Ref, type ShallowRef } from 'vue';
import { useQuasar } from 'quasar';
import { problemPlace } from '../../shared/uploads/file-types';
import { type ApiError, toApiError } from '../api/client';

export interface MutationOptions<R> {
  /** Notified when the change succeeded. */
  success?: string | ((result: R) => string);
  /** Words before the server's message in the failure notification (default "The change failed"). */
  failure?: string;
  /** The component shows `error` itself (beside the form or the field): no failure notification. */
  inline?: boolean;
}

export interface Mutation<A extends unknown[], R> {
  saving: Ref<boolean>;
  error: ShallowRef<ApiError | null>;
  /** Run the change; the result, or undefined when it failed (then `error` says why). */
  run: (...args: A) => Promise<R | undefined>;
  /** Forget the last failure. */
  reset: () => void;
}

/**
 * The server's message with its field messages that it does not already say ("… (Row 3, value: decimal comma; Row 5, unit: pF or nF)."),
 * at most three of them, so a notification loses nothing a person needs to fix the input.
 */
export function errorText(e: ApiError): string {
  const extra = Object.entries(e.fields ?? {}).filter(([, text]) => !e.message.includes(text));
  if (!extra.length) return e.message;
  const shown = extra.slice(0, 3).map(([field, text]) => `${problemPlace(field)}: ${text}`);
  const more = extra.length > 3 ? `; and ${extra.length - 3} more` : '';
  return `${e.message.replace(/[.\s]+$/, '')} (${shown.join('; ')}${more}).`;
}

export function useMutation<A extends unknown[], R>(fn: (...args: A) => Promise<R>, options: MutationOptions<R> = {}): Mutation<A, R> {
  const $q = useQuasar();
  const saving = ref(false);
  const error = shallowRef<ApiError | null>(null);

  async function run(...args: A): Promise<R | undefined> {
    saving.value = true;
    error.value = null;
    let result: R;
    try {
      result = await fn(...args);
    } catch (caught) {
      const e = toApiError(caught);
      error.value = e;
      if (!options.inline) $q.notify({ type: 'negative', message: `${options.failure ?? 'The change failed'}: ${errorText(e)}` });
      return undefined;
    } finally {
      saving.value = false;
    }
    const message = typeof options.success === 'function' ? options.success(result) : options.success;
    if (message) $q.notify({ type: 'positive', message });
    return result;
  }

  return { saving, error, run, reset: () => (error.value = null) };
}
