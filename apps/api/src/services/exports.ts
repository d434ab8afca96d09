/**
 * Exports of a batch's current results (CSV, GeoJSON, a spreadsheet) and a section's plot (SVG).
 * The CSV columns, the GeoJSON properties and the spreadsheet's results sheet are the core's
 * results table (export/export-table.ts, schemas/export-table.schema.json), the same as
 * `scarpline batch` writes — per station a row per design case, then the station's — with the
 * service's own columns at the end: the review state and the job state.
 */
import { CAUTION } from '@scarpline/core/caution';
import { drawSection, type DrawableResult } from '@scarpline/core/draw';
import {
  exportCollection,
  exportCsvHeader,
  exportCsvRow,
  exportFeature,
  stationRecords,
  unanalysedRecord,
  type ExportableCase,
  type ExportRecord,
  type ExportValue,
  resultsSheet,
  resultsWorkbook,
  sliceSheet,
} from '@scarpline/core/export';
import { sectionOfCase, type MethodId, type Section, type UnitSystem } from '@scarpline/core/model';
import type {
  MethodReport,
  RequiredReinforcementReport,
  StationProbability,
  Warning,
} from '@scarpline/core/result';
import { conflict, invalid, notFound } from '../errors';
import { API_LIMITS } from '../limits';
import { Batch, ResultRow, SectionRow, type CaseResultRow } from '../models';
import type { Principal } from './auth';
import { sectionReviewStates } from './reviews';
import { casesOf, loadSection } from './sections';
import { xlsxBuffer } from '@scarpline/report';

/** The columns the service adds after the table's: what only it knows. */
export const SERVICE_COLUMNS = ['review_state', 'job_state'] as const;

interface Row {
  section: SectionRow;
  units: UnitSystem;
  /** The cases of its current result (none without one). */
  cases: CaseResultRow[];
  records: ExportRecord[];
  service: Record<(typeof SERVICE_COLUMNS)[number], ExportValue>;
}

/** A stored case as the results table reads it. */
function exportableCase(c: CaseResultRow): ExportableCase {
  return {
    name: c.name,
    kind: c.kind,
    requiredFs: c.requiredFs,
    governing:
      c.governingMethod !== null && c.governingFs !== null
        ? { method: c.governingMethod as MethodId, fs: c.governingFs }
        : null,
    ratio: c.ratio,
    verdict: c.verdict,
    warnings: c.warnings as Warning[],
    results: c.methods as MethodReport[],
    ...(c.requiredReinforcement
      ? { requiredReinforcement: c.requiredReinforcement as RequiredReinforcementReport }
      : {}),
  };
}

/**
 * A section's rows of the results table from its current result (a row per case, then the
 * station's), or its station row alone saying why it has none.
 */
function recordsOf(
  section: SectionRow,
  result: ResultRow | null,
  cases: readonly CaseResultRow[],
): ExportRecord[] {
  // The stored input is a normalised section; a row written by hand may hold less.
  const input = section.input as Partial<Section>;
  const units = input.units ?? 'si';
  const analysis = input.analysis;
  if (result) {
    return stationRecords({
      id: section.key,
      station: section.station,
      units,
      cases: cases.map(exportableCase),
      governing: result.governingCase === null ? null : { case: result.governingCase },
      verdict: result.verdict,
      warnings: result.warnings as Warning[],
      probability: (result.probability as StationProbability[] | null) ?? null,
    });
  }
  // No result: the job has not finished, or it failed without one (out of time or retries).
  const failed = section.status === 'failed';
  return [
    unanalysedRecord({
      id: section.key,
      station: section.station,
      units,
      case: analysis?.case ?? null,
      requiredFs: analysis?.requiredFs ?? null,
      verdict: failed ? 'no-fs' : null,
      note: failed ? section.failReason : null,
    }),
  ];
}

async function rows(batch: Batch): Promise<Row[]> {
  const sections = await SectionRow.findAll({
    where: { batchId: batch.id },
    order: [
      ['station', 'ASC NULLS LAST'],
      ['position', 'ASC'],
    ],
  });
  const runs = new Map(sections.map((s) => [s.id, s.run]));
  const results = (
    await ResultRow.findAll({
      where: { sectionId: sections.map((s) => s.id) },
      attributes: { exclude: ['methods', 'criticalSurface', 'search', 'input'] },
    })
  ).filter((r) => runs.get(r.sectionId) === r.run);
  const cases = await casesOf(results);
  const resultOf = new Map(results.map((r) => [r.sectionId, r]));
  const reviews = await sectionReviewStates(batch.id);
  return sections.map((section) => {
    const result = resultOf.get(section.id) ?? null;
    const own = result ? (cases.get(result.id) ?? []) : [];
    return {
      section,
      units: (section.input as Partial<Section>).units ?? 'si',
      cases: own,
      records: recordsOf(section, result, own),
      service: {
        review_state: reviews.get(section.id)?.decision ?? 'pending',
        job_state: section.status,
      },
    };
  });
}

export function fileName(batch: Batch, ext: string): string {
  return `${batch.name.replace(/[^A-Za-z0-9._-]+/g, '_')}-results.${ext}`;
}

export async function batchCsv(batch: Batch): Promise<string> {
  const lines = [exportCsvHeader(SERVICE_COLUMNS)];
  for (const { records, service } of await rows(batch)) {
    const own = SERVICE_COLUMNS.map((c) => service[c]);
    for (const record of records) lines.push(exportCsvRow(record, own));
  }
  return lines.join('');
}

/**
 * The name of a batch's spreadsheet: the corridor and the day it was made (UTC).
 *
 * @example xlsxFileName(batch, new Date('2026-12-02T21:30:00Z')) // → 'wcb-main-results-2026-12-02.xlsx'
 */
export function xlsxFileName(batch: Batch, date: Date): string {
  return fileName(batch, 'xlsx').replace(/\.xlsx$/, `-${date.toISOString().slice(0, 10)}.xlsx`);
}

/**
 * The batch's results as a spreadsheet: the results sheet, the same records, columns and
 * precision as the CSV with the service's own columns at the end, and with `slices` a sheet per
 * section holding each case's governing slices (for batches of at most
 * API_LIMITS.sliceSheetSections sections: 422 beyond, so that a download stays bounded).
 */
export async function batchXlsx(batch: Batch, options: { slices: boolean }): Promise<Buffer> {
  if (options.slices && batch.total > API_LIMITS.sliceSheetSections)
    throw invalid(
      `Slice sheets are given for batches of at most ${API_LIMITS.sliceSheetSections} sections; this one has ${batch.total}. Download results.xlsx without them, or a section's slices from its page.`,
    );
  const all = await rows(batch);
  const units = new Set(all.map((r) => r.units));
  const main = resultsSheet(
    all.flatMap(({ records, service }) =>
      records.map((record) => ({ record, extra: SERVICE_COLUMNS.map((c) => service[c]) })),
    ),
    { units: units.size === 1 ? [...units][0] : null, extra: SERVICE_COLUMNS },
  );
  const taken = new Set<string>();
  const slices = options.slices
    ? all
        .filter((r) => r.cases.length > 0)
        .map((r) =>
          sliceSheet(
            {
              id: r.section.key,
              units: r.units,
              cases: r.cases.map((c) => ({
                name: c.name,
                governing: exportableCase(c).governing,
                results: c.methods as MethodReport[],
              })),
            },
            taken,
          ),
        )
    : [];
  return xlsxBuffer(resultsWorkbook(main, slices));
}

export async function batchGeoJson(batch: Batch) {
  return exportCollection(
    batch.name,
    (await rows(batch)).flatMap(({ section, records, service }) =>
      records.map((record) =>
        exportFeature(record, {
          // The section line as the corridor gave it; null when the input had no coordinates.
          geometry: section.geometry ?? null,
          input: section.featureProperties,
          extra: service,
        }),
      ),
    ),
  );
}

/**
 * The section drawn with its current result: the governing case (the first when none
 * governs), or the case named, as that case sees the section (drawSection from the core
 * carries the caution).
 */
export async function sectionSvg(p: Principal, sectionId: number, caseName?: string) {
  const s = await loadSection(p, sectionId);
  const r = await ResultRow.findOne({ where: { sectionId: s.id, run: s.run } });
  if (!r) throw conflict(`Section ${s.key} has no result for run ${s.run} yet.`);
  const cases = (await casesOf([r], { search: true })).get(r.id) ?? [];
  const wanted = caseName ?? r.governingCase;
  const c = cases.find((k) => k.name === wanted) ?? (caseName === undefined ? cases[0] : undefined);
  if (!c) throw notFound(`case ${caseName ?? ''} in section ${s.key}`.replace('  ', ' '));
  const input = s.input as Section;
  const result = {
    id: input.id,
    title: input.title,
    station: input.station,
    units: input.units,
    case: c.name,
    requiredFs: c.requiredFs,
    results: c.methods,
    governing: c.governingMethod ? { method: c.governingMethod, fs: c.governingFs } : null,
    verdict: c.verdict,
    warnings: c.warnings,
    search: c.search,
    solverVersion: r.solverVersion,
    caution: CAUTION,
  } as unknown as DrawableResult;
  const safe = (t: string) => t.replace(/[^A-Za-z0-9._-]+/g, '_');
  return {
    svg: drawSection(sectionOfCase(input, c.name), result),
    fileName: `${safe(s.key)}-run${s.run}${caseName === undefined ? '' : `-${safe(c.name)}`}.svg`,
  };
}
