import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Access, RouteDef } from '../../../server/route-def.js';
import { routeTable } from '../../../server/routes.js';
import { ROLES, type Role } from '../../../shared/schemas/roles.js';
import { bearer, createTestUser, openTestEnv, type TestEnv } from '../../helpers/db.js';

// Who may call each route, written out from ../shared/product/api.md ("who" column, row by row), compared with the
// route table the router is built from, then every route called as every role.

type Who = 'anyone' | 'signed in' | readonly Role[];

// api.md, "HTTP API — the main flow" (every row must exist in the route table).
const MAIN_FLOW: ReadonlyArray<readonly [string, Who]> = [
  ['GET /health', 'anyone'],
  ['POST /auth/login', 'anyone'],
  ['GET /auth/me', 'signed in'],
  ['GET /sites', 'signed in'],
  ['GET /designs', 'signed in'],
  ['GET /designs/:id', 'signed in'],
  ['POST /sites', ['admin']],
  ['POST /designs', ['admin']],
  ['PATCH /sites/:id', ['admin']],
  ['PATCH /designs/:id', ['admin']],
  ['GET /units', 'signed in'],
  ['GET /units/:id', 'signed in'],
  ['POST /units', ['admin']],
  ['PATCH /units/:id', ['admin']],
  ['POST /units/:id/reading-sets', ['tester']],
  ['POST /units/:id/sweeps', ['tester']],
  ['POST /events', ['protection']],
  ['POST /events/:id/attachments', ['protection']],
  ['GET /events', 'signed in'],
  ['GET /events/:id', 'signed in'],
  ['POST /events/:id/sessions', ['tester']],
  ['POST /sessions/:id/imports', ['tester']],
  ['POST /sessions/:id/sweeps', ['tester']],
  // "tester, manager; engineer for comparison runs only (403 otherwise)"
  ['POST /events/:id/screenings', ['tester', 'manager', 'engineer']],
  ['GET /events/:id/case', 'signed in'],
  ['POST /screenings/preview', 'signed in'],
  ['GET /screenings/:id/report.pdf', 'signed in'],
  // "manager (the role itself; admin alone is not enough)"
  ['POST /screenings/:id/decision', ['manager']],
  ['POST /follow-ups/:id/close', ['manager', 'tester']],
  ['POST /events/:id/findings', ['engineer']],
  ['GET /dev/outbox', ['admin', 'manager']],
];

// api.md, "Routes added with rules revision 2 and the administration work". Partly future work: a row missing from the
// route table is not a failure. In the table today: GET/POST /users, PATCH /users/:id, POST /users/:id/reset-password,
// POST /users/:id/unlock, GET /events/:id/attachments/:attachmentId, GET /sweeps/:id, GET /follow-ups, POST /units/import,
// GET /units/export, PATCH /events/:id, PATCH /sessions/:id, POST /events/:id/energised (and GET /events, also a
// main-flow row).
const ADDED: ReadonlyArray<readonly [string, Who]> = [
  ['GET /users', ['admin']],
  ['POST /users', ['admin']],
  ['PATCH /users/:id', ['admin']],
  ['GET /events/:id/attachments/:attachmentId', 'signed in'],
  ['GET /sweeps/:id', 'signed in'],
  ['POST /users/:id/reset-password', ['admin']],
  ['POST /users/:id/unlock', ['admin']],
  ['POST /units/import', ['admin']],
  ['GET /units/export', 'signed in'],
  ['GET /events', 'signed in'],
  ['PATCH /events/:id', ['protection']],
  ['PATCH /sessions/:id', ['tester']],
  ['POST /events/:id/energised', ['manager']],
  // Not an api.md row: lifting the active restrictions of a release with restrictions.
  ['POST /events/:id/restrictions/lift', ['manager']],
  // Not an api.md row: a unit's factory, commissioning or routine set from a readings CSV (the session import's format).
  ['POST /units/:id/reading-sets/import', ['tester']],
  // Not an api.md row: reading sets of many units from one .xlsx or CSV file (fleet onboarding).
  ['POST /units/reading-sets/import', ['tester']],
  // Not api.md rows: correcting a unit's factory, commissioning or routine set, and marking it as the unit's reference.
  ['PATCH /reading-sets/:id', ['tester']],
  ['POST /reading-sets/:id/reference', ['tester']],
  ['DELETE /sweeps/:id', ['tester']],
  ['GET /follow-ups', 'signed in'],
  ['GET /criteria', 'signed in'],
  ['GET /criteria/:version', 'signed in'],
  ['POST /criteria', ['engineer', 'admin']],
  ['PATCH /criteria/:version', ['engineer', 'admin']],
  ['POST /criteria/:version/publish', ['admin']],
  ['GET /designs/:id/sisters', 'signed in'],
  // Not api.md rows: photos and documents on inspection findings, and the readings, indicators and audit exports.
  ['POST /findings/:id/attachments', ['engineer']],
  ['GET /findings/:id/attachments/:attachmentId', 'signed in'],
  ['GET /units/:id/readings/export', 'signed in'],
  ['GET /screenings/:id/indicators/export', 'signed in'],
  ['GET /events/:id/audit/export', 'signed in'],
  // Not api.md rows: resending a mail from the event's e-mail log, and opening an attachment of a mail in the outbox.
  ['POST /notifications/:id/resend', ['manager']],
  ['GET /dev/outbox/:id/attachments/:index', ['admin', 'manager']],
  // Not an api.md row: the case exactly as a stored screening judged it (the evidence charts are drawn from it).
  ['GET /screenings/:id/case', 'signed in'],
  // Not an api.md row: the signed-in person replaces their own password (a one-time password first of all).
  ['POST /auth/password', 'signed in'],
  // Not an api.md row: signing out ends every token of the person (their token version is raised).
  ['POST /auth/logout', 'signed in'],
  // Not an api.md row: the security log (failed and refused sign-ins, locks, unlocks, authorization refusals).
  ['GET /security-events', ['admin']],
];

// api.md: "`admin` may do everything a row names except sign decisions".
const DECISION = 'POST /screenings/:id/decision';

/** `GET /events/:eventId` and `GET /events/:id` are the same route: parameter names do not matter. */
const routeKey = (method: string, path: string) => `${method.toUpperCase()} ${path.replace(/:[A-Za-z]+/g, ':param')}`;
const keyOfDoc = (row: string) => {
  const [method, path] = row.split(' ');
  return routeKey(method, path);
};

/** The access a row of api.md means, in the route table's terms (sorted role list, 'public' or 'signed-in'). */
function expectedAccess(row: string, who: Who): string {
  if (who === 'anyone') return 'public';
  if (who === 'signed in') return 'signed-in';
  const roles = new Set<Role>(who);
  if (keyOfDoc(row) !== keyOfDoc(DECISION)) roles.add('admin');
  return [...roles].sort().join(',');
}

function accessOf(r: RouteDef): string {
  return typeof r.access === 'string' ? r.access : [...r.access].sort().join(',');
}

const documented = new Map<string, { row: string; access: string }>();
for (const [row, who] of [...MAIN_FLOW, ...ADDED]) {
  const key = keyOfDoc(row);
  const access = expectedAccess(row, who);
  const before = documented.get(key);
  if (before && before.access !== access) throw new Error(`api.md lists ${row} twice with different roles`);
  documented.set(key, { row, access });
}
const tableKeys = new Set(routeTable.map((r) => routeKey(r.method, r.path)));

describe('the route table against api.md', () => {
  it('has no duplicate method and path (parameter names aside)', () => {
    expect(tableKeys.size).toBe(routeTable.length);
  });

  for (const r of routeTable) {
    it(`${r.method.toUpperCase()} ${r.path} is in api.md with the same roles`, () => {
      const doc = documented.get(routeKey(r.method, r.path));
      expect(doc, `${routeKey(r.method, r.path)} has no row in api.md`).not.toBeUndefined();
      expect(accessOf(r)).toBe(doc?.access);
    });
  }

  for (const [row] of MAIN_FLOW) {
    it(`${row} (api.md, main flow) is in the route table`, () => {
      expect(tableKeys.has(keyOfDoc(row)), row).toBe(true);
    });
  }

  it('lets no one but the manager role sign a decision (admin included)', () => {
    const decision = routeTable.find((r) => routeKey(r.method, r.path) === keyOfDoc(DECISION));
    expect(decision?.access).toEqual(['manager']);
  });
});

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

const SCREENING_RUN = routeKey('post', '/events/:id/screenings');
// Signing out ends every token of the person: called with a token of its own, so the role's token lives on.
const LOGOUT = routeKey('post', '/auth/logout');
const allows = (access: Access, role: Role) => access === 'signed-in' || (access !== 'public' && access.includes(role));

describe('every route called as every role', () => {
  for (const r of routeTable) {
    const name = `${r.method.toUpperCase()} ${r.path}`;
    if (r.access === 'public') {
      it(`${name} answers without a token (neither 401 nor 403)`, async () => {
        const res = await call(r.method, r.path);
        expect([401, 403]).not.toContain(res.status);
      });
      continue;
    }
    it(`${name} answers 401 without a token`, async () => {
      expect((await call(r.method, r.path)).status).toBe(401);
    });
    for (const role of ROLES) {
      const allowed = allows(r.access, role);
      it(`${name} ${allowed ? 'does not refuse' : 'refuses with 403'} ${role}`, async () => {
        const token = routeKey(r.method, r.path) === LOGOUT ? bearer(env.config, (await createTestUser(env.db, [role])).id) : tokens[role];
        let req = call(r.method, r.path).set(token);
        // An engineer may run comparison screenings only (checked below).
        if (routeKey(r.method, r.path) === SCREENING_RUN) req = req.send({ comparison: true });
        const res = await req;
        if (allowed) expect(res.status).not.toBe(403);
        else {
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      });
    }
  }
});

describe('screening runs by role (api.md: engineer for comparison runs only, 403 otherwise)', () => {
  const path = '/api/events/987654321/screenings';

  it('refuses a normal run by an engineer with 403', async () => {
    const res = await request(env.app).post(path).set(tokens.engineer).send({ comparison: false });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it('lets an engineer ask for a comparison run (404 here: the event does not exist)', async () => {
    const res = await request(env.app).post(path).set(tokens.engineer).send({ comparison: true });
    expect(res.status).toBe(404);
  });

  for (const role of ['tester', 'manager', 'admin'] as const) {
    it(`lets a ${role} ask for a normal run (404 here: the event does not exist)`, async () => {
      const res = await request(env.app).post(path).set(tokens[role]).send({ comparison: false });
      expect(res.status).toBe(404);
    });
  }
});
