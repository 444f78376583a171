// The session form keeps the readings being typed on this device for the signed-in tester, per event.
import { mount, type VueWrapper } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventSessionForm from '../../../src/components/event/EventSessionForm.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { useSessionStore } from '../../../src/stores/session';
import { makeUser, resetClientState, scriptFetch, settle } from '../helpers';

const KEY = 'gapsight.draft.session-new.e11.u7';

function render(): VueWrapper {
  const pinia = createPinia();
  setActivePinia(pinia);
  useSessionStore().user = makeUser({ id: 7 });
  return mount(EventSessionForm, {
    props: { eventId: 11, timeZone: 'Europe/London', configurations: ['CH', 'CL', 'CHL'], faultAt: '2026-07-01T03:12:00.000Z' },
    global: { plugins: [pinia, [Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

async function fill(wrapper: VueWrapper, testId: string, value: string): Promise<void> {
  await wrapper.get(`input[data-test="${testId}"]`).setValue(value);
  await settle();
}
const valueOf = (wrapper: VueWrapper, testId: string) => (wrapper.get(`input[data-test="${testId}"]`).element as HTMLInputElement).value;

describe('EventSessionForm draft', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    resetClientState();
  });

  it('puts typed readings back in a form opened again, and forgets them once saved', async () => {
    const first = render();
    await settle();
    expect(localStorage.getItem(KEY)).toBeNull(); // the time alone is not typed work
    await fill(first, 'session-capacitancePF.CH', '3131');
    await fill(first, 'session-instrument', 'M4100');
    expect(localStorage.getItem(KEY)).toContain('3131');
    first.unmount();

    scriptFetch({ 'POST /api/events/11/sessions': { status: 201, body: { id: 32, eventStatus: 'testing' } } });
    const again = render();
    await settle();
    expect(again.get('[data-test="draft-notice"]').text()).toContain('Draft restored from');
    expect(valueOf(again, 'session-capacitancePF.CH')).toBe('3131');
    expect(valueOf(again, 'session-instrument')).toBe('M4100');

    await again.get('[data-test="session-form"]').trigger('submit');
    await vi.waitFor(() => expect(again.emitted('created')).toBeTruthy());
    expect(localStorage.getItem(KEY)).toBeNull();
  });

  it('Cancel after typing asks, and a yes throws the draft away with the form', async () => {
    const confirm = vi.fn(() => true);
    vi.stubGlobal('confirm', confirm);
    const wrapper = render();
    await settle();
    await fill(wrapper, 'session-capacitancePF.CH', '3131');
    await wrapper.findAll('button').find((b) => b.text() === 'Cancel')!.trigger('click');
    expect(confirm).toHaveBeenCalledOnce();
    expect(wrapper.emitted('cancel')).toBeTruthy();
    expect(localStorage.getItem(KEY)).toBeNull();
  });
});
