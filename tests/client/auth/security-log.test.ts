import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { SecurityEventPage } from '../../../src/api/auth';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, storeToken, type RecordedRequest } from '../helpers';

// The administration's "Security log" (on the People page): events in words, UTC times, paged from the server.

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../src/pages/admin/AdminPeoplePage.vue'), 60_000);

const page = (over: Partial<SecurityEventPage> = {}): SecurityEventPage => ({
  items: [
    { id: 9, at: '2026-12-03T08:15:00.000Z', kind: 'account_locked', userId: 4, userName: 'Morgan Fairweather', email: 'm.fairweather@kestrel-valley.example', address: '203.0.113.7', route: 'POST /api/auth/login', detail: 'locked for 15 minute(s) after 5 failed sign-ins' },
    { id: 8, at: '2026-12-03T08:14:00.000Z', kind: 'sign_in_failed', userId: null, userName: null, email: 'nobody@x.example', address: '203.0.113.7', route: 'POST /api/auth/login', detail: 'no account with this e-mail' },
    { id: 7, at: '2026-12-03T08:00:00.000Z', kind: 'access_refused', userId: 5, userName: 'Ruth Okafor', email: null, address: '198.51.100.2', route: 'GET /api/users', detail: 'This needs one of the roles: admin.' },
  ],
  total: 60,
  page: 1,
  pageSize: 25,
  ...over,
});

describe('the security log', () => {
  afterEach(resetClientState);

  it('lists events in words with who, address and time, and pages through the server', async () => {
    storeToken('valid');
    const { requests } = scriptFetch({
      'GET /api/auth/me': { body: makeUser({ id: 1, roles: ['admin'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/users': { body: { items: [], total: 0, page: 1, pageSize: 25 } },
      'GET /api/sites': { body: [] },
      'GET /api/security-events': (r: RecordedRequest) => ({ body: page({ page: Number(new URL(r.url, 'http://x').searchParams.get('page')) }) }),
    });
    const { wrapper } = await mountApp('/admin/people');
    await vi.waitFor(() => expect(wrapper.find('[data-test="security-event-9"]').exists()).toBe(true));
    const text = wrapper.get('[data-test="security-log-table"]').text();
    expect(text).toContain('Account locked after repeated failures');
    expect(text).toContain('Sign-in failed');
    expect(text).toContain('Access refused: role not held');
    expect(text).toContain('nobody@x.example (no such account)');
    expect(text).toContain('Ruth Okafor');
    expect(text).toContain('2026-12-03 08:15');
    expect(text).not.toMatch(/account_locked|sign_in_failed|access_refused/);
    expect(wrapper.get('[data-test="security-log-page"]').text()).toBe('page 1 of 3');

    await wrapper.get('[data-test="security-log-next"]').trigger('click');
    await vi.waitFor(() => expect(wrapper.get('[data-test="security-log-page"]').text()).toBe('page 2 of 3'));
    const asked = requests.filter((r) => r.url.startsWith('/api/security-events')).map((r) => new URL(r.url, 'http://x').searchParams.get('page'));
    expect(asked).toEqual(['1', '2']);
  });
});
