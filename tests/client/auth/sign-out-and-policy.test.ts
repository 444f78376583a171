import { enableAutoUnmount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { TOKEN_STORAGE_KEY } from '../../../src/api/client';
import { useSessionStore } from '../../../src/stores/session';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';

// Signing out ends the person's tokens on the server (and here, whatever the server says); a password change keeps the
// session with the new token it answers; the password policy shows under the new password as it is typed.

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../src/pages/PasswordPage.vue'), 60_000);

describe('the session store', () => {
  beforeEach(() => setActivePinia(createPinia()));
  afterEach(resetClientState);

  it('signOut sends POST /api/auth/logout with the token it held, and forgets it at once', async () => {
    const { requests } = scriptFetch({
      'POST /api/auth/login': { body: { token: 'jwt-1', user: makeUser() } },
      'POST /api/auth/logout': { status: 204, body: null },
    });
    const session = useSessionStore();
    await session.signIn('a@b.example', 'pw');
    const done = session.signOut();
    expect(session.token).toBeNull();
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull();
    await done;
    const logout = requests.find((r) => r.url === '/api/auth/logout');
    expect(logout?.method).toBe('POST');
    expect(logout?.headers.authorization).toBe('Bearer jwt-1');
  });

  it('signs out here even when the server cannot be reached', async () => {
    scriptFetch({ 'POST /api/auth/login': { body: { token: 'jwt-2', user: makeUser() } }, 'POST /api/auth/logout': new TypeError('offline') });
    const session = useSessionStore();
    await session.signIn('a@b.example', 'pw');
    await expect(session.signOut()).resolves.toBeUndefined();
    expect(session.isSignedIn).toBe(false);
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull();
  });

  it('sends nothing when there is no token', async () => {
    const { requests } = scriptFetch({});
    await useSessionStore().signOut();
    expect(requests).toHaveLength(0);
  });

  it('changePassword keeps the new token the server answers (older tokens have ended)', async () => {
    scriptFetch({
      'POST /api/auth/login': { body: { token: 'before', user: makeUser({ mustChangePassword: true }) } },
      'POST /api/auth/password': { body: { token: 'after', user: makeUser({ mustChangePassword: false }) } },
    });
    const session = useSessionStore();
    await session.signIn('a@b.example', 'pw');
    const user = await session.changePassword({ currentPassword: 'pw', newPassword: 'seven lanterns over the quiet harbour' });
    expect(user.mustChangePassword).toBe(false);
    expect(session.token).toBe('after');
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('after');
  });
});

describe('the password page and the policy', () => {
  afterEach(resetClientState);

  const hintOf = (el: Element) => el.closest('.q-field')?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';

  it('says under the new password, as it is typed, why a guessable one is refused and when one is good; sends nothing refused', async () => {
    storeToken('valid');
    const { requests } = scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['tester'], mustChangePassword: false }) },
      'GET /api/health': { body: healthy },
    });
    const { wrapper } = await mountApp('/password');
    const input = wrapper.get('input[data-test="password-new"]');
    await input.setValue('123456789012');
    await vi.waitFor(() => expect(hintOf(input.element)).toBe('this is one of the most common passwords; choose a longer phrase'), { timeout: 10_000 });
    await input.setValue('seven lanterns over the quiet harbour');
    await vi.waitFor(() => expect(hintOf(input.element)).toBe('Hard to guess: good.'));

    await input.setValue('password1234');
    await vi.waitFor(() => expect(hintOf(input.element)).toMatch(/choose a longer phrase/));
    await wrapper.get('input[data-test="password-current"]').setValue('the current one');
    await wrapper.get('input[data-test="password-repeat"]').setValue('password1234');
    await wrapper.get('form').trigger('submit');
    await settle();
    expect(hintOf(input.element)).toMatch(/common password; choose a longer phrase/);
    expect(requests.filter((r) => r.url === '/api/auth/password')).toHaveLength(0);
  });
});
