import type { Request, RequestHandler, Response } from 'express';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { UserDto } from '../shared/schemas/auth.js';
import type { Role } from '../shared/schemas/roles.js';
import type { Clock } from './common/clock.js';
import { AppError } from './common/app-error.js';
import { loneSurrogateFields } from './common/unicode.js';
import { singleFile } from './common/upload.js';
import { validate } from './common/validate.js';
import { ctx, type AppContext } from './context.js';

/** Who may call a route: anyone, any signed-in user, or the listed roles. */
export type Access = 'public' | 'signed-in' | readonly Role[];

export type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** One row of the declared route table the API router is built from (and the role-matrix test reads). */
export interface RouteDef {
  method: Method;
  /** Path under /api, Express syntax (`/units/:unitId`). */
  path: string;
  access: Access;
  handlers: RequestHandler[];
}

type Parsed<S> = S extends z.ZodType ? z.output<S> : undefined;

/** What a route's handler receives: parsed input, the signed-in user, the request's entity manager and clock. */
export interface RouteInput<A extends Access, P, Q, B, F> {
  params: Parsed<P>;
  query: Parsed<Q>;
  body: Parsed<B>;
  /** The signed-in user (undefined only on public routes). */
  user: A extends 'public' ? UserDto | undefined : UserDto;
  /** The request's transaction on write routes; the data source's manager on reads. */
  m: EntityManager;
  clock: Clock;
  ctx: AppContext;
  /** The uploaded file (routes with `upload`). */
  file: F extends number ? Express.Multer.File : undefined;
  /** Work to do once the transaction has committed (e.g. kick the mail worker). */
  afterCommit(fn: () => void): void;
  req: Request;
}

/** An answer other than JSON with the route's status: another status, headers, or bytes. */
export class Reply {
  constructor(
    readonly opts: { status?: number; headers?: Record<string, string>; json?: unknown; data?: Buffer; contentType?: string },
  ) {}
}

/** Bytes with their content type (PDF, a stored attachment). */
export const fileReply = (data: Buffer, contentType: string, headers: Record<string, string> = {}) => new Reply({ data, contentType, headers });

export interface RouteSpec<A extends Access, P, Q, B, F, R> {
  method: Method;
  path: string;
  access: A;
  params?: P;
  query?: Q;
  body?: B;
  /** One file under the multipart field `file`, at most this many bytes. */
  upload?: F;
  /** Runs the handler in one transaction (default: every method but GET). */
  write?: boolean;
  /** Status of a JSON answer (default 200). */
  status?: number;
  handler(input: RouteInput<A, P, Q, B, F>): Promise<R> | R;
}

/**
 * One route: upload (if any) → validate params, query and body with their zod schemas (400 naming every bad field) →
 * the handler, inside one transaction on write routes → its value as JSON (or a Reply) → the afterCommit work.
 */
export function route<
  A extends Access,
  P extends z.ZodType | undefined = undefined,
  Q extends z.ZodType | undefined = undefined,
  B extends z.ZodType | undefined = undefined,
  F extends number | undefined = undefined,
  R = unknown,
>(spec: RouteSpec<A, P, Q, B, F, R>): RouteDef {
  const write = spec.write ?? spec.method !== 'get';
  const parts = { params: spec.params, query: spec.query, body: spec.body };
  const validates = parts.params || parts.query || parts.body;
  const handlers: RequestHandler[] = [
    ...(spec.body && spec.upload === undefined ? [jsonOnly] : []),
    ...(spec.upload !== undefined ? singleFile(spec.upload) : []),
    wellFormedText,
    ...(validates ? [validate(parts as { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType })] : []),
    async (req, res) => {
      const c = ctx(req);
      const after: (() => void)[] = [];
      const run = async (m: EntityManager) =>
        spec.handler({
          params: res.locals.params,
          query: res.locals.query,
          body: res.locals.body,
          user: res.locals.user,
          m,
          clock: c.clock,
          ctx: c,
          file: req.file as RouteInput<A, P, Q, B, F>['file'],
          afterCommit: (fn) => void after.push(fn),
          req,
        });
      const out = write ? await c.db.transaction(run) : await run(c.db.manager);
      send(res, out, spec.status ?? 200);
      for (const fn of after) {
        try {
          fn();
        } catch (err) {
          req.log.error({ err }, 'after-commit work failed');
        }
      }
    },
  ];
  return { method: spec.method, path: spec.path, access: spec.access, handlers };
}

/** True when the request carries body bytes (chunked, or a Content-Length above 0). */
function hasBodyBytes(req: Request): boolean {
  if (req.headers['transfer-encoding'] !== undefined) return true;
  const n = Number(req.headers['content-length']);
  return Number.isFinite(n) && n > 0;
}

// A route that takes a JSON body answers 415 to a body of another type (text/plain, form-encoded, none), which the JSON
// parser would otherwise leave unread and the route would see as `{}`.
const jsonOnly: RequestHandler = (req, _res, next) => {
  if (hasBodyBytes(req) && !req.is('application/json')) {
    const sent = req.headers['content-type'] ? `"${req.headers['content-type'].split(';')[0]!.trim()}"` : 'no content type';
    return next(new AppError('unsupported_media_type', `This route takes a JSON body: send it with Content-Type "application/json" (the request had ${sent}).`, 415));
  }
  next();
};

// Every string of the parsed body, query and path (keys too) must be well-formed Unicode: JSON.parse accepts a lone
// surrogate ("\ud800"), which the database's utf8mb4 columns reject. 400 naming each field.
const wellFormedText: RequestHandler = (req, _res, next) => {
  const fields = { ...loneSurrogateFields(req.params, 'params'), ...loneSurrogateFields(req.query, 'query'), ...loneSurrogateFields(req.body) };
  if (Object.keys(fields).length) return next(new AppError('invalid_input', 'Some fields are invalid.', 400, fields));
  next();
};

function send(res: Response, out: unknown, status: number): void {
  if (!(out instanceof Reply)) {
    res.status(status).json(out);
    return;
  }
  const o = out.opts;
  for (const [k, v] of Object.entries(o.headers ?? {})) res.setHeader(k, v);
  res.status(o.status ?? status);
  if (o.data) {
    if (o.contentType) res.setHeader('Content-Type', o.contentType);
    res.send(o.data);
  } else res.json(o.json ?? null);
}
