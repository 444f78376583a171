import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import type { Role } from '../../shared/schemas/roles.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from './db.js';

export interface FileApi<R extends Role> {
  /** The app and its database (set once the file's `beforeAll` ran). */
  env: TestEnv;
  /** A bearer header per role, each for its own fresh user with that one role. */
  as: Record<R, { Authorization: string }>;
  /** The id of each role's user. */
  userId: Record<R, number>;
  api: () => ReturnType<typeof request>;
}

/** Opens the test environment before the file's tests, with one signed-in user per role, and closes it after them. */
export function apiForFile<R extends Role>(roles: readonly R[]): FileApi<R> {
  const file = { as: {}, userId: {} } as FileApi<R>;
  file.api = () => request(file.env.app);
  beforeAll(async () => {
    file.env = await openTestEnv();
    for (const role of roles) {
      file.userId[role] = (await createTestUser(file.env.db, [role])).id;
      file.as[role] = bearer(file.env.config, file.userId[role]);
    }
  });
  afterAll(async () => {
    await file.env.db.destroy();
  });
  return file;
}
