import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino, type DestinationStream, type Logger } from 'pino';
import { pinoHttp, type HttpLogger } from 'pino-http';

// The one logger of the server (JSON lines on stdout) and the request log with request ids.

export type { Logger };

/** A logger at the given level (LOG_LEVEL); `destination` defaults to stdout. */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = { level, base: undefined, timestamp: pino.stdTimeFunctions.isoTime };
  return destination ? pino(options, destination) : pino(options);
}

/** Incoming ids are kept when short and plain; anything else gets a fresh UUID. */
const SAFE_REQUEST_ID = /^[A-Za-z0-9._:-]{1,64}$/;

export function requestIdFrom(header: string | string[] | undefined): string {
  return typeof header === 'string' && SAFE_REQUEST_ID.test(header) ? header : randomUUID();
}

/** The id pino-http gave this request (undefined outside the request log). */
export function requestId(req: IncomingMessage): string | undefined {
  return req.id === undefined ? undefined : String(req.id);
}

/**
 * Request log middleware: gives every request an id, sets it as the `X-Request-Id` header of the answer and logs one
 * line per answer (5xx at level error). Only method, path and status are logged: no headers, no bodies.
 */
export function requestLogger(logger: Logger): HttpLogger {
  return pinoHttp({
    logger,
    quietReqLogger: true,
    genReqId: (req: IncomingMessage, res: ServerResponse) => {
      const id = requestIdFrom(req.headers['x-request-id']);
      res.setHeader('X-Request-Id', id);
      return id;
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
    // The error handler logs a thrown error with its stack; the answer's line then only needs the status.
    customErrorObject: (_req, _res, err, val: Record<string, unknown>) =>
      err.message.startsWith('failed with status code') ? { res: val.res, responseTime: val.responseTime } : val,
    serializers: {
      req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  });
}
