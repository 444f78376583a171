// The fleet — GET /api/units (paged, sorted, filtered on the server) and GET /api/units/:id (the unit file).
import type { z } from 'zod';
import type { CurrentIs, FaultType, ReadingSet as CaseReadingSet, Shot } from '../../shared/schemas/case';
import type { Protection } from '../../shared/schemas/case';
import type { ReadingSetBody, UNIT_SORTS, unitListQuerySchema } from '../../shared/schemas/fleet';
import type { Recommendation, ThroughFault } from '../../shared/schemas/result';
import { api } from './client';
import type { Design } from './designs';
import type { Site } from './sites';

export type UnitSort = (typeof UNIT_SORTS)[number];
export type EventStatus = 'logged' | 'testing' | 'screened' | 'held' | 'released';
export type ReadingSetKind = 'factory' | 'commissioning' | 'routine' | 'post-fault';

/** The list query as the client sends it (the server's zod schema, unitListQuerySchema, fills defaults). */
export type UnitListQuery = {
  [K in keyof z.output<typeof unitListQuerySchema>]?: z.output<typeof unitListQuerySchema>[K];
};

/** A unit's own record (nameplate and the denormalised last event). */
export interface Unit {
  id: number;
  serial: string;
  position: string;
  siteId: number;
  designId: number;
  year: number | null;
  phases: 1 | 3;
  hvKV: number;
  lvKV: number;
  ratedKVA: number;
  impedancePercent: number;
  systemImpedancePercent: number;
  conductor: 'Cu' | 'Al';
  lastEventId: number | null;
  lastEventAt: string | null;
  lastEventStatus: EventStatus | null;
  lastRecommendation: Recommendation | null;
}

export interface UnitListItem extends Unit {
  siteName: string;
  siteTimeZone: string;
  designReference: string;
}

export interface UnitListPage {
  items: UnitListItem[];
  total: number;
  page: number;
  pageSize: number;
}

export interface SweepMeta {
  id: number;
  readingSetId: number;
  label: string;
  testType: string;
  terminals: string | null;
  /** Rules revision 2 (absent from servers before it): winding and phase of the trace, tap of its baseline trace. */
  winding?: 'hv' | 'lv' | 'tv' | null;
  phase?: 'A' | 'B' | 'C' | null;
  baselineTapPosition?: string | null;
  tapPosition: string | null;
  demagnetised: boolean | null;
  pointCount: number;
  minHz: number;
  maxHz: number;
  sha256: string;
  fileName: string | null;
  createdAt: string;
}

/** A reading set's stored conditions (no values). */
export interface ReadingSetConditions {
  id: number;
  unitId: number;
  kind: ReadingSetKind;
  eventId: number | null;
  isReference: boolean;
  takenAt: string;
  temperatureC: number | null;
  topOilC: number | null;
  bottomOilC: number | null;
  ambientC: number | null;
  humidityPercent: number | null;
  tapPosition: string | null;
  instrument: string | null;
  instrumentSerial: string | null;
  testKV: number | null;
  testFrequencyHz: number | null;
  hoursDeenergised: number | null;
  notes: string | null;
  createdById: number | null;
  createdAt: string;
}

/** A reading set with its values in the case format and its sweep traces listed. */
export interface ReadingSetWithValues extends ReadingSetConditions {
  values?: CaseReadingSet;
  sweeps: SweepMeta[];
}

export interface UnitEventSummary {
  id: number;
  occurredAt: string;
  type: FaultType;
  side: 'hv' | 'lv';
  /** Rules revision 2 (absent from events logged before it): side the fault was on, and what the shot currents are. */
  location?: 'hv' | 'lv' | null;
  currentIs?: CurrentIs | null;
  status: EventStatus;
  transformerTripped: boolean;
  protectionOperated: Protection[];
  shots: Shot[];
  throughFault: ThroughFault | null;
}

export interface UnitDetail extends Unit {
  site: Site;
  design: Design;
  readingSets: ReadingSetWithValues[];
  events: UnitEventSummary[];
}

// GET /api/units — one page of the fleet.
export function listUnits(query: UnitListQuery = {}, signal?: AbortSignal): Promise<UnitListPage> {
  return api.get<UnitListPage>('/units', { query: { ...query }, signal });
}

/** The answer to a new unit reading set: its stored conditions and values. */
export type CreatedReadingSet = ReadingSetConditions & { values?: CaseReadingSet };

// POST /api/units/:id/reading-sets — a factory, commissioning or routine reading set (tester, admin).
export function createUnitReadingSet(unitId: number, body: ReadingSetBody): Promise<CreatedReadingSet> {
  return api.post<CreatedReadingSet>(`/units/${unitId}/reading-sets`, body);
}

// GET /api/units/:id — the unit file: design, site, reading sets with values, events newest first.
export function getUnit(id: number): Promise<UnitDetail> {
  return api.get<UnitDetail>(`/units/${id}`);
}
