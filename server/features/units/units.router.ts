import { route, type RouteDef } from '../../route-def.js';
import { unitParams } from '../../common/params.js';
import { UPLOAD_LIMITS } from '../../common/upload.js';
import { readingSetBodySchema, unitBodySchema, unitListQuerySchema, unitPatchSchema, unitSweepUploadFieldsSchema } from '../../../shared/schemas/fleet.js';
import { parseSweepUpload } from '../readings/sweeps.service.js';
import { addUnitReadingSet, addUnitSweep, createUnit, getUnit, listUnits, updateUnit } from './units.service.js';

export const unitRoutes: RouteDef[] = [
  // GET /api/units — the fleet, paged, filtered and sorted on the server
  route({ method: 'get', path: '/units', access: 'signed-in', query: unitListQuerySchema, handler: ({ m, query }) => listUnits(m, query) }),
  // GET /api/units/:unitId — a unit with design, site, reading sets and events
  route({ method: 'get', path: '/units/:unitId', access: 'signed-in', params: unitParams, handler: ({ m, params }) => getUnit(m, params.unitId) }),
  // POST /api/units — add a unit (nameplate defaults from its design)
  route({
    method: 'post',
    path: '/units',
    access: ['admin'],
    body: unitBodySchema,
    status: 201,
    handler: ({ m, clock, user, body }) => createUnit(m, clock, user.id, body),
  }),
  // PATCH /api/units/:unitId — change a unit's record
  route({
    method: 'patch',
    path: '/units/:unitId',
    access: ['admin'],
    params: unitParams,
    body: unitPatchSchema,
    handler: ({ m, clock, user, params, body }) => updateUnit(m, clock, user.id, params.unitId, body),
  }),
  // POST /api/units/:unitId/reading-sets — a factory, commissioning or routine reading set
  route({
    method: 'post',
    path: '/units/:unitId/reading-sets',
    access: ['tester', 'admin'],
    params: unitParams,
    body: readingSetBodySchema,
    status: 201,
    handler: ({ m, clock, user, params, body }) => addUnitReadingSet(m, clock, user.id, params.unitId, body),
  }),
  // POST /api/units/:unitId/sweeps — a baseline sweep trace (CSV) on one of the unit's reading sets
  route({
    method: 'post',
    path: '/units/:unitId/sweeps',
    access: ['tester', 'admin'],
    upload: UPLOAD_LIMITS.sweepCsvBytes,
    params: unitParams,
    body: unitSweepUploadFieldsSchema,
    status: 201,
    handler: ({ m, clock, user, params, body, file }) =>
      addUnitSweep(m, clock, user.id, params.unitId, body.readingSetId, body, parseSweepUpload(file), file.originalname),
  }),
];
