import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeTable } from '../../../server/routes.js';
import { ROLES, type Role } from '../../../shared/schemas/roles.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';

// Every route × every role, generated from the declared route table the router is built from.

let env: TestEnv;
const tokens = {} as Record<Role, { Authorization: string }>;
beforeAll(async () => {
  env = await openTestEnv();
  for (const role of ROLES) tokens[role] = bearer(env.config, (await createTestUser(env.db, [role])).id);
});
afterAll(async () => {
  await env.db.destroy();
});

// Ids that exist nowhere: an allowed role reaches validation or a 404, never a write.
const concretePath = (path: string) => `/api${path.replace(/:[A-Za-z]+/g, '987654321')}`;

function call(method: string, path: string) {
  const agent = request(env.app);
  return (agent as unknown as Record<string, (p: string) => request.Test>)[method](concretePath(path));
}

describe('the route table', () => {
  it('has no duplicate method and path', () => {
    const keys = routeTable.map((r) => `${r.method} ${r.path}`);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('never lets admin alone sign a decision (no route that lists manager for a decision also lists admin)', () => {
    for (const r of routeTable.filter((x) => x.path.endsWith('/decision'))) expect(r.access).not.toContain('admin');
  });

  for (const r of routeTable) {
    const name = `${r.method.toUpperCase()} ${r.path}`;
    if (r.access === 'public') {
      it(`${name} answers without a token`, async () => {
        const res = await call(r.method, r.path);
        expect([401, 403]).not.toContain(res.status);
      });
      continue;
    }
    it(`${name} answers 401 without a token`, async () => {
      expect((await call(r.method, r.path)).status).toBe(401);
    });
    for (const role of ROLES) {
      const allowed = r.access === 'signed-in' || r.access.includes(role);
      it(`${name} ${allowed ? 'lets' : 'refuses with 403'} ${role}`, async () => {
        const res = await call(r.method, r.path).set(tokens[role]);
        if (allowed) expect(res.status).not.toBe(403);
        else {
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      });
    }
  }
});
