import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
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
