import { afterEach, describe, expect, it } from 'vitest';
import { health, login, me } from '../../../src/api/auth';
import { makeUser, resetClientState, scriptFetch, storeToken } from '../helpers';

describe('auth api', () => {
  afterEach(resetClientState);

  it('login posts e-mail and password to /api/auth/login without a token and returns token and user', async () => {
    storeToken('left-over');
    const user = makeUser();
    const { requests } = scriptFetch({ 'POST /api/auth/login': { body: { token: 'jwt-1', user } } });

    const answer = await login('r.okafor@kestrel-valley.example', 'secret');

    expect(answer).toEqual({ token: 'jwt-1', user });
    expect(requests[0]).toMatchObject({
      method: 'POST',
      url: '/api/auth/login',
      body: { email: 'r.okafor@kestrel-valley.example', password: 'secret' },
    });
    expect(requests[0].headers.authorization).toBeUndefined();
  });

  it('me asks GET /api/auth/me with the stored token', async () => {
    storeToken('jwt-2');
    const user = makeUser({ roles: ['manager'] });
    const { requests } = scriptFetch({ 'GET /api/auth/me': { body: user } });

    await expect(me()).resolves.toEqual(user);
    expect(requests[0].headers.authorization).toBe('Bearer jwt-2');
  });

  it('health asks GET /api/health without a token', async () => {
    storeToken('jwt-3');
    const { requests } = scriptFetch({
      'GET /api/health': { body: { status: 'ok', db: 'ok', demo: true, mailSink: false } },
    });

    await expect(health()).resolves.toEqual({ status: 'ok', db: 'ok', demo: true, mailSink: false });
    expect(requests[0].headers.authorization).toBeUndefined();
  });
});
