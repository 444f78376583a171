import type { RequestHandler } from 'express';
import type { Role } from '../shared/schemas/roles.js';

/** Who may call a route: anyone, any signed-in user, or the listed roles. */
export type Access = 'public' | 'signed-in' | readonly Role[];

/** One row of the declared route table the API router is built from (and the role-matrix test reads). */
export interface RouteDef {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** Path under /api, Express syntax (`/units/:id`). */
  path: string;
  access: Access;
  handlers: RequestHandler[];
}
