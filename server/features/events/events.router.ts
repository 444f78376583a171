import type { RouteDef } from '../../route-def.js';
import { validate } from '../../common/validate.js';
import { currentUser } from '../../common/auth.js';
import { attachmentParams, idParams, type IdParams } from '../../common/params.js';
import { singleFile, UPLOAD_LIMITS } from '../../common/upload.js';
import { eventBodySchema, eventListQuerySchema, sessionBodySchema, sweepUploadFieldsSchema, type EventBody } from '../../../shared/schemas/fleet.js';
import { notFound } from '../../common/app-error.js';
import { ctx } from '../../context.js';
import { addEventAttachment, getEventAttachment } from '../attachments/attachments.service.js';
import { SweepTrace } from '../readings/sweep-trace.entity.js';
import { parseSweepUpload, sweepMeta } from '../readings/sweeps.service.js';
import { Unit } from '../units/unit.entity.js';
import { buildEventCase } from './case-export.service.js';
import { createEventRow } from './events.service.js';
import { eventThroughFault, eventView, getEvent, listEvents } from './events.query.js';
import { addSessionSweep, createSession, importReadingsCsv } from './sessions.service.js';

const eventId = (res: { locals: Record<string, unknown> }) => (res.locals.params as IdParams).id;

export const eventRoutes: RouteDef[] = [
  {
    // POST /api/events — log a fault event; answers its through-fault duty
    method: 'post',
    path: '/events',
    access: ['protection', 'admin'],
    handlers: [
      validate({ body: eventBodySchema }),
      async (req, res) => {
        const { db } = ctx(req);
        const event = await db.transaction((m) => createEventRow(m, res.locals.body as EventBody, currentUser(res).id));
        const unit = await db.getRepository(Unit).findOneOrFail({ where: { id: event.unitId }, relations: { design: true } });
        res.status(201).json({ ...eventView(event), throughFault: await eventThroughFault(db, event, unit) });
      },
    ],
  },
  {
    // GET /api/events — events, newest first, by status, unit or site
    method: 'get',
    path: '/events',
    access: 'signed-in',
    handlers: [validate({ query: eventListQuerySchema }), async (req, res) => void res.json(await listEvents(ctx(req).db, res.locals.query))],
  },
  {
    // GET /api/events/:id — the event file
    method: 'get',
    path: '/events/:id',
    access: 'signed-in',
    handlers: [validate({ params: idParams }), async (req, res) => void res.json(await getEvent(ctx(req).db, eventId(res)))],
  },
  {
    // GET /api/events/:id/case — the event as a gapsight-case/1 document
    method: 'get',
    path: '/events/:id/case',
    access: 'signed-in',
    handlers: [validate({ params: idParams }), async (req, res) => void res.json(await ctx(req).db.transaction((m) => buildEventCase(m, eventId(res))))],
  },
  {
    // POST /api/events/:id/attachments — a relay record (COMTRADE, CSV, PDF, text)
    method: 'post',
    path: '/events/:id/attachments',
    access: ['protection', 'admin'],
    handlers: [
      ...singleFile(UPLOAD_LIMITS.attachmentBytes),
      validate({ params: idParams }),
      async (req, res) => void res.status(201).json(await addEventAttachment(ctx(req).db, currentUser(res).id, eventId(res), req.file!)),
    ],
  },
  {
    // GET /api/events/:id/attachments/:attachmentId — download a stored relay record
    method: 'get',
    path: '/events/:id/attachments/:attachmentId',
    access: 'signed-in',
    handlers: [
      validate({ params: attachmentParams }),
      async (req, res) => {
        const p = res.locals.params as { id: number; attachmentId: number };
        const a = await getEventAttachment(ctx(req).db, p.id, p.attachmentId);
        res.setHeader('Content-Type', a.contentType);
        res.setHeader('Content-Disposition', `attachment; filename="${a.name.replace(/"/g, '')}"`);
        res.setHeader('X-Content-SHA256', a.sha256);
        res.send(a.data);
      },
    ],
  },
  {
    // POST /api/events/:id/sessions — a post-fault session with its readings; the event moves to testing
    method: 'post',
    path: '/events/:id/sessions',
    access: ['tester', 'admin'],
    handlers: [
      validate({ params: idParams, body: sessionBodySchema }),
      async (req, res) => void res.status(201).json(await createSession(ctx(req).db, currentUser(res).id, eventId(res), res.locals.body)),
    ],
  },
  {
    // POST /api/sessions/:id/imports — a readings CSV into a session: all rows or none
    method: 'post',
    path: '/sessions/:id/imports',
    access: ['tester', 'admin'],
    handlers: [
      ...singleFile(UPLOAD_LIMITS.readingsCsvBytes),
      validate({ params: idParams }),
      async (req, res) => void res.json(await importReadingsCsv(ctx(req).db, currentUser(res).id, eventId(res), req.file!)),
    ],
  },
  {
    // POST /api/sessions/:id/sweeps — a post-fault sweep trace (CSV)
    method: 'post',
    path: '/sessions/:id/sweeps',
    access: ['tester', 'admin'],
    handlers: [
      ...singleFile(UPLOAD_LIMITS.sweepCsvBytes),
      validate({ params: idParams, body: sweepUploadFieldsSchema }),
      async (req, res) => {
        const parsed = parseSweepUpload(req.file!);
        res.status(201).json(await addSessionSweep(ctx(req).db, currentUser(res).id, eventId(res), res.locals.body, parsed, req.file!.originalname));
      },
    ],
  },
  {
    // GET /api/sweeps/:id — one trace with its points (overlay charts)
    method: 'get',
    path: '/sweeps/:id',
    access: 'signed-in',
    handlers: [
      validate({ params: idParams }),
      async (req, res) => {
        const t = await ctx(req).db.getRepository(SweepTrace).findOne({ where: { id: eventId(res) } });
        if (!t) throw notFound('Sweep trace');
        res.json({ ...sweepMeta(t), points: t.points });
      },
    ],
  },
];
