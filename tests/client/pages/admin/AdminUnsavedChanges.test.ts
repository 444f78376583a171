// Administration forms ask before typed changes are thrown away (Cancel, or another page), and not when nothing changed.
import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { healthy, inBody, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, typeInDocument } from '../../helpers';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../../src/pages/admin/AdminSitesPage.vue'), 60_000);

function signedInAsAdmin() {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id: 1, roles: ['admin'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/sites': { body: [{ id: 1, name: 'Harrow Cross', timeZone: 'Europe/London' }] },
    'GET /api/units': { body: { items: [], total: 0 } },
  });
}

function stubConfirm(answer: boolean) {
  const confirm = vi.fn((_message?: string) => answer);
  vi.stubGlobal('confirm', confirm);
  return confirm;
}

describe('administration forms: unsaved changes', () => {
  afterEach(resetClientState);

  it('closes an untouched site form without asking', async () => {
    const confirm = stubConfirm(false);
    signedInAsAdmin();
    const { wrapper } = await mountApp('/admin/sites');
    await wrapper.get('[data-test="site-add"]').trigger('click');
    await settle();
    inBody('site-cancel')!.click();
    await settle();
    expect(confirm).not.toHaveBeenCalled();
    await vi.waitFor(() => expect(inBody('site-dialog')).toBeNull());
  });

  it('asks before Cancel or another page drops a typed site, and keeps it when told to stay', async () => {
    const confirm = stubConfirm(false);
    signedInAsAdmin();
    const { wrapper, router } = await mountApp('/admin/sites');
    await wrapper.get('[data-test="site-add"]').trigger('click');
    await settle();
    await typeInDocument('site-name', 'Millbrook');

    inBody('site-cancel')!.click();
    await settle();
    expect(confirm).toHaveBeenCalledOnce();
    expect(inBody('site-dialog')).not.toBeNull();

    await router.push('/units');
    expect(confirm).toHaveBeenCalledTimes(2);
    expect(router.currentRoute.value.path).toBe('/admin/sites');

    confirm.mockReturnValue(true);
    inBody('site-cancel')!.click();
    await settle();
    await vi.waitFor(() => expect(inBody('site-dialog')).toBeNull());
  });
});
