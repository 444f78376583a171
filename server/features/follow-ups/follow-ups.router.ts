import { route, type RouteDef } from '../../route-def.js';
import { followUpListQuerySchema } from '../../../shared/schemas/fleet.js';
import { listFollowUps } from './follow-ups.query.js';

export const followUpRoutes: RouteDef[] = [
  // GET /api/follow-ups — open follow-ups across events: overdue, due this week, or all open; optionally one site
  route({
    method: 'get',
    path: '/follow-ups',
    access: 'signed-in',
    query: followUpListQuerySchema,
    handler: ({ m, clock, query }) => listFollowUps(m, clock, query),
  }),
];
