import { createPinia, setActivePinia } from 'pinia';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ApiError, TOKEN_STORAGE_KEY } from '../../../src/api/client';
import { useSessionStore } from '../../../src/stores/session';
import { makeUser, resetClientState, scriptFetch, storeToken } from '../helpers';

describe('useSessionStore', () => {
  beforeEach(() => setActivePinia(createPinia()));
  afterEach(resetClientState);

  it('starts from the token kept in localStorage, not yet signed in until the user is known', () => {
    storeToken('kept');

    const session = useSessionStore();

    expect(session.token).toBe('kept');
    expect(session.user).toBeNull();
    expect(session.isSignedIn).toBe(false);
  });

  it('signIn keeps the token in localStorage and holds the user', async () => {
    const user = makeUser({ roles: ['manager', 'engineer'] });
    scriptFetch({ 'POST /api/auth/login': { body: { token: 'jwt-new', user } } });
    const session = useSessionStore();

    await session.signIn(' r.okafor@kestrel-valley.example ', 'pw');

    expect(session.isSignedIn).toBe(true);
    expect(session.user).toEqual(user);
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBe('jwt-new');
  });

  it('signIn sends the e-mail without surrounding spaces', async () => {
    const { requests } = scriptFetch({ 'POST /api/auth/login': { body: { token: 't', user: makeUser() } } });

    await useSessionStore().signIn('  a@kestrel-valley.example ', 'pw');

    expect(requests[0].body).toEqual({ email: 'a@kestrel-valley.example', password: 'pw' });
  });

  it('a refused sign-in throws the ApiError and leaves the user signed out', async () => {
    scriptFetch({
      'POST /api/auth/login': { status: 401, body: { error: { code: 'bad_credentials', message: 'Wrong e-mail or password.' } } },
    });
    const session = useSessionStore();

    await expect(session.signIn('a@b.example', 'nope')).rejects.toBeInstanceOf(ApiError);
    expect(session.isSignedIn).toBe(false);
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull();
  });

  it('hasRole is true when the user holds any of the roles asked for, false otherwise and when signed out', async () => {
    scriptFetch({ 'POST /api/auth/login': { body: { token: 't', user: makeUser({ roles: ['tester', 'engineer'] }) } } });
    const session = useSessionStore();
    expect(session.hasRole('tester')).toBe(false);

    await session.signIn('a@b.example', 'pw');

    expect(session.hasRole('tester')).toBe(true);
    expect(session.hasRole('manager', 'engineer')).toBe(true);
    expect(session.hasRole('manager', 'admin')).toBe(false);
    expect(session.hasRole()).toBe(false);
  });

  it('signOut forgets the token (also in localStorage) and the user', async () => {
    scriptFetch({ 'POST /api/auth/login': { body: { token: 't', user: makeUser() } } });
    const session = useSessionStore();
    await session.signIn('a@b.example', 'pw');

    session.signOut();

    expect(session.token).toBeNull();
    expect(session.user).toBeNull();
    expect(session.isSignedIn).toBe(false);
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull();
  });

  it('restore asks the server once who the stored token belongs to, even when called from several places', async () => {
    storeToken('kept');
    const user = makeUser({ roles: ['protection'] });
    const { requests } = scriptFetch({ 'GET /api/auth/me': { body: user } });
    const session = useSessionStore();

    await Promise.all([session.restore(), session.restore()]);
    await session.restore();

    expect(requests).toHaveLength(1);
    expect(requests[0].headers.authorization).toBe('Bearer kept');
    expect(session.user).toEqual(user);
    expect(session.isSignedIn).toBe(true);
  });

  it('restore asks nothing when no token is stored', async () => {
    const { requests } = scriptFetch({});

    await useSessionStore().restore();

    expect(requests).toHaveLength(0);
  });

  it('restore signs out when the server refuses the stored token', async () => {
    storeToken('expired');
    scriptFetch({ 'GET /api/auth/me': { status: 401, body: { error: { code: 'token_expired', message: 'Sign in again.' } } } });
    const session = useSessionStore();

    await session.restore();

    expect(session.isSignedIn).toBe(false);
    expect(session.token).toBeNull();
    expect(localStorage.getItem(TOKEN_STORAGE_KEY)).toBeNull();
  });

  it('restore keeps the token but stays signed out when the server cannot be reached, and retries next time', async () => {
    storeToken('kept');
    const { fetchMock } = scriptFetch({ 'GET /api/auth/me': new TypeError('Failed to fetch') });
    const session = useSessionStore();

    await session.restore();

    expect(session.isSignedIn).toBe(false);
    expect(session.token).toBe('kept');
    expect(session.restoreError).toMatchObject({ status: 0 });

    const user = makeUser();
    scriptFetch({ 'GET /api/auth/me': { body: user } });
    await session.restore();
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(session.user).toEqual(user);
    expect(session.restoreError).toBeNull();
  });
});
