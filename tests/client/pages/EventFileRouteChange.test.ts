// The event file when its route id changes: the previous event's data, decision panel and upload controls must go,
// and an id the server does not know shows "not found" with a way back to the list.
import { enableAutoUnmount } from '@vue/test-utils';
import { beforeAll, afterEach, describe, expect, it } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';
import { screenedEvent } from './fixtures';

enableAutoUnmount(afterEach);

beforeAll(() => import('../../../src/pages/EventFilePage.vue'), 60_000);

describe('EventFilePage — moving to another event id', () => {
  afterEach(resetClientState);

  it('drops the previous event (serial, decision panel, upload controls) and shows "not found" with links back to the events list and the fleet when the new id answers 404', async () => {
    storeToken('valid');
    scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['manager', 'protection'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/events/11': { body: screenedEvent() },
      'GET /api/events/12': { status: 404, body: { error: { code: 'not_found', message: 'No such event.' } } },
    });
    const { wrapper, router } = await mountApp('/events/11');
    // The loaded event, with the controls that act on it.
    expect(wrapper.get('[data-test="event-title"]').text()).toContain('KVP-HX-T2');
    expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(true);
    expect(wrapper.find('[data-test="attachment-file"]').exists()).toBe(true);

    await router.push('/events/12');
    await settle();

    expect(wrapper.text()).not.toContain('KVP-HX-T2');
    expect(wrapper.find('[data-test="event-title"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="decision-panel"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="attachment-file"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="attachment-upload"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="new-session"]').exists()).toBe(false);
    const notFound = wrapper.get('[data-test="event-error"][data-state="not-found"]');
    expect(notFound.text()).toContain('There is no fault event with this number.');
    expect(notFound.get('a[data-test="load-back"]').attributes('href')).toBe('/events');
    expect(notFound.get('a[data-test="load-back-1"]').attributes('href')).toBe('/units');
  });
});

describe('EventFilePage — a reload that fails', () => {
  afterEach(resetClientState);

  it('keeps the loaded event with a "refresh failed" banner, and its retry loads the event again', async () => {
    storeToken('valid');
    let gets = 0;
    const { requests } = scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['protection'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/events/11': () => {
        gets += 1;
        return gets === 2 ? { status: 503, body: { error: { code: 'unavailable', message: 'The database is busy.' } } } : { body: screenedEvent() };
      },
      'POST /api/events/11/attachments': { status: 201, body: { id: 5, name: 'r.cfg', kind: 'comtrade-cfg', size: 10, createdAt: '2026-07-01T05:00:00.000Z' } },
    });
    const { wrapper } = await mountApp('/events/11');

    const holder = wrapper.get('[data-test="attachment-file"]').element;
    const input = (holder instanceof HTMLInputElement ? holder : holder.querySelector('input[type="file"]')) as HTMLInputElement;
    Object.defineProperty(input, 'files', { value: [new File(['x'], 'r.cfg')], configurable: true, writable: true });
    input.dispatchEvent(new Event('change'));
    await settle();
    await wrapper.get('[data-test="attachment-upload"]').trigger('click');
    await settle();

    expect(gets).toBe(2);
    expect(wrapper.get('[data-test="event-title"]').text()).toContain('KVP-HX-T2');
    const banner = wrapper.get('[data-test="event-refresh-error"]');
    expect(banner.text()).toContain('Refresh failed: The database is busy.');

    await banner.get('[data-test="load-retry"]').trigger('click');
    await settle();
    expect(requests.filter((r) => r.method === 'GET' && r.url === '/api/events/11')).toHaveLength(3);
    expect(wrapper.find('[data-test="event-refresh-error"]').exists()).toBe(false);
    expect(wrapper.get('[data-test="event-title"]').text()).toContain('KVP-HX-T2');
  });
});
