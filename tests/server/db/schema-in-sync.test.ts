import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
});
afterAll(async () => {
  await env.db.destroy();
});

describe('entities and migrations', () => {
  it('agree: after every migration, generating a migration from the entities would produce no statement', async () => {
    // The same comparison `typeorm migration:generate --check` makes.
    const sql = await env.db.driver.createSchemaBuilder().log();
    expect(sql.upQueries.map((q) => q.query)).toEqual([]);
  });
});
