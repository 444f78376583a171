import { randomUUID } from 'node:crypto';
import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { AppError } from '../../../server/common/app-error.js';
import { AppSetting } from '../../../server/common/app-setting.entity.js';
import { AuditEntry } from '../../../server/common/audit-entry.entity.js';
import { FixedClock } from '../../../server/common/clock.js';
import { errorHandler } from '../../../server/common/error-handler.js';
import type { AppContext } from '../../../server/context.js';
import { route } from '../../../server/route-def.js';
import { buildApiRouter } from '../../../server/routes.js';
import { Site } from '../../../server/features/sites/site.entity.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';

// The route helper on a small table of its own (public routes writing app_setting rows with unique keys), and the
// app's clock reaching the services through the context.

const FIXED = new Date('2030-01-02T03:04:05.678Z');
let env: TestEnv;
let app: express.Express;
const afterCommitRan: string[] = [];
const seenAfterCommit: { key: string; stored: boolean }[] = [];

beforeAll(async () => {
  env = await openTestEnv({ clock: new FixedClock(FIXED) });
  const table = [
    route({
      method: 'post',
      path: '/t/settings/:settingKey',
      access: 'public',
      params: z.object({ settingKey: z.string().min(8) }),
      body: z.object({ value: z.string(), fail: z.boolean().default(false) }),
      status: 201,
      handler: async ({ m, params, body, afterCommit }) => {
        await m.insert(AppSetting, { key: params.settingKey, value: body.value });
        afterCommit(() => {
          afterCommitRan.push(params.settingKey);
          void env.db.getRepository(AppSetting).existsBy({ key: params.settingKey }).then((stored) => seenAfterCommit.push({ key: params.settingKey, stored }));
        });
        if (body.fail) throw new AppError('conflict', 'Failing after the write.', 409);
        return { inTransaction: m.queryRunner?.isTransactionActive ?? false };
      },
    }),
    route({
      method: 'get',
      path: '/t/settings/:settingKey',
      access: 'public',
      params: z.object({ settingKey: z.string().min(8) }),
      handler: async ({ m, params }) => ({ inTransaction: m.queryRunner?.isTransactionActive ?? false, exists: await m.getRepository(AppSetting).existsBy({ key: params.settingKey }) }),
    }),
  ];
  app = express();
  app.locals.ctx = { db: env.db, clock: new FixedClock(FIXED), config: env.config, mailSinkRunning: false } satisfies AppContext;
  app.use('/api', express.json());
  app.use('/api', buildApiRouter(table));
  app.use(errorHandler);
});
afterAll(async () => {
  await env.db.destroy();
});

const key = () => `route-helper-${randomUUID()}`;

describe('route()', () => {
  it('runs a write route in one transaction and its afterCommit work once committed', async () => {
    const k = key();
    const res = await request(app).post(`/api/t/settings/${k}`).send({ value: 'x' });
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ inTransaction: true });
    // The afterCommit work read the row from another connection: it was committed by then.
    await vi.waitFor(() => expect(seenAfterCommit.filter((s) => s.key === k)).toEqual([{ key: k, stored: true }]), { timeout: 10_000 });
    const read = await request(app).get(`/api/t/settings/${k}`);
    expect(read.body).toEqual({ inTransaction: false, exists: true });
  });

  it('rolls the whole request back when the handler fails after a write, and skips its afterCommit work', async () => {
    const k = key();
    const res = await request(app).post(`/api/t/settings/${k}`).send({ value: 'x', fail: true });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(await env.db.getRepository(AppSetting).existsBy({ key: k })).toBe(false);
    expect(afterCommitRan).not.toContain(k);
  });

  it('answers 400 naming the bad parameter and body fields, before the handler runs', async () => {
    const res = await request(app).post('/api/t/settings/short').send({ value: 3 });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['params.settingKey', 'value']);
  });
});

describe('the app clock', () => {
  it('dates what a write route stores, and its audit entry, by the context\'s clock', async () => {
    const admin = bearer(env.config, (await createTestUser(env.db, ['admin'])).id);
    const res = await request(env.app).post('/api/sites').set(admin).send({ name: `Clock ${randomUUID().slice(0, 8)}`, timeZone: 'UTC' });
    expect(res.status).toBe(201);
    const site = await env.db.getRepository(Site).findOneByOrFail({ id: res.body.id });
    expect(site.createdAt.toISOString()).toBe(FIXED.toISOString());
    const entry = await env.db.getRepository(AuditEntry).findOneByOrFail({ entity: 'site', entityId: String(site.id), action: 'create' });
    expect(entry.at.toISOString()).toBe(FIXED.toISOString());
  });
});
