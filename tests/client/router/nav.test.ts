import { describe, expect, it } from 'vitest';
import type { RouteRecordRaw } from 'vue-router';
import type { Role } from '../../../src/api/auth';
import { buildNavItems } from '../../../src/router/nav';
import { routes } from '../../../src/router/routes';

const page = () => Promise.resolve({ default: {} });

// A table shaped like the app's, with pages that later issues add.
const table: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: page, meta: { public: true } },
  {
    path: '/',
    component: page,
    children: [
      { path: '', name: 'desk', component: page, meta: { nav: { label: 'Desk', icon: 'space_dashboard' } } },
      { path: 'units', name: 'units', component: page, meta: { nav: { label: 'Fleet', icon: 'bolt' } } },
      { path: 'units/:id', name: 'unit', component: page, props: true },
      {
        path: 'criteria',
        name: 'criteria',
        component: page,
        meta: { roles: ['engineer', 'admin'], nav: { label: 'Criteria', icon: 'rule' } },
      },
      {
        path: 'admin',
        component: page,
        meta: { roles: ['admin'] },
        children: [{ path: 'people', name: 'admin-people', component: page, meta: { nav: { label: 'People', icon: 'group' } } }],
      },
      {
        path: 'dev/outbox',
        name: 'outbox',
        component: page,
        meta: { roles: ['admin', 'manager'], nav: { label: 'Outbox', icon: 'outbox', requiresMailSink: true } },
      },
      { path: ':pathMatch(.*)*', name: 'not-found', component: page, props: true },
    ],
  },
];

const holding = (...held: Role[]) => (...asked: Role[]) => asked.some((role) => held.includes(role));

describe('buildNavItems', () => {
  it('lists the entries with meta.nav in table order, leaving out routes without it', () => {
    const items = buildNavItems(table, { hasRole: holding('tester'), mailSink: false });
    expect(items.map((item) => item.name)).toEqual(['desk', 'units']);
  });

  it('shows role-limited entries only to users holding one of the roles', () => {
    const items = buildNavItems(table, { hasRole: holding('engineer'), mailSink: false });
    expect(items.map((item) => item.label)).toEqual(['Desk', 'Fleet', 'Criteria']);
  });

  it('applies a parent route’s roles to the entries beneath it', () => {
    expect(buildNavItems(table, { hasRole: holding('engineer'), mailSink: true }).map((i) => i.name)).not.toContain(
      'admin-people',
    );
    expect(buildNavItems(table, { hasRole: holding('admin'), mailSink: false }).map((i) => i.name)).toContain(
      'admin-people',
    );
  });

  it('shows the outbox only while the mail sink runs', () => {
    const manager = holding('manager');
    expect(buildNavItems(table, { hasRole: manager, mailSink: false }).map((i) => i.name)).not.toContain('outbox');
    expect(buildNavItems(table, { hasRole: manager, mailSink: true }).map((i) => i.name)).toContain('outbox');
  });

  it('marks only the desk at "/" as an exact-match link', () => {
    const items = buildNavItems(table, { hasRole: holding('admin'), mailSink: true });
    expect(items.filter((item) => item.exact).map((item) => item.name)).toEqual(['desk']);
  });

  it('gives every user of the real table the desk, the fleet, the events and the criteria sets', () => {
    const items = buildNavItems(routes, { hasRole: holding(), mailSink: false });
    expect(items.map((item) => [item.name, item.label])).toEqual([
      ['desk', 'Desk'],
      ['units', 'Fleet'],
      ['events', 'Events'],
      ['criteria', 'Criteria sets'],
    ]);
    expect(items.filter((item) => item.exact).map((item) => item.name)).toEqual(['desk']);
  });

  it('offers "Log a fault" in the real table to protection engineers and administrators only', () => {
    for (const role of ['protection', 'admin'] as Role[]) {
      expect(buildNavItems(routes, { hasRole: holding(role), mailSink: false }).map((i) => i.label)).toContain('Log a fault');
    }
    for (const role of ['tester', 'manager', 'engineer'] as Role[]) {
      expect(buildNavItems(routes, { hasRole: holding(role), mailSink: false }).map((i) => i.label)).not.toContain('Log a fault');
    }
  });
});
