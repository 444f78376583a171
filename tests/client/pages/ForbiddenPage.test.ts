import { enableAutoUnmount } from '@vue/test-utils';
import { afterEach, describe, expect, it } from 'vitest';
import type { RouteRecordRaw } from 'vue-router';
import { routes } from '../../../src/router/routes';
import { healthy, makeUser, mountApp, resetClientState, scriptFetch, storeToken } from '../helpers';

enableAutoUnmount(afterEach);

const [signInRoute, shellRoute] = routes;
const tableWithAdmin: RouteRecordRaw[] = [
  signInRoute,
  {
    ...shellRoute,
    children: [
      {
        path: 'admin/people',
        name: 'admin-people',
        component: () => Promise.resolve({ default: { render: () => null } }),
        meta: { roles: ['admin'] },
      },
      ...(shellRoute.children ?? []),
    ],
  } as RouteRecordRaw,
];

describe('ForbiddenPage', () => {
  afterEach(resetClientState);

  it('names the page asked for and the roles that would open it, with a way back to the desk', async () => {
    storeToken('valid');
    scriptFetch({ 'GET /api/auth/me': { body: makeUser({ roles: ['tester'] }) }, 'GET /api/health': { body: healthy } });
    const { wrapper, router } = await mountApp('/admin/people', { routes: tableWithAdmin });

    expect(router.currentRoute.value.name).toBe('forbidden');
    expect(wrapper.get('[data-test="forbidden-title"]').text()).toBe('This page is not open to your roles');
    expect(wrapper.get('[data-test="forbidden-path"]').text()).toBe('/admin/people');
    expect(wrapper.get('[data-test="forbidden-roles"]').text()).toBe('Administrator');
    expect(wrapper.get('a[href="/"].q-btn').text()).toContain('Back to the desk');
  });
});
