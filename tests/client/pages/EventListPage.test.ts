import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { zoneDayBound } from '../../../shared/lists';
import { browserZone } from '../../../src/composables/useEventList';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest } from '../helpers';
import { eventListItem } from './fixtures';

enableAutoUnmount(afterEach);

const sites = [
  { id: 1, name: 'Harrow Cross', timeZone: 'Europe/London' },
  { id: 2, name: 'Millbrook', timeZone: 'Europe/London' },
];

function signedInWithEvents(answer: (request: RecordedRequest) => { items: unknown[]; total: number }) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/sites': { body: sites },
    'GET /api/events': (request) => ({ body: { page: 1, pageSize: 25, ...answer(request) } }),
  });
}

function eventQueries(requests: RecordedRequest[]): URLSearchParams[] {
  return requests.filter((r) => r.url.split('?')[0] === '/api/events').map((r) => new URLSearchParams(r.url.split('?')[1] ?? ''));
}

const fortyEvents = Array.from({ length: 40 }, (_, k) => eventListItem({ id: 100 + k, unitSerial: `KVP-${String(k).padStart(2, '0')}` }));

describe('EventListPage (/events)', () => {
  afterEach(resetClientState);

  it('asks for the first page newest first and shows each event with unit, site, time in the site’s zone, type, status and recommendation', async () => {
    const { requests } = signedInWithEvents(() => ({ items: [eventListItem({ recommendation: 'no-go' })], total: 1 }));
    const { wrapper } = await mountApp('/events');

    expect(Object.fromEntries(eventQueries(requests)[0])).toEqual({ sort: '-occurredAt', page: '1', pageSize: '25' });
    const row = wrapper.get('[data-test="events-table"] tbody tr');
    expect(row.text()).toContain('KVP-HX-T2');
    expect(row.text()).toContain('Harrow Cross');
    // 03:12 UTC on 1 July is 04:12 in London (summer time).
    expect(row.text()).toContain('2026-07-01 04:12 +01:00 Europe/London');
    expect(row.text()).toContain('Three-phase');
    expect(row.get('[data-test="status-chip"]').text()).toContain('Testing');
    expect(row.get('[data-test="recommendation-badge"]').attributes('data-recommendation')).toBe('no-go');
  });

  it('links each row to its event file, and opens it on a click anywhere in the row', async () => {
    signedInWithEvents(() => ({ items: [eventListItem()], total: 1 }));
    const { wrapper, router } = await mountApp('/events');

    expect(wrapper.get('[data-test="event-link"]').attributes('href')).toBe('/events/11');
    const push = vi.spyOn(router, 'push').mockResolvedValue(undefined);
    await wrapper.get('[data-test="events-table"] tbody tr td:nth-child(2)').trigger('click');
    expect(push).toHaveBeenCalledWith({ name: 'event-file', params: { id: 11 } });
  });

  it('requests the sort of a clicked column, then the reverse order on a second click', async () => {
    const { requests } = signedInWithEvents(() => ({ items: [eventListItem()], total: 1 }));
    const { wrapper } = await mountApp('/events');

    const header = (label: string) => wrapper.findAll('[data-test="events-table"] th').find((th) => th.text().includes(label))!;
    await header('Unit').trigger('click');
    await vi.waitFor(() => expect(eventQueries(requests).at(-1)?.get('sort')).toBe('serial'));
    await header('Unit').trigger('click');
    await vi.waitFor(() => expect(eventQueries(requests).at(-1)?.get('sort')).toBe('-serial'));
    await header('Status').trigger('click');
    await vi.waitFor(() => expect(eventQueries(requests).at(-1)?.get('sort')).toBe('status'));
    await header('Fault time').trigger('click');
    await vi.waitFor(() => expect(eventQueries(requests).at(-1)?.get('sort')).toBe('occurredAt'));
  });

  it('requests page 2 with the same sort when the next page is asked for', async () => {
    const { requests } = signedInWithEvents((r) => {
      const page = Number(new URLSearchParams(r.url.split('?')[1]).get('page'));
      return { items: fortyEvents.slice((page - 1) * 25, page * 25), total: 40 };
    });
    const { wrapper } = await mountApp('/events');

    expect(wrapper.get('[data-test="page-of"]').text()).toBe('page 1 of 2');
    await wrapper.get('[data-test="next-page"]').trigger('click');
    await vi.waitFor(() => expect(eventQueries(requests).at(-1)?.get('page')).toBe('2'));
    expect(eventQueries(requests).at(-1)?.get('sort')).toBe('-occurredAt');
    await settle();
    expect(wrapper.get('[data-test="events-table"] tbody tr').text()).toContain('KVP-25');
  });

  it('sends the typed unit search as q, starts again at page 1 and keeps it in the URL', async () => {
    const { requests } = signedInWithEvents(() => ({ items: [eventListItem()], total: 1 }));
    const { wrapper, router } = await mountApp('/events');

    await wrapper.get('input[data-test="filter-q"]').setValue('HX-T');
    await vi.waitFor(() => expect(eventQueries(requests).at(-1)?.get('q')).toBe('HX-T'), { timeout: 2000 });
    expect(eventQueries(requests).at(-1)?.get('page')).toBe('1');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ q: 'HX-T' }));
  });

  it('takes site, statuses, fault types, days and relay records from the URL; the days bound the browser’s calendar days', async () => {
    const { requests } = signedInWithEvents(() => ({ items: [], total: 0 }));
    await mountApp('/events?siteId=2&status=logged,testing,bogus&type=phase-to-ground&from=2026-07-01&to=2026-07-31&withoutAttachments=true');

    const zone = browserZone();
    expect(Object.fromEntries(eventQueries(requests)[0])).toEqual({
      siteId: '2',
      status: 'logged,testing',
      type: 'phase-to-ground',
      from: zoneDayBound('2026-07-01', zone)!.toISOString(),
      to: zoneDayBound('2026-07-31', zone, true)!.toISOString(),
      withoutAttachments: 'true',
      sort: '-occurredAt',
      page: '1',
      pageSize: '25',
    });
  });

  it('asks for nothing while the from day is after the to day, and says so at the field', async () => {
    const { requests } = signedInWithEvents(() => ({ items: [], total: 0 }));
    const { wrapper } = await mountApp('/events?from=2026-08-01&to=2026-07-01');

    expect(eventQueries(requests)).toHaveLength(0);
    expect(wrapper.text()).toContain('Before the from day');
  });

  it('clears every filter from the query and the URL', async () => {
    const { requests } = signedInWithEvents(() => ({ items: [], total: 0 }));
    const { wrapper, router } = await mountApp('/events?q=HX&status=held');

    await wrapper.get('[data-test="clear-filters"]').trigger('click');
    await vi.waitFor(() => expect(Object.fromEntries(eventQueries(requests).at(-1)!)).toEqual({ sort: '-occurredAt', page: '1', pageSize: '25' }));
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({}));
  });

  it('says what to do next when no event is logged, and when none matches the filters', async () => {
    signedInWithEvents(() => ({ items: [], total: 0 }));
    const empty = await mountApp('/events');
    expect(empty.wrapper.get('[data-test="events-empty"]').text()).toContain('No fault event logged yet.');
    empty.wrapper.unmount();

    signedInWithEvents(() => ({ items: [], total: 0 }));
    const filtered = await mountApp('/events?q=zzz');
    expect(filtered.wrapper.get('[data-test="events-empty"]').text()).toContain('No event matches these filters.');
  });

  it('is in the drawer of a user holding any role', async () => {
    signedInWithEvents(() => ({ items: [], total: 0 }));
    const { wrapper } = await mountApp('/events');
    expect(wrapper.text()).toContain('Events');
    expect(wrapper.find('a[href="/events"]').exists()).toBe(true);
  });
});
