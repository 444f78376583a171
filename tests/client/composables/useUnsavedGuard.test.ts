import { flushPromises, mount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { defineComponent, h, ref } from 'vue';
import { createMemoryHistory, createRouter, RouterView } from 'vue-router';
import { confirmUnsavedChanges, hasUnsavedChanges, useBaseline, useUnsavedGuard, type UnsavedGuard } from '../../../src/composables/useUnsavedGuard';
import { resetClientState } from '../helpers';

const text = ref('');
let guard!: UnsavedGuard;

// A form page (/form) whose only field is `text`, and another page to go to.
const FormPage = defineComponent({
  setup() {
    const baseline = useBaseline(() => text.value);
    guard = useUnsavedGuard(baseline.isDirty);
    return () => h('div', 'form');
  },
});

async function mountAt(path: string) {
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/form', component: FormPage },
      { path: '/other', component: { render: () => h('div', 'other') } },
    ],
  });
  await router.push(path);
  mount(defineComponent({ render: () => h(RouterView) }), { global: { plugins: [router] }, attachTo: document.body });
  await router.isReady();
  await flushPromises();
  return router;
}

// The question the guard asks (the test DOM has no window.confirm of its own).
function stubConfirm(answer: boolean) {
  const confirm = vi.fn((_message?: string) => answer);
  vi.stubGlobal('confirm', confirm);
  return confirm;
}

describe('useUnsavedGuard', () => {
  afterEach(() => {
    text.value = '';
    vi.restoreAllMocks();
    resetClientState();
  });

  it('leaves without asking while nothing changed', async () => {
    const confirm = stubConfirm(true);
    const router = await mountAt('/form');
    await router.push('/other');
    expect(router.currentRoute.value.path).toBe('/other');
    expect(confirm).not.toHaveBeenCalled();
  });

  it('asks before leaving with typed text, and stays when the answer is no', async () => {
    const confirm = stubConfirm(false);
    const router = await mountAt('/form');
    text.value = 'half a reason';
    await router.push('/other');
    expect(confirm).toHaveBeenCalledOnce();
    expect(router.currentRoute.value.path).toBe('/form');
    confirm.mockReturnValue(true);
    await router.push('/other');
    expect(router.currentRoute.value.path).toBe('/other');
  });

  it('does not ask once the work is saved', async () => {
    const confirm = stubConfirm(false);
    const router = await mountAt('/form');
    text.value = 'saved text';
    guard.saved();
    await router.push('/other');
    expect(confirm).not.toHaveBeenCalled();
    expect(router.currentRoute.value.path).toBe('/other');
  });

  it('cancels the tab close while there are changes, not before', async () => {
    await mountAt('/form');
    const quiet = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(quiet);
    expect(quiet.defaultPrevented).toBe(false);
    text.value = 'typed';
    const dirty = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(dirty);
    expect(dirty.defaultPrevented).toBe(true);
  });

  it('confirmDiscard asks only when something would be lost', async () => {
    const confirm = stubConfirm(false);
    await mountAt('/form');
    expect(guard.confirmDiscard()).toBe(true);
    text.value = 'typed';
    expect(guard.confirmDiscard()).toBe(false);
    expect(confirm).toHaveBeenCalledOnce();
  });

  it('confirmUnsavedChanges asks once for the forms on screen and lets the next route change through (Sign out)', async () => {
    const confirm = stubConfirm(true);
    const router = await mountAt('/form');
    expect(hasUnsavedChanges()).toBe(false);
    expect(confirmUnsavedChanges()).toBe(true);
    expect(confirm).not.toHaveBeenCalled();
    text.value = 'typed';
    expect(hasUnsavedChanges()).toBe(true);
    expect(confirmUnsavedChanges()).toBe(true);
    await router.push('/other');
    expect(confirm).toHaveBeenCalledOnce();
    expect(router.currentRoute.value.path).toBe('/other');
  });
});
