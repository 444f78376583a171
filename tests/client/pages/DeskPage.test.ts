import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { EventListItem } from '../../../src/api/events';
import type { FollowUpListItem } from '../../../src/api/followups';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, storeToken, type RecordedRequest } from '../helpers';
import { eventListItem } from './fixtures';

enableAutoUnmount(afterEach);

// Events by status, answered by GET /api/events?status=… (one status or several, comma-separated; newest first),
// and the protection lists by withoutAttachments / from.
const EVENTS: Record<string, EventListItem[]> = {
  logged: [eventListItem({ id: 14, status: 'logged', unitSerial: 'KVP-QL-T1', siteName: 'Quarry Lane', occurredAt: '2026-07-04T22:05:00.000Z' })],
  testing: [eventListItem()],
  screened: [eventListItem({ id: 12, status: 'screened', unitSerial: 'KVP-MB-T3', siteName: 'Millbrook', recommendation: 'no-go' })],
  released: [eventListItem({ id: 4, status: 'released', occurredAt: '2024-02-11T18:40:00.000Z', recommendation: 'conditional' })],
  held: [],
};
const WITHOUT_RELAY_RECORDS = [eventListItem({ id: 14, status: 'logged', unitSerial: 'KVP-QL-T1', siteName: 'Quarry Lane' })];
const RECENT = [eventListItem({ id: 15, status: 'logged', unitSerial: 'KVP-HX-T1', occurredAt: '2026-07-20T10:00:00.000Z' }), eventListItem()];

// Follow-ups by due bucket, answered by GET /api/follow-ups?due=….
const FOLLOW_UPS: Record<string, FollowUpListItem[]> = {
  overdue: [
    followUpItem({ id: 71, task: 'Oil sample 24 h after re-energising', dueAt: '2026-07-02T08:00:00.000Z', daysOverdue: 3 }),
    followUpItem({ id: 72, task: 'Check the Buchholz relay', dueAt: '2026-07-05T06:00:00.000Z', daysOverdue: 0 }),
  ],
  week: [followUpItem({ id: 73, task: 'Sweep at the next outage', dueAt: '2026-07-09T08:00:00.000Z', daysOverdue: null })],
};

function followUpItem(over: Partial<FollowUpListItem>): FollowUpListItem {
  return {
    id: 70,
    task: 'Task',
    dueAt: null,
    closedAt: null,
    closedById: null,
    result: null,
    eventId: 11,
    eventStatus: 'released',
    eventOccurredAt: '2026-07-01T03:12:00.000Z',
    unitId: 3,
    unitSerial: 'KVP-HX-T2',
    siteId: 1,
    siteName: 'Harrow Cross',
    siteTimeZone: 'Europe/London',
    daysOverdue: null,
    ...over,
  };
}

function page<T>(items: T[]) {
  return { body: { items, total: items.length, page: 1, pageSize: 20 } };
}

function signedInAs(user: ReturnType<typeof makeUser>) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: user },
    'GET /api/health': { body: healthy },
    'GET /api/events': (request) => {
      const q = new URL(request.url, 'http://localhost').searchParams;
      if (q.get('withoutAttachments') === 'true') return page(WITHOUT_RELAY_RECORDS);
      if (q.get('from')) return page(RECENT);
      const items = (q.get('status') ?? '').split(',').flatMap((status) => EVENTS[status] ?? []);
      return page(items.sort((a, b) => b.occurredAt.localeCompare(a.occurredAt)));
    },
    'GET /api/follow-ups': (request) => page(FOLLOW_UPS[new URL(request.url, 'http://localhost').searchParams.get('due') ?? ''] ?? []),
  });
}

function queries(requests: RecordedRequest[], path: string): URLSearchParams[] {
  return requests.filter((r) => r.url.split('?')[0] === path).map((r) => new URL(r.url, 'http://localhost').searchParams);
}

describe('DeskPage', () => {
  afterEach(resetClientState);

  it('greets the user by name in the desk heading', async () => {
    signedInAs(makeUser({ name: 'Ruth Okafor' }));
    const { wrapper } = await mountApp('/');

    const title = wrapper.get('[data-test="desk-title"]');
    expect(title.element.tagName).toBe('H1');
    expect(title.text()).toBe('Welcome, Ruth Okafor');
  });

  it('lists each of the user’s roles with a line on what that role does in Gapsight', async () => {
    signedInAs(makeUser({ roles: ['manager', 'tester'] }));
    const { wrapper } = await mountApp('/');

    const roles = wrapper.findAll('[data-test="desk-role"]');
    expect(roles.map((role) => role.attributes('data-role'))).toEqual(['tester', 'manager']);
    expect(roles[0].text()).toContain('Test engineer');
    expect(roles[0].text()).toContain('uploads test-set CSV exports and sweep files');
    expect(roles[1].text()).toContain('Operations manager');
    expect(roles[1].text()).toContain('signs off the decision');
  });

  it('tells a user without any role to ask an administrator', async () => {
    signedInAs(makeUser({ roles: [] }));
    const { wrapper } = await mountApp('/');

    expect(wrapper.findAll('[data-test="desk-role"]')).toHaveLength(0);
    expect(wrapper.get('[data-test="desk-no-role"]').text()).toContain('Ask an administrator');
  });

  it('lists the events to test for a tester: logged and in testing, newest first, linked to their event files', async () => {
    const { requests } = signedInAs(makeUser({ roles: ['tester'] }));
    const { wrapper } = await mountApp('/');

    const list = wrapper.get('[data-test="desk-list-to-test"]');
    const events = list.findAll('[data-test="desk-event"]');
    expect(events.map((e) => e.attributes('data-status'))).toEqual(['logged', 'testing']);
    expect(events[0].text()).toContain('KVP-QL-T1');
    expect(events[0].text()).toContain('Quarry Lane');
    expect(events[0].text()).toContain('2026-07-04 23:05 +01:00 Europe/London');
    // The fault by its type and time, not by its database id.
    expect(events[0].text()).toMatch(/(Three-phase|Phase-to-phase|Phase-to-phase-to-ground|Phase-to-ground) fault · 2026-07-04/);
    expect(events[0].text()).not.toMatch(/event 14/i);
    expect(events[0].get('[data-test="status-chip"]').text()).toContain('Logged');
    expect(events[1].attributes('href')).toBe('/events/11');
    expect(queries(requests, '/api/events').map((q) => q.get('status'))).toEqual(['logged,testing']);
    expect(wrapper.find('[data-test="desk-list-to-decide"]').exists()).toBe(false);
  });

  it('lists the screenings to decide with their recommendation, and the recent decisions, for a manager', async () => {
    signedInAs(makeUser({ roles: ['manager'] }));
    const { wrapper } = await mountApp('/');

    const toDecide = wrapper.get('[data-test="desk-list-to-decide"]').findAll('[data-test="desk-event"]');
    expect(toDecide).toHaveLength(1);
    expect(toDecide[0].text()).toContain('KVP-MB-T3');
    expect(toDecide[0].get('[data-test="recommendation-badge"]').attributes('data-recommendation')).toBe('no-go');
    const recent = wrapper.get('[data-test="desk-list-recent-decisions"]').findAll('[data-test="desk-event"]');
    expect(recent.map((e) => e.attributes('data-status'))).toEqual(['released']);
    expect(wrapper.find('[data-test="desk-list-to-test"]').exists()).toBe(false);
    // Recommendations are shown: the cautions go with them, every sentence.
    expect(wrapper.get('[data-test="cautions"]').findAll('li')).toHaveLength(5);
  });

  it('says what an empty work list means instead of showing an empty table', async () => {
    storeToken('valid');
    scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['manager'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/events': page([]),
      'GET /api/follow-ups': page([]),
    });
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-list-to-decide"] [data-test="desk-list-empty"]').text()).toBe('No screening waits for a decision.');
  });

  it('lists the follow-ups overdue (with days overdue) and due this week for a manager, each linked to its event file', async () => {
    const { requests } = signedInAs(makeUser({ roles: ['manager'] }));
    const { wrapper } = await mountApp('/');

    const overdue = wrapper.get('[data-test="desk-list-follow-ups-overdue"]');
    const items = overdue.findAll('[data-test="desk-follow-up"]');
    expect(items.map((f) => f.text().includes('Oil sample 24 h after re-energising'))).toEqual([true, false]);
    expect(items[0].text()).toContain('KVP-HX-T2');
    expect(items[0].text()).toContain('Harrow Cross');
    // 03:12 UTC on 1 July is 04:12 in London.
    expect(items[0].text()).toContain('fault of 1 Jul 2026 04:12');
    // 08:00 UTC on 2 July is 09:00 in London.
    expect(items[0].get('[data-test="follow-up-due"]').text()).toBe('due 2026-07-02 09:00 +01:00 Europe/London');
    expect(items[0].get('[data-test="follow-up-overdue"]').text()).toBe('3 days overdue');
    expect(items[1].get('[data-test="follow-up-overdue"]').text()).toBe('overdue since today');
    expect(items[0].attributes('href')).toBe('/events/11');
    expect(overdue.get('[data-test="desk-list-count"]').text()).toBe('(2)');
    const week = wrapper.get('[data-test="desk-list-follow-ups-week"]').findAll('[data-test="desk-follow-up"]');
    expect(week).toHaveLength(1);
    expect(week[0].text()).toContain('Sweep at the next outage');
    expect(week[0].find('[data-test="follow-up-overdue"]').exists()).toBe(false);
    expect(queries(requests, '/api/follow-ups').map((q) => q.get('due')).sort()).toEqual(['overdue', 'week']);
    expect(wrapper.find('[data-test="desk-follow-ups-note"]').exists()).toBe(false);
  });

  it('shows the follow-up lists to asset engineers too, and says when none is due', async () => {
    storeToken('valid');
    scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['engineer'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/events': page([]),
      'GET /api/follow-ups': page([]),
    });
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-list-follow-ups-overdue"] [data-test="desk-list-empty"]').text()).toBe('No follow-up is overdue.');
    expect(wrapper.get('[data-test="desk-list-follow-ups-week"] [data-test="desk-list-empty"]').text()).toBe('No follow-up falls due in the next 7 days.');
  });

  it('shows a protection engineer the open events waiting for relay records and the faults of the last 30 days', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-07-25T12:00:00Z'));
    try {
      const { requests } = signedInAs(makeUser({ roles: ['protection'] }));
      const { wrapper } = await mountApp('/');

      const waiting = wrapper.get('[data-test="desk-list-relay-records"]').findAll('[data-test="desk-event"]');
      expect(waiting.map((e) => e.attributes('href'))).toEqual(['/events/14']);
      const recent = wrapper.get('[data-test="desk-list-recent-faults"]').findAll('[data-test="desk-event"]');
      expect(recent.map((e) => e.attributes('href'))).toEqual(['/events/15', '/events/11']);
      const asked = queries(requests, '/api/events');
      expect(asked.find((q) => q.get('withoutAttachments'))?.get('status')).toBe('logged,testing,screened');
      // 30 days of 24 hours before the desk opened.
      expect(asked.find((q) => q.get('from'))?.get('from')).toBe('2026-06-25T12:00:00.000Z');
      expect(queries(requests, '/api/follow-ups')).toHaveLength(0);
      expect(wrapper.find('[data-test="desk-empty"]').exists()).toBe(false);
    } finally {
      vi.useRealTimers();
    }
  });

  it('links a longer list to the same list on the events page', async () => {
    storeToken('valid');
    const many = Array.from({ length: 25 }, (_, k) => eventListItem({ id: 100 + k, status: 'screened' }));
    scriptFetch({
      'GET /api/auth/me': { body: makeUser({ roles: ['manager'] }) },
      'GET /api/health': { body: healthy },
      'GET /api/events': { body: { items: many.slice(0, 20), total: 25, page: 1, pageSize: 20 } },
      'GET /api/follow-ups': page([]),
    });
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-list-to-decide"] [data-test="desk-list-all"]').attributes('href')).toBe('/events?status=screened');
  });

  it('tells a user whose roles have no work list where to look instead', async () => {
    const { requests } = signedInAs(makeUser({ roles: ['admin'] }));
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-empty"]').text()).toContain('No work list for your roles.');
    expect(requests.some((r) => r.url.startsWith('/api/events') || r.url.startsWith('/api/follow-ups'))).toBe(false);
  });
});
