import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { Clock } from './common/clock.js';
import type { Config } from './config.js';

// What every request handler may reach: the database, the clock, the configuration, the mail sink's state.
export interface AppContext {
  db: DataSource;
  /** Where services read "now" (systemClock in the app; tests may pin it). */
  clock: Clock;
  config: Config;
  /** True while the local mail sink runs in this process (the outbox route exists only then). */
  mailSinkRunning: boolean;
  /** Base URL of the app for links in mails (APP_URL, else the listening address). */
  appUrl?: string;
  /** Asks the mail worker to deliver queued notifications now (set by serve()). */
  kickMail?: () => void;
}

export function ctx(req: Request): AppContext {
  return req.app.locals.ctx as AppContext;
}
