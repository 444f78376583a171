import ExcelJS from 'exceljs';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { FLEET_EXPORT_COLUMNS, FLEET_EXPORT_ROW_LIMIT, fleetExportRows, sheetToCsv, type SheetCell } from '../../../shared/imports/units-sheet.js';
import type { unitExportQuerySchema } from '../../../shared/schemas/units-io.js';
import type { Clock } from '../../common/clock.js';
import { listUnits } from './units.service.js';

type UnitExportQuery = z.output<typeof unitExportQuerySchema>;

export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** A workbook of one sheet: bold frozen header with a filter, numbers as numbers, text as text (never a formula). */
async function workbookOf(sheetName: string, header: readonly string[], rows: readonly SheetCell[][], clock: Clock): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Gapsight';
  wb.created = clock.now();
  const ws = wb.addWorksheet(sheetName, { views: [{ state: 'frozen', ySplit: 1 }] });
  ws.addRow([...header]).font = { bold: true };
  for (const r of rows) ws.addRow(r.map((c) => c ?? null));
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: header.length } };
  ws.columns.forEach((col, i) => {
    const longest = Math.max(header[i].length, ...rows.slice(0, 500).map((r) => String(r[i] ?? '').length));
    col.width = Math.min(40, Math.max(8, longest + 2));
  });
  return Buffer.from(await wb.xlsx.writeBuffer());
}

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
  const data =
    format === 'xlsx'
      ? await workbookOf('Fleet', FLEET_EXPORT_COLUMNS, rows, clock)
      : Buffer.from(sheetToCsv(FLEET_EXPORT_COLUMNS, rows), 'utf8');
  return {
    data,
    contentType: format === 'xlsx' ? XLSX_TYPE : 'text/csv; charset=utf-8',
    fileName,
    total: page.total,
    written: rows.length,
  };
}
