import ExcelJS from 'exceljs';
import { formulaSafe, sheetToCsv, type SheetCell } from '../../../shared/imports/units-sheet.js';
import type { Clock } from '../../common/clock.js';

export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
export const CSV_TYPE = 'text/csv; charset=utf-8';
export type SheetFormat = 'xlsx' | 'csv';

/**
 * A workbook of one sheet: bold frozen header with a filter, numbers as numbers, text as text (never a formula: a text
 * cell starting with = + - @, a tab or a carriage return gets a leading apostrophe, as in the CSV, so editing the cell
 * in a spreadsheet cannot turn it into one).
 */
async function workbookOf(sheetName: string, header: readonly string[], rows: readonly SheetCell[][], clock: Clock): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Gapsight';
  wb.created = clock.now();
  const ws = wb.addWorksheet(sheetName, { views: [{ state: 'frozen', ySplit: 1 }] });
  ws.addRow(header.map(safeCell)).font = { bold: true };
  for (const r of rows) ws.addRow(r.map(safeCell));
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: header.length } };
  ws.columns.forEach((col, i) => {
    const longest = Math.max(header[i].length, ...rows.slice(0, 500).map((r) => String(r[i] ?? '').length));
    col.width = Math.min(40, Math.max(8, longest + 2));
  });
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** A cell as written to a workbook: text formula-safe, a number (negative too) as a number, empty as empty. */
function safeCell(c: SheetCell): SheetCell {
  return typeof c === 'string' ? formulaSafe(c) : (c ?? null);
}

/** One sheet as an .xlsx workbook or CSV text (formula-safe), with its content type. */
export async function sheetFile(format: SheetFormat, sheetName: string, header: readonly string[], rows: readonly SheetCell[][], clock: Clock) {
  return format === 'xlsx'
    ? { data: await workbookOf(sheetName, header, rows, clock), contentType: XLSX_TYPE }
    : { data: Buffer.from(sheetToCsv(header, rows), 'utf8'), contentType: CSV_TYPE };
}
