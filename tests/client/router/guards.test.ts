import { createPinia, setActivePinia } from 'pinia';
import { Quasar } from 'quasar';
import { createApp } from 'vue';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createMemoryHistory, type Router, type RouteRecordRaw } from 'vue-router';
import type { Role } from '../../../src/api/auth';
import { api } from '../../../src/api/client';
import { quasarOptions } from '../../../src/quasar-options';
import { createAppRouter } from '../../../src/router';
import { routes } from '../../../src/router/routes';
import { useSessionStore } from '../../../src/stores/session';
import { inBody, makeUser, resetClientState, scriptFetch, settle, storeToken, typeInDocument } from '../helpers';

const page = () => Promise.resolve({ default: { render: () => null } });

// The real table plus a role-limited page like those later issues add (a page for engineers and administrators; not the real criteria page, which every signed-in user sees).
const [signInRoute, shellRoute] = routes;
const tableWithCriteria: RouteRecordRaw[] = [
  signInRoute,
  {
    ...shellRoute,
    children: [
      { path: 'engineering-tools', name: 'engineering-tools', component: page, meta: { roles: ['engineer', 'admin'] } },
      ...(shellRoute.children ?? []),
    ],
  } as RouteRecordRaw,
];

function makeRouter(): Router {
  const pinia = createPinia();
  setActivePinia(pinia);
  // Notify (used when a session ends) needs Quasar installed on some app.
  createApp({ render: () => null }).use(pinia).use(Quasar, quasarOptions);
  return createAppRouter({ history: createMemoryHistory(), routes: tableWithCriteria });
}

function signedInAs(...roles: Role[]) {
  storeToken('valid');
  return scriptFetch({ 'GET /api/auth/me': { body: makeUser({ roles }) } });
}

describe('router guards', () => {
  beforeEach(() => localStorage.clear());
  afterEach(resetClientState);

  it('sends a signed-out user to sign-in with the page asked for as redirect', async () => {
    scriptFetch({});
    const router = makeRouter();

    await router.push('/engineering-tools?version=2');

    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.redirect).toBe('/engineering-tools?version=2');
  });

  it('sends a signed-out user who opens the desk to sign-in, redirecting back to the desk', async () => {
    scriptFetch({});
    const router = makeRouter();

    await router.push('/');

    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.redirect).toBe('/');
  });

  it('restores the user from a stored token and opens the desk', async () => {
    const { requests } = signedInAs('tester');
    const router = makeRouter();

    await router.push('/');

    expect(router.currentRoute.value.name).toBe('desk');
    expect(requests.map((r) => r.url)).toEqual(['/api/auth/me']);
  });

  it('sends a user whose stored token is refused to sign-in and forgets the token', async () => {
    storeToken('expired');
    scriptFetch({ 'GET /api/auth/me': { status: 401, body: { error: { code: 'token_expired', message: 'Expired.' } } } });
    const router = makeRouter();

    await router.push('/');

    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(useSessionStore().token).toBeNull();
  });

  it('shows the forbidden page to a signed-in user lacking the route’s roles', async () => {
    signedInAs('tester', 'protection');
    const router = makeRouter();

    await router.push('/engineering-tools');

    expect(router.currentRoute.value.name).toBe('forbidden');
    expect(router.currentRoute.value.query.from).toBe('/engineering-tools');
  });

  it('lets a user holding one of the route’s roles through', async () => {
    signedInAs('engineer');
    const router = makeRouter();

    await router.push('/engineering-tools');

    expect(router.currentRoute.value.name).toBe('engineering-tools');
  });

  it('sends a signed-in user away from sign-in to the redirect target', async () => {
    signedInAs('engineer');
    const router = makeRouter();

    await router.push({ name: 'sign-in', query: { redirect: '/engineering-tools' } });

    expect(router.currentRoute.value.name).toBe('engineering-tools');
  });

  it('ignores a redirect to another site and opens the desk instead', async () => {
    signedInAs('engineer');
    const router = makeRouter();

    await router.push({ name: 'sign-in', query: { redirect: '//evil.example/' } });

    expect(router.currentRoute.value.name).toBe('desk');
  });

  it('answers an unknown address with the not-found page, the path reaching it as a prop', async () => {
    signedInAs('tester');
    const router = makeRouter();

    await router.push('/no/such/page');

    expect(router.currentRoute.value.name).toBe('not-found');
    expect(router.currentRoute.value.params.pathMatch).toEqual(['no', 'such', 'page']);
  });

  it('asks to sign in again over the page when the server refuses the token later, and stays on the page once signed in', async () => {
    const { fetchMock } = signedInAs('engineer');
    const router = makeRouter();
    await router.push('/engineering-tools');
    const { requests } = scriptFetch({
      'GET /api/units': { status: 401, body: { error: { code: 'token_expired', message: 'Expired.' } } },
      'POST /api/auth/login': { body: { token: 'fresh', user: makeUser({ roles: ['engineer'] }) } },
    });

    await expect(api.get('/units')).rejects.toMatchObject({ status: 401 });
    await settle();

    expect(fetchMock).toHaveBeenCalledTimes(1);
    // The page stays (with whatever was typed on it); the refused token is not sent again.
    expect(router.currentRoute.value.name).toBe('engineering-tools');
    expect(localStorage.getItem('gapsight.token')).toBeNull();
    expect(useSessionStore().expired).toBe(true);
    expect(inBody('reauth-dialog')!.textContent).toContain('Your session has ended');
    expect(inBody('reauth-dialog')!.textContent).toContain(makeUser().email);

    await typeInDocument('reauth-password', 'gapsight-demo');
    inBody('reauth-submit')!.click();
    await settle();
    await vi.waitFor(() => expect(inBody('reauth-dialog')).toBeNull());

    expect(requests.find((r) => r.url === '/api/auth/login')!.body).toEqual({ email: makeUser().email, password: 'gapsight-demo' });
    expect(router.currentRoute.value.name).toBe('engineering-tools');
    expect(useSessionStore().expired).toBe(false);
    expect(localStorage.getItem('gapsight.token')).toBe('fresh');
  });

  it('ends the session and returns to sign-in (redirecting back) when the user signs out instead', async () => {
    signedInAs('engineer');
    const router = makeRouter();
    await router.push('/engineering-tools');
    scriptFetch({ 'GET /api/units': { status: 401, body: { error: { code: 'token_expired', message: 'Expired.' } } } });

    await expect(api.get('/units')).rejects.toMatchObject({ status: 401 });
    await settle();
    inBody('reauth-sign-out')!.click();
    await settle();

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'));
    expect(useSessionStore().isSignedIn).toBe(false);
    expect(router.currentRoute.value.query.redirect).toBe('/engineering-tools');
  });

  it('sets the browser tab title from the route', async () => {
    signedInAs('tester');
    const router = makeRouter();

    await router.push('/');

    expect(document.title).toBe('Desk · Gapsight');
  });
});
