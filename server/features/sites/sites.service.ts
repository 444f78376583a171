import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { siteBodySchema, sitePatchSchema } from '../../../shared/schemas/fleet.js';
import type { SiteView } from '../../../shared/schemas/responses/index.js';
import { assertUnique, createAudited, present, updateAudited, type AuditedKind } from '../../common/audited-row.js';
import type { Clock } from '../../common/clock.js';
import { Site } from './site.entity.js';

const view = (s: Site) => ({ id: s.id, name: s.name, timeZone: s.timeZone, locale: s.locale, controlRoomEmail: s.controlRoomEmail }) satisfies SiteView;

/** All sites by name. */
export async function listSites(m: EntityManager) {
  return (await m.getRepository(Site).find({ order: { name: 'ASC' } })).map(view);
}

const SITE: AuditedKind<Site, SiteView> = { target: Site, entity: 'site', label: 'Site', view };
const NAME_TAKEN = 'A site with this name exists.';

/** Creates a site (audited). */
export async function createSite(m: EntityManager, clock: Clock, userId: number, body: z.infer<typeof siteBodySchema>) {
  await assertUnique(m, Site, 'name', body.name, NAME_TAKEN);
  return createAudited(m, clock, userId, SITE, { ...body, createdAt: clock.now() });
}

/** Changes a site (audited with before and after). */
export async function updateSite(m: EntityManager, clock: Clock, userId: number, id: number, patch: z.infer<typeof sitePatchSchema>) {
  return updateAudited(m, clock, userId, SITE, id, {
    check: async () => {
      if (patch.name !== undefined) await assertUnique(m, Site, 'name', patch.name, NAME_TAKEN, id);
    },
    apply: (site) => Object.assign(site, present(patch)),
    fields: Object.keys(present(patch)),
  });
}
