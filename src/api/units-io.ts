// Fleet spreadsheets — GET /api/units/export (the fleet as filtered, as a file), POST /api/units/import (units from
// an .xlsx or CSV file; a dry run first, then the import), reading sets of many units from one file, and a unit's
// reading set from a readings CSV or .xlsx.
import type { UnitSheetMapping } from '../../shared/imports/units-sheet';
import type { CreatedReadingSet } from '../../shared/schemas/responses';
import type { ReadingSetSheetMapping } from '../../shared/imports/reading-sets-sheet';
import type {
  ReadingSetsImportAnswer,
  ReadingSetsImportPreview,
  UnitImportAnswer,
  UnitImportPreview,
} from '../../shared/schemas/responses/units-io';
import type { UnitListQuery } from './units';
import { api } from './client';

export type { ReadingSetSheetMapping, ReadingSetsImportAnswer, ReadingSetsImportPreview, UnitImportAnswer, UnitImportPreview, UnitSheetMapping };

/** What every sheet import's dry run answers: the sheet, its header, the columns used and every problem. */
export interface SheetImportPreview {
  sheet: string | null;
  headerRow: number;
  headers: string[];
  columns: Record<string, string | null>;
  total: number;
  fields: Record<string, string>;
}
export type FleetExportFormat = 'xlsx' | 'csv';

// GET /api/units/export — every unit of the filter and sort (up to the server's export limit), as a file.
export function exportUnits(query: Omit<UnitListQuery, 'page' | 'pageSize'>, format: FleetExportFormat): Promise<Blob> {
  return api.download('/units/export', { query: { ...query, format } });
}

function importForm<T>(path: string, file: File, mapping: Record<string, string> | undefined, dryRun: boolean) {
  return api.upload<T>(
    path,
    { file, name: file.name },
    { mapping: mapping && Object.keys(mapping).length ? JSON.stringify(mapping) : undefined, dryRun: dryRun ? 'true' : undefined },
  );
}

// POST /api/units/import with dryRun — how the server reads the file: columns, first rows, every problem (admin).
export function previewUnitsImport(file: File, mapping?: UnitSheetMapping): Promise<UnitImportPreview> {
  return importForm<UnitImportPreview>('/units/import', file, mapping, true);
}

// POST /api/units/import — all rows or none (admin).
export function importUnitsFile(file: File, mapping?: UnitSheetMapping): Promise<UnitImportAnswer> {
  return importForm<UnitImportAnswer>('/units/import', file, mapping, false);
}

// POST /api/units/reading-sets/import with dryRun — the sets found per unit and every problem (tester, admin).
export function previewReadingSetsImport(file: File, mapping?: ReadingSetSheetMapping): Promise<ReadingSetsImportPreview> {
  return importForm<ReadingSetsImportPreview>('/units/reading-sets/import', file, mapping, true);
}

// POST /api/units/reading-sets/import — every set or none (tester, admin).
export function importReadingSetsFile(file: File, mapping?: ReadingSetSheetMapping): Promise<ReadingSetsImportAnswer> {
  return importForm<ReadingSetsImportAnswer>('/units/reading-sets/import', file, mapping, false);
}

/** The fields sent with a reading-set CSV (kind, when taken, and a few conditions). */
export interface UnitReadingSetImportFields {
  kind: 'factory' | 'commissioning' | 'routine';
  takenAt: string;
  isReference?: boolean;
  tapPosition?: string;
  instrument?: string;
  notes?: string;
}

// POST /api/units/:id/reading-sets/import — a factory, commissioning or routine set from a readings CSV or .xlsx (tester, admin).
export function importUnitReadingSet(unitId: number, file: File, fields: UnitReadingSetImportFields): Promise<CreatedReadingSet> {
  return api.upload<CreatedReadingSet>(`/units/${unitId}/reading-sets/import`, { file, name: file.name }, { ...fields });
}
