import { fileReply, route, type RouteDef } from '../../route-def.js';
import { attachmentParams, eventParams, sessionParams, sweepParams } from '../../common/params.js';
import { UPLOAD_LIMITS } from '../../common/upload.js';
import { eventBodySchema, eventListQuerySchema, eventPatchSchema, sessionBodySchema, sessionPatchSchema, sweepUploadFieldsSchema } from '../../../shared/schemas/fleet.js';
import { addEventAttachment, getEventAttachment } from '../attachments/attachments.service.js';
import { disposition } from '../../common/disposition.js';
import { getSweep, parseSweepUpload } from '../readings/sweeps.service.js';
import { buildEventCase } from './case-export.service.js';
import { correctEvent, logEvent } from './events.service.js';
import { getEvent, listEvents } from './events.query.js';
import { addSessionSweep, correctSession, createSession, importReadingsCsv } from './sessions.service.js';

export const eventRoutes: RouteDef[] = [
  // POST /api/events — log a fault event; answers its through-fault duty
  route({
    method: 'post',
    path: '/events',
    access: ['protection', 'admin'],
    body: eventBodySchema,
    status: 201,
    handler: ({ m, clock, user, body }) => logEvent(m, clock, user.id, body),
  }),
  // GET /api/events — one page of events: by unit serial, site, unit, statuses, fault types, dates, relay records; sorted
  route({
    method: 'get',
    path: '/events',
    access: 'signed-in',
    query: eventListQuerySchema,
    handler: ({ m, query }) => listEvents(m, query),
  }),
  // GET /api/events/:eventId — the event file
  route({
    method: 'get',
    path: '/events/:eventId',
    access: 'signed-in',
    params: eventParams,
    handler: ({ m, params }) => getEvent(m, params.eventId),
  }),
  // PATCH /api/events/:eventId — correct a logged fault's facts before a decision (409 after); answers the recomputed duty
  route({
    method: 'patch',
    path: '/events/:eventId',
    access: ['protection', 'admin'],
    params: eventParams,
    body: eventPatchSchema,
    handler: ({ m, clock, user, params, body }) => correctEvent(m, clock, user.id, params.eventId, body),
  }),
  // GET /api/events/:eventId/case — the event as a gapsight-case/1 document
  route({
    method: 'get',
    path: '/events/:eventId/case',
    access: 'signed-in',
    params: eventParams,
    handler: ({ m, params }) => buildEventCase(m, params.eventId),
  }),
  // POST /api/events/:eventId/attachments — a relay record (COMTRADE, CSV, PDF, text)
  route({
    method: 'post',
    path: '/events/:eventId/attachments',
    access: ['protection', 'admin'],
    upload: UPLOAD_LIMITS.attachmentBytes,
    params: eventParams,
    status: 201,
    handler: ({ m, clock, user, params, file }) => addEventAttachment(m, clock, user.id, params.eventId, file),
  }),
  // GET /api/events/:eventId/attachments/:attachmentId — download a stored relay record
  route({
    method: 'get',
    path: '/events/:eventId/attachments/:attachmentId',
    access: 'signed-in',
    params: attachmentParams,
    handler: async ({ m, params }) => {
      const a = await getEventAttachment(m, params.eventId, params.attachmentId);
      return fileReply(a.data, a.contentType, {
        'Content-Disposition': disposition(a.name, { utf8: 'always' }),
        'X-Content-SHA256': a.sha256,
      });
    },
  }),
  // POST /api/events/:eventId/sessions — a post-fault session with its readings; the event moves to testing
  route({
    method: 'post',
    path: '/events/:eventId/sessions',
    access: ['tester', 'admin'],
    params: eventParams,
    body: sessionBodySchema,
    status: 201,
    handler: ({ m, clock, user, params, body }) => createSession(m, clock, user.id, params.eventId, body),
  }),
  // PATCH /api/sessions/:sessionId — correct a session's conditions and readings before its screening is decided
  route({
    method: 'patch',
    path: '/sessions/:sessionId',
    access: ['tester', 'admin'],
    params: sessionParams,
    body: sessionPatchSchema,
    handler: ({ m, clock, user, params, body }) => correctSession(m, clock, user.id, params.sessionId, body),
  }),
  // POST /api/sessions/:sessionId/imports — a readings CSV into a session: all rows or none
  route({
    method: 'post',
    path: '/sessions/:sessionId/imports',
    access: ['tester', 'admin'],
    upload: UPLOAD_LIMITS.readingsCsvBytes,
    params: sessionParams,
    handler: ({ m, clock, user, params, file }) => importReadingsCsv(m, clock, user.id, params.sessionId, file),
  }),
  // POST /api/sessions/:sessionId/sweeps — a post-fault sweep trace (CSV)
  route({
    method: 'post',
    path: '/sessions/:sessionId/sweeps',
    access: ['tester', 'admin'],
    upload: UPLOAD_LIMITS.sweepCsvBytes,
    params: sessionParams,
    body: sweepUploadFieldsSchema,
    status: 201,
    handler: ({ m, clock, user, params, body, file }) => addSessionSweep(m, clock, user.id, params.sessionId, body, parseSweepUpload(file), file.originalname),
  }),
  // GET /api/sweeps/:sweepId — one trace with its points (overlay charts)
  route({
    method: 'get',
    path: '/sweeps/:sweepId',
    access: 'signed-in',
    params: sweepParams,
    handler: ({ m, params }) => getSweep(m, params.sweepId),
  }),
];
