// After a release: the manager records when the unit was re-energised and lifts the restrictions in force; others only
// read them.
import { mount, type VueWrapper } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import EventReleaseActions from '../../../src/components/event/EventReleaseActions.vue';
import { quasarOptions } from '../../../src/quasar-options';
import { eventDetail } from '../pages/fixtures';
import { resetClientState, scriptFetch, settle } from '../helpers';

const released = eventDetail({ status: 'released', activeRestrictions: 'Load below 80 %; reclosing blocked' });

function render(canManage: boolean, event = released) {
  return mount(EventReleaseActions, {
    props: { event, zone: 'Europe/London', canManage, personName: (id: number | null | undefined) => (id === 7 ? 'Ruth Okafor' : '—') },
    global: { plugins: [[Quasar, quasarOptions]] },
    attachTo: document.body,
  });
}

async function fill(wrapper: VueWrapper, selector: string, value: string): Promise<void> {
  await wrapper.get(selector).setValue(value);
  await settle();
}

describe('EventReleaseActions', () => {
  afterEach(() => {
    resetClientState();
  });

  it('shows the restrictions in force to everybody, and the controls to the manager only', () => {
    const reader = render(false);
    expect(reader.get('[data-test="active-restrictions"]').text()).toContain('Load below 80 %; reclosing blocked');
    expect(reader.find('[data-test="lift-restrictions"]').exists()).toBe(false);
    expect(reader.find('[data-test="record-energised"]').exists()).toBe(false);
    reader.unmount();
    const manager = render(true);
    expect(manager.find('[data-test="lift-restrictions"]').exists()).toBe(true);
    expect(manager.find('[data-test="record-energised"]').exists()).toBe(true);
  });

  it('records the re-energising time typed in site time, sent in UTC', async () => {
    const { requests } = scriptFetch({ 'POST /api/events/11/energised': { body: { eventId: 11, energisedAt: '2026-07-03T13:30:00.000Z', followUps: [] } } });
    const wrapper = render(true);
    await wrapper.get('[data-test="record-energised"]').trigger('click');
    await settle();
    // 14:30 in London in July is 13:30 UTC (summer time).
    await fill(wrapper, 'input[data-test="energised-input"]', '2026-07-03T14:30');
    await wrapper.get('[data-test="energised-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests[0].body).toEqual({ at: '2026-07-03T13:30:00.000Z' });
    await vi.waitFor(() => expect(wrapper.emitted('changed')).toBeTruthy());
  });

  it('asks why before lifting the restrictions, then sends the reason', async () => {
    const { requests } = scriptFetch({
      'POST /api/events/11/restrictions/lift': {
        body: { eventId: 11, decisionId: 3, restrictions: 'Load below 80 %; reclosing blocked', liftedAt: '2026-07-10T09:00:00.000Z', liftedById: 7, reason: 'Cable repaired.' },
      },
    });
    const wrapper = render(true);
    await wrapper.get('[data-test="lift-restrictions"]').trigger('click');
    await settle();
    await wrapper.get('[data-test="lift-form"]').trigger('submit');
    await settle();
    expect(requests).toHaveLength(0);
    expect(wrapper.get('[data-test="lift-form"]').text()).toContain('required');
    await fill(wrapper, 'textarea[data-test="lift-reason"]', 'Cable repaired.');
    await wrapper.get('[data-test="lift-form"]').trigger('submit');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests[0].body).toEqual({ reason: 'Cable repaired.' });
  });

  it('says when and why restrictions were lifted', () => {
    const wrapper = render(false, eventDetail({ status: 'released', restrictionsLifted: { at: '2026-07-10T09:00:00.000Z', byId: 7, reason: 'Cable repaired.' } }));
    expect(wrapper.get('[data-test="restrictions-lifted"]').text()).toMatch(/Restrictions lifted .* by Ruth Okafor: Cable repaired\./);
  });
});
