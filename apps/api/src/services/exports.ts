/**
 * Exports of a batch's current results (CSV, GeoJSON) and a section's plot (SVG). The CSV
 * columns and GeoJSON properties are the core's results table (export/export-table.ts,
 * schemas/export-table.schema.json), the same as `scarpline batch` writes — per station a row
 * per design case, then the station's — with the service's own columns at the end: the review
 * state and the job state.
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
} from '@scarpline/core/export';
import { sectionOfCase, type MethodId, type Section } from '@scarpline/core/model';
import type { MethodReport, RequiredReinforcementReport, Warning } from '@scarpline/core/result';
import { conflict, notFound } from '../errors';
import { Batch, ResultRow, SectionRow, type CaseResultRow } from '../models';
import type { Principal } from './auth';
import { sectionReviewStates } from './reviews';
import { casesOf, loadSection } from './sections';

/** The columns the service adds after the table's: what only it knows. */
export const SERVICE_COLUMNS = ['review_state', 'job_state'] as const;

interface Row {
  section: SectionRow;
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
    return {
      section,
      records: recordsOf(section, result, result ? (cases.get(result.id) ?? []) : []),
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
