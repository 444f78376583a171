import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { loadConfig } from '../../server/config.js';
import { entities } from '../../server/db/entities.js';
import { migrations } from '../../server/db/migrations/index.js';

/** A data source on the second, empty test database (TEST_DB_NAME_FIXED), migrated. One test file owns it. */
export async function openFixedDb(): Promise<DataSource> {
  const name = process.env.TEST_DB_NAME_FIXED;
  if (!name) throw new Error('This test needs the second database of `npm test` (TEST_DB_NAME_FIXED).');
  const c = loadConfig();
  const db = new DataSource({
    type: 'mariadb',
    host: c.DB_HOST,
    port: c.DB_PORT,
    username: c.DB_USER,
    password: c.dbPassword,
    database: name,
    entities,
    migrations,
    synchronize: false,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    extra: { decimalNumbers: true, supportBigNumbers: true, bigNumberStrings: false },
  });
  await db.initialize();
  await db.runMigrations({ transaction: 'each' });
  return db;
}
