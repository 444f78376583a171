import { In, Not, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { compareFamily, familyQuantities, memberQuantities, type FamilyMember } from '../../../shared/fleet/family.js';
import { mergeReadingSets } from '../../../shared/readings/merge.js';
import type { designBodySchema, designPatchSchema } from '../../../shared/schemas/fleet.js';
import type { DesignDetail, DesignListItem, DesignSisters, DesignView } from '../../../shared/schemas/responses/index.js';
import { badRequest, notFound } from '../../common/app-error.js';
import { assertUnique, createAudited, present, updateAudited, type AuditedKind } from '../../common/audited-row.js';
import type { Clock } from '../../common/clock.js';
import { loadCriteria } from '../criteria/criteria.service.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { loadCaseReadingSets } from '../readings/readings.service.js';
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

/**
 * The design family compared on one quantity (default: the first it has): each unit's latest value — the merge of its
 * non-post-fault reading sets, as the case export takes a sister's readings — its modified z over the family and its
 * deviation from the family's median, with the newest published criteria set's constants (shared/fleet/family.ts).
 */
export async function getDesignSisters(m: EntityManager, designId: number, quantity: string | undefined) {
  const d = await m.getRepository(Design).findOne({ where: { id: designId } });
  if (!d) throw notFound('Design');
  const units = await m.getRepository(Unit).find({ where: { designId }, order: { serial: 'ASC' } });
  const sets = units.length
    ? await m.getRepository(ReadingSet).find({ where: { unitId: In(units.map((u) => u.id)), kind: Not('post-fault') }, order: { takenAt: 'ASC', id: 'ASC' } })
    : [];
  const values = await loadCaseReadingSets(m, sets);
  const setsOf = (unitId: number) => sets.filter((s) => s.unitId === unitId);
  const members: FamilyMember[] = units.map((u) => ({
    unitId: u.id,
    serial: u.serial,
    values: mergeReadingSets(setsOf(u.id).map((s) => values.get(s.id)!)),
    unit: { hvKV: u.hvKV, ratedKVA: u.ratedKVA },
  }));
  const quantities = familyQuantities(members);
  const chosen = quantity ?? quantities[0]?.name ?? null;
  if (quantity !== undefined && !quantities.some((q) => q.name === quantity)) {
    const known = quantities.map((q) => q.name).join(', ') || 'none';
    throw badRequest('Some fields are invalid.', { quantity: `not a quantity this family can be compared on (it has: ${known})` });
  }
  const { version, criteria } = await loadCriteria(m);
  const f = chosen ? compareFamily(members, chosen, criteria) : null;
  const unitById = new Map(units.map((u) => [u.id, u]));
  // When the value was taken: the newest non-post-fault set of the unit that gave it.
  const takenAt = (unitId: number) => {
    const u = unitById.get(unitId)!;
    const s = [...setsOf(unitId)].reverse().find((x) => memberQuantities(values.get(x.id), u).has(chosen!));
    return s ? s.takenAt.toISOString() : null;
  };
  return {
    designId: d.id,
    quantity: chosen,
    label: f?.quantity.label ?? null,
    unit: f?.quantity.unit ?? null,
    quantities: quantities.map((q) => ({ name: q.name, label: q.label, unit: q.unit })),
    items: (f?.items ?? []).map((i) => ({
      unitId: i.unitId!,
      serial: i.serial,
      value: i.value,
      takenAt: takenAt(i.unitId!),
      modifiedZ: i.modifiedZ,
      deviationFromMedianPercent: i.deviationFromMedianPercent,
      outlier: i.outlier,
    })),
    median: f?.median ?? null,
    mad: f?.mad ?? null,
    madFloored: f?.madFloored ?? false,
    constant: criteria.sisters.modifiedZConstant,
    limit: criteria.sisters.modifiedZLimit,
    criteriaVersion: version,
    note: f ? f.note : 'No unit of this family has a capacitance or reactance reading yet.',
  } satisfies DesignSisters;
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
    apply: (d) => Object.assign(d, present(patch), { updatedAt: clock.now() }),
    fields: Object.keys(present(patch)),
  });
}
