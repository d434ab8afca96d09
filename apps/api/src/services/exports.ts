/**
 * Exports of a batch's current results (CSV, GeoJSON) and a section's plot (SVG). The CSV
 * columns and GeoJSON properties are the core's results table (export/export-table.ts,
 * schemas/export-table.schema.json), the same as `scarpline batch` writes, with the service's
 * own columns at the end: the review state and the job state.
 */
import { CAUTION } from '@scarpline/core/caution';
import { drawSection, type DrawableResult } from '@scarpline/core/draw';
import {
  exportCollection,
  exportCsvHeader,
  exportCsvRow,
  exportFeature,
  exportRecord,
  unanalysedRecord,
  type ExportRecord,
  type ExportValue,
} from '@scarpline/core/export';
import type { Section } from '@scarpline/core/model';
import type { MethodReport, Warning } from '@scarpline/core/result';
import { conflict } from '../errors';
import { Batch, ResultRow, SectionRow } from '../models';
import type { Principal } from './auth';
import { sectionReviewStates } from './reviews';
import { loadSection } from './sections';

/** The columns the service adds after the table's: what only it knows. */
export const SERVICE_COLUMNS = ['review_state', 'job_state'] as const;

interface Row {
  section: SectionRow;
  record: ExportRecord;
  service: Record<(typeof SERVICE_COLUMNS)[number], ExportValue>;
}

/** A section's row of the results table, from its current result (or why it has none). */
function recordOf(section: SectionRow, result: ResultRow | null): ExportRecord {
  // The stored input is a normalised section; a row written by hand may hold less.
  const input = section.input as Partial<Section>;
  const units = input.units ?? 'si';
  const analysis = input.analysis;
  if (result) {
    return exportRecord({
      id: section.key,
      station: section.station,
      units,
      case: analysis?.case ?? null,
      requiredFs: result.requiredFs,
      governing:
        result.governingMethod !== null && result.governingFs !== null
          ? { method: result.governingMethod as MethodReport['method'], fs: result.governingFs }
          : null,
      verdict: result.verdict,
      warnings: result.warnings as Warning[],
      results: result.methods as MethodReport[],
    });
  }
  // No result: the job has not finished, or it failed without one (out of time or retries).
  const failed = section.status === 'failed';
  return unanalysedRecord({
    id: section.key,
    station: section.station,
    units,
    case: analysis?.case ?? null,
    requiredFs: analysis?.requiredFs ?? null,
    verdict: failed ? 'no-fs' : null,
    note: failed ? section.failReason : null,
  });
}

async function rows(batch: Batch): Promise<Row[]> {
  const sections = await SectionRow.findAll({
    where: { batchId: batch.id },
    order: [
      ['station', 'ASC NULLS LAST'],
      ['position', 'ASC'],
    ],
  });
  const results = await ResultRow.findAll({ where: { sectionId: sections.map((s) => s.id) } });
  const reviews = await sectionReviewStates(batch.id);
  return sections.map((section) => {
    const result = results.find((r) => r.sectionId === section.id && r.run === section.run);
    return {
      section,
      record: recordOf(section, result ?? null),
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
  for (const { record, service } of await rows(batch)) {
    lines.push(
      exportCsvRow(
        record,
        SERVICE_COLUMNS.map((c) => service[c]),
      ),
    );
  }
  return lines.join('');
}

export async function batchGeoJson(batch: Batch) {
  return exportCollection(
    batch.name,
    (await rows(batch)).map(({ section, record, service }) =>
      exportFeature(record, {
        // The section line as the corridor gave it; null when the input had no coordinates.
        geometry: section.geometry ?? null,
        input: section.featureProperties,
        extra: service,
      }),
    ),
  );
}

/** The section drawn with its current result (drawSection from the core carries the caution). */
export async function sectionSvg(p: Principal, sectionId: number) {
  const s = await loadSection(p, sectionId);
  const r = await ResultRow.findOne({ where: { sectionId: s.id, run: s.run } });
  if (!r) throw conflict(`Section ${s.key} has no result for run ${s.run} yet.`);
  const input = s.input as Section;
  const result = {
    id: input.id,
    title: input.title,
    station: input.station,
    units: input.units,
    case: input.analysis.case,
    requiredFs: r.requiredFs,
    results: r.methods,
    governing: r.governingMethod ? { method: r.governingMethod, fs: r.governingFs } : null,
    verdict: r.verdict,
    warnings: r.warnings,
    search: r.search,
    solverVersion: r.solverVersion,
    caution: CAUTION,
  } as unknown as DrawableResult;
  return {
    svg: drawSection(input, result),
    fileName: `${s.key.replace(/[^A-Za-z0-9._-]+/g, '_')}-run${s.run}.svg`,
  };
}
