/**
 * The results table of a corridor, a row per station and design case and then the station's
 * row, as every export writes it: results.csv and results.geojson of `scarpline batch`, and
 * the CSV and GeoJSON exports of the API. One module builds the columns and the properties, so
 * the command line and the service write the same names in the same order with the same
 * precision. The contract, column by column, is schemas/export-table.schema.json.
 */
import type {
  CaseKind,
  CaseResult,
  MethodReport,
  StationProbability,
  StationResult,
  Warning,
} from '../result';
import { CAUTION } from '../caution';
import { chainageLabel } from '../draw/chainage-label';
import type { UnitSystem } from '../model/types';
import { fsRounded, fsText, type Verdict } from '../verdict';
import { isProjectedLine, wgs84Line } from '../geo/wgs84-geometry';

/** The columns of the table, in order (the properties of a results.geojson feature). */
export const EXPORT_COLUMNS = [
  'station',
  'chainage',
  'section_id',
  'row',
  'case',
  'kind',
  'governing_method',
  'fs',
  'required_fs',
  'ratio',
  'verdict',
  'required_force',
  'required_layers',
  'pf',
  'pf_se',
  'beta_normal',
  'beta_lognormal',
  'warnings',
  'note',
  'caution',
] as const;
export type ExportColumn = (typeof EXPORT_COLUMNS)[number];

/** What a row of the table is: one design case of a station, or the station as a whole. */
export type ExportRow = 'case' | 'station';

/** One row of the table, values as computed (the writers round the FS and the ratio). */
export interface ExportRecord {
  /** The station (chainage) as a number, as given. */
  station: number | null;
  /** The station written as chainage in the section's units: 1+240 (m), 150+00 (ft). */
  chainage: string | null;
  /** The section's id: `<batch id>@<station>` in a corridor; never a database key. */
  section_id: string;
  /** A case's row, or the station's (its governing case, and the station's verdict over every case). */
  row: ExportRow;
  case: string | null;
  kind: CaseKind | null;
  governing_method: string | null;
  fs: number | null;
  required_fs: number | null;
  /** Governing FS / required FS (null without either, or with no significant slope). */
  ratio: number | null;
  /** null only in the service, while the section's job is queued or running. */
  verdict: Verdict | null;
  /**
   * Where the section asks for it and the case is below its requirement: the further uniform
   * force per run that meets it (to 0.1, in the section's units), or the number of layers of the
   * product; null otherwise, or where no value in range meets it (the note says so).
   */
  required_force: number | null;
  required_layers: number | null;
  /**
   * Where the section asks for its probability of failure on the critical surface: the case's
   * P(FS < 1) counted over its realisations and its standard error (to 6 decimals), and β
   * with FS taken as normal and as lognormal (to 3 decimals); null otherwise.
   */
  pf: number | null;
  pf_se: number | null;
  beta_normal: number | null;
  beta_lognormal: number | null;
  /** How many warnings the row's case lists (distinctWarnings; the station's row adds the station's own); null without a result. */
  warnings: number | null;
  /** Why there is no factor of safety, or what is wrong with the input. */
  note: string | null;
  caution: string;
}

/** A value of a cell or property. */
export type ExportValue = string | number | null;

/** What the table reads of one case: a CaseResult, or the parts of one the service keeps. */
export type ExportableCase = Pick<
  CaseResult,
  'name' | 'kind' | 'requiredFs' | 'governing' | 'ratio' | 'verdict' | 'warnings'
> &
  Partial<Pick<CaseResult, 'requiredReinforcement'>> & {
    results: readonly Pick<MethodReport, 'method' | 'reason' | 'warnings'>[];
  };

/** What the table reads of a station: a StationResult, or the parts of one the service keeps. */
export interface ExportableStation {
  id: StationResult['id'];
  station: StationResult['station'];
  units: StationResult['units'];
  cases: readonly ExportableCase[];
  /** The governing case by name; null when none governs. */
  governing: Pick<NonNullable<StationResult['governing']>, 'case'> | null;
  /** The station's verdict over all its cases. */
  verdict: Verdict;
  /** The station's own warnings (not those of a case). */
  warnings: readonly Warning[];
  /** Each case's probability of failure, where the section asks for it (null or absent: none). */
  probability?: readonly StationProbability[] | null;
}

/**
 * The warnings a section's report lists, each once: the methods' own warnings (not those
 * saying a method does not apply, nor its convergence, which the method's row says), then
 * the section's (but convergence).
 *
 * @example distinctWarnings(result) // → [{ method: 'bishop', code: 'm-alpha-small', message: '…' }]
 */
export function distinctWarnings(
  r: Pick<ExportableCase, 'warnings' | 'results'>,
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

/**
 * Why a station has no factor of safety to compare: its one case's methods and their reasons,
 * or, when it has several, each case without one by name.
 *
 * @example stationUnsolvedReason(result.cases) // → 'end of construction: bishop: no convergence after 200 iterations'
 */
export function stationUnsolvedReason(
  cases: readonly Pick<ExportableCase, 'name' | 'verdict' | 'results'>[],
): string {
  if (cases.length === 1) return unsolvedReason(cases[0].results);
  return (
    cases
      .filter((c) => c.verdict === 'no-fs')
      .map((c) => `${c.name}: ${unsolvedReason(c.results)}`)
      .join('; ') || 'no case gave a factor of safety'
  );
}

const chainageOf = (station: number | null, units: UnitSystem) =>
  station === null ? null : chainageLabel(station, units);

/**
 * The case of a station that its row speaks for: the governing case, or the first when none
 * governs (every case without a factor of safety, or without a significant slope).
 */
export function stationCase<C extends ExportableCase>(
  s: Omit<ExportableStation, 'cases'> & { cases: readonly C[] },
): C | null {
  return s.cases.find((c) => c.name === s.governing?.case) ?? s.cases[0] ?? null;
}

/**
 * The row of one case of an analysed station.
 *
 * @example caseRecord(result, result.cases[0]).ratio // → 0.93
 */
export function caseRecord(s: ExportableStation, c: ExportableCase): ExportRecord {
  return {
    station: s.station,
    chainage: chainageOf(s.station, s.units),
    section_id: s.id,
    row: 'case',
    case: c.name,
    kind: c.kind,
    governing_method: c.governing?.method ?? null,
    fs: c.governing?.fs ?? null,
    required_fs: c.requiredFs,
    ratio: c.ratio,
    verdict: c.verdict,
    ...required(c),
    ...probabilityColumns(s, c.name),
    warnings: distinctWarnings(c).length,
    note: c.verdict === 'no-fs' ? unsolvedReason(c.results) : notReached(c),
    caution: CAUTION,
  };
}

/** A case's required reinforcement as the two columns give it. */
function required(
  c: ExportableCase | null,
): Pick<ExportRecord, 'required_force' | 'required_layers'> {
  const r = c?.requiredReinforcement;
  const value = r && r.reached ? r.value : null;
  return {
    required_force: value !== null && r!.kind === 'force' ? Math.round(value * 10) / 10 : null,
    required_layers: value !== null && r!.kind === 'layers' ? value : null,
  };
}

const rounded = (v: number | null | undefined, digits: number): number | null =>
  typeof v === 'number' && Number.isFinite(v) ? Number(v.toFixed(digits)) : null;

/** A case's probability of failure as the four columns give it (null where there is none). */
function probabilityColumns(
  s: Pick<ExportableStation, 'probability'>,
  caseName: string | null,
): Pick<ExportRecord, 'pf' | 'pf_se' | 'beta_normal' | 'beta_lognormal'> {
  const p = caseName === null ? undefined : s.probability?.find((x) => x.case === caseName);
  return {
    pf: rounded(p?.pFailure.p, 6),
    pf_se: rounded(p?.pFailure.standardError, 6),
    beta_normal: rounded(p?.betaNormal, 3),
    beta_lognormal: rounded(p?.betaLognormal, 3),
  };
}

/** Where a case's required reinforcement was asked but no value in range meets it: why. */
function notReached(c: ExportableCase | null): string | null {
  const r = c?.requiredReinforcement;
  return r && !r.reached ? `required reinforcement not reached: ${r.reason ?? ''}` : null;
}

/**
 * The station's row of an analysed station: its governing case (the first when none governs)
 * with that case's method, FS, requirement and ratio, and the station's verdict over every
 * case; its warnings are the case's and the station's own; without a factor of safety, the note
 * says why (by case when the station has several).
 *
 * @example stationRecord(result).verdict // → 'below' when any case is below its requirement
 */
export function stationRecord(s: ExportableStation): ExportRecord {
  const c = stationCase(s);
  const note = s.verdict === 'no-fs' ? stationUnsolvedReason(s.cases) : null;
  return {
    station: s.station,
    chainage: chainageOf(s.station, s.units),
    section_id: s.id,
    row: 'station',
    case: c?.name ?? null,
    kind: c?.kind ?? null,
    governing_method: c?.governing?.method ?? null,
    fs: c?.governing?.fs ?? null,
    required_fs: c?.requiredFs ?? null,
    ratio: c?.ratio ?? null,
    verdict: s.verdict,
    ...required(c),
    ...probabilityColumns(s, c?.name ?? null),
    warnings: (c ? distinctWarnings(c).length : 0) + s.warnings.length,
    note: note ?? notReached(c),
    caution: CAUTION,
  };
}

/**
 * The rows of an analysed station: one per design case, in the order the section lists them,
 * then the station's.
 *
 * @example stationRecords(analyzeSection(section)).map((r) => r.row) // → ['case', 'case', 'station']
 */
export function stationRecords(s: ExportableStation): ExportRecord[] {
  return [...s.cases.map((c) => caseRecord(s, c)), stationRecord(s)];
}

/**
 * The row of a section without a result (its station's row, the only one it has): one that
 * did not read (`input-error`), one whose analysis stopped (`no-fs`), or, in the service, one
 * whose job has not finished (null).
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
    row: 'station',
    case: s.case ?? null,
    kind: null,
    governing_method: null,
    fs: null,
    required_fs: s.requiredFs ?? null,
    ratio: null,
    verdict: s.verdict,
    required_force: null,
    required_layers: null,
    ...probabilityColumns({}, null),
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

/** The columns written to FS_DECIMALS decimals: the FS and the FS / required FS. */
const ROUNDED: readonly ExportColumn[] = ['fs', 'ratio'];

/**
 * A row of the CSV table: the FS and the ratio to FS_DECIMALS decimals, empty cells for null,
 * then the writer's own values.
 */
export function exportCsvRow(r: ExportRecord, extra: readonly ExportValue[] = []): string {
  const values = EXPORT_COLUMNS.map((c): ExportValue => {
    const v = r[c];
    return ROUNDED.includes(c) && typeof v === 'number' ? fsText(v) : v;
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
 * A feature of results.geojson, one per row: the section's line as its geometry (null when the
 * input had none: an unlocated feature, RFC 7946 §3.2; a line in a named projected system, a
 * ProjectedLine, in WGS 84 longitude and latitude with `crs` and `projected_coordinates` among
 * the properties), the input feature's own flat
 * properties (its attributes; settings for Scarpline, which are objects, left out), then the
 * columns of the table (the FS and the ratio rounded as in the CSV), then the writer's own. Its
 * id: the section's id for the station's row, `<section id>#<case>` for a case's.
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
    EXPORT_COLUMNS.map((c) => {
      const v = r[c];
      return [c, ROUNDED.includes(c) && typeof v === 'number' ? fsRounded(v) : v];
    }),
  );
  // A line in a named projected system is written in WGS 84 (RFC 7946), its projected
  // positions and their system kept in the properties.
  const mapped = isProjectedLine(options.geometry) ? wgs84Line(options.geometry) : null;
  // (x and y to a thousandth of the unit, a millimetre in metres: proj4's round trip leaves noise below it)
  const thousandth = (v: number) => Math.round(v * 1000) / 1000;
  const located = mapped
    ? {
        crs: mapped.crs,
        projected_coordinates: mapped.projected.map((p) =>
          p.map((v, i) => (i < 2 ? thousandth(v) : v)),
        ),
      }
    : {};
  return {
    type: 'Feature',
    id: r.row === 'case' ? `${r.section_id}#${r.case}` : r.section_id,
    geometry: mapped ? mapped.geometry : (options.geometry ?? null),
    properties: { ...Object.fromEntries(input), ...own, ...options.extra, ...located },
  };
}

/** results.geojson: the features of a corridor, named after it, with the caution. */
export function exportCollection(
  name: string,
  features: ExportFeature[],
): { type: 'FeatureCollection'; name: string; caution: string; features: ExportFeature[] } {
  return { type: 'FeatureCollection', name, caution: CAUTION, features };
}
