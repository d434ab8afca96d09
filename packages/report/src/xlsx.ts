/**
 * .xlsx files: the core's description of a workbook (export/export-workbook.ts: the sheets,
 * their cells, widths and number formats) written with exceljs, for the command line's
 * results.xlsx and the service's download alike. The layout is the core's; this only turns it
 * into a file (exceljs needs Node, which the core must not). exceljs is loaded only when a
 * workbook is written, so that a command's start-up does not pay for it.
 */
import type { WorkbookSpec } from '@scarpline/core/export';

/** The media type of an .xlsx file (ECMA-376, as registered with IANA). */
export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

async function workbook(spec: WorkbookSpec) {
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
  return wb;
}

/**
 * The workbook as the bytes of an .xlsx file.
 *
 * @example await xlsxBuffer(resultsWorkbook(resultsSheet(records, { units: 'si' })))
 */
export async function xlsxBuffer(spec: WorkbookSpec): Promise<Buffer> {
  return Buffer.from(await (await workbook(spec)).xlsx.writeBuffer());
}

/**
 * The workbook written to `path`.
 *
 * @example await writeXlsx('results/results.xlsx', resultsWorkbook(resultsSheet(records, { units: 'si' })))
 */
export async function writeXlsx(path: string, spec: WorkbookSpec): Promise<void> {
  await (await workbook(spec)).xlsx.writeFile(path);
}
