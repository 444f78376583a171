import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest, type ScriptedResponse, typeInDocument } from '../../helpers';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../../src/pages/admin/AdminSitesPage.vue'), 60_000);

function signedInAsAdmin(script: Record<string, ScriptedResponse | ((r: RecordedRequest) => ScriptedResponse)> = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id: 1, roles: ['admin'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/sites': { body: [{ id: 1, name: 'Harrow Cross', timeZone: 'Europe/London' }] },
    ...script,
  });
}

const fieldOf = (testId: string) => document.body.querySelector(`input[data-test="${testId}"]`)!.closest('.q-field')!.textContent ?? '';
const submit = async () => {
  document.body.querySelector('[data-test="site-form"]')!.dispatchEvent(new Event('submit'));
  await settle();
};

describe('AdminSitesPage (/admin/sites)', () => {
  afterEach(resetClientState);

  it('adds a site with its name, IANA time zone and control-room address', async () => {
    const { requests } = signedInAsAdmin({ 'POST /api/sites': { status: 201, body: { id: 2, name: 'Millbrook', timeZone: 'America/Chicago' } } });
    const { wrapper } = await mountApp('/admin/sites');
    expect(wrapper.get('[data-test="site-row-1"]').text()).toContain('Europe/London');

    await wrapper.get('[data-test="site-add"]').trigger('click');
    await settle();
    await typeInDocument('site-name', 'Millbrook');
    await typeInDocument('site-time-zone', 'America/Chicago');
    await typeInDocument('site-control-room-email', 'control@millbrook.example');
    await submit();
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true), { timeout: 5000 });

    expect(requests.find((r) => r.method === 'POST')!.body).toEqual({ name: 'Millbrook', timeZone: 'America/Chicago', locale: null, controlRoomEmail: 'control@millbrook.example' });
    await vi.waitFor(() => expect(document.body.querySelector('[data-test="site-dialog"]')).toBeNull(), { timeout: 5000 });
  });

  it('names a control-room address that is not an e-mail address and sends nothing', async () => {
    const { requests } = signedInAsAdmin();
    const { wrapper } = await mountApp('/admin/sites');
    await wrapper.get('[data-test="site-add"]').trigger('click');
    await settle();
    await typeInDocument('site-name', 'Millbrook');
    await typeInDocument('site-time-zone', 'America/Chicago');
    await typeInDocument('site-control-room-email', 'control room');
    await submit();

    expect(fieldOf('site-control-room-email')).toContain('not an e-mail address');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('names a time zone that is not an IANA name and sends nothing', async () => {
    const { requests } = signedInAsAdmin();
    const { wrapper } = await mountApp('/admin/sites');
    await wrapper.get('[data-test="site-add"]').trigger('click');
    await settle();
    await typeInDocument('site-name', 'Nowhere');
    await typeInDocument('site-time-zone', 'Europe/Nowhere');
    await submit();

    expect(fieldOf('site-time-zone')).toContain('not an IANA time zone');
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });

  it('shows the server’s word on the name field when it refuses the change', async () => {
    signedInAsAdmin({
      'PATCH /api/sites/1': { status: 409, body: { error: { code: 'name_taken', message: 'A site with this name already exists.', fields: { name: 'already in use' } } } },
    });
    const { wrapper } = await mountApp('/admin/sites');
    await wrapper.get('[data-test="site-edit-1"]').trigger('click');
    await settle();
    expect(document.body.querySelector<HTMLInputElement>('input[data-test="site-name"]')!.value).toBe('Harrow Cross');
    await typeInDocument('site-name', 'Millbrook');
    await submit();
    await vi.waitFor(() => expect(document.body.querySelector('[data-test="site-form-error"]')?.textContent).toContain('already exists'), { timeout: 5000 });

    expect(fieldOf('site-name')).toContain('already in use');
  });
});
