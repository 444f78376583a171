import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { AppSetting } from '../../common/app-setting.entity.js';
import { audit } from '../../common/audit.js';
import { User } from '../../features/users/user.entity.js';
import { DEMO_PASSWORD, DEMO_USERS } from './demo-users.js';

export const SEED_MARKER_KEY = 'demo-seed';

/** Seeds the demo scenario once; the marker row (not "a table is empty") says it was done. Returns true when it seeded now. */
export async function seedDemo(db: DataSource): Promise<boolean> {
  return db.transaction(async (m) => {
    // Lock the marker row so that two starting servers do not both seed.
    const marker = await m.getRepository(AppSetting).findOne({ where: { key: SEED_MARKER_KEY }, lock: { mode: 'pessimistic_write' } });
    if (marker) return false;
    await m.insert(AppSetting, { key: SEED_MARKER_KEY, value: JSON.stringify({ version: 1, at: new Date().toISOString() }) });
    const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
    for (const u of DEMO_USERS) {
      const existing = await m.getRepository(User).findOne({ where: { email: u.email } });
      if (existing) continue;
      const user = await m.getRepository(User).save(
        m.getRepository(User).create({ ...u, passwordHash: hash, active: true, demo: true, sites: [] }),
      );
      await audit(m, { userId: null, action: 'create', entity: 'user', entityId: user.id, after: { email: u.email, roles: u.roles }, note: 'demo data' });
    }
    return true;
  });
}
