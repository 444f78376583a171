import 'reflect-metadata';
import type { DataSource } from 'typeorm';
import { loadConfig } from '../../server/config.js';
import { createDataSource } from '../../server/db/create-data-source.js';
import { migrateAsOwner } from '../../server/scripts/prepare.js';

// Databases of their own for test files that need one (provisioned by tests/run.ts). Migrations run as the migrator,
// which then gives the app account its table rights, as `npm start` does; the tests then work as the app.

/** A data source as the app account on `database`, migrated first (as the migrator). */
export async function openMigratedDb(database: string): Promise<DataSource> {
  const c = loadConfig();
  await migrateAsOwner({ ...c, DB_NAME: database });
  const db = createDataSource({ ...c, DB_NAME: database });
  await db.initialize();
  return db;
}

/** The migrator's data source on `database`: for what the app account may not do (change or delete audit entries). */
export async function openOwnerDb(database: string): Promise<DataSource> {
  const c = loadConfig();
  if (!c.dbOwnerPassword) throw new Error('This test needs the migrator account of `npm test` (DB_OWNER_PASSWORD).');
  const db = createDataSource({ ...c, DB_NAME: database, DB_USER: c.dbOwnerUser, dbPassword: c.dbOwnerPassword });
  await db.initialize();
  return db;
}

/** A data source on the second, empty test database (TEST_DB_NAME_FIXED), migrated. One test file owns it. */
export async function openFixedDb(): Promise<DataSource> {
  const name = process.env.TEST_DB_NAME_FIXED;
  if (!name) throw new Error('This test needs the second database of `npm test` (TEST_DB_NAME_FIXED).');
  return openMigratedDb(name);
}
