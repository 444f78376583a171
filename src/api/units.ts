// The fleet — GET /api/units (paged, sorted, filtered on the server) and GET /api/units/:id (the unit file).
import type { z } from 'zod';
import type { ReadingSetBody, unitListQuerySchema } from '../../shared/schemas/fleet';
import type { UNIT_SORTS } from '../../shared/schemas/enums';
import type {
  CreatedReadingSet,
  ReadingSetConditions,
  ReadingSetView,
  SweepMeta,
  UnitDetail,
  UnitEventSummary,
  UnitListItem,
  UnitListPage,
  UnitView,
} from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses (the server's views are checked against the same schemas).
export type { EventStatus, ReadingSetKind } from '../../shared/schemas/enums';
export type { CreatedReadingSet, ReadingSetConditions, SweepMeta, UnitDetail, UnitEventSummary, UnitListItem, UnitListPage };
/** A unit's own record (nameplate and the denormalised last event). */
export type Unit = UnitView;
/** A reading set with its values in the case format and its sweep traces listed. */
export type ReadingSetWithValues = ReadingSetView;

export type UnitSort = (typeof UNIT_SORTS)[number];

/** The list query as the client sends it (the server's zod schema, unitListQuerySchema, fills defaults). */
export type UnitListQuery = {
  [K in keyof z.output<typeof unitListQuerySchema>]?: z.output<typeof unitListQuerySchema>[K];
};

// GET /api/units — one page of the fleet.
export function listUnits(query: UnitListQuery = {}, signal?: AbortSignal): Promise<UnitListPage> {
  return api.get<UnitListPage>('/units', { query: { ...query }, signal });
}

// POST /api/units/:id/reading-sets — a factory, commissioning or routine reading set (tester, admin).
export function createUnitReadingSet(unitId: number, body: ReadingSetBody): Promise<CreatedReadingSet> {
  return api.post<CreatedReadingSet>(`/units/${unitId}/reading-sets`, body);
}

// GET /api/units/:id — the unit file: design, site, reading sets with values, events newest first.
export function getUnit(id: number, signal?: AbortSignal): Promise<UnitDetail> {
  return api.get<UnitDetail>(`/units/${id}`, { signal });
}

/** POST/PATCH /api/units bodies (the server's zod schemas' input). */
export type UnitBody = import('zod').input<typeof import('../../shared/schemas/fleet').unitBodySchema>;

// POST /api/units — add a unit; nameplate values left out come from its design (admin).
export function createUnit(body: UnitBody): Promise<Unit> {
  return api.post<Unit>('/units', body);
}

// PATCH /api/units/:id — change a unit's record (admin).
export function updateUnit(id: number, patch: Partial<UnitBody>): Promise<Unit> {
  return api.patch<Unit>(`/units/${id}`, patch);
}
