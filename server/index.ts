import type { Server } from 'node:http';
import type { DataSource } from 'typeorm';
import { createApp } from './app.js';
import type { Config } from './config.js';
import { createLogger, type Logger } from './logger.js';
import type { RouteDef } from './route-def.js';
import { createTransport } from './mail/mailer.js';
import { startMailSink, type MailSink } from './mail/sink.js';
import { startMailWorker } from './features/notifications/notifications.service.js';
import { systemClock } from './common/clock.js';

export interface Running {
  url: string;
  port: number;
  sink: MailSink | null;
  stop(): Promise<void>;
}

export interface ServeOptions {
  /** Folder of the built client (dist/). */
  staticDir?: string;
  /** Stop on SIGINT / SIGTERM and exit (npm start). */
  handleSignals?: boolean;
  logger?: Logger;
  /** How long stop() lets requests in flight finish before it closes their connections. */
  shutdownGraceMs?: number;
  /** The API route table (tests only). */
  routes?: RouteDef[];
}

/**
 * Stops accepting connections, closes idle keep-alive connections, lets requests in flight finish and, after
 * `graceMs`, closes whatever connections are left.
 */
export function closeGracefully(server: Server, graceMs: number): Promise<void> {
  return new Promise((resolve) => {
    const force = setTimeout(() => server.closeAllConnections(), graceMs);
    // A keep-alive connection turns idle once its answer is sent; close it then.
    const idle = setInterval(() => server.closeIdleConnections(), 100);
    server.close(() => {
      clearTimeout(force);
      clearInterval(idle);
      resolve();
    });
    server.closeIdleConnections();
  });
}

/**
 * Starts the mail sink (unless real SMTP is configured) and the HTTP server. stop() (and, with handleSignals, Ctrl-C or
 * SIGTERM) stops accepting, lets requests in flight finish (up to ~10 s), then stops the mail worker and sink and closes
 * the database.
 */
export async function serve(db: DataSource, config: Config, opts: ServeOptions = {}): Promise<Running> {
  const logger = opts.logger ?? createLogger(config.LOG_LEVEL);
  let sink: MailSink | null = null;
  if (!config.SMTP_HOST) {
    try {
      sink = await startMailSink(db, config.MAIL_SINK_PORT, '127.0.0.1');
    } catch (err) {
      const e = err as NodeJS.ErrnoException;
      if (e.code === 'EADDRINUSE') {
        throw new Error(`Port ${config.MAIL_SINK_PORT} (the local mail sink) is in use by another program; set MAIL_SINK_PORT to a free port.`);
      }
      throw err;
    }
  }
  const context = { db, clock: systemClock, config, mailSinkRunning: sink !== null, appUrl: config.APP_URL } as import('./context.js').AppContext;
  const worker = startMailWorker(
    db,
    context.clock,
    { transport: createTransport(config, sink?.port ?? null), from: config.MAIL_FROM },
    () => context.appUrl ?? '',
    logger,
  );
  context.kickMail = worker.kick;
  const app = createApp(context, { staticDir: opts.staticDir, logger, routes: opts.routes });
  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(config.PORT, config.HOST);
    s.once('listening', () => resolve(s));
    s.once('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EADDRINUSE') reject(new Error(`Port ${config.PORT} on ${config.HOST} is in use by another program; set PORT to a free port (e.g. PORT=${config.PORT + 1} npm start).`));
      else reject(err);
    });
  });
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : config.PORT;
  context.appUrl ??= `http://${config.HOST}:${port}`;
  worker.kick();
  logger.info({ url: `http://${config.HOST}:${port}` }, 'listening');
  let stopping: Promise<void> | null = null;
  const stop = () =>
    (stopping ??= (async () => {
      await closeGracefully(server, opts.shutdownGraceMs ?? 10_000);
      await worker.stop();
      await sink?.close();
      if (db.isInitialized) await db.destroy();
      logger.info('stopped');
    })());
  if (opts.handleSignals) {
    for (const sig of ['SIGINT', 'SIGTERM'] as const) {
      process.once(sig, () => {
        logger.info({ signal: sig }, 'stopping: no new connections, waiting for requests in flight');
        stop().then(
          () => process.exit(0),
          (err: unknown) => {
            logger.error({ err }, 'stopping failed');
            process.exit(1);
          },
        );
      });
    }
  }
  return { url: `http://${config.HOST}:${port}`, port, sink, stop };
}
