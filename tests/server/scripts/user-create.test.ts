import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../../server/features/users/user.entity.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
});
afterAll(async () => {
  await env.db.destroy();
});

function userCreate(args: string[]) {
  return spawnSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', '--tsconfig', 'server/tsconfig.json', 'server/scripts/user-create.ts', ...args], {
    encoding: 'utf8',
    env: process.env,
  });
}

describe('npm run user:create', () => {
  it('creates a real (non-demo) account with the given roles and a generated password it prints once', async () => {
    const email = `ops-${randomUUID().slice(0, 8)}@utility.example`;
    const r = userCreate(['--email', email, '--name', 'Ops Person', '--roles', 'manager,tester', '--all-sites']);
    expect(r.status).toBe(0);
    const password = /Password \(shown once\): (\S+)/.exec(r.stdout)?.[1];
    expect(password).toMatch(/^[A-Za-z0-9_-]{16}$/); // 12 random bytes in base64url
    const user = await env.db.getRepository(User).findOneByOrFail({ email });
    expect(user).toMatchObject({ roles: ['manager', 'tester'], allSites: true, demo: false, active: true });
    expect(await bcrypt.compare(password!, user.passwordHash)).toBe(true);
  });

  it('exits 2 naming the field for an unknown role, and creates nothing', async () => {
    const email = `bad-${randomUUID().slice(0, 8)}@utility.example`;
    const r = userCreate(['--email', email, '--name', 'X', '--roles', 'wizard']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/roles\.0/);
    expect(await env.db.getRepository(User).exists({ where: { email } })).toBe(false);
  });
});
