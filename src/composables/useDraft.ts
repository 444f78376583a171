// A form's typed values kept on this device (localStorage) while the user types, so a reload, a closed tab or a
// sign-in again does not lose them. One draft per signed-in user and per thing edited: the key is
// `gapsight.draft.<name>.u<user id>` (e.g. `gapsight.draft.fault-new.u3`, `gapsight.draft.decision.e12.s40.u4`), so
// another person signing in on the same browser never sees it.
//
// How to use it in a form component:
//
//   const draft = useDraft({
//     name: () => `decision.e${eventId}.s${screening.id}`,   // the thing edited (the user id is added here)
//     values: () => ({ outcome: form.values.outcome, reason: form.values.reason }),  // plain JSON, no password
//     apply: (saved) => Object.assign(form.values, saved),  // put a saved draft back into the form
//     isEmpty: (v) => !v.reason.trim(),                     // nothing typed yet: nothing to keep
//   });
//   <AppDraftNotice :draft="draft" />                        // "Draft restored from 03:14 — Discard draft"
//   …after a successful submit: draft.clear()
//
// The draft is read back when the component is mounted (after the form's own set-up in `onMounted` hooks registered
// before it) and whenever `name` changes; from then on every change is written. Drafts older than `maxAgeDays` (7) are
// dropped. Any field whose name contains "password" is never written.
import { computed, getCurrentInstance, onMounted, ref, watch, type ComputedRef, type Ref } from 'vue';
import { getActivePinia } from 'pinia';
import { useSessionStore } from '../stores/session';

export const DRAFT_PREFIX = 'gapsight.draft.';
const DAY_MS = 24 * 60 * 60 * 1000;

export interface DraftOptions<V> {
  /** The thing edited, without the user: 'fault-new', `decision.e12.s40`; null = no draft (not ready yet). */
  name: () => string | null;
  /** The values to keep, as plain JSON. */
  values: () => V;
  /** Put saved values back into the form. */
  apply: (saved: V) => void;
  /** True when there is nothing worth keeping (the form as it starts): no draft is written, an old one is removed. */
  isEmpty?: (values: V) => boolean;
  /** Called by `discard()` after the draft is removed (e.g. reset the form). */
  onDiscard?: () => void;
  maxAgeDays?: number;
  /** Read the draft back on mount (default true); false = call `restore()` yourself. */
  restoreOnMount?: boolean;
}

export interface Draft {
  /** When the restored draft was last written (ISO), while its notice should show; null otherwise. */
  restoredAt: Ref<string | null>;
  /** The full storage key in use (null when no one is signed in or the name is not ready). */
  key: ComputedRef<string | null>;
  /** Read the draft back into the form; true when one was restored. */
  restore: () => boolean;
  /** Forget the draft and call `onDiscard` (the "Discard draft" button). */
  discard: () => void;
  /** Forget the draft (after a successful submit); writing resumes on the next change. */
  clear: () => void;
  /** Hide the "restored" notice, keeping the draft. */
  dismiss: () => void;
}

interface Stored<V> {
  savedAt: string;
  values: V;
}

function storage(): Storage | null {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null;
  }
}

/** The signed-in user's id, or null (no store installed in a component test, or signed out). */
function currentUserId(): number | null {
  if (!getActivePinia()) return null;
  return useSessionStore().user?.id ?? null;
}

/** A copy of the values without any key that names a password, at any depth. */
export function withoutPasswords<V>(values: V): V {
  return JSON.parse(JSON.stringify(values ?? null, (k, v: unknown) => (/password/i.test(k) ? undefined : v))) as V;
}

export function draftKey(name: string, userId: number): string {
  return `${DRAFT_PREFIX}${name}.u${userId}`;
}

/** Read a stored draft; null when absent, unreadable or older than maxAgeDays (an old one is removed). */
export function readDraft<V>(key: string, maxAgeDays = 7, now = Date.now()): Stored<V> | null {
  const store = storage();
  if (!store) return null;
  try {
    const text = store.getItem(key);
    if (!text) return null;
    const parsed = JSON.parse(text) as Stored<V>;
    const at = Date.parse(parsed.savedAt);
    if (!Number.isFinite(at) || now - at > maxAgeDays * DAY_MS || parsed.values === undefined) {
      store.removeItem(key);
      return null;
    }
    return parsed;
  } catch {
    return null;
  }
}

function remove(key: string | null): void {
  if (!key) return;
  try {
    storage()?.removeItem(key);
  } catch {
    // storage disabled: nothing was kept
  }
}

export function useDraft<V>(options: DraftOptions<V>): Draft {
  const maxAgeDays = options.maxAgeDays ?? 7;
  const userId = ref<number | null>(null);
  const restoredAt = ref<string | null>(null);
  // Writing starts once the draft of the current key has been read back (else the empty form would overwrite it).
  const readKey = ref<string | null>(null);

  const key = computed(() => {
    const name = options.name();
    const user = userId.value;
    return name && user !== null ? draftKey(name, user) : null;
  });

  function refreshUser(): void {
    userId.value = currentUserId();
  }
  refreshUser();
  if (getActivePinia()) {
    const session = useSessionStore();
    watch(() => session.user?.id ?? null, (id) => {
      userId.value = id;
    });
  }

  function restore(): boolean {
    const k = key.value;
    readKey.value = k;
    restoredAt.value = null;
    if (!k) return false;
    const stored = readDraft<V>(k, maxAgeDays);
    if (!stored || options.isEmpty?.(stored.values)) return false;
    options.apply(stored.values);
    restoredAt.value = stored.savedAt;
    return true;
  }

  function write(): void {
    const k = key.value;
    if (!k || readKey.value !== k) return;
    const values = withoutPasswords(options.values());
    if (options.isEmpty?.(values)) {
      remove(k);
      return;
    }
    try {
      storage()?.setItem(k, JSON.stringify({ savedAt: new Date().toISOString(), values } satisfies Stored<V>));
    } catch {
      // Storage full or disabled: the form still works, only without a draft.
    }
  }

  watch(() => JSON.stringify(options.values() ?? null), write, { flush: 'sync' });

  const mounted = ref(!getCurrentInstance() || options.restoreOnMount === false);
  if (getCurrentInstance() && options.restoreOnMount !== false) {
    onMounted(() => {
      mounted.value = true;
      restore();
    });
  }
  // Another user, another record: that one's draft (if any) replaces the form's values.
  watch(key, (now, before) => {
    if (now === before || !mounted.value) return;
    if (options.restoreOnMount === false && readKey.value === null) return;
    restore();
  });

  return {
    restoredAt,
    key,
    restore,
    discard: () => {
      remove(key.value);
      restoredAt.value = null;
      options.onDiscard?.();
      // onDiscard may have reset the form: what is left is not a draft.
      remove(key.value);
    },
    clear: () => {
      remove(key.value);
      restoredAt.value = null;
    },
    dismiss: () => {
      restoredAt.value = null;
    },
  };
}
