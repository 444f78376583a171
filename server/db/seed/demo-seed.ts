import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { AppSetting } from '../../common/app-setting.entity.js';
import { audit } from '../../common/audit.js';
import { User } from '../../features/users/user.entity.js';
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
 * transaction. The marker row (not "a table is empty") says it was done. Returns true when it seeded now.
 */
export async function seedDemo(db: DataSource, opts: SeedDemoOptions = {}): Promise<boolean> {
  const now = opts.now ?? new Date();
  return db.transaction(async (m) => {
    // Lock the marker row so that two starting servers do not both seed.
    const marker = await m.getRepository(AppSetting).findOne({ where: { key: SEED_MARKER_KEY }, lock: { mode: 'pessimistic_write' } });
    if (marker) return false;
    await m.insert(AppSetting, { key: SEED_MARKER_KEY, value: JSON.stringify({ version: DEMO_SCENARIO_VERSION, scenario: 'Kestrel Valley Power', at: now.toISOString() }) });
    const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
    for (const u of DEMO_USERS) {
      const existing = await m.getRepository(User).findOne({ where: { email: u.email } });
      if (existing) continue;
      const user = await m.getRepository(User).save(
        m.getRepository(User).create({ ...u, passwordHash: hash, active: true, demo: true, sites: [] }),
      );
      await audit(m, { userId: null, action: 'create', entity: 'user', entityId: user.id, after: { email: u.email, roles: u.roles }, note: 'demo data' });
    }
    const users = await m.getRepository(User).find({ where: { email: In(DEMO_USERS.map((u) => u.email)) } });
    const idOf = (role: string) => {
      const email = DEMO_USERS.find((u) => u.roles.includes(role as never))!.email;
      return users.find((u) => u.email === email)!.id;
    };
    const ids: DemoUserIds = { admin: idOf('admin'), protection: idOf('protection'), tester: idOf('tester'), manager: idOf('manager'), engineer: idOf('engineer') };
    await seedScenario(m, ids, now);
    return true;
  });
}
