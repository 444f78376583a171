import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest, type ScriptedResponse, typeInDocument } from '../../helpers';
import { design40, unitItem } from '../fixtures';

enableAutoUnmount(afterEach);
beforeAll(() => import('../../../../src/pages/admin/AdminUnitsPage.vue'), 60_000);

const site = { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London' };

function signedInAsAdmin(script: Record<string, ScriptedResponse | ((r: RecordedRequest) => ScriptedResponse)> = {}) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ id: 1, roles: ['admin'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/units': { body: { items: [unitItem()], total: 1, page: 1, pageSize: 25 } },
    'GET /api/sites': { body: [site] },
    'GET /api/designs': { body: [{ ...design40, unitCount: 1 }] },
    ...script,
  });
}

describe('AdminUnitsPage (/admin/units)', () => {
  afterEach(resetClientState);

  it('changes a unit: the form starts from its record and PATCHes the nameplate as numbers', async () => {
    const { requests } = signedInAsAdmin({ 'PATCH /api/units/3': (r) => ({ body: { ...unitItem(), ...(r.body as object) } }) });
    const { wrapper } = await mountApp('/admin/units');
    expect(wrapper.get('[data-test="unit-row-3"]').text()).toContain('KVP-HX-T2');

    await wrapper.get('[data-test="unit-edit-3"]').trigger('click');
    await settle();
    expect(document.body.querySelector<HTMLInputElement>('input[data-test="unit-rated-kva"]')!.value).toBe('40000');
    await typeInDocument('unit-system-impedance', '0.8');
    await typeInDocument('unit-year', '');
    document.body.querySelector('[data-test="unit-form"]')!.dispatchEvent(new Event('submit'));
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true), { timeout: 5000 });

    expect(requests.find((r) => r.method === 'PATCH')!.body).toEqual({
      serial: 'KVP-HX-T2',
      position: 'Bay 2',
      siteId: 1,
      designId: 2,
      year: null,
      phases: 3,
      hvKV: 132,
      lvKV: 33,
      ratedKVA: 40000,
      impedancePercent: 10.5,
      systemImpedancePercent: 0.8,
      conductor: 'Cu',
    });
  });

  it('keeps a unit’s nameplate: an emptied rated power is named on its field and nothing is sent', async () => {
    const { requests } = signedInAsAdmin();
    const { wrapper } = await mountApp('/admin/units');
    await wrapper.get('[data-test="unit-edit-3"]').trigger('click');
    await settle();
    await typeInDocument('unit-rated-kva', '');
    document.body.querySelector('[data-test="unit-form"]')!.dispatchEvent(new Event('submit'));
    await settle();

    expect(document.body.querySelector('input[data-test="unit-rated-kva"]')!.closest('.q-field')!.textContent).toContain('required');
    expect(requests.some((r) => r.method === 'PATCH')).toBe(false);
  });

  it('asks for a site and a design family before the first unit', async () => {
    signedInAsAdmin({ 'GET /api/units': { body: { items: [], total: 0, page: 1, pageSize: 25 } }, 'GET /api/designs': { body: [] } });
    const { wrapper } = await mountApp('/admin/units');

    expect(wrapper.get('[data-test="units-need-first"]').text()).toContain('add a design family first');
    expect(wrapper.get('[data-test="unit-add"]').attributes('disabled')).toBeDefined();
  });
});
