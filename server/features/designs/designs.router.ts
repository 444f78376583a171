import { route, type RouteDef } from '../../route-def.js';
import { designParams } from '../../common/params.js';
import { designBodySchema, designPatchSchema } from '../../../shared/schemas/fleet.js';
import { createDesign, getDesign, listDesigns, updateDesign } from './designs.service.js';

export const designRoutes: RouteDef[] = [
  // GET /api/designs — design families with their unit counts
  route({ method: 'get', path: '/designs', access: 'signed-in', handler: ({ m }) => listDesigns(m) }),
  // GET /api/designs/:designId — one design with its sister units
  route({ method: 'get', path: '/designs/:designId', access: 'signed-in', params: designParams, handler: ({ m, params }) => getDesign(m, params.designId) }),
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
