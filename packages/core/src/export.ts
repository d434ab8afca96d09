/**
 * `@scarpline/core/export`: the results table (CSV columns and GeoJSON properties) that
 * `scarpline batch` and the API's exports both write. Pure and browser-safe.
 */
export * from './export/export-table';
