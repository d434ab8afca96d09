/**
 * results.xlsx: the core's description of the workbook (export/export-workbook.ts: the sheets,
 * their cells, widths and number formats) written with exceljs. The layout is the core's; this
 * only turns it into a file, and the service's apps/api/src/xlsx.ts does the same for its
 * download (exceljs needs Node, which the core must not).
 */
import type { WorkbookSpec } from '@scarpline/core';

/**
 * Write the workbook to `path` (exceljs is loaded only when a workbook is written, so the
 * command's start-up does not pay for it).
 *
 * @example await writeXlsx('results/results.xlsx', resultsWorkbook(resultsSheet(records, { units: 'si' })))
 */
export async function writeXlsx(path: string, spec: WorkbookSpec): Promise<void> {
  const { Workbook } = await import('exceljs');
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
  await wb.xlsx.writeFile(path);
}
