import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it } from 'vitest';
import type { EventListItem } from '../../../src/api/events';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, storeToken } from '../helpers';
import { eventListItem } from './fixtures';

enableAutoUnmount(afterEach);

// Events by status, answered by GET /api/events?status=… (the query decides the page).
const EVENTS: Record<string, EventListItem[]> = {
  logged: [eventListItem({ id: 14, status: 'logged', unitSerial: 'KVP-QL-T1', siteName: 'Quarry Lane', occurredAt: '2026-07-04T22:05:00.000Z' })],
  testing: [eventListItem()],
  screened: [eventListItem({ id: 12, status: 'screened', unitSerial: 'KVP-MB-T3', siteName: 'Millbrook', recommendation: 'no-go' })],
  released: [eventListItem({ id: 4, status: 'released', occurredAt: '2024-02-11T18:40:00.000Z', recommendation: 'conditional' })],
  held: [],
};

function signedInAs(user: ReturnType<typeof makeUser>) {
  storeToken('valid');
  return scriptFetch({
    'GET /api/auth/me': { body: user },
    'GET /api/health': { body: healthy },
    'GET /api/events': (request) => {
      const status = new URL(request.url, 'http://localhost').searchParams.get('status') ?? '';
      const items = EVENTS[status] ?? [];
      return { body: { items, total: items.length } };
    },
  });
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
    expect(events[0].get('[data-test="status-chip"]').text()).toContain('Logged');
    expect(events[1].attributes('href')).toBe('/events/11');
    const statuses = requests.filter((r) => r.url.startsWith('/api/events')).map((r) => new URL(r.url, 'http://localhost').searchParams.get('status'));
    expect(statuses.sort()).toEqual(['logged', 'testing']);
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
      'GET /api/events': { body: { items: [], total: 0 } },
    });
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-list-to-decide"] [data-test="desk-list-empty"]').text()).toBe('No screening waits for a decision.');
  });

  it('does not pretend to list follow-ups due: it says where they are', async () => {
    signedInAs(makeUser({ roles: ['manager'] }));
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-follow-ups-note"]').text()).toContain('listed on each event file');
  });

  it('tells a user whose roles have no work list where to look instead', async () => {
    const { requests } = signedInAs(makeUser({ roles: ['protection'] }));
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('[data-test="desk-empty"]').text()).toContain('No work list for your roles.');
    expect(requests.some((r) => r.url.startsWith('/api/events'))).toBe(false);
  });
});
