import { Workbook, type Worksheet } from 'exceljs';

/** A workbook written by the command, read back with exceljs. */
export async function readXlsx(path: string): Promise<Workbook> {
  const wb = new Workbook();
  await wb.xlsx.readFile(path);
  return wb;
}

/** The values of a sheet's row (1-based), without exceljs's empty first slot. */
export function rowValues(ws: Worksheet, n: number, columns: number): unknown[] {
  const row = ws.getRow(n);
  return Array.from({ length: columns }, (_, i) => row.getCell(i + 1).value);
}

/**
 * A cell as a spreadsheet shows it: empty for none, a number in its number format (`0.000`:
 * three decimals; else as it is), text as it is.
 */
export function shown(ws: Worksheet, row: number, column: number): string {
  const cell = ws.getRow(row).getCell(column);
  const v = cell.value;
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') {
    const m = /^0\.(0+)$/.exec(cell.numFmt ?? '');
    return m ? v.toFixed(m[1].length) : String(v);
  }
  if (typeof v === 'string') return v;
  throw new Error(`cell ${cell.address}: not a number or a text: ${JSON.stringify(v)}`);
}
