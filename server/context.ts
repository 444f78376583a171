import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { Config } from './config.js';

// What every request handler may reach: the database, the configuration, the mail sink's state.
export interface AppContext {
  db: DataSource;
  config: Config;
  /** True while the local mail sink runs in this process (the outbox route exists only then). */
  mailSinkRunning: boolean;
}

export function ctx(req: Request): AppContext {
  return req.app.locals.ctx as AppContext;
}
