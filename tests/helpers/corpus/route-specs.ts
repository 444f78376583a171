import type { z } from 'zod';
import type { Access, Method, RouteDef } from '../../../server/route-def.js';

// The route table keeps each route's method, path, access and handlers; the zod schemas and the upload limit a route
// was declared with live only inside its validation closure. The bad-input corpus records them as the routers declare
// their routes: its test file replaces `route()` with `recordingRoute(route)` through `vi.mock`, so every row of the
// real table (built by the real `route()`) is paired with the spec it came from, by method and path (a router may wrap
// its rows in new objects, e.g. to add a header handler).

/** What a route was declared with (the parts the corpus needs). */
export interface RouteSchemas {
  method: Method;
  path: string;
  access: Access;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  /** Largest upload in bytes (routes that take one file under `file`). */
  upload?: number;
  /** Status of a JSON answer on success. */
  status?: number;
}

const specs = new Map<string, RouteSchemas>();

/** Wraps the real `route()`: the same RouteDef, with its spec remembered. */
export function recordingRoute<R extends (spec: never) => RouteDef>(real: R): R {
  return ((spec: RouteSchemas) => {
    const def = (real as unknown as (s: RouteSchemas) => RouteDef)(spec);
    specs.set(routeKey(def), { method: spec.method, path: spec.path, access: spec.access, params: spec.params, query: spec.query, body: spec.body, upload: spec.upload, status: spec.status });
    return def;
  }) as unknown as R;
}

/** The spec a row of the route table was declared with (undefined when it was not made by `route()`). */
export function schemasOf(def: RouteDef): RouteSchemas | undefined {
  return specs.get(routeKey(def));
}

/** "POST /events/:eventId/sessions" — a route's name in the corpus. */
export const routeKey = (r: { method: string; path: string }) => `${r.method.toUpperCase()} ${r.path}`;
