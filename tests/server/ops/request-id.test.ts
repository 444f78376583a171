import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app.js';
import { AppError } from '../../../server/common/app-error.js';
import type { AppContext } from '../../../server/context.js';
import { createLogger } from '../../../server/logger.js';
import type { RouteDef } from '../../../server/route-def.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

// Request ids: on every answer's X-Request-Id header, in the body of 5xx answers and in the error's log line.

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

// Test-only routes: one that answers, one that throws, one that fails with a 5xx AppError.
const testRoutes: RouteDef[] = [
  { method: 'get', path: '/ok', access: 'public', handlers: [(_req, res) => void res.json({ ok: true })] },
  {
    method: 'get',
    path: '/boom',
    access: 'public',
    handlers: [
      () => {
        throw new Error('boom from a test route');
      },
    ],
  },
  {
    method: 'get',
    path: '/unavailable',
    access: 'public',
    handlers: [
      () => {
        throw new AppError('unavailable', 'The test route is unavailable.', 503);
      },
    ],
  },
];

let env: TestEnv;
let app: Express;
const logLines: Array<Record<string, unknown>> = [];
beforeAll(async () => {
  env = await openTestEnv();
  const logger = createLogger('info', { write: (line: string) => void logLines.push(JSON.parse(line)) });
  app = createApp(env.app.locals.ctx as AppContext, { routes: testRoutes, logger });
});
afterAll(async () => {
  await env.db.destroy();
});

describe('request ids', () => {
  it('are on a 200 of the real app (GET /api/health) and on a 200 of a test route', async () => {
    const health = await request(env.app).get('/api/health');
    expect(health.status).toBe(200);
    expect(health.headers['x-request-id']).toMatch(UUID);
    const ok = await request(app).get('/api/ok');
    expect(ok.status).toBe(200);
    expect(ok.headers['x-request-id']).toMatch(UUID);
  });

  it('are on a 404 of an unknown API route', async () => {
    const res = await request(env.app).get('/api/no-such-route');
    expect(res.status).toBe(404);
    expect(res.headers['x-request-id']).toMatch(UUID);
  });

  it('differ between two requests', async () => {
    const a = await request(app).get('/api/ok');
    const b = await request(app).get('/api/ok');
    expect(a.headers['x-request-id']).not.toBe(b.headers['x-request-id']);
  });

  it('are in the header and the body of a 500 from a route that throws, and in the logged error', async () => {
    const res = await request(app).get('/api/boom');
    expect(res.status).toBe(500);
    const id = res.headers['x-request-id'];
    expect(id).toMatch(UUID);
    expect(res.body).toEqual({
      error: { code: 'internal', message: 'Something went wrong on the server; the error was logged.', requestId: id },
    });
    expect(JSON.stringify(res.body)).not.toContain('boom from a test route');
    const logged = logLines.find((l) => l.reqId === id && (l.err as { message?: string } | undefined)?.message === 'boom from a test route');
    expect(logged).toMatchObject({ level: 50 });
  });

  it('are in the body of a 5xx AppError', async () => {
    const res = await request(app).get('/api/unavailable');
    expect(res.status).toBe(503);
    expect(res.body.error).toEqual({ code: 'unavailable', message: 'The test route is unavailable.', requestId: res.headers['x-request-id'] });
  });

  it('are in the body of the 503 health answers while the database is unreachable', async () => {
    const { createDataSource } = await import('../../../server/db/create-data-source.js');
    // A data source never connected: every query fails as it does while the database is down.
    const down = createDataSource({ ...env.config, DB_PORT: 1 });
    const downApp = createApp({ ...(env.app.locals.ctx as AppContext), db: down });
    const res = await request(downApp).get('/api/health').set('X-Request-Id', 'health-check-1');
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ status: 'degraded', db: 'down', requestId: 'health-check-1' });
  });

  it('are not in the body of a 4xx', async () => {
    const res = await request(env.app).get('/api/no-such-route');
    expect(res.body.error.requestId).toBeUndefined();
    expect(res.body.error.code).toBe('not_found');
  });

  it('echo a plain incoming X-Request-Id of up to 64 characters, on a 200 and on a 500', async () => {
    const ok = await request(app).get('/api/ok').set('X-Request-Id', 'edge-proxy.42:abc_DEF');
    expect(ok.headers['x-request-id']).toBe('edge-proxy.42:abc_DEF');
    const long = 'a'.repeat(64);
    const boom = await request(app).get('/api/boom').set('X-Request-Id', long);
    expect(boom.headers['x-request-id']).toBe(long);
    expect(boom.body.error.requestId).toBe(long);
  });

  it('replace an incoming id that is too long or has other characters with a fresh UUID', async () => {
    for (const bad of ['a'.repeat(65), 'has space', '<script>', 'a/b', '']) {
      const res = await request(app).get('/api/ok').set('X-Request-Id', bad);
      expect(res.headers['x-request-id'], bad).toMatch(UUID);
    }
  });

  it('are in the log line of each answer, with method, path and status but no headers', async () => {
    const res = await request(app).get('/api/ok?x=1').set('Authorization', 'Bearer secret-token-value');
    const id = res.headers['x-request-id'];
    const line = logLines.find((l) => l.reqId === id && l.msg === 'request completed');
    expect(line).toMatchObject({ level: 30, req: { method: 'GET', url: '/api/ok?x=1' }, res: { statusCode: 200 } });
    expect(JSON.stringify(logLines)).not.toContain('secret-token-value');
  });
});
