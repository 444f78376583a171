import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { loadConfig } from '../../../server/config.js';
import { openOwnerDb } from '../../helpers/fixed-db.js';

// As the migrator: the app account sees only the rights it has, not the whole schema (foreign keys among others).
let db: DataSource;
beforeAll(async () => {
  db = await openOwnerDb(loadConfig().DB_NAME);
});
afterAll(async () => {
  await db.destroy();
});

describe('entities and migrations', () => {
  it('agree: after every migration, generating a migration from the entities would produce no statement', async () => {
    // The same comparison `typeorm migration:generate --check` makes.
    const sql = await db.driver.createSchemaBuilder().log();
    expect(sql.upQueries.map((q) => q.query)).toEqual([]);
  });
});
