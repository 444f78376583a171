import { fileReply, route, type RouteDef } from '../../route-def.js';
import { eventParams, screeningParams, unitParams } from '../../common/params.js';
import { exportFormatQuerySchema } from '../../../shared/schemas/exports.js';
import { disposition } from '../../common/disposition.js';
import { exportEventAudit, exportScreeningIndicators, exportUnitReadings } from './exports.service.js';

const download = (out: { data: Buffer; contentType: string; fileName: string; written: number }) =>
  fileReply(out.data, out.contentType, { 'Content-Disposition': disposition(out.fileName, { utf8: 'always' }), 'X-Exported-Count': String(out.written) });

// Spreadsheet exports (.xlsx or CSV) of a unit's readings, a screening's indicators and an event's audit trail.
export const exportRoutes: RouteDef[] = [
  // GET /api/units/:unitId/readings/export?format=xlsx|csv
  route({
    method: 'get',
    path: '/units/:unitId/readings/export',
    access: 'signed-in',
    params: unitParams,
    query: exportFormatQuerySchema,
    handler: async ({ m, clock, params, query }) => download(await exportUnitReadings(m, clock, params.unitId, query.format)),
  }),
  // GET /api/screenings/:screeningId/indicators/export?format=xlsx|csv
  route({
    method: 'get',
    path: '/screenings/:screeningId/indicators/export',
    access: 'signed-in',
    params: screeningParams,
    query: exportFormatQuerySchema,
    handler: async ({ m, clock, params, query }) => download(await exportScreeningIndicators(m, clock, params.screeningId, query.format)),
  }),
  // GET /api/events/:eventId/audit/export?format=xlsx|csv
  route({
    method: 'get',
    path: '/events/:eventId/audit/export',
    access: 'signed-in',
    params: eventParams,
    query: exportFormatQuerySchema,
    handler: async ({ m, clock, params, query }) => download(await exportEventAudit(m, clock, params.eventId, query.format)),
  }),
];
