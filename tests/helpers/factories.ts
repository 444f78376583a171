import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { Design } from '../../server/features/designs/design.entity.js';
import { Site } from '../../server/features/sites/site.entity.js';
import { Unit } from '../../server/features/units/unit.entity.js';

// Rows for API tests; every name is unique so tests on one shared database never collide. Invented values.

const tag = () => randomUUID().slice(0, 8);

export async function makeSite(db: DataSource, over: Partial<Site> = {}): Promise<Site> {
  const repo = db.getRepository(Site);
  return repo.save(repo.create({ name: `Site ${tag()}`, timeZone: 'Europe/London', ...over }));
}

export async function makeDesign(db: DataSource, over: Partial<Design> = {}): Promise<Design> {
  const repo = db.getRepository(Design);
  return repo.save(
    repo.create({
      reference: `D-${tag()}`,
      maker: 'Test Works',
      windings: 'two-winding',
      vectorGroup: 'YNd1',
      phases: 3,
      hvKV: 132,
      lvKV: 33,
      tvKV: null,
      coolingStages: [{ stage: 'ONAN', kVA: 40000 }],
      impedancePercent: 10.5,
      impedanceBaseKVA: 40000,
      conductor: 'Cu',
      requiredCapacitance: ['CH', 'CL', 'CHL'],
      notes: null,
      ...over,
    }),
  );
}

export async function makeUnit(db: DataSource, over: Partial<Unit> = {}): Promise<Unit> {
  const site = over.siteId ? null : await makeSite(db);
  const design = over.designId ? null : await makeDesign(db);
  const repo = db.getRepository(Unit);
  return repo.save(
    repo.create({
      serial: `T-${tag()}`,
      position: 'T1',
      siteId: site?.id,
      designId: design?.id,
      year: 2010,
      phases: 3,
      hvKV: 132,
      lvKV: 33,
      ratedKVA: 40000,
      impedancePercent: 10.5,
      systemImpedancePercent: 0,
      conductor: 'Cu',
      ...over,
    }),
  );
}
