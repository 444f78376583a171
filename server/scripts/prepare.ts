import type { DataSource } from 'typeorm';
import { loadConfig, type Config } from '../config.js';
import { seedDemo } from '../db/seed/demo-seed.js';
import { applyAppGrants } from './mariadb.js';

// Migrations run as the migrator account (DB_OWNER_USER, default <DB_USER>_owner), never as the app's account: after
// every migration run the migrator gives the app account its row rights on every table (new tables need theirs), with
// only SELECT and INSERT on the audit trail. The demo seed then runs as the app, through the services.

export interface MigrateOptions {
  log?: (l: string) => void;
  /** The app account (user@host, host default 127.0.0.1) to give its table rights after the migrations (needs GRANT OPTION). */
  grantTo?: { user: string; host?: string };
}

/** Runs pending migrations on an initialised data source; then, when grantTo is given, the app account's grants. */
export async function migrateOn(db: DataSource, opts: MigrateOptions = {}): Promise<string[]> {
  const log = opts.log ?? (() => {});
  const ran = await db.runMigrations({ transaction: 'each' });
  if (ran.length) log(`Applied ${ran.length} migration(s): ${ran.map((m) => m.name).join(', ')}`);
  if (opts.grantTo) {
    const database = String(db.options.database);
    // Default: the host the provisioning makes the accounts for; migrateAsOwner passes the migrator's own host.
    const host = opts.grantTo.host ?? '127.0.0.1';
    try {
      await applyAppGrants((sql, params) => db.query(sql, params), database, opts.grantTo.user, host);
    } catch (err) {
      throw new Error(
        `The migrations ran, but the app account '${opts.grantTo.user}'@'${host}' could not be given its rights on ${database} ` +
          `(${err instanceof Error ? err.message : String(err)}). See the README, "Database accounts".`,
      );
    }
  }
  return ran.map((m) => m.name);
}

/** Seeds the demo data once (an empty database) when seed is on; returns whether it did. */
export async function seedOn(db: DataSource, opts: { seed: boolean; log?: (l: string) => void }): Promise<boolean> {
  const seeded = opts.seed ? await seedDemo(db) : false;
  if (seeded) (opts.log ?? (() => {}))('Seeded the demo data (Kestrel Valley Power).');
  return seeded;
}

/** Migrations (and grants, when grantTo is given) and the demo seed on one data source. */
export async function migrateAndSeedOn(
  db: DataSource,
  opts: { seed: boolean; log?: (l: string) => void; grantTo?: MigrateOptions['grantTo'] },
): Promise<{ migrations: string[]; seeded: boolean }> {
  const migrations = await migrateOn(db, opts);
  return { migrations, seeded: await seedOn(db, opts) };
}

/**
 * Migrates the configured database as the migrator account and gives DB_USER its rights. Without a migrator password
 * (a database of your own with no DB_OWNER_PASSWORD) it migrates as DB_USER and grants nothing: see the README's
 * "Database accounts" for the rights to give by hand.
 */
export async function migrateAsOwner(config: Config, log: (l: string) => void = () => {}): Promise<string[]> {
  const { createDataSource } = await import('../db/create-data-source.js');
  const asOwner = config.dbOwnerPassword !== '';
  if (!asOwner) log(`No migrator password (DB_OWNER_PASSWORD or ${config.dataDir}/db-owner-password): migrating as ${config.DB_USER}.`);
  const db = createDataSource(asOwner ? { ...config, DB_USER: config.dbOwnerUser, dbPassword: config.dbOwnerPassword } : config);
  await db.initialize();
  try {
    if (!asOwner) return await migrateOn(db, { log });
    // The app account is taken to connect from where the migrator does (both made for one host: README).
    const host = String((await db.query('SELECT CURRENT_USER() AS u'))[0].u).replace(/^.*@/, '');
    return await migrateOn(db, { log, grantTo: { user: config.DB_USER, host } });
  } finally {
    await db.destroy();
  }
}

/** `npm run db:migrate`: migrates as the migrator (and seeds the demo data as the app when asked and DEMO is on). */
export async function migrateAndSeed(opts: { seed: boolean }): Promise<void> {
  const config = loadConfig();
  await migrateAsOwner(config, (l) => console.log(l));
  if (!(opts.seed && config.DEMO === 'on')) return;
  const { createDataSource } = await import('../db/create-data-source.js');
  const db = createDataSource(config);
  await db.initialize();
  try {
    await seedOn(db, { seed: true, log: (l) => console.log(l) });
  } finally {
    await db.destroy();
  }
}
