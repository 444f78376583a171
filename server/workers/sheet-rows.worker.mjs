// Reads the rows of an .xlsx workbook off the main thread (unpacking and parsing a workbook's XML of thousands of rows
// takes long enough to hold every other request). Plain JavaScript that needs only exceljs, so it starts the same under
// tsx, in tests and in a built server. In: { bytes, sheetName, maxRows, maxColumns }. Out: { sheet, rows } of
// { row, cells: string[] }, or { error: 'unreadable' | 'no-sheet' | 'too-many', message?, count? }.
import { parentPort, workerData } from 'node:worker_threads';
import ExcelJS from 'exceljs';

/**
 * A cell's value as the text a person sees in it (a formula's result, rich text joined, a date as YYYY-MM-DD). A date
 * cell with a time of day keeps it (YYYY-MM-DDTHH:MM:SS.sssZ): a workbook has no time zone, so its clock reads as UTC.
 */
function cellText(value) {
  if (value === null || value === undefined) return '';
  if (typeof value === 'string') return value;
  if (typeof value === 'number') return String(value);
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (value instanceof Date) return value.getTime() % 86_400_000 === 0 ? value.toISOString().slice(0, 10) : value.toISOString();
  if ('richText' in value) return value.richText.map((t) => t.text).join('');
  if ('formula' in value || 'sharedFormula' in value) return cellText(value.result ?? null);
  if ('hyperlink' in value) return typeof value.text === 'string' ? value.text : cellText(value.text);
  if ('error' in value) return String(value.error);
  return '';
}

async function read({ bytes, sheetName, maxRows, maxColumns }) {
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(Buffer.from(bytes));
  } catch (err) {
    return { error: 'unreadable', message: err instanceof Error ? err.message : String(err) };
  }
  // The sheet of the given name if there is one, else the first.
  const ws = wb.worksheets.find((w) => w.name.trim().toLowerCase() === sheetName) ?? wb.worksheets[0];
  if (!ws) return { error: 'no-sheet' };
  if (ws.actualRowCount - 1 > maxRows) return { error: 'too-many', count: ws.actualRowCount - 1 };
  const columns = Math.min(ws.columnCount, maxColumns);
  const rows = [];
  ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
    const cells = [];
    // A merged cell reads as its master cell's value.
    for (let c = 1; c <= columns; c += 1) {
      const cell = row.getCell(c);
      cells.push(cellText((cell.isMerged ? cell.master : cell).value));
    }
    rows.push({ row: rowNumber, cells });
  });
  return { sheet: ws.name, rows };
}

parentPort.postMessage(await read(workerData));
