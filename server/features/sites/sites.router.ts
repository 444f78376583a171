import { route, type RouteDef } from '../../route-def.js';
import { siteParams } from '../../common/params.js';
import { siteBodySchema, sitePatchSchema } from '../../../shared/schemas/fleet.js';
import { createSite, listSites, updateSite } from './sites.service.js';

export const siteRoutes: RouteDef[] = [
  // GET /api/sites — every site with its time zone
  route({ method: 'get', path: '/sites', access: 'signed-in', handler: ({ m }) => listSites(m) }),
  // POST /api/sites — add a site
  route({ method: 'post', path: '/sites', access: ['admin'], body: siteBodySchema, status: 201, handler: ({ m, clock, user, body }) => createSite(m, clock, user.id, body) }),
  // PATCH /api/sites/:siteId — rename a site or change its time zone
  route({
    method: 'patch',
    path: '/sites/:siteId',
    access: ['admin'],
    params: siteParams,
    body: sitePatchSchema,
    handler: ({ m, clock, user, params, body }) => updateSite(m, clock, user.id, params.siteId, body),
  }),
];
