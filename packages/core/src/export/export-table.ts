/**
 * The results table of a corridor, a row per station, as every export writes it: results.csv
 * and results.geojson of `scarpline batch`, and the CSV and GeoJSON exports of the API. One
 * module builds the columns and the properties, so the command line and the service write the
 * same names in the same order with the same precision. The contract, column by column, is
 * schemas/export-table.schema.json.
 */
import type { MethodReport, SectionResult, Warning } from '../result';
import { CAUTION } from '../caution';
import { chainageLabel } from '../draw/chainage-label';
import type { UnitSystem } from '../model/types';
import { fsRounded, fsText, type Verdict } from '../verdict';

/** The columns of the table, in order (the properties of a results.geojson feature). */
export const EXPORT_COLUMNS = [
  'station',
  'chainage',
  'section_id',
  'case',
  'governing_method',
  'fs',
  'required_fs',
  'verdict',
  'warnings',
  'note',
  'caution',
] as const;
export type ExportColumn = (typeof EXPORT_COLUMNS)[number];

/** One row of the table, values as computed (the writers round the FS). */
export interface ExportRecord {
  /** The station (chainage) as a number, as given. */
  station: number | null;
  /** The station written as chainage in the section's units: 1+240 (m), 150+00 (ft). */
  chainage: string | null;
  /** The section's id: `<batch id>@<station>` in a corridor; never a database key. */
  section_id: string;
  case: string | null;
  governing_method: string | null;
  fs: number | null;
  required_fs: number | null;
  /** null only in the service, while the section's job is queued or running. */
  verdict: Verdict | null;
  /** How many warnings the section's report lists (distinctWarnings); null without a result. */
  warnings: number | null;
  /** Why there is no factor of safety, or what is wrong with the input. */
  note: string | null;
  caution: string;
}

/** A value of a cell or property. */
export type ExportValue = string | number | null;

/** What the table reads of a result: a SectionResult, or the parts of one the service keeps. */
export type ExportableResult = Pick<
  SectionResult,
  'id' | 'station' | 'units' | 'case' | 'requiredFs' | 'governing' | 'verdict' | 'warnings'
> & { results: readonly Pick<MethodReport, 'method' | 'reason' | 'warnings'>[] };

/**
 * The warnings a section's report lists, each once: the methods' own warnings (not those
 * saying a method does not apply, nor its convergence, which the method's row says), then
 * the section's (but convergence).
 *
 * @example distinctWarnings(result) // → [{ method: 'bishop', code: 'm-alpha-small', message: '…' }]
 */
export function distinctWarnings(
  r: Pick<ExportableResult, 'warnings' | 'results'>,
): (Warning & { method: string | null })[] {
  const out: (Warning & { method: string | null })[] = [];
  const seen = new Set<string>();
  for (const m of r.results) {
    for (const w of m.warnings) {
      const key = `${w.code}:${w.message}`;
      if (seen.has(key) || w.code === 'not-applicable' || w.code === 'no-convergence') continue;
      seen.add(key);
      out.push({ method: m.method, code: w.code, message: w.message });
    }
  }
  for (const w of r.warnings) {
    if (w.code !== 'no-convergence') out.push({ method: null, code: w.code, message: w.message });
  }
  return out;
}

/**
 * Why a section has no factor of safety: each method and its reason.
 *
 * @example unsolvedReason(result.results) // → 'bishop: no convergence after 200 iterations; …'
 */
export function unsolvedReason(
  methods: readonly Pick<MethodReport, 'method' | 'reason'>[],
): string {
  return (
    methods.map((m) => `${m.method}: ${m.reason ?? 'no solution'}`).join('; ') ||
    'no method applies to this section'
  );
}

const chainageOf = (station: number | null, units: UnitSystem) =>
  station === null ? null : chainageLabel(station, units);

/**
 * The row of an analysed section.
 *
 * @example exportRecord(result).verdict // → 'below'
 */
export function exportRecord(r: ExportableResult): ExportRecord {
  return {
    station: r.station,
    chainage: chainageOf(r.station, r.units),
    section_id: r.id,
    case: r.case,
    governing_method: r.governing?.method ?? null,
    fs: r.governing?.fs ?? null,
    required_fs: r.requiredFs,
    verdict: r.verdict,
    warnings: distinctWarnings(r).length,
    note: r.verdict === 'no-fs' ? unsolvedReason(r.results) : null,
    caution: CAUTION,
  };
}

/**
 * The row of a section without a result: one that did not read (`input-error`), one whose
 * analysis stopped (`no-fs`), or, in the service, one whose job has not finished (null).
 *
 * @example unanalysedRecord({ id: 'wcb@1240', station: 1240, units: 'si', verdict: 'input-error', note: 'ground[2]: …' })
 */
export function unanalysedRecord(s: {
  id: string;
  station: number | null;
  units: UnitSystem;
  case?: string | null;
  requiredFs?: number | null;
  verdict: 'input-error' | 'no-fs' | null;
  note: string | null;
}): ExportRecord {
  return {
    station: s.station,
    chainage: chainageOf(s.station, s.units),
    section_id: s.id,
    case: s.case ?? null,
    governing_method: null,
    fs: null,
    required_fs: s.requiredFs ?? null,
    verdict: s.verdict,
    warnings: null,
    note: s.note,
    caution: CAUTION,
  };
}

/** A CSV cell (RFC 4180): quoted when it holds a comma, a quote or a line break. */
function cell(v: ExportValue): string {
  const s = v === null ? '' : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A CSV record (RFC 4180), CRLF-terminated. */
export function csvRecord(values: readonly ExportValue[]): string {
  return `${values.map(cell).join(',')}\r\n`;
}

/**
 * The header of the CSV table: the columns, then the writer's own (the service's, at the end).
 *
 * @example exportCsvHeader(['review_state']) // → 'station,chainage,section_id,…,caution,review_state\r\n'
 */
export function exportCsvHeader(extra: readonly string[] = []): string {
  return csvRecord([...EXPORT_COLUMNS, ...extra]);
}

/**
 * A row of the CSV table: the FS to FS_DECIMALS decimals, empty cells for null, then the
 * writer's own values.
 */
export function exportCsvRow(r: ExportRecord, extra: readonly ExportValue[] = []): string {
  const values = EXPORT_COLUMNS.map((c): ExportValue => {
    if (c === 'fs') return r.fs === null ? null : fsText(r.fs);
    return r[c];
  });
  return csvRecord([...values, ...extra]);
}

/** A feature of results.geojson (RFC 7946). */
export interface ExportFeature {
  type: 'Feature';
  id: string;
  geometry: unknown;
  properties: Record<string, unknown>;
}

/**
 * A feature of results.geojson: the section's line as its geometry (null when the input had
 * none: an unlocated feature, RFC 7946 §3.2), the input feature's own flat properties (its
 * attributes; settings for Scarpline, which are objects, left out), then the columns of the
 * table (the FS rounded as in the CSV), then the writer's own.
 */
export function exportFeature(
  r: ExportRecord,
  options: {
    geometry?: unknown;
    input?: Record<string, unknown> | null;
    extra?: Record<string, ExportValue>;
  } = {},
): ExportFeature {
  const input = Object.entries(options.input ?? {}).filter(
    ([, v]) => v === null || typeof v !== 'object',
  );
  const own = Object.fromEntries(
    EXPORT_COLUMNS.map((c) => [c, c === 'fs' && r.fs !== null ? fsRounded(r.fs) : r[c]]),
  );
  return {
    type: 'Feature',
    id: r.section_id,
    geometry: options.geometry ?? null,
    properties: { ...Object.fromEntries(input), ...own, ...options.extra },
  };
}

/** results.geojson: the features of a corridor, named after it, with the caution. */
export function exportCollection(
  name: string,
  features: ExportFeature[],
): { type: 'FeatureCollection'; name: string; caution: string; features: ExportFeature[] } {
  return { type: 'FeatureCollection', name, caution: CAUTION, features };
}
