import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { TOKEN_STORAGE_KEY } from '../../../src/api/client';
import { healthy, healthyDemo, makeUser, mountApp, resetClientState, scriptFetch, settle } from '../helpers';

enableAutoUnmount(afterEach);

// The visible message of the field around an input (Quasar puts it below the control).
function fieldMessage(input: HTMLElement): string {
  return input.closest('.q-field')?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
}

describe('SignInPage', () => {
  afterEach(resetClientState);

  it('shows e-mail, password and a sign-in button with the data-test hooks of the browser tests', async () => {
    scriptFetch({ 'GET /api/health': { body: healthy } });
    const { wrapper } = await mountApp('/sign-in');

    expect(wrapper.get('input[data-test="signin-email"]').attributes('type')).toBe('email');
    expect(wrapper.get('input[data-test="signin-password"]').attributes('type')).toBe('password');
    expect(wrapper.get('button[data-test="signin-submit"]').text()).toContain('Sign in');
  });

  it('names empty fields next to them and asks the server nothing', async () => {
    const { requests } = scriptFetch({ 'GET /api/health': { body: healthy } });
    const { wrapper } = await mountApp('/sign-in');

    await wrapper.get('form').trigger('submit');
    await settle();

    expect(fieldMessage(wrapper.get('[data-test="signin-email"]').element as HTMLElement)).toBe('Enter your e-mail address.');
    expect(fieldMessage(wrapper.get('[data-test="signin-password"]').element as HTMLElement)).toBe('Enter your password.');
    expect(requests.filter((r) => r.url === '/api/auth/login')).toHaveLength(0);
  });

  it('signs in and continues to the page that was asked for', async () => {
    const user = makeUser({ roles: ['manager'] });
    const { requests } = scriptFetch({
      'GET /api/health': { body: healthy },
      'POST /api/auth/login': { body: { token: 'jwt-ok', user } },
    });
    const { wrapper, router } = await mountApp('/sign-in?redirect=/no-such-page');

    await wrapper.get('[data-test="signin-email"]').setValue('manager@kestrel-valley.example');
    await wrapper.get('[data-test="signin-password"]').setValue('gapsight-demo');
    await wrapper.get('form').trigger('submit');
    await settle();

    expect(requests.find((r) => r.url === '/api/auth/login')?.body).toEqual({
      email: 'manager@kestrel-valley.example',
      password: 'gapsight-demo',
    });
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('jwt-ok');
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/no-such-page'));
  });

  it('opens the desk after sign-in when no page was asked for', async () => {
    scriptFetch({
      'GET /api/health': { body: healthy },
      'POST /api/auth/login': { body: { token: 'jwt-ok', user: makeUser({ name: 'Ruth Okafor' }) } },
    });
    const { wrapper, router } = await mountApp('/sign-in');

    await wrapper.get('[data-test="signin-email"]').setValue('tester@kestrel-valley.example');
    await wrapper.get('[data-test="signin-password"]').setValue('pw');
    await wrapper.get('form').trigger('submit');
    await settle();

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('desk'));
    await settle();
    expect(wrapper.get('[data-test="desk-title"]').text()).toContain('Ruth Okafor');
  });

  it('shows a refused sign-in as a banner and stays on the form', async () => {
    scriptFetch({
      'GET /api/health': { body: healthy },
      'POST /api/auth/login': {
        status: 401,
        body: { error: { code: 'bad_credentials', message: 'Wrong e-mail or password.' } },
      },
    });
    const { wrapper, router } = await mountApp('/sign-in');

    await wrapper.get('[data-test="signin-email"]').setValue('tester@kestrel-valley.example');
    await wrapper.get('[data-test="signin-password"]').setValue('wrong');
    await wrapper.get('form').trigger('submit');
    await settle();

    expect(wrapper.get('[data-test="signin-error"]').text()).toContain('Wrong e-mail or password.');
    expect(wrapper.get('[data-test="signin-error"]').attributes('role')).toBe('alert');
    expect(router.currentRoute.value.name).toBe('sign-in');
  });

  it('shows the server’s field errors next to the fields they name', async () => {
    scriptFetch({
      'GET /api/health': { body: healthy },
      'POST /api/auth/login': {
        status: 400,
        body: { error: { code: 'invalid_input', message: 'Invalid input.', fields: { email: 'Use your work address.' } } },
      },
    });
    const { wrapper } = await mountApp('/sign-in');

    await wrapper.get('[data-test="signin-email"]').setValue('someone@elsewhere.example');
    await wrapper.get('[data-test="signin-password"]').setValue('pw');
    await wrapper.get('form').trigger('submit');
    await settle();

    expect(fieldMessage(wrapper.get('[data-test="signin-email"]').element as HTMLElement)).toBe('Use your work address.');
    expect(wrapper.find('[data-test="signin-error"]').exists()).toBe(false);
  });

  it('tells how long to wait after too many attempts', async () => {
    scriptFetch({
      'GET /api/health': { body: healthy },
      'POST /api/auth/login': {
        status: 429,
        headers: { 'Retry-After': '300' },
        body: { error: { code: 'too_many_attempts', message: 'Too many failed sign-ins.' } },
      },
    });
    const { wrapper } = await mountApp('/sign-in');

    await wrapper.get('[data-test="signin-email"]').setValue('tester@kestrel-valley.example');
    await wrapper.get('[data-test="signin-password"]').setValue('pw');
    await wrapper.get('form').trigger('submit');
    await settle();

    expect(wrapper.get('[data-test="signin-error"]').text()).toContain('Too many failed sign-ins. Try again in 5 minutes.');
  });

  it('lists the five demo accounts and their password when the server says demo data is loaded', async () => {
    scriptFetch({ 'GET /api/health': { body: healthyDemo } });
    const { wrapper } = await mountApp('/sign-in');

    const hint = wrapper.get('[data-test="demo-accounts"]');
    expect(hint.text()).toContain('gapsight-demo');
    expect(hint.findAll('[data-test="demo-account-email"]').map((item) => item.text())).toEqual([
      'admin@kestrel-valley.example',
      'protection@kestrel-valley.example',
      'tester@kestrel-valley.example',
      'manager@kestrel-valley.example',
      'engineer@kestrel-valley.example',
    ]);
  });

  it('does not show the demo accounts or their password when demo data is off', async () => {
    scriptFetch({ 'GET /api/health': { body: healthy } });
    const { wrapper } = await mountApp('/sign-in');

    expect(wrapper.find('[data-test="demo-accounts"]').exists()).toBe(false);
    expect(wrapper.text()).not.toContain('gapsight-demo');
  });

  it('fills in a demo account when its "Use" button is pressed', async () => {
    scriptFetch({ 'GET /api/health': { body: healthyDemo } });
    const { wrapper } = await mountApp('/sign-in');

    await wrapper.findAll('[data-test="demo-account"]')[3].get('button').trigger('click');

    expect((wrapper.get('[data-test="signin-email"]').element as HTMLInputElement).value).toBe(
      'manager@kestrel-valley.example',
    );
    expect((wrapper.get('[data-test="signin-password"]').element as HTMLInputElement).value).toBe('gapsight-demo');
  });

  it('warns that signing in will fail when the server does not answer', async () => {
    scriptFetch({ 'GET /api/health': new TypeError('Failed to fetch') });
    const { wrapper } = await mountApp('/sign-in');

    expect(wrapper.get('[data-test="signin-health-warning"]').text()).toContain('does not answer');
    expect(wrapper.find('[data-test="demo-accounts"]').exists()).toBe(false);
  });
});
