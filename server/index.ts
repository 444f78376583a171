import type { Server } from 'node:http';
import type { DataSource } from 'typeorm';
import { createApp } from './app.js';
import type { Config } from './config.js';
import { createTransport } from './mail/mailer.js';
import { startMailSink, type MailSink } from './mail/sink.js';
import { startMailWorker } from './features/notifications/notifications.service.js';

export interface Running {
  url: string;
  port: number;
  sink: MailSink | null;
  stop(): Promise<void>;
}

/** Starts the mail sink (unless real SMTP is configured) and the HTTP server; Ctrl-C / SIGTERM stop them cleanly. */
export async function serve(db: DataSource, config: Config, opts: { staticDir?: string; handleSignals?: boolean } = {}): Promise<Running> {
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
  const context = { db, config, mailSinkRunning: sink !== null, appUrl: config.APP_URL } as import('./context.js').AppContext;
  const worker = startMailWorker(db, { transport: createTransport(config, sink?.port ?? null), from: config.MAIL_FROM }, () => context.appUrl ?? '');
  context.kickMail = worker.kick;
  const app = createApp(context, { staticDir: opts.staticDir });
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
  let stopping: Promise<void> | null = null;
  const stop = () =>
    (stopping ??= (async () => {
      await new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      });
      await worker.stop();
      await sink?.close();
      if (db.isInitialized) await db.destroy();
    })());
  if (opts.handleSignals) {
    for (const sig of ['SIGINT', 'SIGTERM'] as const) {
      process.once(sig, () => {
        console.log(`\n${sig}: stopping Gapsight …`);
        stop().then(
          () => process.exit(0),
          () => process.exit(1),
        );
      });
    }
  }
  return { url: `http://${config.HOST}:${port}`, port, sink, stop };
}
