import { Router } from 'express';
import { authenticate, requireRoles } from './common/auth.js';
import type { RouteDef } from './route-def.js';
import { authRoutes } from './features/auth/auth.router.js';
import { healthRoutes } from './features/health/health.router.js';
import { notificationRoutes } from './features/notifications/notifications.router.js';
import { outboxRoutes } from './features/outbox/outbox.router.js';
import { userRoutes } from './features/users/users.router.js';
import { siteRoutes } from './features/sites/sites.router.js';
import { designRoutes } from './features/designs/designs.router.js';
import { unitRoutes } from './features/units/units.router.js';
import { unitIoRoutes } from './features/units/units-io.router.js';
import { eventRoutes } from './features/events/events.router.js';
import { readingSetRoutes } from './features/readings/reading-sets.router.js';
import { screeningRoutes } from './features/screenings/screenings.router.js';
import { followUpRoutes } from './features/follow-ups/follow-ups.router.js';
import { findingRoutes } from './features/findings/findings.router.js';
import { exportRoutes } from './features/exports/exports.router.js';
import { criteriaRoutes } from './features/criteria/criteria.router.js';
import { securityRoutes } from './features/security/security.router.js';

/** Every API route with who may call it; the router is built from this table and the role-matrix test reads it. */
export const routeTable: RouteDef[] = [
  ...healthRoutes,
  ...authRoutes,
  ...userRoutes,
  ...siteRoutes,
  ...designRoutes,
  ...unitIoRoutes,
  ...unitRoutes,
  ...eventRoutes,
  ...readingSetRoutes,
  ...screeningRoutes,
  ...followUpRoutes,
  ...findingRoutes,
  ...exportRoutes,
  ...criteriaRoutes,
  ...outboxRoutes,
  ...notificationRoutes,
  ...securityRoutes,
];

/** The /api router: authentication and role guards come from each row's access. */
export function buildApiRouter(table: RouteDef[] = routeTable): Router {
  const router = Router();
  for (const r of table) {
    const guards = r.access === 'public' ? [] : r.access === 'signed-in' ? [authenticate] : [authenticate, requireRoles(r.access)];
    router[r.method](r.path, ...guards, ...r.handlers);
  }
  return router;
}
