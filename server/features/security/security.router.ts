import { route, type RouteDef } from '../../route-def.js';
import { securityEventQuerySchema } from '../../../shared/schemas/auth.js';
import { listSecurityEvents } from './security.service.js';

export const securityRoutes: RouteDef[] = [
  // GET /api/security-events — the security log (failed, throttled and refused sign-ins, locks, unlocks, authorization
  // refusals), newest first, one page at a time
  route({ method: 'get', path: '/security-events', access: ['admin'], query: securityEventQuerySchema, handler: ({ m, query }) => listSecurityEvents(m, query) }),
];
