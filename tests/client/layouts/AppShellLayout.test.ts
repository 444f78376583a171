import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { RouteRecordRaw } from 'vue-router';
import { TOKEN_STORAGE_KEY } from '../../../src/api/client';
import type { HealthStatus } from '../../../src/api/auth';
import { routes } from '../../../src/router/routes';
import { healthy, healthyDemo, makeUser, mountApp, resetClientState, scriptFetch, settle, storeToken } from '../helpers';

enableAutoUnmount(afterEach);

const page = () => Promise.resolve({ default: { render: () => null } });
const [signInRoute, shellRoute] = routes;

// The real table plus pages of later issues, to show the drawer picks them up by themselves.
const tableWithLaterPages: RouteRecordRaw[] = [
  signInRoute,
  {
    ...shellRoute,
    children: [
      // The real fleet, criteria and outbox routes are replaced by stand-in pages (the events list left out), so the
      // drawer entries stay the ones under test.
      ...(shellRoute.children ?? []).filter((r) => r.name !== 'not-found' && r.name !== 'units' && r.name !== 'criteria' && r.name !== 'outbox' && r.name !== 'events'),
      { path: 'units', name: 'units', component: page, meta: { nav: { label: 'Fleet', icon: 'bolt' } } },
      {
        path: 'criteria',
        name: 'criteria',
        component: page,
        meta: { roles: ['engineer', 'admin'], nav: { label: 'Criteria', icon: 'rule' } },
      },
      {
        path: 'dev/outbox',
        name: 'outbox',
        component: page,
        meta: { roles: ['admin', 'manager'], nav: { label: 'Outbox', icon: 'outbox', requiresMailSink: true } },
      },
      ...(shellRoute.children ?? []).filter((r) => r.name === 'not-found'),
    ],
  } as RouteRecordRaw,
];

function signedInAs(user: ReturnType<typeof makeUser>, health: HealthStatus = healthy) {
  storeToken('valid');
  return scriptFetch({ 'GET /api/auth/me': { body: user }, 'GET /api/health': { body: health } });
}

function navLabels(wrapper: Awaited<ReturnType<typeof mountApp>>['wrapper']): string[] {
  return wrapper.findAll('#app-nav .app-nav__label').map((item) => item.text());
}

describe('AppShellLayout', () => {
  afterEach(resetClientState);

  it('shows the mark, the name Gapsight, the user’s name and roles in the header', async () => {
    signedInAs(makeUser({ name: 'Ruth Okafor', roles: ['tester', 'manager'] }));
    const { wrapper } = await mountApp('/');

    const header = wrapper.get('.q-header');
    expect(header.find('svg.app-logo-mark').exists()).toBe(true);
    expect(header.get('.app-brand__name').text()).toBe('Gapsight');
    expect(header.get('[data-test="user-name"]').text()).toBe('Ruth Okafor');
    expect(header.get('[data-test="user-roles"]').text()).toBe('Test engineer · Operations manager');
  });

  it('shows a DEMO DATA chip only when the server runs on demo data', async () => {
    signedInAs(makeUser(), healthyDemo);
    const demo = await mountApp('/');
    expect(demo.wrapper.get('[data-test="demo-chip"]').text()).toContain('DEMO DATA');
    demo.wrapper.unmount();

    signedInAs(makeUser(), healthy);
    const real = await mountApp('/');
    expect(real.wrapper.find('[data-test="demo-chip"]').exists()).toBe(false);
  });

  it('signs out and returns to sign-in when "Sign out" is pressed', async () => {
    signedInAs(makeUser());
    const { wrapper, router } = await mountApp('/');

    await wrapper.get('[data-test="signout"]').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'));

    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull();
    await settle();
    expect(wrapper.find('[data-test="user-name"]').exists()).toBe(false);
  });

  it('builds the drawer from the route table, filtered by the user’s roles', async () => {
    signedInAs(makeUser({ roles: ['tester'] }));
    const tester = await mountApp('/', { routes: tableWithLaterPages });
    expect(navLabels(tester.wrapper)).toEqual(['Desk', 'Fleet']);
    tester.wrapper.unmount();

    signedInAs(makeUser({ roles: ['engineer'] }));
    const engineer = await mountApp('/', { routes: tableWithLaterPages });
    expect(navLabels(engineer.wrapper)).toEqual(['Desk', 'Fleet', 'Criteria']);
  });

  it('lists the outbox for a manager only while the mail sink runs', async () => {
    signedInAs(makeUser({ roles: ['manager'] }), { ...healthy, mailSink: true });
    const { wrapper } = await mountApp('/', { routes: tableWithLaterPages });

    expect(navLabels(wrapper)).toEqual(['Desk', 'Fleet', 'Outbox']);
  });

  it('makes the drawer entries real links, reachable with the keyboard', async () => {
    signedInAs(makeUser({ roles: ['engineer'] }));
    const { wrapper } = await mountApp('/', { routes: tableWithLaterPages });

    const links = wrapper.findAll('#app-nav a.q-item');
    expect(links.map((link) => link.attributes('href'))).toEqual(['/', '/units', '/criteria']);
    expect(links.every((link) => link.attributes('tabindex') !== '-1')).toBe(true);
    expect(wrapper.get('nav#app-nav').attributes('aria-label')).toBe('Main navigation');
  });

  it('marks the entry of the page on screen as the current page', async () => {
    signedInAs(makeUser({ roles: ['engineer'] }));
    const { wrapper } = await mountApp('/criteria', { routes: tableWithLaterPages });

    const current = wrapper.findAll('#app-nav a.q-item').filter((link) => link.attributes('aria-current') === 'page');
    expect(current.map((link) => link.get('.app-nav__label').text())).toEqual(['Criteria']);
    expect(current[0].classes()).toContain('app-nav__active');
  });

  it('offers a "Skip to content" link to the main region', async () => {
    signedInAs(makeUser());
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('a.gs-skip-link').attributes('href')).toBe('#main-content');
    expect(wrapper.find('#main-content').exists()).toBe(true);
    // One `main` landmark: the page's own (q-page), inside the skip link's target.
    expect(document.querySelectorAll('main')).toHaveLength(1);
    expect(wrapper.find('#main-content main.q-page').exists()).toBe(true);
  });

  it('states that the recommendation is decision support for qualified staff', async () => {
    signedInAs(makeUser());
    const { wrapper } = await mountApp('/');

    expect(wrapper.get('.q-footer').text()).toContain('The recommendation is decision support for qualified staff.');
  });
});
