import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { siteBodySchema, sitePatchSchema } from '../../../shared/schemas/fleet.js';
import type { SiteView } from '../../../shared/schemas/responses/index.js';
import { AppError, notFound } from '../../common/app-error.js';
import { audit } from '../../common/audit.js';
import type { Clock } from '../../common/clock.js';
import { Site } from './site.entity.js';

const view = (s: Site) => ({ id: s.id, name: s.name, timeZone: s.timeZone }) satisfies SiteView;

/** All sites by name. */
export async function listSites(m: EntityManager) {
  return (await m.getRepository(Site).find({ order: { name: 'ASC' } })).map(view);
}

async function assertNameFree(m: EntityManager, name: string, exceptId?: number) {
  const other = await m.getRepository(Site).findOne({ where: { name } });
  if (other && other.id !== exceptId) throw new AppError('name_taken', 'A site with this name exists.', 409, { name: 'already in use' });
}

/** Creates a site (audited). */
export async function createSite(m: EntityManager, clock: Clock, userId: number, body: z.infer<typeof siteBodySchema>) {
  await assertNameFree(m, body.name);
  const site = await m.getRepository(Site).save(m.getRepository(Site).create({ ...body, createdAt: clock.now() }));
  await audit(m, clock, { userId, action: 'create', entity: 'site', entityId: site.id, after: view(site) });
  return view(site);
}

/** Changes a site (audited with before and after). */
export async function updateSite(m: EntityManager, clock: Clock, userId: number, id: number, patch: z.infer<typeof sitePatchSchema>) {
  const site = await m.getRepository(Site).findOne({ where: { id } });
  if (!site) throw notFound('Site');
  const before = view(site);
  if (patch.name !== undefined) await assertNameFree(m, patch.name, id);
  Object.assign(site, patch);
  await m.getRepository(Site).save(site);
  await audit(m, clock, { userId, action: 'update', entity: 'site', entityId: id, before, after: view(site) });
  return view(site);
}
