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
