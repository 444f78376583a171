import { existsSync } from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type Express } from 'express';
import expressStaticGzip from 'express-static-gzip';
import helmet from 'helmet';
import type { AppContext } from './context.js';
import { apiNotFound, errorHandler } from './common/error-handler.js';
import { createLogger, requestLogger, type Logger } from './logger.js';
import type { RouteDef } from './route-def.js';
import { buildApiRouter, routeTable } from './routes.js';
import { loginRateLimit, trustProxySetting } from './features/auth/sign-in-protection.js';
import { recordRefusals } from './features/security/security.service.js';

export interface AppOptions {
  /** Folder of the built client (dist/); when absent only the API is served. */
  staticDir?: string;
  /** The request log's logger; by default one at the configured LOG_LEVEL. */
  logger?: Logger;
  /** The API route table; tests pass their own, the app always uses the declared one. */
  routes?: RouteDef[];
}

/** Builds the Express app (no listen: tests import it with supertest). */
export function createApp(context: AppContext, opts: AppOptions = {}): Express {
  const app = express();
  app.locals.ctx = context;
  app.disable('x-powered-by');
  // The client's address (sign-in throttling, security log): X-Forwarded-For only from the proxies TRUST_PROXY names.
  app.set('trust proxy', trustProxySetting(context.config.TRUST_PROXY));
  // First, so every answer (404s, static files and errors included) carries X-Request-Id.
  app.use(requestLogger(opts.logger ?? createLogger(context.config.LOG_LEVEL)));
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          'upgrade-insecure-requests': null,
        },
      },
      strictTransportSecurity: false,
    }),
  );
  // JSON answers over 1 kB gzip-compressed for a client that accepts it (the event file's answers shrink to about a
  // tenth on a slow site link); files (PDF, CSV, workbooks, attachments) are sent as they are.
  app.use('/api', compression({ threshold: 1024, filter: (req, res) => /^application\/json\b/.test(String(res.getHeader('Content-Type') ?? '')) && compression.filter(req, res) }));
  app.use('/api', express.json({ limit: '5mb' }));
  app.use('/api/auth/login', loginRateLimit(context));
  app.use('/api', buildApiRouter(opts.routes ?? routeTable));
  app.use('/api', recordRefusals);
  app.use('/api', apiNotFound);

  const dir = opts.staticDir;
  if (dir && existsSync(path.join(dir, 'index.html'))) {
    app.use(serveClientFiles(dir));
    // Single-page fallback: every non-API path gets the client, which routes itself.
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(dir, 'index.html'));
    });
  }
  app.use(errorHandler);
  return app;
}

/** The built client's files: the brotli or gzip copy the build wrote beside a file when the browser accepts it (brotli
 * first), `Vary: Accept-Encoding`; hashed files under assets/ cached for a year, index.html revalidated every time. */
function serveClientFiles(dir: string) {
  const root = path.resolve(dir);
  return expressStaticGzip(root, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: false,
    serveStatic: {
      index: false,
      setHeaders(res, file) {
        const name = path.relative(root, file).replace(/\.(br|gz)$/, '').split(path.sep).join('/');
        if (name.startsWith('assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        else if (name === 'index.html') res.setHeader('Cache-Control', 'no-cache');
        else res.setHeader('Cache-Control', 'public, max-age=3600');
      },
    },
  });
}
