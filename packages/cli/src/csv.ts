import { stringify } from 'csv-stringify/sync';
import { CAUTION, type SectionResult } from '@scarpline/core';

/** The columns of `scarpline analyze --csv`: a row per section and method. */
export const ANALYZE_COLUMNS = [
  'file',
  'id',
  'station',
  'case',
  'units',
  'method',
  'fs',
  'converged',
  'governing',
  'required_fs',
  'section_passes',
  'reason',
  'caution',
] as const;

const cell = (v: number | boolean | string | null | undefined): string =>
  v === null || v === undefined
    ? ''
    : typeof v === 'number'
      ? String(Number(v.toPrecision(10)))
      : String(v);

/**
 * CSV of analysed sections: a row per section and method, with the caution on every row (it
 * travels with any row copied out of the file).
 *
 * @example analyzeCsv([{ file: 'cut.yaml', result }]) // → 'file,id,station,…\ncut.yaml,wcb-1240-L,…'
 */
export function analyzeCsv(rows: readonly { file: string; result: SectionResult }[]): string {
  const records: string[][] = [];
  for (const { file, result: r } of rows) {
    for (const m of r.results) {
      records.push(
        [
          file,
          r.id,
          r.station,
          r.case,
          r.units,
          m.method,
          m.fs,
          m.converged,
          r.governing?.method === m.method,
          r.requiredFs,
          r.passes,
          m.converged ? '' : (m.reason ?? ''),
          CAUTION,
        ].map(cell),
      );
    }
  }
  return stringify(records, { header: true, columns: [...ANALYZE_COLUMNS] });
}
