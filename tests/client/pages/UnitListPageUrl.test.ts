import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest } from '../helpers';
import { unitItem } from './fixtures';

// The fleet's view (filters, sort, page) lives in the URL: a shared link opens it, Back from a unit returns to it.

enableAutoUnmount(afterEach);

const sites = [{ id: 2, name: 'Millbrook', timeZone: 'Europe/London' }];
const sixtyUnits = Array.from({ length: 60 }, (_, k) => unitItem({ id: 100 + k, serial: `KVP-${String(k).padStart(2, '0')}` }));

function signedInWithFleet() {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/sites': { body: sites },
    'GET /api/designs': { body: [] },
    'GET /api/units': (request) => {
      const page = Number(new URLSearchParams(request.url.split('?')[1]).get('page'));
      return { body: { items: sixtyUnits.slice((page - 1) * 25, page * 25), total: 60 } };
    },
    'GET /api/units/:id': { status: 404, body: { error: { code: 'not-found', message: 'Not found' } } },
  });
}

function unitQueries(requests: RecordedRequest[]): Record<string, string>[] {
  return requests.filter((r) => r.url.split('?')[0] === '/api/units').map((r) => Object.fromEntries(new URLSearchParams(r.url.split('?')[1] ?? '')));
}

describe('UnitListPage: the view kept in the URL', () => {
  afterEach(resetClientState);

  it('opens a shared link on its filter, sort and page, asking the server once for exactly that page', async () => {
    const { requests } = signedInWithFleet();
    const { wrapper } = await mountApp('/units?siteId=2&sort=-lastEventAt&page=2');

    expect(unitQueries(requests)).toEqual([{ siteId: '2', sort: '-lastEventAt', page: '2', pageSize: '25' }]);
    expect(wrapper.get('[data-test="page-of"]').text()).toBe('page 2 of 3');
    expect(wrapper.get('[data-test="fleet-table"] tbody tr').text()).toContain('KVP-25');
    // The table shows the sort it was asked for: the "Last event" header is the sorted, descending one.
    const sorted = wrapper.findAll('[data-test="fleet-table"] th.sorted');
    expect(sorted.map((th) => th.text())).toEqual([expect.stringContaining('Last event')]);
    expect(sorted[0].classes()).toContain('sort-desc');
  });

  it('ignores a sort, page or page size that the list does not offer', async () => {
    const { requests } = signedInWithFleet();
    await mountApp('/units?sort=password&page=-3&pageSize=100000');
    expect(unitQueries(requests)).toEqual([{ sort: 'serial', page: '1', pageSize: '25' }]);
  });

  it('writes sort and page into the URL as they change, and a new filter starts again at page 1', async () => {
    signedInWithFleet();
    const { wrapper, router } = await mountApp('/units');

    const siteHeader = () => wrapper.findAll('[data-test="fleet-table"] th').find((th) => th.text().includes('Site'))!;
    await siteHeader().trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ sort: 'site' }));
    await wrapper.get('[data-test="next-page"]').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ sort: 'site', page: '2' }));

    await wrapper.get('input[data-test="filter-q"]').setValue('KVP');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ q: 'KVP', sort: 'site' }), { timeout: 2000 });
  });

  it('comes back from a unit file to the same sort and page (Back)', async () => {
    const { requests } = signedInWithFleet();
    const { wrapper, router } = await mountApp('/units');

    await wrapper.get('[data-test="next-page"]').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ page: '2' }));
    await settle();
    await wrapper.get('[data-test="unit-link"]').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('unit-file'));
    await settle();

    const before = unitQueries(requests).length;
    router.back();
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('units'));
    await settle();
    expect(router.currentRoute.value.query).toEqual({ page: '2' });
    expect(unitQueries(requests).slice(before)).toEqual([{ sort: 'serial', page: '2', pageSize: '25' }]);
    expect(wrapper.get('[data-test="page-of"]').text()).toBe('page 2 of 3');
  });
});
