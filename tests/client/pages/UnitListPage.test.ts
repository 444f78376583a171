import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { captureDownloads, healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest } from '../helpers';
import { unitItem } from './fixtures';
import { ICON_SVGS } from '../../../src/icons';

// Which icon a q-icon draws (inline SVG, no ligature word): its SVG paths, named back through src/icons.ts.
const iconOf = (el: Element) => {
  const drawn = [...el.querySelectorAll('path')].map((p) => p.getAttribute('d')).join('&&');
  return Object.keys(ICON_SVGS).find((name) => ICON_SVGS[name].split('&&').map((p) => p.split('@@')[0]).join('&&') === drawn);
};

enableAutoUnmount(afterEach);

const sites = [
  { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London' },
  { id: 2, name: 'Millbrook', timeZone: 'Europe/London' },
];
const designs = [{ id: 2, reference: 'KV-40-132', unitCount: 8 }];

function signedInWithFleet(answer: (request: RecordedRequest) => { items: unknown[]; total: number }) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/sites': { body: sites },
    'GET /api/designs': { body: designs },
    'GET /api/units': (request) => ({ body: answer(request) }),
  });
}

function unitQueries(requests: RecordedRequest[]): URLSearchParams[] {
  return requests.filter((r) => r.url.split('?')[0] === '/api/units').map((r) => new URLSearchParams(r.url.split('?')[1] ?? ''));
}

const fortyUnits = Array.from({ length: 40 }, (_, k) => unitItem({ id: 100 + k, serial: `KVP-${String(k).padStart(2, '0')}` }));

describe('UnitListPage (/units)', () => {
  afterEach(resetClientState);

  it('asks the server for the first page sorted by serial and shows each unit with site, design, last event and recommendation', async () => {
    const { requests } = signedInWithFleet(() => ({ items: [unitItem()], total: 1 }));
    const { wrapper } = await mountApp('/units');

    const [first] = unitQueries(requests);
    expect(Object.fromEntries(first)).toEqual({ sort: 'serial', page: '1', pageSize: '25' });
    const row = wrapper.get('[data-test="fleet-table"] tbody tr');
    expect(row.text()).toContain('KVP-HX-T2');
    expect(row.text()).toContain('Harrow Cross');
    expect(row.text()).toContain('KV-40-132');
    // 03:12 UTC on 1 July is 04:12 in London (summer time), shown with offset and zone.
    expect(row.text()).toContain('2026-07-01 04:12 +01:00 Europe/London');
    const badge = row.get('[data-test="recommendation-badge"]');
    expect(badge.attributes('data-recommendation')).toBe('conditional');
    expect(badge.text()).toContain('Conditional');
    expect(iconOf(badge.get('.q-icon').element)).toBe('warning');
  });

  it('requests the sort of a clicked column, then the reverse order on a second click', async () => {
    const { requests } = signedInWithFleet(() => ({ items: [unitItem()], total: 1 }));
    const { wrapper } = await mountApp('/units');

    const siteHeader = () => wrapper.findAll('[data-test="fleet-table"] th').find((th) => th.text().includes('Site'))!;
    await siteHeader().trigger('click');
    await vi.waitFor(() => expect(unitQueries(requests).at(-1)?.get('sort')).toBe('site'));
    await siteHeader().trigger('click');
    await vi.waitFor(() => expect(unitQueries(requests).at(-1)?.get('sort')).toBe('-site'));
    expect(unitQueries(requests).at(-1)?.get('page')).toBe('1');
  });

  it('requests page 2 with the same sort when the next page is asked for', async () => {
    const { requests } = signedInWithFleet((r) => {
      const page = Number(new URLSearchParams(r.url.split('?')[1]).get('page'));
      return { items: fortyUnits.slice((page - 1) * 25, page * 25), total: 40 };
    });
    const { wrapper } = await mountApp('/units');

    expect(wrapper.get('[data-test="page-of"]').text()).toBe('page 1 of 2');
    await wrapper.get('[data-test="next-page"]').trigger('click');
    await vi.waitFor(() => expect(unitQueries(requests).at(-1)?.get('page')).toBe('2'));
    expect(unitQueries(requests).at(-1)?.get('sort')).toBe('serial');
    await settle();
    expect(wrapper.get('[data-test="fleet-table"] tbody tr').text()).toContain('KVP-25');
  });

  it('sends the typed text as q and starts again at page 1', async () => {
    const { requests } = signedInWithFleet(() => ({ items: [unitItem()], total: 1 }));
    const { wrapper } = await mountApp('/units');

    await wrapper.get('input[data-test="filter-q"]').setValue('HX-T');
    await vi.waitFor(() => expect(unitQueries(requests).at(-1)?.get('q')).toBe('HX-T'), { timeout: 2000 });
    expect(unitQueries(requests).at(-1)?.get('page')).toBe('1');
  });

  it('takes site, design and recommendation filters from the URL into the query string', async () => {
    const { requests } = signedInWithFleet(() => ({ items: [], total: 0 }));
    await mountApp('/units?siteId=2&designId=2&recommendation=no-go');

    expect(Object.fromEntries(unitQueries(requests)[0])).toEqual({
      siteId: '2',
      designId: '2',
      recommendation: 'no-go',
      sort: 'serial',
      page: '1',
      pageSize: '25',
    });
  });

  it('says what to do next when the fleet is empty, and when no unit matches the filters', async () => {
    signedInWithFleet(() => ({ items: [], total: 0 }));
    const empty = await mountApp('/units');
    expect(empty.wrapper.get('[data-test="fleet-empty"]').text()).toContain('An administrator adds the sites, designs and units');
    empty.wrapper.unmount();

    signedInWithFleet(() => ({ items: [], total: 0 }));
    const filtered = await mountApp('/units?q=zzz');
    expect(filtered.wrapper.get('[data-test="fleet-empty"]').text()).toContain('No unit matches these filters.');
    expect(filtered.wrapper.get('[data-test="fleet-empty"]').text()).toContain('Clear the filters');
  });

  it('downloads the export of the current filter and sort from the server, as CSV or Excel', async () => {
    storeToken('valid');
    const { requests } = scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/sites': { body: sites },
      'GET /api/designs': { body: designs },
      'GET /api/units': { body: { items: [unitItem()], total: 1 } },
      'GET /api/units/export': { body: 'serial,position\r\nKVP-HX-T2,T2\r\n' },
    });
    const { blobs, fileName } = captureDownloads();
    const { wrapper } = await mountApp('/units?recommendation=conditional');

    await wrapper.get('[data-test="export-csv"]').trigger('click');
    await vi.waitFor(() => expect(blobs).toHaveLength(1));
    await wrapper.get('[data-test="export-xlsx"]').trigger('click');
    await vi.waitFor(() => expect(blobs).toHaveLength(2));

    const exports = requests.filter((r) => r.url.split('?')[0] === '/api/units/export').map((r) => Object.fromEntries(new URLSearchParams(r.url.split('?')[1])));
    expect(exports).toEqual([
      { recommendation: 'conditional', sort: 'serial', format: 'csv' },
      { recommendation: 'conditional', sort: 'serial', format: 'xlsx' },
    ]);
    expect(await blobs[0].text()).toBe('serial,position\r\nKVP-HX-T2,T2\r\n');
    expect(fileName(0)).toMatch(/^gapsight-fleet-\d{4}-\d{2}-\d{2}\.csv$/);
    expect(fileName(1)).toMatch(/\.xlsx$/);
    // No paging requests for the export: the server writes every unit of the filter.
    expect(unitQueries(requests).every((q) => q.get('pageSize') !== '500')).toBe(true);
  });

  it('offers the units import to an admin only', async () => {
    signedInWithFleet(() => ({ items: [unitItem()], total: 1 }));
    const engineer = await mountApp('/units');
    expect(engineer.wrapper.find('[data-test="import-units"]').exists()).toBe(false);
    engineer.wrapper.unmount();

    storeToken('valid');
    scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['admin'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/sites': { body: sites },
      'GET /api/designs': { body: designs },
      'GET /api/units': { body: { items: [unitItem()], total: 1 } },
    });
    const admin = await mountApp('/units');
    expect(admin.wrapper.find('[data-test="import-units"]').exists()).toBe(true);
  });

  it('offers the reading-sets import to a tester and an admin, not to an engineer', async () => {
    signedInWithFleet(() => ({ items: [unitItem()], total: 1 }));
    const engineer = await mountApp('/units');
    expect(engineer.wrapper.find('[data-test="import-reading-sets"]').exists()).toBe(false);
    engineer.wrapper.unmount();

    for (const role of ['tester', 'admin'] as const) {
      storeToken('valid');
      scriptFetch({
        'GET /api/auth/me': { body: makeUser({ roles: [role] }) },
        'GET /api/health': { body: healthy },
        'GET /api/sites': { body: sites },
        'GET /api/designs': { body: designs },
        'GET /api/units': { body: { items: [unitItem()], total: 1 } },
      });
      const page = await mountApp('/units');
      expect(page.wrapper.find('[data-test="import-reading-sets"]').exists()).toBe(true);
      expect(page.wrapper.find('[data-test="import-units"]').exists()).toBe(role === 'admin');
      page.wrapper.unmount();
    }
  });

  it('shows the cautions under the table, where recommendations appear', async () => {
    signedInWithFleet(() => ({ items: [unitItem()], total: 1 }));
    const { wrapper } = await mountApp('/units');

    const cautions = wrapper.get('[data-test="cautions"]').text();
    expect(cautions).toContain('The recommendation is decision support for qualified staff.');
    expect(cautions).toContain('High-voltage tests must follow');
  });
});
