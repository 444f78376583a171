import ExcelJS from 'exceljs';
import { sheetToCsv, type SheetCell } from '../../../shared/imports/units-sheet.js';
import type { Clock } from '../../common/clock.js';

export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
export const CSV_TYPE = 'text/csv; charset=utf-8';
export type SheetFormat = 'xlsx' | 'csv';

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

/** One sheet as an .xlsx workbook or CSV text (formula-safe), with its content type. */
export async function sheetFile(format: SheetFormat, sheetName: string, header: readonly string[], rows: readonly SheetCell[][], clock: Clock) {
  return format === 'xlsx'
    ? { data: await workbookOf(sheetName, header, rows, clock), contentType: XLSX_TYPE }
    : { data: Buffer.from(sheetToCsv(header, rows), 'utf8'), contentType: CSV_TYPE };
}
