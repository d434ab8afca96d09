import { CAUTION, csvRecord, fsText, type SectionResult } from '@scarpline/core';

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
  'verdict',
  'reason',
  'caution',
] as const;

/**
 * CSV of analysed sections: a row per section and method, with the section's verdict (a code
 * of the core's vocabulary) and the caution on every row (it travels with any row copied out
 * of the file). FS with the core's three decimals, CSV as the exports write it (RFC 4180).
 *
 * @example analyzeCsv([{ file: 'cut.yaml', result }]) // → 'file,id,station,…\r\ncut.yaml,wcb-1240-L,…'
 */
export function analyzeCsv(rows: readonly { file: string; result: SectionResult }[]): string {
  const lines = [csvRecord(ANALYZE_COLUMNS)];
  for (const { file, result: r } of rows) {
    for (const m of r.results) {
      lines.push(
        csvRecord([
          file,
          r.id,
          r.station,
          r.case,
          r.units,
          m.method,
          m.fs === null ? null : fsText(m.fs),
          String(m.converged),
          String(r.governing?.method === m.method),
          r.requiredFs,
          r.verdict,
          m.converged ? '' : (m.reason ?? ''),
          CAUTION,
        ]),
      );
    }
  }
  return lines.join('');
}
