import { fileReply, route, type RouteDef } from '../../route-def.js';
import { caseSchema } from '../../../shared/schemas/case.js';
import { decisionBodySchema, energisedBodySchema, findingBodySchema, followUpCloseSchema, liftRestrictionsBodySchema, screeningRunBodySchema } from '../../../shared/schemas/screening.js';
import { eventParams, followUpParams, screeningParams } from '../../common/params.js';
import { disposition } from '../../common/disposition.js';
import { screeningReportPdf } from '../../reports/report.service.js';
import { assertMayRunScreening, closeFollowUp, decide, liftRestrictions, previewScreening, recordEnergised, recordFinding, runScreening, screenedCase } from './screenings.service.js';

export const screeningRoutes: RouteDef[] = [
  // POST /api/screenings/preview — screen a gapsight-case/1 body; nothing is stored
  route({
    method: 'post',
    path: '/screenings/preview',
    access: 'signed-in',
    body: caseSchema,
    write: false,
    handler: ({ m, body }) => previewScreening(m, body),
  }),
  // POST /api/events/:eventId/screenings — screen the event from its stored readings (a comparison run changes nothing else)
  route({
    method: 'post',
    path: '/events/:eventId/screenings',
    access: ['tester', 'manager', 'engineer', 'admin'],
    params: eventParams,
    body: screeningRunBodySchema,
    status: 201,
    handler: async ({ m, clock, user, params, body, ctx, afterCommit }) => {
      assertMayRunScreening(user.roles, body.comparison);
      const out = await runScreening(m, clock, user.id, params.eventId, body);
      if (out.mailsQueued) afterCommit(() => ctx.kickMail?.());
      return out;
    },
  }),
  // GET /api/screenings/:screeningId/report.pdf — the screening report, rendered from the stored result
  route({
    method: 'get',
    path: '/screenings/:screeningId/report.pdf',
    access: 'signed-in',
    params: screeningParams,
    handler: async ({ m, params, ctx, req }) => {
      const report = await screeningReportPdf(m, params.screeningId, ctx.appUrl ?? `${req.protocol}://${req.get('host')}`);
      return fileReply(report.pdf, 'application/pdf', { 'Content-Disposition': disposition(report.filename, { type: 'inline' }) });
    },
  }),
  // GET /api/screenings/:screeningId/case — the gapsight-case/1 exactly as it was screened (the charts of the evidence
  // are drawn from it: sweep traces, sister values, dissipation at several frequencies)
  route({
    method: 'get',
    path: '/screenings/:screeningId/case',
    access: 'signed-in',
    params: screeningParams,
    handler: ({ m, params }) => screenedCase(m, params.screeningId),
  }),
  // POST /api/screenings/:screeningId/decision — the manager signs off: release, release with restrictions, or hold
  route({
    method: 'post',
    path: '/screenings/:screeningId/decision',
    access: ['manager'],
    params: screeningParams,
    body: decisionBodySchema,
    status: 201,
    handler: async ({ m, clock, user, params, body, ctx, afterCommit }) => {
      const out = await decide(m, clock, user.id, params.screeningId, body);
      afterCommit(() => ctx.kickMail?.());
      return out;
    },
  }),
  // POST /api/follow-ups/:followUpId/close — close a follow-up with its result
  route({
    method: 'post',
    path: '/follow-ups/:followUpId/close',
    access: ['manager', 'tester', 'admin'],
    params: followUpParams,
    body: followUpCloseSchema,
    handler: ({ m, clock, user, params, body }) => closeFollowUp(m, clock, user.id, params.followUpId, body.result),
  }),
  // POST /api/events/:eventId/findings — what an inspection found
  route({
    method: 'post',
    path: '/events/:eventId/findings',
    access: ['engineer', 'admin'],
    params: eventParams,
    body: findingBodySchema,
    status: 201,
    handler: ({ m, clock, user, params, body }) => recordFinding(m, clock, user.id, params.eventId, body),
  }),
  // POST /api/events/:eventId/energised — when the released unit was re-energised; follow-ups count from it
  route({
    method: 'post',
    path: '/events/:eventId/energised',
    access: ['manager', 'admin'],
    params: eventParams,
    body: energisedBodySchema,
    handler: ({ m, clock, user, params, body }) => recordEnergised(m, clock, user.id, params.eventId, body.at),
  }),
  // POST /api/events/:eventId/restrictions/lift — the restrictions of a release with restrictions no longer apply
  route({
    method: 'post',
    path: '/events/:eventId/restrictions/lift',
    access: ['manager', 'admin'],
    params: eventParams,
    body: liftRestrictionsBodySchema,
    handler: ({ m, clock, user, params, body }) => liftRestrictions(m, clock, user.id, params.eventId, body.reason),
  }),
];
