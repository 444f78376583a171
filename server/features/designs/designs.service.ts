import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { designBodySchema, designPatchSchema } from '../../../shared/schemas/fleet.js';
import type { DesignDetail, DesignListItem, DesignView } from '../../../shared/schemas/responses/index.js';
import { notFound } from '../../common/app-error.js';
import { assertUnique, createAudited, updateAudited, type AuditedKind } from '../../common/audited-row.js';
import type { Clock } from '../../common/clock.js';
import { Unit } from '../units/unit.entity.js';
import { Design } from './design.entity.js';

export function designView(d: Design) {
  return {
    id: d.id,
    reference: d.reference,
    maker: d.maker,
    windings: d.windings,
    vectorGroup: d.vectorGroup,
    phases: d.phases,
    hvKV: d.hvKV,
    lvKV: d.lvKV,
    tvKV: d.tvKV,
    coolingStages: d.coolingStages,
    impedancePercent: d.impedancePercent,
    impedanceBaseKVA: d.impedanceBaseKVA,
    conductor: d.conductor,
    requiredCapacitance: d.requiredCapacitance,
    notes: d.notes,
  } satisfies DesignView;
}

/** Every design with its number of units. */
export async function listDesigns(m: EntityManager) {
  const designs = await m.getRepository(Design).find({ order: { reference: 'ASC' } });
  const counts: { designId: number; n: number }[] = await m.query('SELECT designId, COUNT(*) AS n FROM `unit` GROUP BY designId');
  const byId = new Map(counts.map((c) => [Number(c.designId), Number(c.n)]));
  return designs.map((d) => ({ ...designView(d), unitCount: byId.get(d.id) ?? 0 }) satisfies DesignListItem);
}

/** One design with its units (the sister family). */
export async function getDesign(m: EntityManager, id: number) {
  const d = await m.getRepository(Design).findOne({ where: { id } });
  if (!d) throw notFound('Design');
  const units = await m.getRepository(Unit).find({ where: { designId: id }, relations: { site: true }, order: { serial: 'ASC' } });
  return {
    ...designView(d),
    units: units.map((u) => ({ id: u.id, serial: u.serial, position: u.position, siteId: u.siteId, siteName: u.site.name, year: u.year, lastRecommendation: u.lastRecommendation })),
  } satisfies DesignDetail;
}

const DESIGN: AuditedKind<Design, DesignView> = { target: Design, entity: 'design', label: 'Design', view: designView };
const REFERENCE_TAKEN = 'A design with this reference exists.';

/** Creates a design family (audited). */
export async function createDesign(m: EntityManager, clock: Clock, userId: number, body: z.infer<typeof designBodySchema>) {
  await assertUnique(m, Design, 'reference', body.reference, REFERENCE_TAKEN);
  return createAudited(m, clock, userId, DESIGN, { ...body, tvKV: body.tvKV ?? null, notes: body.notes ?? null, createdAt: clock.now(), updatedAt: clock.now() });
}

/** Changes a design (audited with before and after). */
export async function updateDesign(m: EntityManager, clock: Clock, userId: number, id: number, patch: z.infer<typeof designPatchSchema>) {
  return updateAudited(m, clock, userId, DESIGN, id, {
    check: async () => {
      if (patch.reference !== undefined) await assertUnique(m, Design, 'reference', patch.reference, REFERENCE_TAKEN, id);
    },
    apply: (d) => Object.assign(d, patch, { updatedAt: clock.now() }),
  });
}
