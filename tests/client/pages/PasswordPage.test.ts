import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../src/pages/PasswordPage.vue'), 60_000);

// The visible message of the field around an input (Quasar puts it below the control).
function fieldMessage(input: HTMLElement): string {
  return input.closest('.q-field')?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
}

const ONE_TIME = 'Qx7-vR2mTz9bLw4k';
const NEW = 'a brand new passphrase';

function signedIn(mustChangePassword: boolean, extra: Parameters<typeof scriptFetch>[0] = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['tester'], mustChangePassword }) },
    'GET /api/health': { body: healthy },
    ...extra,
  });
}

describe('PasswordPage (/password) and its guard', () => {
  afterEach(resetClientState);

  it('takes a person with a one-time password to "Choose your password" from any page, and keeps them there', async () => {
    signedIn(true);
    const { wrapper, router } = await mountApp('/events');
    expect(router.currentRoute.value.name).toBe('password');
    expect(router.currentRoute.value.query.redirect).toBe('/events');
    expect(wrapper.get('[data-test="password-title"]').text()).toBe('Choose your password');
    expect(wrapper.get('[data-test="password-forced"]').text()).toContain('one-time password');
    expect(wrapper.find('[data-test="password-cancel"]').exists()).toBe(false);

    await router.push('/units');
    await settle();
    expect(router.currentRoute.value.name).toBe('password');
  });

  it('checks the new password on the client (length, same as current, repeated) and sends nothing', async () => {
    const { requests } = signedIn(true);
    const { wrapper } = await mountApp('/password');
    await wrapper.get('input[data-test="password-current"]').setValue(ONE_TIME);
    await wrapper.get('input[data-test="password-new"]').setValue('too short');
    await wrapper.get('input[data-test="password-repeat"]').setValue('other');
    await wrapper.get('form').trigger('submit');
    await settle();
    expect(fieldMessage(wrapper.get('[data-test="password-new"]').element as HTMLElement)).toBe('at least 12 characters');
    expect(fieldMessage(wrapper.get('[data-test="password-repeat"]').element as HTMLElement)).toBe('The two new passwords differ.');

    await wrapper.get('input[data-test="password-new"]').setValue(ONE_TIME);
    await wrapper.get('input[data-test="password-repeat"]').setValue(ONE_TIME);
    await wrapper.get('form').trigger('submit');
    await settle();
    expect(fieldMessage(wrapper.get('[data-test="password-new"]').element as HTMLElement)).toBe('must differ from the current password');
    expect(requests.filter((r) => r.url === '/api/auth/password')).toHaveLength(0);
  });

  it('shows the server’s word on the current password under its field', async () => {
    signedIn(true, {
      'POST /api/auth/password': { status: 400, body: { error: { code: 'invalid_input', message: 'The current password is wrong.', fields: { currentPassword: 'wrong password' } } } },
    });
    const { wrapper, router } = await mountApp('/password');
    await wrapper.get('input[data-test="password-current"]').setValue('not it at all');
    await wrapper.get('input[data-test="password-new"]').setValue(NEW);
    await wrapper.get('input[data-test="password-repeat"]').setValue(NEW);
    await wrapper.get('form').trigger('submit');
    await vi.waitFor(() => expect(fieldMessage(wrapper.get('[data-test="password-current"]').element as HTMLElement)).toBe('wrong password'));
    expect(router.currentRoute.value.name).toBe('password');
  });

  it('sends the current and new password, then continues to the page first asked for', async () => {
    const { requests } = signedIn(true, { 'POST /api/auth/password': { body: { token: 'after-change', user: makeUser({ roles: ['tester'], mustChangePassword: false }) } } });
    const { wrapper, router } = await mountApp('/no-such-page');
    expect(router.currentRoute.value.name).toBe('password');
    await wrapper.get('input[data-test="password-current"]').setValue(ONE_TIME);
    await wrapper.get('input[data-test="password-new"]').setValue(NEW);
    await wrapper.get('input[data-test="password-repeat"]').setValue(NEW);
    await wrapper.get('form').trigger('submit');
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/no-such-page'));
    expect(requests.find((r) => r.url === '/api/auth/password')?.body).toEqual({ currentPassword: ONE_TIME, newPassword: NEW });
  });

  it('is open to anyone signed in, with a way back, and linked from the shell as "Change password"', async () => {
    signedIn(false, { 'GET /api/events': { body: { items: [], total: 0, page: 1, pageSize: 25 } }, 'GET /api/follow-ups': { body: { items: [], total: 0, page: 1, pageSize: 50 } } });
    const { wrapper, router } = await mountApp('/forbidden');
    const link = wrapper.get('[data-test="change-password"]');
    expect(link.text()).toContain('Change password');
    await link.trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('password'));
    await settle();
    expect(wrapper.find('[data-test="password-forced"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="password-cancel"]').exists()).toBe(true);
  });
});
