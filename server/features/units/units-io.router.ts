import { fileReply, Reply, route, type RouteDef } from '../../route-def.js';
import { UPLOAD_LIMITS } from '../../common/upload.js';
import { disposition } from '../../common/disposition.js';
import { unitParams } from '../../common/params.js';
import { readingSetsImportFieldsSchema, unitExportQuerySchema, unitImportFieldsSchema, unitReadingSetImportFieldsSchema } from '../../../shared/schemas/units-io.js';
import { importReadingSets } from './reading-sets-import.service.js';
import { exportUnits } from './units-export.service.js';
import { importUnitReadingSet, importUnits } from './units-import.service.js';

// Fleet spreadsheets. Registered before the unit routes, so `export` and `import` are never read as a unit id.
export const unitIoRoutes: RouteDef[] = [
  // GET /api/units/export?format=xlsx|csv&… — the fleet table as filtered, as a file
  route({
    method: 'get',
    path: '/units/export',
    access: 'signed-in',
    query: unitExportQuerySchema,
    handler: async ({ m, clock, query }) => {
      const out = await exportUnits(m, clock, query);
      return fileReply(out.data, out.contentType, {
        'Content-Disposition': disposition(out.fileName),
        'X-Total-Count': String(out.total),
        'X-Exported-Count': String(out.written),
      });
    },
  }),
  // POST /api/units/import — units from an .xlsx or CSV file (one a row): all or none; dryRun=true checks only
  route({
    method: 'post',
    path: '/units/import',
    access: ['admin'],
    upload: UPLOAD_LIMITS.unitSheetBytes,
    body: unitImportFieldsSchema,
    status: 201,
    handler: async ({ m, clock, user, body, file }) => {
      const answer = await importUnits(m, clock, user.id, file, { mapping: body.mapping, dryRun: body.dryRun });
      return 'dryRun' in answer ? new Reply({ status: 200, json: answer }) : answer;
    },
  }),
  // POST /api/units/reading-sets/import — reading sets of many units from an .xlsx or CSV file (one reading a row,
  // one set per serial, kind and takenAt): all or none; dryRun=true checks only (not an api.md row)
  route({
    method: 'post',
    path: '/units/reading-sets/import',
    access: ['tester', 'admin'],
    upload: UPLOAD_LIMITS.unitSheetBytes,
    body: readingSetsImportFieldsSchema,
    status: 201,
    handler: async ({ m, clock, user, body, file }) => {
      const answer = await importReadingSets(m, clock, user.id, file, { mapping: body.mapping, dryRun: body.dryRun });
      return 'dryRun' in answer ? new Reply({ status: 200, json: answer }) : answer;
    },
  }),
  // POST /api/units/:unitId/reading-sets/import — a factory, commissioning or routine set from a readings CSV or .xlsx (not an
  // api.md row: the readings CSV of the session import, on the unit file)
  route({
    method: 'post',
    path: '/units/:unitId/reading-sets/import',
    access: ['tester', 'admin'],
    upload: UPLOAD_LIMITS.readingsCsvBytes,
    params: unitParams,
    body: unitReadingSetImportFieldsSchema,
    status: 201,
    handler: ({ m, clock, user, params, body, file }) => importUnitReadingSet(m, clock, user.id, params.unitId, body, file),
  }),
];
