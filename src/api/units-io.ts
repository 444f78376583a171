// Fleet spreadsheets — GET /api/units/export (the fleet as filtered, as a file), POST /api/units/import (units from
// an .xlsx or CSV file; a dry run first, then the import) and a unit's reading set from a readings CSV.
import type { UnitSheetMapping } from '../../shared/imports/units-sheet';
import type { CreatedReadingSet } from '../../shared/schemas/responses';
import type { UnitImportAnswer, UnitImportPreview } from '../../shared/schemas/responses/units-io';
import type { UnitListQuery } from './units';
import { api } from './client';

export type { UnitImportAnswer, UnitImportPreview, UnitSheetMapping };
export type FleetExportFormat = 'xlsx' | 'csv';

// GET /api/units/export — every unit of the filter and sort (up to the server's export limit), as a file.
export function exportUnits(query: Omit<UnitListQuery, 'page' | 'pageSize'>, format: FleetExportFormat): Promise<Blob> {
  return api.download('/units/export', { query: { ...query, format } });
}

function importForm(file: File, mapping: UnitSheetMapping | undefined, dryRun: boolean) {
  return api.upload<UnitImportAnswer | UnitImportPreview>(
    '/units/import',
    { file, name: file.name },
    { mapping: mapping && Object.keys(mapping).length ? JSON.stringify(mapping) : undefined, dryRun: dryRun ? 'true' : undefined },
  );
}

// POST /api/units/import with dryRun — how the server reads the file: columns, first rows, every problem (admin).
export function previewUnitsImport(file: File, mapping?: UnitSheetMapping): Promise<UnitImportPreview> {
  return importForm(file, mapping, true) as Promise<UnitImportPreview>;
}

// POST /api/units/import — all rows or none (admin).
export function importUnitsFile(file: File, mapping?: UnitSheetMapping): Promise<UnitImportAnswer> {
  return importForm(file, mapping, false) as Promise<UnitImportAnswer>;
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

// POST /api/units/:id/reading-sets/import — a factory, commissioning or routine set from a readings CSV (tester, admin).
export function importUnitReadingSet(unitId: number, file: File, fields: UnitReadingSetImportFields): Promise<CreatedReadingSet> {
  return api.upload<CreatedReadingSet>(`/units/${unitId}/reading-sets/import`, { file, name: file.name }, { ...fields });
}
