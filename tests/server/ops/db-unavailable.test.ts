import mysql2 from 'mysql2';
import mysql2p from 'mysql2/promise';
import request from 'supertest';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createApp } from '../../../server/app.js';
import { databaseFault, duplicateEntry } from '../../../server/common/error-handler.js';
import type { AppContext } from '../../../server/context.js';
import { boundPoolWait, createDataSource } from '../../../server/db/create-data-source.js';
import { route, type RouteDef } from '../../../server/route-def.js';
import { routeTable } from '../../../server/routes.js';
import { bearer, createTestUser, openTestEnv, TEST_PASSWORD, type TestEnv } from '../../helpers/db.js';
import { makeSite } from '../../helpers/factories.js';
import { Site } from '../../../server/features/sites/site.entity.js';
import { closedPort, silentServer, startFaultProxy, type FaultProxy } from '../../helpers/fault-proxy.js';

// The database unreachable is a 503 db_unavailable with Retry-After on every route, decided by the error handler from
// the driver's real error objects: no connection (refused, timed out, hung up, lost, pool wait), a server that is shutting
// down or busy (lock wait timeout); a deadlock is a 409 to try again; anything else stays as it was.

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
});

/** The error of a connection attempt with mysql2 (what the pool hands TypeORM). */
function connectError(opts: mysql2.ConnectionOptions): Promise<Error> {
  return new Promise((resolve, reject) => {
    const c = mysql2.createConnection({ host: '127.0.0.1', user: 'nobody', password: 'x', ...opts });
    c.on('error', () => undefined);
    c.connect((err) => {
      if (err) resolve(err);
      else {
        c.destroy();
        reject(new Error('connected, but an error was expected'));
      }
    });
  });
}

/** Two connections of the test database's account (autocommit off where a test needs a transaction). */
async function testConnection() {
  const c = env.config;
  const conn = await mysql2p.createConnection({ host: c.DB_HOST, port: c.DB_PORT, user: c.DB_USER, password: c.dbPassword, database: c.DB_NAME });
  conn.on('error', () => undefined);
  return conn;
}

async function caught(p: Promise<unknown>): Promise<unknown> {
  try {
    await p;
  } catch (err) {
    return err;
  }
  throw new Error('no error thrown');
}

describe('databaseFault on real driver errors', () => {
  it('a refused connection (nothing listens on the port) is unavailable', async () => {
    const err = await connectError({ port: await closedPort() });
    expect((err as { code?: string }).code).toBe('ECONNREFUSED');
    expect(databaseFault(err)).toBe('unavailable');
  });

  it('a server that accepts and never answers: connect ETIMEDOUT after connectTimeout, unavailable', async () => {
    const srv = await silentServer('silent');
    try {
      const err = await connectError({ port: srv.port, connectTimeout: 300 });
      expect((err as { code?: string }).code).toBe('ETIMEDOUT');
      expect(databaseFault(err)).toBe('unavailable');
    } finally {
      await srv.close();
    }
  });

  it('a server that hangs up during the handshake: the connection is lost, unavailable', async () => {
    const srv = await silentServer('hang-up');
    try {
      const err = await connectError({ port: srv.port, connectTimeout: 2000 });
      expect(databaseFault(err)).toBe('unavailable');
    } finally {
      await srv.close();
    }
  });

  it('a pool with no free connection in time: POOL_ACQUIRE_TIMEOUT, unavailable; a connection arriving late goes back', async () => {
    const srv = await silentServer('silent');
    const pool = boundPoolWait(mysql2.createPool({ host: '127.0.0.1', port: srv.port, user: 'nobody', connectTimeout: 5000, connectionLimit: 1 }), 150);
    try {
      const err = await new Promise<Error | null>((resolve) => pool.getConnection((e) => resolve(e)));
      expect((err as { code?: string }).code).toBe('POOL_ACQUIRE_TIMEOUT');
      expect(databaseFault(err)).toBe('unavailable');
    } finally {
      await srv.close();
      await new Promise<void>((r) => pool.end(() => r()));
    }
  });

  it("a closed pool ('Pool is closed.') and TypeORM's not-connected data source are unavailable", async () => {
    const pool = mysql2.createPool({ host: '127.0.0.1', port: await closedPort(), user: 'nobody' });
    await new Promise<void>((r) => pool.end(() => r()));
    const err = await new Promise<Error | null>((resolve) => pool.getConnection((e) => resolve(e)));
    expect(err?.message).toMatch(/Pool is closed/);
    expect(databaseFault(err)).toBe('unavailable');
    const never = createDataSource({ ...env.config, DB_PORT: await closedPort() });
    const notConnected = await caught(never.query('SELECT 1'));
    expect(databaseFault(notConnected)).toBe('unavailable');
  });

  it('a connection killed on the server (the pooled connection of a restarted database) is unavailable on its next query', async () => {
    const victim = await testConnection();
    const killer = await testConnection();
    try {
      const [rows] = await victim.query('SELECT CONNECTION_ID() AS id');
      await killer.query(`KILL CONNECTION ${(rows as { id: number }[])[0]!.id}`);
      const err = await caught(victim.query('SELECT 1'));
      expect(databaseFault(err)).toBe('unavailable');
      expect(databaseFault(await caught(victim.query('SELECT 1')))).toBe('unavailable');
    } finally {
      victim.destroy();
      await killer.end();
    }
  });

  it('a lock wait timeout (1205) through TypeORM is unavailable; a deadlock (1213) is a deadlock', async () => {
    // Two sites of this test, locked by transactions that are rolled back: nothing is changed.
    const [s1, s2] = [await makeSite(env.db), await makeSite(env.db)];
    const lock = (id: number) => `UPDATE site SET timeZone = timeZone WHERE id = ${id}`;
    const a = await testConnection();
    const b = await testConnection();
    try {
      // Lock wait: a holds site 1, a TypeORM transaction waiting for it gives up after 1 s.
      await a.query('START TRANSACTION');
      await a.query(lock(s1.id));
      const waitErr = await caught(
        env.db.transaction(async (m) => {
          await m.query('SET SESSION innodb_lock_wait_timeout = 1');
          await m.query(lock(s1.id));
        }),
      );
      expect((waitErr as { driverError?: { code?: string } }).driverError?.code).toBe('ER_LOCK_WAIT_TIMEOUT');
      expect(databaseFault(waitErr)).toBe('unavailable');
      await a.query('ROLLBACK');
      // Deadlock: a holds 1 and wants 2, b holds 2 and wants 1; InnoDB picks one victim.
      await a.query('START TRANSACTION');
      await b.query('START TRANSACTION');
      await a.query(lock(s1.id));
      await b.query(lock(s2.id));
      const results = await Promise.allSettled([a.query(lock(s2.id)), b.query(lock(s1.id))]);
      const failed = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
      expect(failed).toHaveLength(1);
      expect((failed[0]!.reason as { code?: string }).code).toBe('ER_LOCK_DEADLOCK');
      expect(databaseFault(failed[0]!.reason)).toBe('deadlock');
    } finally {
      await a.query('ROLLBACK').catch(() => undefined);
      await b.query('ROLLBACK').catch(() => undefined);
      await a.end();
      await b.end();
    }
  });

  it('other errors are not database faults: a syntax error, a duplicate key, a refused connection that is not the driver\'s', async () => {
    const syntax = await caught(env.db.query('SELEC 1'));
    expect(databaseFault(syntax)).toBeUndefined();
    const dup = Object.assign(new Error("Duplicate entry 'x' for key 'y'"), { code: 'ER_DUP_ENTRY', errno: 1062 });
    expect(databaseFault(dup)).toBeUndefined();
    expect(duplicateEntry(dup)).toBeDefined();
    // A mail server refusing (nodemailer) carries the same code without mysql2's `fatal` mark.
    const mail = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:25'), { code: 'ECONNREFUSED', syscall: 'connect' });
    expect(databaseFault(mail)).toBeUndefined();
    expect(databaseFault(new Error('boom'))).toBeUndefined();
    expect(databaseFault(null)).toBeUndefined();
  });
});

describe('the app while its database is cut off and back', () => {
  let proxy: FaultProxy;
  let db: DataSource;
  let app: ReturnType<typeof createApp>;
  // The probe route's rows: sites with this name (the app account has no right to create tables).
  const probeName = `Probe ${randomUUID().slice(0, 8)}`;
  const probeRows = async () => Number((await env.db.query('SELECT COUNT(*) AS n FROM site WHERE name LIKE ?', [`${probeName}%`]))[0].n);
  let releaseWrite: () => void = () => undefined;
  let writeEntered: () => void = () => undefined;

  // A write route that inserts a row, then waits for the test (which cuts the database) before it returns and commits.
  const probeRoutes: RouteDef[] = [
    route({
      method: 'post',
      path: '/probe-write',
      access: 'public',
      handler: async ({ m }) => {
        await m.getRepository(Site).save(m.getRepository(Site).create({ name: `${probeName} ${randomUUID().slice(0, 4)}`, timeZone: 'Europe/London' }));
        writeEntered();
        await new Promise<void>((r) => (releaseWrite = r));
        return { saved: true };
      },
    }),
  ];

  beforeAll(async () => {
    proxy = await startFaultProxy({ host: env.config.DB_HOST, port: env.config.DB_PORT });
    db = createDataSource({ ...env.config, DB_PORT: proxy.port });
    await db.initialize();
    app = createApp({ ...(env.app.locals.ctx as AppContext), db }, { routes: [...probeRoutes, ...routeTable] });
  });
  afterAll(async () => {
    await proxy?.close();
    if (db?.isInitialized) await db.destroy();
  });

  const expect503 = (res: request.Response) => {
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBe('5');
    expect(res.body.error).toEqual({
      code: 'db_unavailable',
      message: 'The database is not reachable; try again in a moment.',
      requestId: res.headers['x-request-id'],
    });
  };

  it('signed-in reads (the sign-in lookup included), writes, sign-in and health answer 503 with Retry-After, then 200 again', async () => {
    const admin = await createTestUser(env.db, ['admin']);
    const auth = bearer(env.config, admin.id);
    expect((await request(app).get('/api/units').set(auth)).status).toBe(200);

    await proxy.cut();
    expect503(await request(app).get('/api/units').set(auth));
    expect503(await request(app).get('/api/auth/me').set(auth));
    expect503(await request(app).post('/api/units').set(auth).send({ serial: `DOWN-${randomUUID().slice(0, 6)}`, siteId: 1, designId: 1 }));
    expect503(await request(app).post('/api/auth/login').send({ email: admin.email, password: TEST_PASSWORD }));
    const health = await request(app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.headers['retry-after']).toBe('5');
    expect(health.body).toMatchObject({ status: 'degraded', db: 'down' });

    await proxy.restore();
    expect((await request(app).get('/api/units').set(auth)).status).toBe(200);
    expect((await request(app).get('/api/health')).status).toBe(200);
  });

  it('a write cut off before its COMMIT answers 503 and leaves nothing behind', async () => {
    const entered = new Promise<void>((r) => (writeEntered = r));
    const answer = request(app).post('/api/probe-write').then((r) => r);
    await entered;
    await proxy.cut();
    releaseWrite();
    expect503(await answer);
    await proxy.restore();
    // The server rolled the transaction back when its connection went; counted on the test's own connection.
    expect(await probeRows()).toBe(0);
    // And the same write goes through once the database is back.
    const again = request(app).post('/api/probe-write').then((r) => r);
    await new Promise<void>((r) => (writeEntered = r));
    releaseWrite();
    expect((await again).status).toBe(200);
    expect(await probeRows()).toBe(1);
  });
});
