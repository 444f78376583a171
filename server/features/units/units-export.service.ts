import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { FLEET_EXPORT_COLUMNS, FLEET_EXPORT_ROW_LIMIT, fleetExportRows } from '../../../shared/imports/units-sheet.js';
import type { unitExportQuerySchema } from '../../../shared/schemas/units-io.js';
import type { Clock } from '../../common/clock.js';
import { sheetFile } from '../exports/sheet-file.js';
import { listUnits } from './units.service.js';

type UnitExportQuery = z.output<typeof unitExportQuerySchema>;

/**
 * GET /api/units/export: the fleet table with the list's filters and sort, every page (up to FLEET_EXPORT_ROW_LIMIT
 * units), as .xlsx or CSV; the answer says how many units matched and how many were written.
 */
export async function exportUnits(m: EntityManager, clock: Clock, q: UnitExportQuery) {
  const { format, ...filters } = q;
  const page = await listUnits(m, { ...filters, page: 1, pageSize: FLEET_EXPORT_ROW_LIMIT });
  const rows = fleetExportRows(page.items);
  const day = clock.now().toISOString().slice(0, 10);
  const fileName = `gapsight-fleet-${day}.${format}`;
  return {
    ...(await sheetFile(format, 'Fleet', FLEET_EXPORT_COLUMNS, rows, clock)),
    fileName,
    total: page.total,
    written: rows.length,
  };
}
