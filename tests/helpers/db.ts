import 'reflect-metadata';
import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { createApp } from '../../server/app.js';
import { signToken } from '../../server/common/auth.js';
import { systemClock, type Clock } from '../../server/common/clock.js';
import { loadConfig, type Config } from '../../server/config.js';
import { User } from '../../server/features/users/user.entity.js';
import type { Role } from '../../shared/schemas/roles.js';

// Test helpers for API tests on the throw-away MariaDB started by tests/run.ts.

export const TEST_PASSWORD = 'correct horse battery';
// One hash for every factory user: bcrypt cost 10 takes ~0.1 s a hash.
const TEST_HASH = bcrypt.hashSync(TEST_PASSWORD, 10);

export interface TestEnv {
  db: DataSource;
  config: Config;
  app: Express;
}

/** Opens the test database and builds the app on it. */
export async function openTestEnv(opts: { mailSinkRunning?: boolean; clock?: Clock } = {}): Promise<TestEnv> {
  if (!process.env.DB_PASSWORD) throw new Error('API tests need the database of `npm test` (tests/run.ts).');
  const config = loadConfig();
  const { default: db } = await import('../../server/db/data-source.js');
  if (!db.isInitialized) await db.initialize();
  const app = createApp({ db, clock: opts.clock ?? systemClock, config, mailSinkRunning: opts.mailSinkRunning ?? false });
  return { db, config, app };
}

/** A fresh user with the given roles and a unique e-mail. */
export async function createTestUser(db: DataSource, roles: Role[], over: Partial<User> = {}): Promise<User> {
  const repo = db.getRepository(User);
  return repo.save(
    repo.create({
      email: `u-${randomUUID()}@test.example`,
      name: `Test ${roles.join('+')}`,
      passwordHash: TEST_HASH,
      roles,
      allSites: true,
      sites: [],
      active: true,
      ...over,
    }),
  );
}

/** A bearer header for a user, minted directly (tests that are not about sign-in skip bcrypt). */
export function bearer(config: Config, userId: number, expiresIn = '1h'): { Authorization: string } {
  return { Authorization: `Bearer ${signToken(userId, config.jwtSecret, expiresIn)}` };
}
