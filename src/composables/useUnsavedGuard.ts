// Ask before typed work is thrown away: on a route change (another page, or the same page for another record) and on
// closing or reloading the tab, while the form says it has unsaved changes.
//
// How to use it, in any component rendered under the router-view (a page, a card of a page, a dialog opened by it):
//
//   const baseline = useBaseline(() => form.values);            // what "unchanged" means: the values as loaded
//   const guard = useUnsavedGuard(baseline.isDirty);             // or any getter: () => reason.value.trim() !== ''
//   …after a successful save that leaves the page:  guard.saved(); await router.push(…)
//   …after a successful save that stays on the page: baseline.reset()   (the new values are the saved ones)
//   …a Cancel button of a dialog:                    if (guard.confirmDiscard()) close()
//
// Outside a router-view (a component test without a router) the route part is skipped; the tab-close part still works.
//
// An action that leaves in a way the route guard cannot stop in time (Sign out: the session ends before the route
// changes) asks first with `confirmUnsavedChanges()`: if (!confirmUnsavedChanges()) return; session.signOut(); …
import { getCurrentInstance, inject, onBeforeUnmount, onMounted, ref, type Ref } from 'vue';
import { matchedRouteKey, onBeforeRouteLeave, onBeforeRouteUpdate, type RouteLocationNormalized } from 'vue-router';

export const UNSAVED_MESSAGE = 'You have changes that are not saved. Leave and lose them?';

export interface UnsavedGuardOptions {
  /** The question asked on a route change (the tab-close question is the browser's own). */
  message?: string;
}

export interface UnsavedGuard {
  /** The work was saved: leave without asking (until `arm()`). */
  saved: () => void;
  /** Ask again from now on (after `saved()`, when the form stays for new work). */
  arm: () => void;
  /** Whether leaving now would throw away changes. */
  isActive: () => boolean;
  /** Ask the question now (a dialog's Cancel): true = go ahead and discard. No question when nothing would be lost. */
  confirmDiscard: () => boolean;
}

// One navigation asks once, however many dirty forms are on the page: the answer is kept for that navigation's target.
const answered = new WeakMap<RouteLocationNormalized, boolean>();
/** The guards of the forms on screen now. */
const mounted = new Set<() => boolean>();
/** The question was asked already (confirmUnsavedChanges): the next navigation goes without asking again. */
let alreadyConfirmed = false;

function ask(message: string): boolean {
  try {
    return typeof window === 'undefined' || typeof window.confirm !== 'function' ? true : window.confirm(message) === true;
  } catch {
    return true;
  }
}

export function useUnsavedGuard(isDirty: () => boolean, options: UnsavedGuardOptions = {}): UnsavedGuard {
  const message = options.message ?? UNSAVED_MESSAGE;
  const suppressed = ref(false);
  const isActive = (): boolean => !suppressed.value && isDirty();

  function confirmNavigation(to: RouteLocationNormalized): boolean {
    if (!isActive()) return true;
    const earlier = answered.get(to);
    if (earlier !== undefined) return earlier;
    if (alreadyConfirmed) {
      alreadyConfirmed = false;
      answered.set(to, true);
      return true;
    }
    const go = ask(message);
    answered.set(to, go);
    return go;
  }

  // Route guards need the component to sit under a router-view; without one, vue-router only warns, so skip them.
  if (getCurrentInstance() && inject(matchedRouteKey, null)) {
    onBeforeRouteLeave((to) => confirmNavigation(to));
    // The same page for another record (/events/4 → /events/5); a query change (a tab, a filter) loses nothing.
    onBeforeRouteUpdate((to, from) => (to.path === from.path ? true : confirmNavigation(to)));
  }

  // The browser asks its own question on close and reload when the event is cancelled.
  function onBeforeUnload(event: BeforeUnloadEvent): void {
    if (!isActive()) return;
    event.preventDefault();
    event.returnValue = '';
  }
  if (getCurrentInstance()) {
    onMounted(() => {
      window.addEventListener('beforeunload', onBeforeUnload);
      mounted.add(isActive);
    });
    onBeforeUnmount(() => {
      window.removeEventListener('beforeunload', onBeforeUnload);
      mounted.delete(isActive);
    });
  }

  return {
    saved: () => {
      suppressed.value = true;
    },
    arm: () => {
      suppressed.value = false;
    },
    isActive,
    confirmDiscard: () => !isActive() || ask(message),
  };
}

/** Whether any form on screen has changes that are not saved. */
export function hasUnsavedChanges(): boolean {
  return [...mounted].some((active) => active());
}

/**
 * Ask now, once, whether to drop the unsaved changes of the forms on screen (true at once when there are none); a yes
 * lets the next route change through without asking again. For Sign out and the like, before the session ends.
 */
export function confirmUnsavedChanges(message = UNSAVED_MESSAGE): boolean {
  if (!hasUnsavedChanges()) return true;
  const go = ask(message);
  alreadyConfirmed = go;
  return go;
}

export interface Baseline {
  /** The values differ from the baseline. */
  isDirty: () => boolean;
  /** The current values become the baseline (after loading or saving them). */
  reset: () => void;
  /** The baseline as JSON (for tests and drafts). */
  snapshot: Ref<string>;
}

/** "Changed" for a form: its values (as JSON) differ from what they were when set up or last `reset()`. */
export function useBaseline(values: () => unknown): Baseline {
  const json = (): string => JSON.stringify(values() ?? null);
  const snapshot = ref(json());
  return {
    isDirty: () => json() !== snapshot.value,
    reset: () => {
      snapshot.value = json();
    },
    snapshot,
  };
}
