import 'reflect-metadata';
import mysql2 from 'mysql2';
import { DataSource } from 'typeorm';
import type { Config } from '../config.js';
import { entities } from './entities.js';
import { migrations } from './migrations/index.js';

/** Connections in the pool. */
export const DB_POOL_SIZE = 10;
/** How long opening a connection (TCP and handshake) may take before it fails with ETIMEDOUT. */
export const DB_CONNECT_TIMEOUT_MS = 2_000;
/**
 * How long a request waits for a connection (a free one, or a new one opened within DB_CONNECT_TIMEOUT_MS) before it
 * fails with POOL_ACQUIRE_TIMEOUT; the error handler answers 503 db_unavailable either way.
 */
export const DB_ACQUIRE_TIMEOUT_MS = 4_000;
/** Requests that may wait for a connection at once; one more fails at once ("Queue limit reached."), also a 503. */
export const DB_QUEUE_LIMIT = 500;

type PoolCallback = (err: Error | null, connection?: { release(): void }) => void;
type Pool = { getConnection(cb: PoolCallback): void };

/**
 * mysql2's pool waits for a free connection without a time limit (it has no acquireTimeout, and TypeORM's
 * `acquireTimeout` is passed to it and ignored), so getConnection is bounded here: after `waitMs` the caller gets an
 * error with code POOL_ACQUIRE_TIMEOUT, and a connection that turns up later goes straight back to the pool.
 */
export function boundPoolWait<P extends Pool>(pool: P, waitMs: number): P {
  const getConnection = pool.getConnection.bind(pool);
  pool.getConnection = (cb: PoolCallback) => {
    let settled = false;
    const timer = setTimeout(() => {
      settled = true;
      cb(Object.assign(new Error(`No database connection within ${waitMs} ms.`), { code: 'POOL_ACQUIRE_TIMEOUT' }));
    }, waitMs);
    timer.unref();
    getConnection((err, connection) => {
      if (settled) {
        if (!err) connection?.release();
        return;
      }
      settled = true;
      clearTimeout(timer);
      cb(err, connection);
    });
  };
  return pool;
}

// The mysql2 module TypeORM loads, with pools whose wait for a connection is bounded.
const boundedMysql2 = {
  ...mysql2,
  createPool: (options: mysql2.PoolOptions) => boundPoolWait(mysql2.createPool(options) as unknown as Pool, DB_ACQUIRE_TIMEOUT_MS),
};

/**
 * The data source for a checked configuration. Never synchronize: the schema comes from migrations. Fails fast when the
 * database is down: a connection opens within DB_CONNECT_TIMEOUT_MS and a request gets one within DB_ACQUIRE_TIMEOUT_MS
 * (or an error the error handler answers with 503); a pooled connection the server closed is dropped by mysql2, and new
 * ones are opened once the server is back, so the app recovers from a database restart without a restart of its own.
 */
export function createDataSource(config: Pick<Config, 'DB_HOST' | 'DB_PORT' | 'DB_USER' | 'DB_NAME' | 'dbPassword'>): DataSource {
  return new DataSource({
    type: 'mariadb',
    driver: boundedMysql2,
    host: config.DB_HOST,
    port: config.DB_PORT,
    username: config.DB_USER,
    password: config.dbPassword,
    database: config.DB_NAME,
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    connectTimeout: DB_CONNECT_TIMEOUT_MS,
    poolSize: DB_POOL_SIZE,
    extra: { decimalNumbers: true, supportBigNumbers: true, bigNumberStrings: false, waitForConnections: true, queueLimit: DB_QUEUE_LIMIT },
  });
}
