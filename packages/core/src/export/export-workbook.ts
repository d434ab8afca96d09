/**
 * The results as a workbook (results.xlsx), described as plain data: which sheets, which rows
 * and cells, how wide each column is and how its numbers are shown. The main sheet is the
 * results table of export-table.ts — the same records, columns, names and precision as the CSV
 * and the GeoJSON — and, on request, a sheet per section holds the slice table of the governing
 * method of each of its cases. Every sheet opens with the caution, then a row of column names
 * and a row of their units. Writing the file (exceljs, which needs Node) is the caller's: the
 * command line and the service each turn this description into a file with a few lines.
 */
import type { CaseResult, SliceReport } from '../result';
import { CAUTION } from '../caution';
import type { UnitSystem } from '../model/types';
import { UNIT_LABELS } from '../model/units';
import { fsRounded, FS_DECIMALS } from '../verdict';
import {
  EXPORT_COLUMNS,
  type ExportColumn,
  type ExportRecord,
  type ExportValue,
} from './export-table';

/** A column of a sheet: its name (the header), its unit ('' for none), its width and number format. */
export interface SheetColumn {
  name: string;
  unit: string;
  /** Width in characters. */
  width: number;
  /** The spreadsheet's number format (e.g. `0.000`); absent: as the number is. */
  format?: string;
}

/**
 * One sheet: its rows in order. The first row is the caution, the second the column names, the
 * third their units; the data starts at row DATA_ROW (1-based) and `frozen` rows stay in view.
 */
export interface SheetSpec {
  name: string;
  columns: SheetColumn[];
  rows: ExportValue[][];
  frozen: number;
  /** Rows (1-based) written in bold: the names and the units. */
  bold: number[];
}

export interface WorkbookSpec {
  caution: string;
  sheets: SheetSpec[];
}

/** The first row of data of every sheet (1-based): after the caution, the names and the units. */
export const DATA_ROW = 4;

/** The name of the main sheet. */
export const RESULTS_SHEET = 'results';

/** The number format of a value written to `digits` decimals. */
const decimals = (digits: number) => (digits === 0 ? '0' : `0.${'0'.repeat(digits)}`);

/** The columns written as a factor of safety (to FS_DECIMALS decimals), as the CSV writes them. */
const ROUNDED: readonly ExportColumn[] = ['fs', 'ratio'];

/** The unit of a column of the results table in a unit system (null: the section's own). */
function resultUnit(c: ExportColumn, units: UnitSystem | null): string {
  const u = units ? UNIT_LABELS[units] : null;
  if (c === 'station') return u ? u.length : "section's length unit";
  if (c === 'required_force') return u ? u.forcePerLength : "section's force per run";
  if (c === 'fs' || c === 'required_fs' || c === 'ratio' || c === 'required_layers') return '–';
  if (c === 'pf' || c === 'pf_se' || c === 'beta_normal' || c === 'beta_lognormal') return '–';
  if (c === 'warnings') return 'count';
  return '';
}

const RESULT_WIDTHS: Partial<Record<ExportColumn, number>> = {
  chainage: 10,
  section_id: 22,
  case: 22,
  kind: 16,
  governing_method: 18,
  verdict: 14,
  note: 40,
  caution: 40,
};

/**
 * The main sheet: the results table, a row per record with the cells the CSV writes (fs and
 * ratio rounded to FS_DECIMALS and shown with them; null as an empty cell), then the writer's
 * own columns.
 *
 * @example resultsSheet(records, { units: 'si' }).rows[DATA_ROW - 1] // → [1240, '1+240', 'wcb@1240', 'case', …]
 */
export function resultsSheet(
  records: readonly { record: ExportRecord; extra?: readonly ExportValue[] }[],
  options: { units: UnitSystem | null; extra?: readonly string[] },
): SheetSpec {
  const extra = options.extra ?? [];
  const columns: SheetColumn[] = [
    ...EXPORT_COLUMNS.map((c) => ({
      name: c,
      unit: resultUnit(c, options.units),
      width: RESULT_WIDTHS[c] ?? Math.max(10, c.length + 2),
      ...(ROUNDED.includes(c) ? { format: decimals(FS_DECIMALS) } : {}),
    })),
    ...extra.map((name) => ({ name, unit: '', width: Math.max(12, name.length + 2) })),
  ];
  const rows: ExportValue[][] = records.map(({ record, extra: own }) => [
    ...EXPORT_COLUMNS.map((c): ExportValue => {
      const v = record[c];
      return ROUNDED.includes(c) && typeof v === 'number' ? fsRounded(v) : v;
    }),
    ...(own ?? []),
  ]);
  return sheet(RESULTS_SHEET, columns, rows);
}

/** A column of the slice table: what it shows of a slice, to how many decimals. */
interface SliceColumn extends SheetColumn {
  value: (s: SliceReport) => ExportValue;
}

const round = (v: number | null | undefined, digits: number): number | null =>
  typeof v === 'number' && Number.isFinite(v) ? Number(v.toFixed(digits)) : null;

/**
 * The columns of a slice table, as the web page's slice table and the command line's
 * `--slice-table` show them, in the web page's order: geometry (x, b, α, the base length l),
 * weight, pore pressure, base forces, interslice forces E and X and the height of the line of
 * thrust (empty where the method computes none), the base material and the strength it took
 * (c′ or Su, φ′), the stress a strength that varies with stress was taken at (σ′n on the base,
 * σ′v above it), and the reinforcement force where the method has one. Decimals as the command
 * line writes them (lengths 2, widths and base lengths 3, angles, forces and stresses 1).
 */
function sliceColumns(units: UnitSystem, slices: readonly SliceReport[]): SliceColumn[] {
  const u = UNIT_LABELS[units];
  const col = (
    name: string,
    unit: string,
    digits: number,
    value: (s: SliceReport) => number | null | undefined,
  ): SliceColumn => ({
    name,
    unit,
    width: 10,
    format: decimals(digits),
    value: (s) => round(value(s), digits),
  });
  const cols: SliceColumn[] = [
    col('x', u.length, 2, (s) => s.x),
    col('b', u.length, 3, (s) => s.width),
    col('α', '°', 1, (s) => s.alpha),
    col('l', u.length, 3, (s) => s.baseLength),
    col('W', u.forcePerLength, 1, (s) => s.weight),
    col('u', u.pressure, 1, (s) => s.porePressure),
    col('N′', u.forcePerLength, 1, (s) => s.normal),
    col('S', u.forcePerLength, 1, (s) => s.shear),
    col('E', u.forcePerLength, 1, (s) => s.interslice.E),
    col('X', u.forcePerLength, 1, (s) => s.interslice.X),
    col('thrust y', u.length, 2, (s) => s.interslice.thrust),
    { name: 'material', unit: '', width: 16, value: (s) => s.material },
    col('c′/Su', u.pressure, 1, (s) => s.cohesion),
    col('φ′', '°', 1, (s) => s.frictionAngle),
  ];
  if (slices.some((s) => s.strengthAt))
    cols.push(
      {
        name: 'taken at',
        unit: '',
        width: 10,
        value: (s) => (s.strengthAt ? (s.strengthAt.kind === 'normal' ? 'σ′n' : 'σ′v') : null),
      },
      col('stress', u.pressure, 1, (s) => s.strengthAt?.stress),
    );
  // blank where a slice carries no force, as both tables leave it
  if (slices.some((s) => typeof s.reinforcement === 'number'))
    cols.push(col('T', u.forcePerLength, 1, (s) => s.reinforcement || null));
  return cols;
}

/** What a slice sheet reads of one case: its name and the governing method's slices. */
export type SliceSheetCase = Pick<CaseResult, 'name' | 'governing'> & {
  results: readonly { method: string; slices: readonly SliceReport[] }[];
};

/**
 * A section's slice sheet: for each of its cases, in order, a row per slice of the governing
 * method (cases without one have no rows), with the case, the method and the slice's number
 * first. Named after the section (SHEET_NAME_LIMIT characters at most; `taken` holds the names
 * already used, so each is new).
 *
 * @example sliceSheet({ id: 'wcb@1240', units: 'si', cases: result.cases }, new Set()).columns.map((c) => c.name) // → ['case', 'method', '#', 'x', …]
 */
export function sliceSheet(
  section: { id: string; units: UnitSystem; cases: readonly SliceSheetCase[] },
  taken: Set<string>,
): SheetSpec {
  const governing = section.cases.flatMap((c) => {
    const m = c.results.find((r) => r.method === c.governing?.method);
    return m ? [{ name: c.name, method: m.method, slices: m.slices }] : [];
  });
  const cols = sliceColumns(
    section.units,
    governing.flatMap((g) => g.slices),
  );
  const columns: SheetColumn[] = [
    { name: 'case', unit: '', width: 22 },
    { name: 'method', unit: '', width: 18 },
    { name: '#', unit: '', width: 5 },
    ...cols.map(({ name, unit, width, format }) => ({
      name,
      unit,
      width,
      ...(format ? { format } : {}),
    })),
  ];
  const rows = governing.flatMap((g) =>
    g.slices.map((s, i): ExportValue[] => [
      g.name,
      g.method,
      i + 1,
      ...cols.map((c) => c.value(s)),
    ]),
  );
  return sheet(uniqueSheetName(section.id, taken), columns, rows);
}

/** The most characters of a sheet's name (the format's limit). */
export const SHEET_NAME_LIMIT = 31;

/**
 * A sheet name from a section id: the characters a sheet name cannot hold replaced, cut to the
 * limit, made unique among `taken` (compared as the format does, without case), which it joins.
 *
 * @example uniqueSheetName('wcb@1+240', new Set()) // → 'wcb@1+240'
 */
export function uniqueSheetName(id: string, taken: Set<string>): string {
  const base = id.replace(/[[\]:*?/\\]/g, '_').replace(/^'|'$/g, '_') || 'section';
  let name = base.slice(0, SHEET_NAME_LIMIT);
  for (let n = 2; taken.has(name.toLowerCase()) || name.toLowerCase() === RESULTS_SHEET; n++) {
    const suffix = `~${n}`;
    name = `${base.slice(0, SHEET_NAME_LIMIT - suffix.length)}${suffix}`;
  }
  taken.add(name.toLowerCase());
  return name;
}

/** A sheet: the caution, the names, the units, then the rows. */
function sheet(name: string, columns: SheetColumn[], rows: ExportValue[][]): SheetSpec {
  return {
    name,
    columns,
    rows: [
      [`Caution: ${CAUTION}`],
      columns.map((c) => c.name),
      columns.map((c) => c.unit),
      ...rows,
    ],
    frozen: DATA_ROW - 1,
    bold: [2, 3],
  };
}

/**
 * The workbook: the results sheet, then the slice sheets asked for.
 *
 * @example resultsWorkbook(resultsSheet(records, { units: 'si' })).sheets.length // → 1
 */
export function resultsWorkbook(
  results: SheetSpec,
  slices: readonly SheetSpec[] = [],
): WorkbookSpec {
  return { caution: CAUTION, sheets: [results, ...slices] };
}
