import { mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { afterEach, describe, expect, it } from 'vitest';
import { defineComponent, h, nextTick, reactive } from 'vue';
import { draftKey, readDraft, useDraft, withoutPasswords, type Draft } from '../../../src/composables/useDraft';
import { useSessionStore } from '../../../src/stores/session';
import { makeUser, resetClientState } from '../helpers';

interface Values {
  reason: string;
  password?: string;
}

// A form of one field with a draft named `thing`, mounted with a session store holding `userId` (null = signed out).
function mountForm(userId: number | null, thing = 'decision.e12.s40') {
  const pinia = createPinia();
  setActivePinia(pinia);
  if (userId !== null) useSessionStore().user = makeUser({ id: userId });
  const values = reactive<Values>({ reason: '' });
  let draft!: Draft;
  const wrapper = mount(
    defineComponent({
      setup() {
        draft = useDraft<Values>({
          name: () => thing,
          values: () => ({ ...values }),
          apply: (saved) => Object.assign(values, saved),
          isEmpty: (v) => !v.reason.trim(),
        });
        return () => h('div');
      },
    }),
    { global: { plugins: [pinia] } },
  );
  return { values, draft: () => draft, wrapper };
}

describe('useDraft', () => {
  afterEach(resetClientState);

  it('keeps what is typed under a key naming the thing and the user, and puts it back in a new form of the same user', async () => {
    const first = mountForm(4);
    first.values.reason = 'Gas trend flat, sweep within limits';
    await nextTick();
    expect(readDraft<Values>('gapsight.draft.decision.e12.s40.u4')?.values.reason).toBe('Gas trend flat, sweep within limits');
    first.wrapper.unmount();

    const again = mountForm(4);
    await nextTick();
    expect(again.values.reason).toBe('Gas trend flat, sweep within limits');
    expect(again.draft().restoredAt.value).not.toBeNull();
  });

  it('shows nothing to another user on the same browser', async () => {
    const first = mountForm(4);
    first.values.reason = 'typed by user 4';
    await nextTick();
    first.wrapper.unmount();
    const other = mountForm(5);
    await nextTick();
    expect(other.values.reason).toBe('');
    expect(other.draft().restoredAt.value).toBeNull();
  });

  it('keeps nothing while no one is signed in', async () => {
    const form = mountForm(null);
    form.values.reason = 'typed';
    await nextTick();
    expect(Object.keys(localStorage).filter((k) => k.startsWith('gapsight.draft.'))).toEqual([]);
  });

  it('forgets the draft on clear (a submit) and on discard, and an emptied form removes it', async () => {
    const form = mountForm(4);
    const key = draftKey('decision.e12.s40', 4);
    form.values.reason = 'something';
    await nextTick();
    expect(localStorage.getItem(key)).not.toBeNull();
    form.draft().clear();
    expect(localStorage.getItem(key)).toBeNull();
    form.values.reason = 'something else';
    expect(localStorage.getItem(key)).not.toBeNull();
    form.draft().discard();
    expect(localStorage.getItem(key)).toBeNull();
    form.values.reason = 'third';
    form.values.reason = '  ';
    expect(localStorage.getItem(key)).toBeNull();
  });

  it('ignores and removes a draft older than seven days', async () => {
    const key = draftKey('decision.e12.s40', 4);
    const old = new Date(Date.now() - 8 * 24 * 3600 * 1000).toISOString();
    localStorage.setItem(key, JSON.stringify({ savedAt: old, values: { reason: 'stale' } }));
    const form = mountForm(4);
    await nextTick();
    expect(form.values.reason).toBe('');
    expect(localStorage.getItem(key)).toBeNull();
  });

  it('never writes a field named like a password', async () => {
    expect(withoutPasswords({ reason: 'a', password: 'secret', nested: { newPassword: 'x', keep: 1 } })).toEqual({ reason: 'a', nested: { keep: 1 } });
    const form = mountForm(4);
    form.values.reason = 'r';
    form.values.password = 'hunter2';
    await nextTick();
    expect(localStorage.getItem(draftKey('decision.e12.s40', 4))).not.toContain('hunter2');
  });
});
