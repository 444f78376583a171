import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, storeToken } from '../helpers';

enableAutoUnmount(afterEach);

describe('NotFoundPage', () => {
  afterEach(resetClientState);

  it('shows the address that matched no page, inside the shell, with a way back to the desk', async () => {
    storeToken('valid');
    scriptFetch({ 'GET /api/auth/me': { body: makeUser() }, 'GET /api/health': { body: healthy } });
    const { wrapper } = await mountApp('/units/99/nonsense');

    expect(wrapper.get('[data-test="not-found-title"]').text()).toBe('No page here');
    expect(wrapper.get('[data-test="not-found-path"]').text()).toBe('/units/99/nonsense');
    expect(wrapper.find('[data-test="user-name"]').exists()).toBe(true);
    expect(wrapper.get('a[href="/"].q-btn').text()).toContain('Back to the desk');
  });
});
