// The follow-up close form keeps a typed result: Cancel, another follow-up's Close and a closed tab ask first.
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventFollowUps from '../../../src/components/event/EventFollowUps.vue';
import type { FollowUpView } from '../../../src/api/events';
import { quasarOptions } from '../../../src/quasar-options';
import { resetClientState, settle } from '../helpers';

const followUp = (id: number, task: string): FollowUpView =>
  ({ id, task, dueAt: '2026-12-20T10:00:00.000Z', closedAt: null, closedById: null, result: null });

function render() {
  return mount(EventFollowUps, {
    props: { followUps: [followUp(1, 'Dissolved-gas sample 24 h after re-energising'), followUp(2, 'Sweep at the next outage')], zone: 'UTC', canClose: true, personName: () => 'Tess Tester', now: new Date('2026-12-01T10:00:00Z') },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

function stubConfirm(answer: boolean) {
  const confirm = vi.fn((_message?: string) => answer);
  vi.stubGlobal('confirm', confirm);
  return confirm;
}

describe('EventFollowUps close form', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    resetClientState();
    document.body.innerHTML = '';
  });

  it('closes an empty form without a question', async () => {
    const confirm = stubConfirm(false);
    const wrapper = render();
    await wrapper.get('[data-test="follow-up-close-1"]').trigger('click');
    await wrapper.get('[data-test="follow-up-cancel"]').trigger('click');
    await settle();
    expect(confirm).not.toHaveBeenCalled();
    expect(wrapper.find('[data-test="follow-up-result-input"]').exists()).toBe(false);
    wrapper.unmount();
  });

  it('asks before Cancel, another Close or a closed tab throws a typed result away, and keeps it when told to', async () => {
    const confirm = stubConfirm(false);
    const wrapper = render();
    await wrapper.get('[data-test="follow-up-close-1"]').trigger('click');
    await wrapper.get('textarea[data-test="follow-up-result-input"]').setValue('DGA normal: C2H2 0 ppm');

    const unload = new Event('beforeunload', { cancelable: true });
    window.dispatchEvent(unload);
    expect(unload.defaultPrevented).toBe(true);

    await wrapper.get('[data-test="follow-up-cancel"]').trigger('click');
    await settle();
    expect(confirm).toHaveBeenCalledTimes(1);
    expect((wrapper.get('textarea[data-test="follow-up-result-input"]').element as HTMLTextAreaElement).value).toBe('DGA normal: C2H2 0 ppm');

    await wrapper.get('[data-test="follow-up-close-2"]').trigger('click');
    await settle();
    expect(confirm).toHaveBeenCalledTimes(2);
    expect((wrapper.get('textarea[data-test="follow-up-result-input"]').element as HTMLTextAreaElement).value).toBe('DGA normal: C2H2 0 ppm');

    confirm.mockReturnValue(true);
    await wrapper.get('[data-test="follow-up-cancel"]').trigger('click');
    await settle();
    expect(wrapper.find('[data-test="follow-up-result-input"]').exists()).toBe(false);
    wrapper.unmount();
  });
});
