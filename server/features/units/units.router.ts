import type { RouteDef } from '../../route-def.js';
import { validate } from '../../common/validate.js';
import { currentUser } from '../../common/auth.js';
import { idParams, type IdParams } from '../../common/params.js';
import { singleFile, UPLOAD_LIMITS } from '../../common/upload.js';
import { readingSetBodySchema, unitBodySchema, unitListQuerySchema, unitPatchSchema, unitSweepUploadFieldsSchema } from '../../../shared/schemas/fleet.js';
import { ctx } from '../../context.js';
import { parseSweepUpload } from '../readings/sweeps.service.js';
import { addUnitReadingSet, addUnitSweep, createUnit, getUnit, listUnits, updateUnit } from './units.service.js';

export const unitRoutes: RouteDef[] = [
  {
    // GET /api/units — the fleet, paged, filtered and sorted on the server
    method: 'get',
    path: '/units',
    access: 'signed-in',
    handlers: [validate({ query: unitListQuerySchema }), async (req, res) => void res.json(await listUnits(ctx(req).db, res.locals.query))],
  },
  {
    // GET /api/units/:id — a unit with design, site, reading sets and events
    method: 'get',
    path: '/units/:id',
    access: 'signed-in',
    handlers: [validate({ params: idParams }), async (req, res) => void res.json(await getUnit(ctx(req).db, (res.locals.params as IdParams).id))],
  },
  {
    // POST /api/units — add a unit (nameplate defaults from its design)
    method: 'post',
    path: '/units',
    access: ['admin'],
    handlers: [validate({ body: unitBodySchema }), async (req, res) => void res.status(201).json(await createUnit(ctx(req).db, currentUser(res).id, res.locals.body))],
  },
  {
    // PATCH /api/units/:id — change a unit's record
    method: 'patch',
    path: '/units/:id',
    access: ['admin'],
    handlers: [
      validate({ params: idParams, body: unitPatchSchema }),
      async (req, res) => void res.json(await updateUnit(ctx(req).db, currentUser(res).id, (res.locals.params as IdParams).id, res.locals.body)),
    ],
  },
  {
    // POST /api/units/:id/reading-sets — a factory, commissioning or routine reading set
    method: 'post',
    path: '/units/:id/reading-sets',
    access: ['tester', 'admin'],
    handlers: [
      validate({ params: idParams, body: readingSetBodySchema }),
      async (req, res) => void res.status(201).json(await addUnitReadingSet(ctx(req).db, currentUser(res).id, (res.locals.params as IdParams).id, res.locals.body)),
    ],
  },
  {
    // POST /api/units/:id/sweeps — a baseline sweep trace (CSV) on one of the unit's reading sets
    method: 'post',
    path: '/units/:id/sweeps',
    access: ['tester', 'admin'],
    handlers: [
      ...singleFile(UPLOAD_LIMITS.sweepCsvBytes),
      validate({ params: idParams, body: unitSweepUploadFieldsSchema }),
      async (req, res) => {
        const fields = res.locals.body as { readingSetId: number; label: string; testType: never };
        const parsed = parseSweepUpload(req.file!);
        res.status(201).json(await addUnitSweep(ctx(req).db, currentUser(res).id, (res.locals.params as IdParams).id, fields.readingSetId, res.locals.body, parsed, req.file!.originalname));
      },
    ],
  },
];
