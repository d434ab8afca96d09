/**
 * results.xlsx: the core's description of the workbook (export/export-workbook.ts: the sheets,
 * their cells, widths and number formats) written with exceljs into a buffer for a download.
 * The layout is the core's; this only turns it into a file, as the command line's
 * packages/cli/src/xlsx.ts does for results.xlsx on disk (exceljs needs Node, which the core
 * must not).
 */
import { Workbook } from 'exceljs';
import type { WorkbookSpec } from '@scarpline/core/export';

/** The media type of an .xlsx file (ECMA-376, as registered with IANA). */
export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/**
 * The workbook as the bytes of an .xlsx file.
 *
 * @example await xlsxBuffer(resultsWorkbook(resultsSheet(records, { units: 'si' })))
 */
export async function xlsxBuffer(spec: WorkbookSpec): Promise<Buffer> {
  const wb = new Workbook();
  wb.creator = 'Scarpline';
  wb.description = spec.caution;
  for (const s of spec.sheets) {
    const ws = wb.addWorksheet(s.name, { views: [{ state: 'frozen', ySplit: s.frozen }] });
    s.columns.forEach((c, i) => {
      const column = ws.getColumn(i + 1);
      column.width = c.width;
      if (c.format) column.numFmt = c.format;
    });
    for (const row of s.rows) ws.addRow(row);
    for (const n of s.bold) ws.getRow(n).font = { bold: true };
  }
  return Buffer.from(await wb.xlsx.writeBuffer());
}
