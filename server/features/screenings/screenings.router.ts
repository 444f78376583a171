import type { RouteDef } from '../../route-def.js';
import { parseCase } from '../../../shared/schemas/case.js';
import { decisionBodySchema, findingBodySchema, followUpCloseSchema, screeningRunBodySchema, type DecisionBody } from '../../../shared/schemas/screening.js';
import { screenCase } from '../../../shared/screening/index.js';
import { AppError } from '../../common/app-error.js';
import { currentUser } from '../../common/auth.js';
import { idParams, type IdParams } from '../../common/params.js';
import { validate } from '../../common/validate.js';
import { ctx } from '../../context.js';
import { renderPdf } from '../../reports/pdf.js';
import { loadReportData } from '../../reports/report-data.service.js';
import { buildReportDocDefinition } from '../../reports/screening-report.js';
import { loadCriteria } from '../criteria/criteria.service.js';
import { closeFollowUp, decide, recordFinding, runScreening } from './screenings.service.js';

const paramId = (res: { locals: Record<string, unknown> }) => (res.locals.params as IdParams).id;

export const screeningRoutes: RouteDef[] = [
  {
    // POST /api/screenings/preview — screen a gapsight-case/1 body; nothing is stored
    method: 'post',
    path: '/screenings/preview',
    access: 'signed-in',
    handlers: [
      async (req, res) => {
        const parsed = parseCase(req.body);
        if (!parsed.ok) {
          throw new AppError('invalid_case', 'The case is invalid.', 400, Object.fromEntries(parsed.errors.map((e) => [e.path || '(case)', e.message])));
        }
        const { criteria } = await loadCriteria(ctx(req).db.manager);
        res.json(screenCase(parsed.value, criteria));
      },
    ],
  },
  {
    // POST /api/events/:id/screenings — screen the event from its stored readings (a comparison run changes nothing else)
    method: 'post',
    path: '/events/:id/screenings',
    access: ['tester', 'manager', 'engineer', 'admin'],
    handlers: [
      validate({ params: idParams, body: screeningRunBodySchema }),
      async (req, res) => void res.status(201).json(await runScreening(ctx(req), currentUser(res).id, paramId(res), res.locals.body)),
    ],
  },
  {
    // GET /api/screenings/:id/report.pdf — the screening report, rendered from the stored result
    method: 'get',
    path: '/screenings/:id/report.pdf',
    access: 'signed-in',
    handlers: [
      validate({ params: idParams }),
      async (req, res) => {
        const c = ctx(req);
        const data = await loadReportData(c.db.manager, paramId(res), c.appUrl ?? `${req.protocol}://${req.get('host')}`);
        const pdf = await renderPdf(buildReportDocDefinition(data));
        res.setHeader('Content-Type', 'application/pdf');
        res.setHeader('Content-Disposition', `inline; filename="gapsight-${data.unit.serial}-screening-${data.screening.id}.pdf"`);
        res.send(pdf);
      },
    ],
  },
  {
    // POST /api/screenings/:id/decision — the manager signs off: release, release with restrictions, or hold
    method: 'post',
    path: '/screenings/:id/decision',
    access: ['manager'],
    handlers: [
      validate({ params: idParams, body: decisionBodySchema }),
      async (req, res) => void res.status(201).json(await decide(ctx(req).db, currentUser(res).id, paramId(res), res.locals.body as DecisionBody)),
    ],
  },
  {
    // POST /api/follow-ups/:id/close — close a follow-up with its result
    method: 'post',
    path: '/follow-ups/:id/close',
    access: ['manager', 'tester', 'admin'],
    handlers: [
      validate({ params: idParams, body: followUpCloseSchema }),
      async (req, res) => void res.json(await closeFollowUp(ctx(req).db, currentUser(res).id, paramId(res), (res.locals.body as { result: string }).result)),
    ],
  },
  {
    // POST /api/events/:id/findings — what an inspection found
    method: 'post',
    path: '/events/:id/findings',
    access: ['engineer', 'admin'],
    handlers: [
      validate({ params: idParams, body: findingBodySchema }),
      async (req, res) => void res.status(201).json(await recordFinding(ctx(req).db, currentUser(res).id, paramId(res), res.locals.body)),
    ],
  },
];
