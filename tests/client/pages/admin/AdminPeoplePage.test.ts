import { enableAutoUnmount, type VueWrapper } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../../src/api/auth';
import type { PersonView, PersonWithPassword } from '../../../../src/api/users';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest, type ScriptedResponse, typeInDocument } from '../../helpers';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../../src/pages/admin/AdminPeoplePage.vue'), 60_000);

const ONE_TIME = 'Qx7-vR2mTz9bLw4k';

const person = (over: Partial<PersonView> = {}): PersonView => ({
  id: 21,
  email: 'a.moss@utility.example',
  name: 'Alex Moss',
  roles: ['tester'],
  siteIds: [2],
  allSites: false,
  active: true,
  demo: false,
  mustChangePassword: false,
  lastSignInAt: null,
  lockedUntil: null,
  ...over,
});

function signedInAs(roles: Role[], script: Record<string, ScriptedResponse | ((r: RecordedRequest) => ScriptedResponse)> = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id: 1, roles, name: 'Ada Admin' }) },
    'GET /api/health': { body: healthy },
    'GET /api/users': { body: pageOf([person()]) },
    'GET /api/sites': { body: [{ id: 2, name: 'Harrow Cross', timeZone: 'Europe/London' }] },
    ...script,
  });
}

const pageOf = (items: PersonView[], total = items.length) => ({ items, total, page: 1, pageSize: 25 });
const isList = (r: RecordedRequest) => r.method === 'GET' && r.url.split('?')[0] === '/api/users';

const inDialog = (selector: string) => document.body.querySelector(selector);

async function click(selector: string): Promise<void> {
  (document.body.querySelector(selector) as HTMLElement).click();
  await settle();
}

function rowText(wrapper: VueWrapper, id: number): string {
  return wrapper.get(`[data-test="person-row-${id}"]`).text();
}

describe('AdminPeoplePage (/admin/people)', () => {
  afterEach(resetClientState);

  it('lists people with roles, sites and state', async () => {
    signedInAs(['admin'], { 'GET /api/users': { body: pageOf([person(), person({ id: 22, name: 'Bo Lane', email: 'b@x.example', roles: ['manager', 'admin'], allSites: true, siteIds: [], lockedUntil: '2026-07-01T10:00:00.000Z' }), person({ id: 23, name: 'Cy Old', email: 'c@x.example', active: false })]) } });
    const { wrapper } = await mountApp('/admin/people');

    expect(rowText(wrapper, 21)).toContain('Test engineer');
    expect(rowText(wrapper, 21)).toContain('Harrow Cross');
    expect(rowText(wrapper, 21)).toContain('Active');
    expect(rowText(wrapper, 22)).toContain('Operations manager, Administrator');
    expect(rowText(wrapper, 22)).toContain('All sites');
    expect(rowText(wrapper, 22)).toContain('Locked until 2026-07-01 10:00');
    expect(wrapper.find('[data-test="person-unlock-22"]').exists()).toBe(true);
    expect(wrapper.find('[data-test="person-unlock-21"]').exists()).toBe(false);
    expect(rowText(wrapper, 23)).toContain('Deactivated');
    expect(wrapper.find('[data-test="person-reactivate-23"]').exists()).toBe(true);
  });

  it('adds a person and shows the one-time password once, with a copy button and a warning; closed, it is gone', async () => {
    const created: PersonWithPassword = { ...person({ id: 30, name: 'Nia Tester', email: 'nia@utility.example', roles: ['tester'], siteIds: [] }), oneTimePassword: ONE_TIME };
    const { requests } = signedInAs(['admin'], { 'POST /api/users': { status: 201, body: created } });
    const { wrapper } = await mountApp('/admin/people');

    await wrapper.get('[data-test="person-add"]').trigger('click');
    await settle();
    await typeInDocument('person-name', 'Nia Tester');
    await typeInDocument('person-email', 'nia@utility.example');
    await click('[data-test="person-role-tester"]');
    (inDialog('[data-test="person-form"]') as HTMLFormElement).dispatchEvent(new Event('submit'));
    await vi.waitFor(() => expect(inDialog('[data-test="otp-dialog"]')).not.toBeNull(), { timeout: 5000 });

    const post = requests.find((r) => r.method === 'POST' && r.url === '/api/users')!.body as Record<string, unknown>;
    expect(post).toEqual({ name: 'Nia Tester', email: 'nia@utility.example', roles: ['tester'], allSites: false, siteIds: [] });
    expect(inDialog('[data-test="otp-password"]')?.textContent).toBe(ONE_TIME);
    expect(inDialog('[data-test="otp-email"]')?.textContent).toBe('nia@utility.example');
    expect(inDialog('[data-test="otp-warning"]')?.textContent).toContain('will not be shown again');
    expect(inDialog('[data-test="otp-copy"]')).not.toBeNull();

    await click('[data-test="otp-close"]');
    await vi.waitFor(() => expect(inDialog('[data-test="otp-dialog"]')).toBeNull(), { timeout: 5000 });
    expect(document.body.innerHTML).not.toContain(ONE_TIME);
    // The list is loaded again after the creation, and lists no password.
    expect(requests.filter(isList).length).toBe(2);
  });

  it('shows the server’s field error on the e-mail field and no password when the e-mail is taken', async () => {
    signedInAs(['admin'], {
      'POST /api/users': { status: 409, body: { error: { code: 'email_taken', message: 'A user with this e-mail already exists.', fields: { email: 'already in use' } } } },
    });
    const { wrapper } = await mountApp('/admin/people');

    await wrapper.get('[data-test="person-add"]').trigger('click');
    await settle();
    await typeInDocument('person-name', 'Twin');
    await typeInDocument('person-email', 'a.moss@utility.example');
    await click('[data-test="person-role-manager"]');
    (inDialog('[data-test="person-form"]') as HTMLFormElement).dispatchEvent(new Event('submit'));
    await vi.waitFor(() => expect(inDialog('[data-test="person-form-error"]')).not.toBeNull(), { timeout: 5000 });

    const emailField = document.body.querySelector('input[data-test="person-email"]')!.closest('.q-field')!;
    expect(emailField.textContent).toContain('already in use');
    expect(inDialog('[data-test="otp-dialog"]')).toBeNull();
  });

  it('refuses to send a person without a role, naming the field', async () => {
    const { requests } = signedInAs(['admin']);
    const { wrapper } = await mountApp('/admin/people');

    await wrapper.get('[data-test="person-add"]').trigger('click');
    await settle();
    await typeInDocument('person-name', 'No Role');
    await typeInDocument('person-email', 'norole@utility.example');
    (inDialog('[data-test="person-form"]') as HTMLFormElement).dispatchEvent(new Event('submit'));
    await settle();

    expect(inDialog('[data-test="person-dialog"]')?.textContent).toContain('pick at least one role');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('resets a password after a confirmation and shows the new one-time password once', async () => {
    const { requests } = signedInAs(['admin'], { 'POST /api/users/21/reset-password': { body: { ...person(), oneTimePassword: ONE_TIME } } });
    const { wrapper } = await mountApp('/admin/people');

    await wrapper.get('[data-test="person-reset-21"]').trigger('click');
    await settle();
    expect(inDialog('[data-test="confirm-dialog"]')?.textContent).toContain('Reset the password of Alex Moss?');
    expect(requests.some((r) => r.url.endsWith('/reset-password'))).toBe(false);
    await click('[data-test="confirm-ok"]');
    await vi.waitFor(() => expect(inDialog('[data-test="otp-password"]')?.textContent).toBe(ONE_TIME), { timeout: 5000 });
    expect(inDialog('[data-test="otp-dialog"]')?.textContent).toContain('Password reset');
  });

  it('deactivates after a confirmation, offers no deactivation of oneself, and unlocks a locked person', async () => {
    const me = person({ id: 1, name: 'Ada Admin', email: 'ada@x.example', roles: ['admin'] });
    const locked = person({ id: 24, name: 'Lee Locked', email: 'l@x.example', lockedUntil: '2026-07-01T10:00:00.000Z' });
    const { requests } = signedInAs(['admin'], {
      'GET /api/users': { body: pageOf([me, person(), locked]) },
      'PATCH /api/users/21': { body: person({ active: false }) },
      'POST /api/users/24/unlock': { body: { ...locked, lockedUntil: null } },
    });
    const { wrapper } = await mountApp('/admin/people');

    expect(wrapper.find('[data-test="person-deactivate-1"]').exists()).toBe(false);
    await wrapper.get('[data-test="person-deactivate-21"]').trigger('click');
    await settle();
    await click('[data-test="confirm-ok"]');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true), { timeout: 5000 });
    expect(requests.find((r) => r.method === 'PATCH')!.body).toEqual({ active: false });

    await wrapper.get('[data-test="person-unlock-24"]').trigger('click');
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.url === '/api/users/24/unlock')).toBe(true), { timeout: 5000 });
  });

  it('is not open to a manager: the router sends them to "not allowed", and the drawer has no Administration entry', async () => {
    signedInAs(['manager']);
    const { wrapper, router } = await mountApp('/admin/people');

    expect(router.currentRoute.value.name).toBe('forbidden');
    expect(wrapper.find('[data-test="nav-admin"]').exists()).toBe(false);
  });

  it('puts Administration in the drawer for an administrator', async () => {
    signedInAs(['admin']);
    const { wrapper } = await mountApp('/admin/people');

    expect(wrapper.get('[data-test="nav-admin"]').text()).toContain('Administration');
  });

  it('asks the server for one page, pages on, and a search by name or e-mail starts again at page 1', async () => {
    const { requests } = signedInAs(['admin'], {
      'GET /api/users': (r) => ({ body: r.url.includes('q=moss') ? pageOf([person()]) : pageOf([person(), person({ id: 22, name: 'Bo Lane', email: 'b@x.example' })], 60) }),
    });
    const { wrapper } = await mountApp('/admin/people');
    const first = new URL(requests.filter(isList)[0].url, 'http://x');
    expect(first.searchParams.get('page')).toBe('1');
    expect(first.searchParams.get('pageSize')).toBe('25');
    expect(wrapper.get('[data-test="page-of"]').text()).toBe('page 1 of 3');

    await wrapper.get('[data-test="next-page"]').trigger('click');
    await vi.waitFor(() => expect(new URL(requests.filter(isList).at(-1)!.url, 'http://x').searchParams.get('page')).toBe('2'), { timeout: 5000 });

    await wrapper.get('input[data-test="people-search"]').setValue('moss');
    await vi.waitFor(() => expect(requests.filter(isList).at(-1)!.url).toContain('q=moss'), { timeout: 5000 });
    const searched = new URL(requests.filter(isList).at(-1)!.url, 'http://x');
    expect(searched.searchParams.get('page')).toBe('1');
    await settle();
    expect(wrapper.find('[data-test="person-row-22"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="person-row-21"]').exists()).toBe(true);
  });
});
