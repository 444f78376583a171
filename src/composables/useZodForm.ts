// The one way a form checks and sends: the values, the fields the user has left (touched), the client's errors from the
// shared zod schema (shown for touched fields, and for every field once a submit was tried), then — after a submit —
// the server's `fields` errors on the same field names. The order is the same in every form: client check on submit,
// nothing sent while it fails; then the server, whose field errors stay until that field is edited.
import { computed, reactive, ref, shallowRef, watch, type ComputedRef, type Ref, type UnwrapNestedRefs } from 'vue';
import type { z } from 'zod';
import type { FieldErrors } from '../api/client';
import type { Mutation } from './useMutation';

export interface ZodFormOptions<V, S extends z.ZodType> {
  /** The request body the values stand for (trimmed text, parsed numbers, dates in UTC); default: the values. */
  toBody?: (values: V) => z.input<S>;
  /** Words for a field's zod error, by field name (`followUps.*.task` matches any row). */
  messages?: Record<string, string>;
  /** Rules of the form beyond the schema (by field name), checked with it. */
  rules?: (values: V) => FieldErrors;
}

export interface ZodForm<V, S extends z.ZodType> {
  values: UnwrapNestedRefs<V>;
  touched: Record<string, boolean>;
  /** A submit was tried: every client error shows. */
  submitted: Ref<boolean>;
  /** The client's errors for every field (shown or not). */
  clientErrors: ComputedRef<FieldErrors>;
  serverErrors: Ref<FieldErrors>;
  /** The error to show under a field: the client's (touched or submitted), else the server's. */
  errorOf: (field: string) => string | undefined;
  /** q-input error props for a field (`v-bind="form.errorProps('name')"`). */
  errorProps: (field: string) => { error: boolean; errorMessage: string | undefined };
  touch: (field: string) => void;
  /** Mark the form submitted and say whether the client check passes. */
  validate: () => boolean;
  /** Client check, then the mutation with the parsed body; the server's field errors land on the fields. */
  submit: <R>(mutation: Mutation<[z.output<S>], R>) => Promise<R | undefined>;
  /** Back to the initial values, nothing touched or submitted. */
  reset: () => void;
}

const wildcard = (field: string) => field.replace(/\.\d+(?=\.|$)/g, '.*');

export function useZodForm<S extends z.ZodType, V extends object>(schema: S, initial: () => V, options: ZodFormOptions<V, S> = {}): ZodForm<V, S> {
  const values = reactive(initial()) as UnwrapNestedRefs<V>;
  const touched = reactive<Record<string, boolean>>({});
  const submitted = ref(false);
  const serverErrors = shallowRef<FieldErrors>({});

  const body = () => (options.toBody ? options.toBody(values as V) : values);
  const parsed = computed(() => schema.safeParse(body()));

  const clientErrors = computed<FieldErrors>(() => {
    const out: FieldErrors = {};
    const result = parsed.value;
    if (!result.success) {
      for (const issue of result.error.issues) {
        const field = issue.path.map(String).join('.');
        if (out[field]) continue;
        out[field] = options.messages?.[field] ?? options.messages?.[wildcard(field)] ?? issue.message;
      }
    }
    return { ...out, ...(options.rules?.(values as V) ?? {}) };
  });

  // An edited field drops the server's word about it (it was about the value sent).
  watch(
    () => JSON.stringify(values),
    (now, before) => {
      if (!Object.keys(serverErrors.value).length) return;
      const a = JSON.parse(now) as Record<string, unknown>;
      const b = JSON.parse(before) as Record<string, unknown>;
      const kept = Object.fromEntries(Object.entries(serverErrors.value).filter(([field]) => JSON.stringify(pick(a, field)) === JSON.stringify(pick(b, field))));
      serverErrors.value = kept;
    },
  );

  function errorOf(field: string): string | undefined {
    const client = submitted.value || touched[field] ? clientErrors.value[field] : undefined;
    return client ?? serverErrors.value[field];
  }

  function validate(): boolean {
    submitted.value = true;
    return Object.keys(clientErrors.value).length === 0;
  }

  async function submit<R>(mutation: Mutation<[z.output<S>], R>): Promise<R | undefined> {
    if (!validate()) return undefined;
    const result = parsed.value;
    if (!result.success) return undefined;
    serverErrors.value = {};
    const answer = await mutation.run(result.data);
    serverErrors.value = mutation.error.value?.fields ?? {};
    return answer;
  }

  function reset(): void {
    Object.assign(values, initial());
    for (const key of Object.keys(touched)) delete touched[key];
    submitted.value = false;
    serverErrors.value = {};
  }

  return { values, touched, submitted, clientErrors, serverErrors, errorOf, errorProps: (field) => ({ error: !!errorOf(field), errorMessage: errorOf(field) }), touch: (field) => (touched[field] = true), validate, submit, reset };
}

// The value at a dotted field name (`followUps.0.task`) of plain data.
function pick(data: unknown, field: string): unknown {
  return field.split('.').reduce<unknown>((at, part) => (at !== null && typeof at === 'object' ? (at as Record<string, unknown>)[part] : undefined), data);
}
