import { spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../../server/features/users/user.entity.js';
import { openTestEnv, type TestEnv } from '../../helpers/db.js';

// npm run user:create holds a typed password to the policy (shared/auth/password-policy.ts).

let env: TestEnv;
beforeAll(async () => {
  env = await openTestEnv();
});
afterAll(async () => {
  await env.db.destroy();
});

const userCreate = (args: string[]) =>
  spawnSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', '--tsconfig', 'server/tsconfig.json', 'server/scripts/user-create.ts', ...args], { encoding: 'utf8', env: process.env });

describe('npm run user:create -- --password', () => {
  it('refuses a common password with exit 2 and the reason in words, and creates nothing', async () => {
    const email = `weak-${randomUUID().slice(0, 8)}@utility.example`;
    const r = userCreate(['--email', email, '--name', 'Weak Choice', '--roles', 'tester', '--password', 'password1234']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^password: .*choose a longer phrase/m);
    expect(await env.db.getRepository(User).exists({ where: { email } })).toBe(false);
  });

  it('refuses more than 72 bytes, naming password', async () => {
    const email = `long-${randomUUID().slice(0, 8)}@utility.example`;
    const r = userCreate(['--email', email, '--name', 'Long Choice', '--roles', 'tester', '--password', 'seven lanterns over the quiet harbour '.repeat(2)]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^password: at most 72 bytes/m);
  });

  it('accepts a phrase of unrelated words', async () => {
    const email = `good-${randomUUID().slice(0, 8)}@utility.example`;
    const r = userCreate(['--email', email, '--name', 'Good Choice', '--roles', 'tester', '--password', 'seven lanterns over the quiet harbour']);
    expect(r.status, r.stderr).toBe(0);
    expect(await env.db.getRepository(User).exists({ where: { email } })).toBe(true);
  });
});
