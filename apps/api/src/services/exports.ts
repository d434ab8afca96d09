/** Exports of a batch's current results (CSV, GeoJSON) and a section's plot (SVG). */
import { CAUTION, drawSection, type DrawableResult, type Section } from '@scarpline/core';
import { conflict } from '../errors';
import { Batch, ResultRow, SectionRow } from '../models';
import type { Principal } from './auth';
import { sectionReviewStates } from './reviews';
import { loadSection } from './sections';
import { passes, stationLabel } from './views';

interface Row {
  section: SectionRow;
  result: ResultRow | null;
  reviewState: string;
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
  return sections.map((section) => ({
    section,
    result: results.find((r) => r.sectionId === section.id && r.run === section.run) ?? null,
    reviewState: reviews.get(section.id)?.decision ?? 'pending',
  }));
}

function cell(v: unknown): string {
  const s = v === null || v === undefined ? '' : String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function fileName(batch: Batch, ext: string): string {
  return `${batch.name.replace(/[^A-Za-z0-9._-]+/g, '_')}-results.${ext}`;
}

export async function batchCsv(batch: Batch): Promise<string> {
  const head = [
    'station',
    'id',
    'governing_method',
    'fs',
    'required_fs',
    'passes',
    'status',
    'review_state',
    'caution',
  ];
  const lines = [head.join(',')];
  for (const { section, result, reviewState } of await rows(batch)) {
    const p = passes(result);
    lines.push(
      [
        section.station,
        section.key,
        result?.governingMethod,
        result?.governingFs?.toFixed(3),
        result?.requiredFs,
        p === null ? '' : p ? 'yes' : 'no',
        section.status,
        reviewState,
        CAUTION,
      ]
        .map(cell)
        .join(','),
    );
  }
  return lines.join('\r\n') + '\r\n';
}

export async function batchGeoJson(batch: Batch) {
  return {
    type: 'FeatureCollection',
    name: batch.name,
    caution: CAUTION,
    features: (await rows(batch)).map(({ section, result, reviewState }) => ({
      type: 'Feature',
      id: section.key,
      // The section line as the corridor gave it; null when the input had no coordinates.
      geometry: section.geometry ?? null,
      properties: {
        id: section.key,
        sectionId: section.id,
        station: section.station,
        stationLabel: stationLabel(section),
        status: section.status,
        fs: result?.governingFs ?? null,
        method: result?.governingMethod ?? null,
        required: result?.requiredFs ?? null,
        passes: passes(result),
        warningCount: result ? (result.warnings as unknown[]).length : null,
        reviewState,
        caution: CAUTION,
      },
    })),
  };
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
    passes: passes(r),
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
