import { z } from 'zod';
import { route, type RouteDef } from '../../route-def.js';
import { createDraft, getCriteriaSet, listCriteriaSets, patchDraft, publishCriteriaSet } from './criteria.service.js';

const versionParams = z.object({ version: z.coerce.number().int().positive('not a valid version') });

/** POST /api/criteria — a new draft copied from a version. */
export const criteriaDraftBodySchema = z.strictObject({
  fromVersion: z.number().int().positive(),
  name: z.string().trim().min(1).max(200).optional(),
  notes: z.string().max(4000).nullable().optional(),
});

/** PATCH /api/criteria/:version — thresholds (checked against the criteria schema by the service), name, notes. */
export const criteriaPatchBodySchema = z.strictObject({
  thresholds: z.unknown().optional(),
  name: z.string().trim().min(1).max(200).optional(),
  notes: z.string().max(4000).nullable().optional(),
});

export const criteriaRoutes: RouteDef[] = [
  // GET /api/criteria — every criteria set version, newest first
  route({ method: 'get', path: '/criteria', access: 'signed-in', handler: ({ m }) => listCriteriaSets(m) }),
  // GET /api/criteria/:version — one version with its thresholds
  route({ method: 'get', path: '/criteria/:version', access: 'signed-in', params: versionParams, handler: ({ m, params }) => getCriteriaSet(m, params.version) }),
  // POST /api/criteria — a new draft from a version
  route({
    method: 'post',
    path: '/criteria',
    access: ['engineer', 'admin'],
    body: criteriaDraftBodySchema,
    status: 201,
    handler: ({ m, clock, user, body }) => createDraft(m, clock, user.id, body),
  }),
  // PATCH /api/criteria/:version — change a draft (a published version answers 409)
  route({
    method: 'patch',
    path: '/criteria/:version',
    access: ['engineer', 'admin'],
    params: versionParams,
    body: criteriaPatchBodySchema,
    handler: ({ m, clock, user, params, body }) => patchDraft(m, clock, user.id, params.version, body),
  }),
  // POST /api/criteria/:version/publish — the draft becomes immutable and screenings use it
  route({
    method: 'post',
    path: '/criteria/:version/publish',
    access: ['admin'],
    params: versionParams,
    handler: ({ m, clock, user, params }) => publishCriteriaSet(m, clock, user.id, params.version),
  }),
];
