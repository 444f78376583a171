import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { requestId } from '../logger.js';
import { AppError } from './app-error.js';

// JSON 404 for unknown API routes.
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.originalUrl}.` } });
};

// Turns every error into `{ error: { code, message, fields? } }`; never a stack trace to the client.
// A 5xx answer also carries the request id, which the log line of the error has too.
export const errorHandler: ErrorRequestHandler = (err, req, res, next) => {
  if (res.headersSent) {
    // Too late for a JSON answer (a stream failed half-way): log it and let Express end the connection.
    req.log?.error({ err }, 'error after the answer started');
    next(err);
    return;
  }
  if (err instanceof AppError) {
    if (err.headers) for (const [k, v] of Object.entries(err.headers)) res.setHeader(k, v);
    const serverSide = err.status >= 500 ? { requestId: requestId(req) } : {};
    if (err.status >= 500) req.log?.error({ err }, 'request failed');
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}), ...serverSide } });
    return;
  }
  if (err instanceof multer.MulterError) {
    const tooLarge = err.code === 'LIMIT_FILE_SIZE';
    res.status(tooLarge ? 413 : 400).json({
      error: {
        code: tooLarge ? 'file_too_large' : 'invalid_upload',
        message: tooLarge ? 'The file is larger than the upload limit.' : `Upload rejected: ${err.message}.`,
        fields: { [err.field ?? 'file']: tooLarge ? 'too large' : err.message },
      },
    });
    return;
  }
  const fault = databaseFault(err);
  if (fault === 'unavailable') {
    // Expected while the database restarts: a warning with the driver's code, not a stack trace per request.
    req.log?.warn({ code: faultCode(err) }, 'database unavailable');
    res.setHeader('Retry-After', String(DB_RETRY_AFTER_SECONDS));
    res.status(503).json({ error: { code: 'db_unavailable', message: 'The database is not reachable; try again in a moment.', requestId: requestId(req) } });
    return;
  }
  if (fault === 'deadlock') {
    res.status(409).json({
      error: { code: 'conflict', message: 'Another change to the same records was being saved at the same moment; nothing of this request was saved. Try again.' },
    });
    return;
  }
  const dup = duplicateEntry(err, req.app.locals.ctx?.db as DataSource | undefined);
  if (dup) {
    res.status(409).json({ error: { code: 'conflict', message: dup.message, ...(dup.fields ? { fields: dup.fields } : {}) } });
    return;
  }
  // body-parser errors (bad JSON, body too large) carry a status and a type.
  const e = err as { status?: number; type?: string; message?: string };
  if (e && typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    const code = e.type === 'entity.parse.failed' ? 'invalid_json' : e.type === 'entity.too.large' ? 'body_too_large' : 'bad_request';
    const message = code === 'invalid_json' ? 'The request body is not valid JSON.' : code === 'body_too_large' ? 'The request body is too large.' : 'Bad request.';
    res.status(e.status).json({ error: { code, message } });
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({
    error: { code: 'internal', message: 'Something went wrong on the server; the error was logged.', requestId: requestId(req) },
  });
};

/**
 * A unique-key violation from MariaDB (ER_DUP_ENTRY, errno 1062: two requests created the same serial, name, e-mail at
 * once, after each checked it was free) as a 409 naming the field when the key is a known entity's unique index
 * ("serial: a unit with this serial already exists."), a generic 409 otherwise; undefined for any other error.
 */
export function duplicateEntry(err: unknown, db?: DataSource): { message: string; fields?: Record<string, string> } | undefined {
  const e = err as { code?: string; errno?: number; driverError?: { code?: string; errno?: number; sqlMessage?: string }; sqlMessage?: string; message?: string };
  const driver = e?.driverError ?? e;
  if (!driver || (driver.code !== 'ER_DUP_ENTRY' && driver.errno !== 1062)) return undefined;
  const text = driver.sqlMessage ?? e.message ?? '';
  const key = /for key '(?:[^']*\.)?([^'.]+)'/.exec(text)?.[1];
  if (key && db?.isInitialized !== false) {
    for (const meta of db?.entityMetadatas ?? []) {
      const index = meta.indices.find((i) => i.name === key) ?? meta.uniques.find((u) => u.name === key);
      if (!index) continue;
      const cols = index.columns.map((c) => c.propertyName);
      const field = cols.join(', ');
      const thing = meta.tableName.replace(/_/g, ' ');
      const msg = `a ${thing} with this ${cols.length > 1 ? 'combination of ' + field : field} already exists`;
      return { message: `${field}: ${msg}.`, fields: Object.fromEntries(cols.map((c) => [c, 'already in use'])) };
    }
  }
  return { message: 'This record already exists (another request created it at the same moment).' };
}

/** Seconds a client is asked to wait (Retry-After) before trying again while the database is unreachable. */
export const DB_RETRY_AFTER_SECONDS = 5;

// Socket errors of the database connection (mysql2 marks them `fatal`); the same codes from anything else (a mail
// server) are not the database's.
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'ECONNABORTED']);
// mysql2's own codes for a lost or unusable connection, and server errors that mean "not now" rather than "never".
const UNAVAILABLE_CODES = new Set([
  'PROTOCOL_CONNECTION_LOST', // the server closed the connection (killed, restarted)
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR',
  'PROTOCOL_ENQUEUE_AFTER_QUIT',
  'POOL_ACQUIRE_TIMEOUT', // no free connection in time (server/db/create-data-source.ts)
  'ER_CON_COUNT_ERROR', // 1040 too many connections
  'ER_TOO_MANY_USER_CONNECTIONS', // 1203
  'ER_SERVER_SHUTDOWN', // 1053 server shutdown in progress
  'ER_LOCK_WAIT_TIMEOUT', // 1205 a lock held too long by another transaction: busy, the request's transaction is rolled back
  'ER_QUERY_INTERRUPTED', // 1317 interrupted by a shutdown
  'ER_CONNECTION_KILLED', // 1927 (MariaDB)
]);
const UNAVAILABLE_ERRNOS = new Set([1040, 1053, 1203, 1205, 1317, 1927, 2002, 2003, 2006, 2013]);
// mysql2 errors that carry no code: the pool closed or full, a command on a connection the server closed.
const UNAVAILABLE_MESSAGES = [/^Pool is closed\.?$/, /^Queue limit reached\.?$/, /^No connections available\.?$/, /Can't add new command when connection is in closed state/, /Can't write in closed state/];
// TypeORM's errors for a data source that is not connected (not yet, or closed by a shutdown).
const UNAVAILABLE_NAMES = new Set(['CannotExecuteNotConnectedError', 'ConnectionIsNotSetError']);
const NOT_CONNECTED = /^Connection is not established with \w+ database/;

type DriverLike = { code?: unknown; errno?: unknown; fatal?: unknown; message?: unknown; name?: unknown; driverError?: unknown; cause?: unknown; errors?: unknown };

/** The error and what it wraps (TypeORM's `driverError`, `cause`, an AggregateError's `errors`), a few levels deep. */
function* errorChain(err: unknown, depth = 0): Generator<DriverLike> {
  if (!err || typeof err !== 'object' || depth > 4) return;
  const e = err as DriverLike;
  yield e;
  yield* errorChain(e.driverError, depth + 1);
  yield* errorChain(e.cause, depth + 1);
  if (Array.isArray(e.errors)) for (const x of e.errors) yield* errorChain(x, depth + 1);
}

function unavailable(e: DriverLike): boolean {
  if (typeof e.code === 'string') {
    if (UNAVAILABLE_CODES.has(e.code)) return true;
    if (SOCKET_CODES.has(e.code) && e.fatal === true) return true;
  }
  if (typeof e.errno === 'number' && UNAVAILABLE_ERRNOS.has(e.errno)) return true;
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGES.some((re) => re.test(e.message as string))) return true;
  if (e.name === 'TypeORMError' && typeof e.message === 'string' && NOT_CONNECTED.test(e.message)) return true;
  return typeof e.name === 'string' && UNAVAILABLE_NAMES.has(e.name);
}

/**
 * What a database error means for the client: 'unavailable' (503 db_unavailable with Retry-After: the server is down,
 * restarting, unreachable, out of connections, or a lock wait timed out — the request's transaction did not commit),
 * 'deadlock' (ER_LOCK_DEADLOCK 1213: InnoDB rolled the transaction back; 409, try again), undefined for anything else.
 */
export function databaseFault(err: unknown): 'unavailable' | 'deadlock' | undefined {
  for (const e of errorChain(err)) {
    if (e.code === 'ER_LOCK_DEADLOCK' || e.errno === 1213) return 'deadlock';
    if (unavailable(e)) return 'unavailable';
  }
  return undefined;
}

function faultCode(err: unknown): string | undefined {
  for (const e of errorChain(err)) if (typeof e.code === 'string') return e.code;
  return undefined;
}
