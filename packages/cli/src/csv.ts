import { CAUTION, csvRecord, fsText, type StationResult } from '@scarpline/core';

/** The columns of `scarpline analyze --csv`: a row per section, design case and method. */
export const ANALYZE_COLUMNS = [
  'file',
  'id',
  'station',
  'case',
  'kind',
  'units',
  'method',
  'fs',
  'converged',
  'governing',
  'required_fs',
  'verdict',
  'station_verdict',
  'reason',
  'caution',
] as const;

/**
 * CSV of analysed sections: a row per section, case and method, with the case's verdict and
 * the station's (codes of the core's vocabulary; `governing` says whether the method governs
 * its case) and the caution on every row (it travels with any row copied out
 * of the file). FS with the core's three decimals, CSV as the exports write it (RFC 4180).
 *
 * @example analyzeCsv([{ file: 'cut.yaml', result }]) // → 'file,id,station,…\r\ncut.yaml,wcb-1240-L,…'
 */
export function analyzeCsv(rows: readonly { file: string; result: StationResult }[]): string {
  const lines = [csvRecord(ANALYZE_COLUMNS)];
  for (const { file, result: r } of rows) {
    for (const c of r.cases) {
      for (const m of c.results) {
        lines.push(
          csvRecord([
            file,
            r.id,
            r.station,
            c.name,
            c.kind,
            r.units,
            m.method,
            m.fs === null ? null : fsText(m.fs),
            String(m.converged),
            String(c.governing?.method === m.method),
            c.requiredFs,
            c.verdict,
            r.verdict,
            m.converged ? '' : (m.reason ?? ''),
            CAUTION,
          ]),
        );
      }
    }
  }
  return lines.join('');
}
