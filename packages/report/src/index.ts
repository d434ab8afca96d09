/**
 * @scarpline/report — the Node-side writers of the files Scarpline hands out: the section and
 * corridor reports as PDF (pdfkit, svg-to-pdfkit, Fira Sans embedded), the results workbook
 * as .xlsx (exceljs) and a drawing as PNG (resvg). The core stays pure; these do the bytes.
 */
export type {
  CorridorReportInput,
  CorridorStation,
  ReportMeta,
  ReviewRecord,
  SectionReportInput,
} from './types';
export { sectionReportPdf } from './section-report';
export { corridorReportPdf, REPORT_LIMITS, appendixStations } from './corridor-report';
export { writeXlsx, xlsxBuffer, XLSX_TYPE } from './xlsx';
export { svgToPng } from './svg-to-png';

/** The media type of a PDF file (RFC 8118). */
export const PDF_TYPE = 'application/pdf';
