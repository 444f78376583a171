import type { DataSource } from 'typeorm';
import { loadConfig } from '../config.js';
import { seedDemo } from '../db/seed/demo-seed.js';

/** Runs pending migrations on an initialised data source; seeds the demo data once when DEMO is on. */
export async function migrateAndSeedOn(db: DataSource, opts: { seed: boolean; log?: (l: string) => void }): Promise<{ migrations: string[]; seeded: boolean }> {
  const log = opts.log ?? (() => {});
  const ran = await db.runMigrations({ transaction: 'each' });
  if (ran.length) log(`Applied ${ran.length} migration(s): ${ran.map((m) => m.name).join(', ')}`);
  const seeded = opts.seed ? await seedDemo(db) : false;
  if (seeded) log('Seeded the demo data (Kestrel Valley Power).');
  return { migrations: ran.map((m) => m.name), seeded };
}

/** Opens the configured database, migrates (and seeds), closes it. */
export async function migrateAndSeed(opts: { seed: boolean }): Promise<void> {
  const { default: db } = await import('../db/data-source.js');
  await db.initialize();
  try {
    await migrateAndSeedOn(db, { seed: opts.seed && loadConfig().DEMO === 'on', log: (l) => console.log(l) });
  } finally {
    await db.destroy();
  }
}
