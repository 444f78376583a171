import { In, type EntityManager, type ObjectLiteral, type SelectQueryBuilder } from 'typeorm';
import type { z } from 'zod';
import type { ReadingSetBody, unitBodySchema, unitListQuerySchema, unitPatchSchema } from '../../../shared/schemas/fleet.js';
import type { CreatedReadingSet, ReadingSetConditions, UnitDetail, UnitListPage, UnitView } from '../../../shared/schemas/responses/index.js';
import { dutyWithPriorFaults } from '../../../shared/screening/duty-history.js';
import { AppError, notFound } from '../../common/app-error.js';
import { assertUnique, createAudited, present, updateAudited, type AuditedKind } from '../../common/audited-row.js';
import type { Clock } from '../../common/clock.js';
import { Design } from '../designs/design.entity.js';
import { designView } from '../designs/designs.service.js';
import { caseFault, caseUnit } from '../events/case-export.service.js';
import { FaultEvent } from '../events/fault-event.entity.js';
import { ReadingSet } from '../readings/reading-set.entity.js';
import { insertReadingSet, loadCaseReadingSets } from '../readings/readings.service.js';
import { activeRestrictionsByUnit } from '../screenings/screenings.service.js';
import { SweepTrace } from '../readings/sweep-trace.entity.js';
import { insertSweepTrace, sweepMeta, type SweepFields } from '../readings/sweeps.service.js';
import { Site } from '../sites/site.entity.js';
import { Unit } from './unit.entity.js';

type UnitListQuery = z.infer<typeof unitListQuerySchema>;

/** A unit's answer fields, from an entity or from a raw row of the same columns (its time as a Date or a string). */
export function unitView(u: Omit<UnitView, 'lastEventAt'> & { lastEventAt: Date | string | null }) {
  return {
    id: u.id,
    serial: u.serial,
    position: u.position,
    siteId: u.siteId,
    designId: u.designId,
    year: u.year,
    phases: u.phases,
    hvKV: u.hvKV,
    lvKV: u.lvKV,
    ratedKVA: u.ratedKVA,
    impedancePercent: u.impedancePercent,
    systemImpedancePercent: u.systemImpedancePercent,
    conductor: u.conductor,
    lastEventId: u.lastEventId,
    lastEventAt: u.lastEventAt ? new Date(u.lastEventAt).toISOString() : null,
    lastEventStatus: u.lastEventStatus,
    lastRecommendation: u.lastRecommendation,
  } satisfies UnitView;
}

const SORT_COLUMNS: Record<string, string> = {
  serial: 'u.serial',
  site: 's.name',
  design: 'd.reference',
  lastEventAt: 'u.lastEventAt',
  lastRecommendation: 'u.lastRecommendation',
};

/** The list's filters on the unit table under `alias` (the page and its count apply the same ones). */
function unitFilters<T extends ObjectLiteral>(qb: SelectQueryBuilder<T>, alias: string, q: UnitListQuery): SelectQueryBuilder<T> {
  if (q.siteId) qb.andWhere(`${alias}.siteId = :siteId`, { siteId: q.siteId });
  if (q.designId) qb.andWhere(`${alias}.designId = :designId`, { designId: q.designId });
  if (q.recommendation) qb.andWhere(`${alias}.lastRecommendation = :rec`, { rec: q.recommendation });
  if (q.q) qb.andWhere(`(${alias}.serial LIKE :q OR ${alias}.position LIKE :q)`, { q: `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
  return qb;
}

/**
 * The columns of a fleet row: the unit's own, and its site (name, zone, locale) and design reference read by primary
 * key in subqueries, so the unit table alone drives the plan (its index order, stopping at the page).
 */
const UNIT_ROW_COLUMNS = [
  ...['id', 'serial', 'position', 'siteId', 'designId', 'year', 'phases', 'hvKV', 'lvKV', 'ratedKVA', 'impedancePercent', 'systemImpedancePercent', 'conductor', 'lastEventId', 'lastEventAt', 'lastEventStatus', 'lastRecommendation'].map(
    (c) => `u.${c} AS ${c}`,
  ),
  "(SELECT JSON_OBJECT('name', rs.name, 'timeZone', rs.timeZone, 'locale', rs.locale) FROM site rs WHERE rs.id = u.siteId) AS site",
  '(SELECT rd.reference FROM design rd WHERE rd.id = u.designId) AS designReference',
];

type UnitRow = Omit<UnitView, 'lastEventAt'> & { lastEventAt: Date | null; site: string | null; designReference: string | null; total: number | string };

/**
 * The fleet query of one page (exported so a test can EXPLAIN it): only the columns a row shows. Sorting by serial,
 * last event or recommendation reads the unit table through its indexes and stops at the page; sorting by site or
 * design name joins them.
 */
export function unitListQuery(m: EntityManager, q: UnitListQuery) {
  const key = q.sort.replace(/^-/, '');
  const qb = m.getRepository(Unit).createQueryBuilder('u').select(UNIT_ROW_COLUMNS);
  if (key === 'site') qb.innerJoin('u.site', 's');
  if (key === 'design') qb.innerJoin('u.design', 'd');
  unitFilters(qb, 'u', q);
  const desc = q.sort.startsWith('-');
  const column = SORT_COLUMNS[key];
  qb.orderBy(column, desc ? 'DESC' : 'ASC');
  if (column !== 'u.serial') qb.addOrderBy('u.serial', 'ASC');
  qb.offset((q.page - 1) * q.pageSize).limit(q.pageSize);
  return qb;
}

/** One page of the fleet, filtered and sorted on the server: one query for the rows and the total, one for restrictions. */
export async function listUnits(m: EntityManager, q: UnitListQuery) {
  // The page and, in the same round trip, the number of units matching the filters (an uncorrelated subquery,
  // evaluated once).
  const rows = await unitListQuery(m, q)
    .addSelect((sub) => unitFilters(sub.select('COUNT(*)').from(Unit, 'cu'), 'cu', q), 'total')
    .getRawMany<UnitRow>();
  // A page past the end has no row to carry the total: count alone then.
  const total = rows.length ? Number(rows[0].total) : q.page === 1 ? 0 : await unitFilters(m.getRepository(Unit).createQueryBuilder('cu'), 'cu', q).getCount();
  const restrictions = await activeRestrictionsByUnit(m, rows.map((u) => u.id));
  return {
    items: rows.map((u) => {
      const site = (typeof u.site === 'string' ? JSON.parse(u.site) : u.site) as { name: string; timeZone: string; locale: string | null } | null;
      return {
        ...unitView(u),
        siteName: site?.name ?? '',
        siteTimeZone: site?.timeZone ?? 'UTC',
        siteLocale: site?.locale ?? null,
        designReference: u.designReference ?? '',
        activeRestrictions: restrictions.get(u.id) ?? null,
      };
    }),
    total,
    page: q.page,
    pageSize: q.pageSize,
  } satisfies UnitListPage;
}

/** A unit with its design, site, reading sets (with values, sweeps listed) and events, newest first. */
export async function getUnit(m: EntityManager, id: number) {
  const u = await m.getRepository(Unit).findOne({ where: { id }, relations: { site: true, design: true } });
  if (!u) throw notFound('Unit');
  const sets = await m.getRepository(ReadingSet).find({ where: { unitId: id }, order: { takenAt: 'DESC', id: 'DESC' } });
  const values = await loadCaseReadingSets(m, sets);
  const sweeps = sets.length ? await m.getRepository(SweepTrace).find({ where: { readingSetId: In(sets.map((s) => s.id)) }, order: { id: 'ASC' } }) : [];
  const events = await m.getRepository(FaultEvent).find({ where: { unitId: id }, order: { occurredAt: 'DESC', id: 'DESC' } });
  const unitForDuty = caseUnit(u);
  const unitFaults = events.map((e) => ({ id: e.id, ...caseFault(e) }));
  return {
    ...unitView(u),
    site: { id: u.site.id, name: u.site.name, timeZone: u.site.timeZone, locale: u.site.locale },
    design: designView(u.design),
    readingSets: sets.map((s) => ({
      ...readingSetConditions(s),
      values: values.get(s.id),
      sweeps: sweeps.filter((t) => t.readingSetId === s.id).map(sweepMeta),
    })),
    events: events.map((e) => ({
      id: e.id,
      occurredAt: e.occurredAt.toISOString(),
      type: e.type,
      side: e.side,
      location: e.location,
      currentIs: e.currentIs,
      status: e.status,
      transformerTripped: e.transformerTripped,
      protectionOperated: e.protectionOperated,
      shots: e.shots,
      // The unit's earlier faults counted, by the same rule as the event file.
      throughFault: dutyWithPriorFaults(unitForDuty, caseFault(e), unitFaults, e.id),
    })),
    activeRestrictions: (await activeRestrictionsByUnit(m, [u.id])).get(u.id) ?? null,
  } satisfies UnitDetail;
}

/** The stored conditions of a reading set (no values). */
export function readingSetConditions(s: ReadingSet) {
  return {
    id: s.id,
    unitId: s.unitId,
    kind: s.kind,
    eventId: s.eventId,
    isReference: s.isReference,
    takenAt: s.takenAt.toISOString(),
    temperatureC: s.temperatureC,
    topOilC: s.topOilC,
    bottomOilC: s.bottomOilC,
    ambientC: s.ambientC,
    humidityPercent: s.humidityPercent,
    tapPosition: s.tapPosition,
    instrument: s.instrument,
    instrumentSerial: s.instrumentSerial,
    testKV: s.testKV,
    testFrequencyHz: s.testFrequencyHz,
    hoursDeenergised: s.hoursDeenergised,
    demagnetised: s.demagnetised,
    windingTemperatureC: s.windingTemperatureC,
    notes: s.notes,
    createdById: s.createdById,
    createdAt: s.createdAt.toISOString(),
  } satisfies ReadingSetConditions;
}

async function checkRefs(m: EntityManager, siteId?: number, designId?: number) {
  const fields: Record<string, string> = {};
  if (siteId !== undefined && !(await m.getRepository(Site).exists({ where: { id: siteId } }))) fields.siteId = `no site with id ${siteId}`;
  const design = designId !== undefined ? await m.getRepository(Design).findOne({ where: { id: designId } }) : null;
  if (designId !== undefined && !design) fields.designId = `no design with id ${designId}`;
  if (Object.keys(fields).length) throw new AppError('invalid_input', 'Some fields are invalid.', 400, fields);
  return design;
}

const UNIT: AuditedKind<Unit, UnitView> = { target: Unit, entity: 'unit', label: 'Unit', view: unitView };
const SERIAL_TAKEN = 'A unit with this serial exists.';

/** Creates a unit; nameplate values not given come from its design (audited). */
export async function createUnit(m: EntityManager, clock: Clock, userId: number, body: z.infer<typeof unitBodySchema>) {
  const design = (await checkRefs(m, body.siteId, body.designId))!;
  await assertUnique(m, Unit, 'serial', body.serial, SERIAL_TAKEN);
  return createAudited(m, clock, userId, UNIT, {
    serial: body.serial,
    position: body.position ?? '',
    siteId: body.siteId,
    designId: body.designId,
    year: body.year ?? null,
    phases: body.phases ?? design.phases,
    hvKV: body.hvKV ?? design.hvKV,
    lvKV: body.lvKV ?? design.lvKV,
    ratedKVA: body.ratedKVA ?? design.impedanceBaseKVA,
    impedancePercent: body.impedancePercent ?? design.impedancePercent,
    systemImpedancePercent: body.systemImpedancePercent ?? 0,
    conductor: body.conductor ?? design.conductor,
    createdAt: clock.now(),
    updatedAt: clock.now(),
  });
}

/** Changes a unit (audited with before and after). */
export async function updateUnit(m: EntityManager, clock: Clock, userId: number, id: number, patch: z.infer<typeof unitPatchSchema>) {
  return updateAudited(m, clock, userId, UNIT, id, {
    check: async () => {
      await checkRefs(m, patch.siteId, patch.designId);
      if (patch.serial !== undefined) await assertUnique(m, Unit, 'serial', patch.serial, SERIAL_TAKEN, id);
    },
    apply: (u) => {
      Object.assign(u, present(patch));
      u.updatedAt = clock.now();
    },
    fields: Object.keys(present(patch)),
  });
}

/** Stores a factory, commissioning or routine reading set on a unit. */
export async function addUnitReadingSet(m: EntityManager, clock: Clock, userId: number, unitId: number, body: ReadingSetBody) {
  if (!(await m.getRepository(Unit).exists({ where: { id: unitId } }))) throw notFound('Unit');
  const set = await insertReadingSet(m, clock, { unitId, kind: body.kind, body, userId });
  const values = await loadCaseReadingSets(m, [set]);
  return { ...readingSetConditions(set), values: values.get(set.id) } satisfies CreatedReadingSet;
}

/** Stores a baseline sweep trace on one of the unit's (non post-fault) reading sets. */
export async function addUnitSweep(
  m: EntityManager,
  clock: Clock,
  userId: number,
  unitId: number,
  readingSetId: number,
  fields: SweepFields,
  parsed: { points: number[][]; minHz: number; maxHz: number },
  fileName: string,
) {
  if (!(await m.getRepository(Unit).exists({ where: { id: unitId } }))) throw notFound('Unit');
  const set = await m.getRepository(ReadingSet).findOne({ where: { id: readingSetId } });
  if (!set || set.unitId !== unitId) throw new AppError('invalid_input', 'Some fields are invalid.', 400, { readingSetId: `no reading set ${readingSetId} on this unit` });
  if (set.kind === 'post-fault') {
    throw new AppError('invalid_input', 'Some fields are invalid.', 400, { readingSetId: 'a post-fault session: upload post-fault traces to the session instead' });
  }
  return sweepMeta(await insertSweepTrace(m, clock, readingSetId, fields, parsed, fileName, userId));
}
