import type { RouteDef } from '../../route-def.js';
import { parseCase } from '../../../shared/schemas/case.js';
import { screenCase } from '../../../shared/screening/index.js';
import { AppError } from '../../common/app-error.js';
import { ctx } from '../../context.js';
import { loadCriteria } from '../criteria/criteria.service.js';

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
];
