import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { LocationQuery } from 'vue-router';
import { tableQuery, tableStateFromQuery } from '../../../src/composables/useServerTable';
import { EVENT_SORTS } from '../../../shared/schemas/enums';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken, type RecordedRequest } from '../helpers';
import { eventListItem } from '../pages/fixtures';

// The events list keeps its view in the URL as the fleet does (useEventList reads it, useServerTable writes it).

enableAutoUnmount(afterEach);

const sixty = Array.from({ length: 60 }, (_, k) => eventListItem({ id: 100 + k, unitSerial: `KVP-${String(k).padStart(2, '0')}` }));

function signedInWithEvents() {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
    'GET /api/health': { body: healthy },
    'GET /api/sites': { body: [] },
    'GET /api/events': (request) => {
      const page = Number(new URLSearchParams(request.url.split('?')[1]).get('page'));
      return { body: { page, pageSize: 25, items: sixty.slice((page - 1) * 25, page * 25), total: 60 } };
    },
  });
}

function eventQueries(requests: RecordedRequest[]): Record<string, string>[] {
  return requests.filter((r) => r.url.split('?')[0] === '/api/events').map((r) => Object.fromEntries(new URLSearchParams(r.url.split('?')[1] ?? '')));
}

describe('table view in the URL', () => {
  it('reads a sort the list knows, a positive page and an offered page size; anything else is the default', () => {
    const read = (query: LocationQuery) => tableStateFromQuery(query, EVENT_SORTS, '-occurredAt');
    expect(read({ sort: 'status', page: '3', pageSize: '50' })).toEqual({ sort: 'status', page: 3, pageSize: 50 });
    expect(read({ sort: 'DROP TABLE', page: '0', pageSize: '7' })).toEqual({ sort: '-occurredAt', page: 1, pageSize: 25 });
    expect(read({ sort: ['-serial', 'status'], page: '2.5' })).toEqual({ sort: '-serial', page: 1, pageSize: 25 });
  });

  it('writes only what differs from the defaults, lists joined by commas', () => {
    expect(tableQuery({ q: 'HX', status: ['held', 'screened'], siteId: undefined }, { sort: '-occurredAt', page: 1, pageSize: 25 }, '-occurredAt')).toEqual({ q: 'HX', status: 'held,screened' });
    expect(tableQuery({}, { sort: 'serial', page: 4, pageSize: 100 }, '-occurredAt')).toEqual({ sort: 'serial', page: '4', pageSize: '100' });
  });
});

describe('EventListPage: the view kept in the URL', () => {
  afterEach(resetClientState);

  it('opens a shared link on its filter, sort and page', async () => {
    const { requests } = signedInWithEvents();
    const { wrapper } = await mountApp('/events?status=held&sort=serial&page=2');
    expect(eventQueries(requests)).toEqual([{ status: 'held', sort: 'serial', page: '2', pageSize: '25' }]);
    expect(wrapper.get('[data-test="events-table"] tbody tr').text()).toContain('KVP-25');
  });

  it('keeps a new sort and page in the URL, and Back from an event returns to them', async () => {
    const { requests } = signedInWithEvents();
    const { wrapper, router } = await mountApp('/events');

    const statusHeader = () => wrapper.findAll('[data-test="events-table"] th').find((th) => th.text().includes('Status'))!;
    await statusHeader().trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ sort: 'status' }));
    await wrapper.get('[data-test="next-page"]').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toEqual({ sort: 'status', page: '2' }));

    await router.push({ name: 'event-file', params: { id: 125 } }).catch(() => undefined);
    await settle();
    const before = eventQueries(requests).length;
    router.back();
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('events'));
    await settle();
    expect(router.currentRoute.value.query).toEqual({ sort: 'status', page: '2' });
    expect(eventQueries(requests).slice(before)).toEqual([{ sort: 'status', page: '2', pageSize: '25' }]);
  });
});
