import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, api, apiRequest, setUnauthorizedHandler } from '../../../src/api/client';
import { resetClientState, scriptFetch, storeToken } from '../helpers';

describe('api client', () => {
  beforeEach(() => setUnauthorizedHandler(null));
  afterEach(() => {
    setUnauthorizedHandler(null);
    resetClientState();
  });

  it('sends requests under /api with the stored token as a bearer token', async () => {
    storeToken('tok-123');
    const { requests } = scriptFetch({ 'GET /api/units': { body: { items: [], total: 0 } } });

    const answer = await api.get<{ total: number }>('/units');

    expect(answer).toEqual({ items: [], total: 0 });
    expect(requests[0].url).toBe('/api/units');
    expect(requests[0].headers.authorization).toBe('Bearer tok-123');
  });

  it('sends no Authorization header for a route that needs no sign-in, even with a stored token', async () => {
    storeToken('tok-123');
    const { requests } = scriptFetch({ 'GET /api/health': { body: { status: 'ok' } } });

    await api.get('/health', { auth: false });

    expect(requests[0].headers.authorization).toBeUndefined();
  });

  it('sends a body as JSON and leaves empty query values out of the URL', async () => {
    const { requests } = scriptFetch({ 'POST /api/events': { status: 201, body: { id: 4 } } });

    await apiRequest('POST', '/events', { body: { unitId: 3 }, query: { dryRun: true, q: '', page: 2, x: null } });

    expect(requests[0].url).toBe('/api/events?dryRun=true&page=2');
    expect(requests[0].headers['content-type']).toBe('application/json');
    expect(requests[0].body).toEqual({ unitId: 3 });
  });

  it('turns the server error shape into an ApiError with status, code, message and fields', async () => {
    scriptFetch({
      'POST /api/events': {
        status: 400,
        body: {
          error: {
            code: 'invalid_input',
            message: 'Some fields are invalid.',
            fields: { 'shots.0.durationS': 'must be above zero' },
          },
        },
      },
    });

    const error = await api.post('/events', {}).catch((caught: unknown) => caught);

    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 400,
      code: 'invalid_input',
      message: 'Some fields are invalid.',
      fields: { 'shots.0.durationS': 'must be above zero' },
    });
  });

  it('still throws a readable ApiError when an error answer is not JSON (a proxy page)', async () => {
    scriptFetch({ 'GET /api/units': { status: 502, body: '<html>Bad gateway</html>' } });

    const error = await api.get('/units').catch((caught: unknown) => caught);

    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 502, code: 'http_error' });
    expect((error as ApiError).message).toContain('502');
  });

  it('reports an unreachable server as an ApiError with status 0', async () => {
    scriptFetch({ 'GET /api/units': new TypeError('Failed to fetch') });

    const error = await api.get('/units').catch((caught: unknown) => caught);

    expect(error).toMatchObject({ status: 0, code: 'network_error' });
    expect((error as ApiError).message).toMatch(/cannot reach/i);
  });

  it('reads the seconds to wait from a 429 answer', async () => {
    scriptFetch({
      'POST /api/auth/login': {
        status: 429,
        headers: { 'Retry-After': '120' },
        body: { error: { code: 'too_many_attempts', message: 'Too many failed sign-ins.' } },
      },
    });

    const error = await api.post('/auth/login', {}, { auth: false }).catch((caught: unknown) => caught);

    expect(error).toMatchObject({ status: 429, retryAfterS: 120 });
  });

  it('returns undefined for 204 No Content', async () => {
    scriptFetch({ 'DELETE /api/things/1': { status: 204 } });

    await expect(api.delete('/things/1')).resolves.toBeUndefined();
  });

  it('ends the session once when the current token is refused, however many requests fail with it', async () => {
    storeToken('expired');
    const handler = vi.fn(() => storeToken(null)); // the real handler signs out, which forgets the token
    setUnauthorizedHandler(handler);
    const refused = { status: 401, body: { error: { code: 'token_expired', message: 'Sign in again.' } } };
    scriptFetch({ 'GET /api/units': refused, 'GET /api/events': refused });

    const results = await Promise.allSettled([api.get('/units'), api.get('/events')]);

    expect(results.map((result) => result.status)).toEqual(['rejected', 'rejected']);
    expect(handler).toHaveBeenCalledTimes(1);
    expect(handler.mock.calls[0]).toEqual([expect.objectContaining({ status: 401, code: 'token_expired' })]);
  });

  it('treats a 401 on a request sent without a token (wrong password) as an ordinary error', async () => {
    const handler = vi.fn();
    setUnauthorizedHandler(handler);
    scriptFetch({
      'POST /api/auth/login': { status: 401, body: { error: { code: 'bad_credentials', message: 'Wrong e-mail or password.' } } },
    });

    const error = await api.post('/auth/login', { email: 'a@b.c', password: 'x' }, { auth: false }).catch((e: unknown) => e);

    expect(error).toMatchObject({ status: 401, code: 'bad_credentials' });
    expect(handler).not.toHaveBeenCalled();
  });

  it('hands the caller’s AbortSignal to fetch (GET and download), and passes our own abort through instead of a network error', async () => {
    const seen: (AbortSignal | null | undefined)[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (_input: RequestInfo | URL, init: RequestInit = {}) => {
        seen.push(init.signal);
        if (init.signal?.aborted) throw new DOMException('The operation was aborted.', 'AbortError');
        return new Response('{}', { status: 200, headers: { 'Content-Type': 'application/json' } });
      }),
    );
    const controller = new AbortController();
    await api.get('/events/11', { signal: controller.signal });
    await api.download('/events/11/attachments/1', { signal: controller.signal });
    expect(seen).toEqual([controller.signal, controller.signal]);

    controller.abort();
    const error = await api.get('/events/11', { signal: controller.signal }).catch((e: unknown) => e);
    expect(error).not.toBeInstanceOf(ApiError);
    expect((error as Error).name).toBe('AbortError');
  });
});
