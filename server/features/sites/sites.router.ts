import type { RouteDef } from '../../route-def.js';
import { validate } from '../../common/validate.js';
import { currentUser } from '../../common/auth.js';
import { idParams, type IdParams } from '../../common/params.js';
import { siteBodySchema, sitePatchSchema } from '../../../shared/schemas/fleet.js';
import { ctx } from '../../context.js';
import { createSite, listSites, updateSite } from './sites.service.js';

export const siteRoutes: RouteDef[] = [
  // GET /api/sites — every site with its time zone
  { method: 'get', path: '/sites', access: 'signed-in', handlers: [async (req, res) => void res.json(await listSites(ctx(req).db))] },
  {
    // POST /api/sites — add a site
    method: 'post',
    path: '/sites',
    access: ['admin'],
    handlers: [validate({ body: siteBodySchema }), async (req, res) => void res.status(201).json(await createSite(ctx(req).db, currentUser(res).id, res.locals.body))],
  },
  {
    // PATCH /api/sites/:id — rename a site or change its time zone
    method: 'patch',
    path: '/sites/:id',
    access: ['admin'],
    handlers: [
      validate({ params: idParams, body: sitePatchSchema }),
      async (req, res) => void res.json(await updateSite(ctx(req).db, currentUser(res).id, (res.locals.params as IdParams).id, res.locals.body)),
    ],
  },
];
