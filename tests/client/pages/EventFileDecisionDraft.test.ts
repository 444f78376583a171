// The decision panel keeps what the manager typed on this device: back after a reload, gone once signed or discarded.
import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it, vi } from 'vitest';
import type { DecisionView } from '../../../src/api/events';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { screenedEvent } from './fixtures';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

const KEY = 'gapsight.draft.decision.e11.s61.u9';

const decision: DecisionView = {
  id: 81,
  screeningId: 61,
  managerId: 9,
  outcome: 'hold',
  restrictions: null,
  reason: 'Bushing C1 doubtful; hold until the bushing is re-tested.',
  againstRecommendation: true,
  signedAt: '2026-07-03T11:00:00.000Z',
};

function signedInAsManager(id = 9) {
  let decided = false;
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id, name: 'Priya Nair', roles: ['manager'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/events/11': () => ({ body: decided ? screenedEvent({ status: 'held', decision, decisions: [decision] }) : screenedEvent() }),
    'POST /api/screenings/61/decision': () => {
      decided = true;
      return { status: 201, body: decision };
    },
  });
}

const reasonOf = (wrapper: VueWrapper) => (wrapper.get('textarea[data-test="decision-reason"]').element as HTMLTextAreaElement).value;

async function typeHold(wrapper: VueWrapper): Promise<void> {
  await wrapper.get('[data-test="outcome-hold"]').trigger('click');
  await wrapper.get('textarea[data-test="decision-reason"]').setValue(decision.reason);
  await settle();
}

describe('EventFilePage — decision draft', () => {
  afterEach(resetClientState);

  it('puts the typed outcome and reason back when the event file is opened again, and Discard draft empties the panel', async () => {
    signedInAsManager();
    const first = await mountApp('/events/11');
    expect(first.wrapper.find('[data-test="draft-notice"]').exists()).toBe(false);
    await typeHold(first.wrapper);
    expect(localStorage.getItem(KEY)).toContain('hold until the bushing');
    first.wrapper.unmount();

    signedInAsManager();
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.get('[data-test="draft-notice"]').text()).toContain('Draft restored from');
    expect(reasonOf(wrapper)).toBe(decision.reason);
    expect(wrapper.get('[data-test="outcome-hold"]').attributes('aria-checked')).toBe('true');

    await wrapper.get('[data-test="draft-discard"]').trigger('click');
    await settle();
    expect(reasonOf(wrapper)).toBe('');
    expect(wrapper.get('[data-test="outcome-hold"]').attributes('aria-checked')).toBe('false');
    expect(localStorage.getItem(KEY)).toBeNull();
  });

  it('shows another manager nothing of it', async () => {
    signedInAsManager();
    const first = await mountApp('/events/11');
    await typeHold(first.wrapper);
    first.wrapper.unmount();

    signedInAsManager(10);
    const { wrapper } = await mountApp('/events/11');
    expect(wrapper.find('[data-test="draft-notice"]').exists()).toBe(false);
    expect(reasonOf(wrapper)).toBe('');
  });

  it('forgets the draft once the decision is signed', async () => {
    signedInAsManager();
    const { wrapper } = await mountApp('/events/11');
    await typeHold(wrapper);
    await wrapper.get('[data-test="decision-panel"]').trigger('submit');
    await settle();
    document.body.querySelector<HTMLElement>('[data-test="confirm-ok"]')!.click();
    await vi.waitFor(() => expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(false));
    expect(localStorage.getItem(KEY)).toBeNull();
  });
});
