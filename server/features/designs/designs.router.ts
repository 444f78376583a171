import { route, type RouteDef } from '../../route-def.js';
import { designParams } from '../../common/params.js';
import { designBodySchema, designPatchSchema } from '../../../shared/schemas/fleet.js';
import { z } from 'zod';
import { createDesign, getDesign, getDesignSisters, listDesigns, updateDesign } from './designs.service.js';

/** `quantity` of the family comparison: `capacitance.<configuration>` or `reactance.<phase>` (default: the first). */
export const designSistersQuerySchema = z.object({ quantity: z.string().trim().min(1, 'a quantity such as capacitance.CHL').optional() });

export const designRoutes: RouteDef[] = [
  // GET /api/designs — design families with their unit counts
  route({ method: 'get', path: '/designs', access: 'signed-in', handler: ({ m }) => listDesigns(m) }),
  // GET /api/designs/:designId — one design with its sister units
  route({ method: 'get', path: '/designs/:designId', access: 'signed-in', params: designParams, handler: ({ m, params }) => getDesign(m, params.designId) }),
  // GET /api/designs/:designId/sisters?quantity= — the family compared on one quantity (modified z, median, MAD)
  route({
    method: 'get',
    path: '/designs/:designId/sisters',
    access: 'signed-in',
    params: designParams,
    query: designSistersQuerySchema,
    handler: ({ m, params, query }) => getDesignSisters(m, params.designId, query.quantity),
  }),
  // POST /api/designs — add a design family
  route({
    method: 'post',
    path: '/designs',
    access: ['admin'],
    body: designBodySchema,
    status: 201,
    handler: ({ m, clock, user, body }) => createDesign(m, clock, user.id, body),
  }),
  // PATCH /api/designs/:designId — change a design family
  route({
    method: 'patch',
    path: '/designs/:designId',
    access: ['admin'],
    params: designParams,
    body: designPatchSchema,
    handler: ({ m, clock, user, params, body }) => updateDesign(m, clock, user.id, params.designId, body),
  }),
];
