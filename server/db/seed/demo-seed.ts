import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { AppSetting } from '../../common/app-setting.entity.js';
import { FixedClock, systemClock } from '../../common/clock.js';
import { User } from '../../features/users/user.entity.js';
import { createUser } from '../../features/users/users.service.js';
import { userCreateSchema } from '../../../shared/schemas/auth.js';
import { demoTimeline } from './demo-events.js';
import { seedScenario, type DemoUserIds } from './demo-scenario.js';
import { DEMO_PASSWORD, DEMO_USERS } from './demo-users.js';

export const SEED_MARKER_KEY = 'demo-seed';
/** Scenario version written into the marker (informative; the marker's presence is what counts). */
export const DEMO_SCENARIO_VERSION = 2;

export interface SeedDemoOptions {
  /** The instant the story's relative dates hang on (default: the current time). */
  now?: Date;
}

/**
 * Seeds the demo data once: the demo users and the "Kestrel Valley Power" scenario (demo-scenario.ts), all in ONE
 * transaction, through the services with a fixed clock walked through the story. The marker row (not "a table is
 * empty") says it was done. Returns true when it seeded now.
 */
export async function seedDemo(db: DataSource, opts: SeedDemoOptions = {}): Promise<boolean> {
  const now = opts.now ?? systemClock.now();
  const clock = new FixedClock(now);
  return db.transaction(async (m) => {
    // Lock the marker row so that two starting servers do not both seed.
    const marker = await m.getRepository(AppSetting).findOne({ where: { key: SEED_MARKER_KEY }, lock: { mode: 'pessimistic_write' } });
    if (marker) return false;
    await m.insert(AppSetting, { key: SEED_MARKER_KEY, value: JSON.stringify({ version: DEMO_SCENARIO_VERSION, scenario: 'Kestrel Valley Power', at: now.toISOString() }) });
    // The demo people were there when the fleet was set up (one hash for all: bcrypt is slow on purpose).
    clock.set(demoTimeline(now).setup);
    const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);
    for (const u of DEMO_USERS) {
      if (await m.getRepository(User).exists({ where: { email: u.email } })) continue;
      const input = userCreateSchema.parse({ ...u, password: DEMO_PASSWORD, siteIds: [] });
      await createUser(m, clock, null, input, { demo: true, passwordHash });
    }
    const users = await m.getRepository(User).find({ where: { email: In(DEMO_USERS.map((u) => u.email)) } });
    const idOf = (role: string) => {
      const email = DEMO_USERS.find((u) => u.roles.includes(role as never))!.email;
      return users.find((u) => u.email === email)!.id;
    };
    const ids: DemoUserIds = { admin: idOf('admin'), protection: idOf('protection'), tester: idOf('tester'), manager: idOf('manager'), engineer: idOf('engineer') };
    await seedScenario(m, clock, ids, now);
    return true;
  });
}
