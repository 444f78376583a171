import { route, type RouteDef } from '../../route-def.js';
import { readingSetParams, sweepParams } from '../../common/params.js';
import { sessionPatchSchema } from '../../../shared/schemas/fleet.js';
import { correctUnitReadingSet, markReference, removeUnitSweep } from './reading-sets.service.js';

export const readingSetRoutes: RouteDef[] = [
  // PATCH /api/reading-sets/:readingSetId — correct a unit's factory, commissioning or routine set (as a session's
  // correction); 409 once a decided screening used it
  route({
    method: 'patch',
    path: '/reading-sets/:readingSetId',
    access: ['tester', 'admin'],
    params: readingSetParams,
    body: sessionPatchSchema,
    handler: ({ m, clock, user, params, body }) => correctUnitReadingSet(m, clock, user.id, params.readingSetId, body),
  }),
  // POST /api/reading-sets/:readingSetId/reference — the unit's reference set of its kind (the previous one unmarked)
  route({
    method: 'post',
    path: '/reading-sets/:readingSetId/reference',
    access: ['tester', 'admin'],
    params: readingSetParams,
    handler: ({ m, clock, user, params }) => markReference(m, clock, user.id, params.readingSetId),
  }),
  // DELETE /api/sweeps/:sweepId — remove a trace of a unit's factory, commissioning or routine set; 409 once a decided
  // screening used the set
  route({
    method: 'delete',
    path: '/sweeps/:sweepId',
    access: ['tester', 'admin'],
    params: sweepParams,
    handler: ({ m, clock, user, params }) => removeUnitSweep(m, clock, user.id, params.sweepId),
  }),
];
