/**
 * `@scarpline/core/export`: the results table (CSV columns and GeoJSON properties) that
 * `scarpline batch` and the API's exports both write, and the workbook (results.xlsx) described
 * as plain data for the callers to write. Pure and browser-safe.
 */
export * from './export/export-table';
export * from './export/export-workbook';
