import type { RouteDef } from '../../route-def.js';
import { validate } from '../../common/validate.js';
import { currentUser } from '../../common/auth.js';
import { idParams, type IdParams } from '../../common/params.js';
import { designBodySchema, designPatchSchema } from '../../../shared/schemas/fleet.js';
import { ctx } from '../../context.js';
import { createDesign, getDesign, listDesigns, updateDesign } from './designs.service.js';

export const designRoutes: RouteDef[] = [
  // GET /api/designs — design families with their unit counts
  { method: 'get', path: '/designs', access: 'signed-in', handlers: [async (req, res) => void res.json(await listDesigns(ctx(req).db))] },
  {
    // GET /api/designs/:id — one design with its sister units
    method: 'get',
    path: '/designs/:id',
    access: 'signed-in',
    handlers: [validate({ params: idParams }), async (req, res) => void res.json(await getDesign(ctx(req).db, (res.locals.params as IdParams).id))],
  },
  {
    // POST /api/designs — add a design family
    method: 'post',
    path: '/designs',
    access: ['admin'],
    handlers: [validate({ body: designBodySchema }), async (req, res) => void res.status(201).json(await createDesign(ctx(req).db, currentUser(res).id, res.locals.body))],
  },
  {
    // PATCH /api/designs/:id — change a design family
    method: 'patch',
    path: '/designs/:id',
    access: ['admin'],
    handlers: [
      validate({ params: idParams, body: designPatchSchema }),
      async (req, res) => void res.json(await updateDesign(ctx(req).db, currentUser(res).id, (res.locals.params as IdParams).id, res.locals.body)),
    ],
  },
];
