import { writeFileSync } from 'node:fs';
import { basename, dirname, extname, join } from 'node:path';
import {
  analyzeSection,
  AnalysisStopped,
  formatMessage,
  isGeoJsonCorridor,
  isLandXml,
  parseSections,
  stationProbabilityOrWarning,
  type Section,
  type StationProbability,
  type StationResult,
} from '@scarpline/core';
import { corridorReportPdf, sectionReportPdf, type ReportMeta } from '@scarpline/report';
import { exitCode } from './analyze-files';
import type { BatchOptions } from './batch/run-batch';
import { readInput, STDIN_NAME, UserError } from './read-input';

/** Which section pages a corridor report ends with. */
export type Appendix = 'all' | 'below' | 'none';
export const APPENDIX_CHOICES: readonly Appendix[] = ['all', 'below', 'none'];

/** What a report is asked to hold beyond the results: where it goes, its appendix, who and what for. */
export interface ReportRequest {
  /** The PDF to write (a batch's report: default <out>/<corridor id>-corridor-report.pdf). */
  path?: string;
  appendix: Appendix;
  project?: string;
  /** Submitted by. */
  by?: string;
}

/** A file name made of safe characters. */
const safe = (name: string) => name.replace(/[^A-Za-z0-9._+@-]/g, '_');

/** The corridor report's file name in a folder: "<corridor id>-corridor-report.pdf". */
export const corridorReportName = (id: string): string =>
  `${safe(basename(id, extname(id)))}-corridor-report.pdf`;

/** The record of a report made now by this command (nobody has reviewed it yet). */
function metaOf(
  r: Omit<ReportRequest, 'path' | 'appendix'>,
  m: { source: string; solverVersion: string; corridor?: string },
): ReportMeta {
  return {
    ...(r.project ? { project: r.project } : {}),
    ...(m.corridor ? { corridor: m.corridor } : {}),
    source: m.source,
    date: new Date().toISOString(),
    solverVersion: m.solverVersion,
    ...(r.by ? { submittedBy: r.by } : {}),
    review: null,
  };
}

/**
 * The corridor report of a batch that `scarpline batch` ran (its stations with their sections
 * and results, or why they have none), written to `request.path`; the path written.
 */
export async function writeCorridorReport(
  request: ReportRequest & { path: string },
  corridor: {
    id: string;
    source: string;
    solverVersion: string;
    /** each result as the batch's worker gives it: with the probability of failure it computed */
    stations: {
      section: Section;
      result: (StationResult & { probability?: StationProbability[] | null }) | null;
      reason?: string;
    }[];
    unread: { label: string; station: number | null; reason: string }[];
  },
  err: (line: string) => void,
): Promise<string> {
  const meta = metaOf(request, {
    source: corridor.source,
    solverVersion: corridor.solverVersion,
    corridor: corridor.id,
  });
  let last = -1;
  const pdf = await corridorReportPdf({
    meta,
    // the probability of failure the batch's worker computed with each station's result
    stations: corridor.stations.map((s) => ({
      ...s,
      probability: s.result?.probability ?? null,
      meta,
    })),
    unread: corridor.unread,
    appendix: request.appendix,
    onProgress: (done, total) => {
      // a line at every tenth of the appendix
      const step = Math.floor((10 * done) / Math.max(total, 1));
      if (total > 0 && step !== last) {
        last = step;
        err(`report: ${done}/${total} section pages`);
      }
    },
  });
  writeFileSync(request.path, pdf);
  return request.path;
}

/**
 * `scarpline report <file>`: a file of one section → its section report; a batch, a GeoJSON
 * corridor or a file of several sections → the corridor report, analysed as `scarpline batch`
 * analyses it (its worker threads and bounds: runBatch). The PDF goes to `options.out`, or
 * beside the input as "<id>-section-report.pdf" / "<corridor>-corridor-report.pdf". A file that
 * does not read gives its located messages and no PDF. Returns the exit code, as `analyze`
 * and `batch` give it.
 */
export async function reportFile(
  file: string,
  options: Omit<ReportRequest, 'path'> & { out?: string } & Omit<BatchOptions, 'out' | 'report'>,
  out: (line: string) => void,
  err: (line: string) => void,
): Promise<number> {
  const input = readInput(file);
  const name = input.name === STDIN_NAME ? 'stdin.yaml' : input.name;
  const dir = input.name === STDIN_NAME ? '.' : dirname(input.name);
  const request = (path: string): ReportRequest => ({
    path,
    appendix: options.appendix,
    ...(options.project ? { project: options.project } : {}),
    ...(options.by ? { by: options.by } : {}),
  });
  // a GeoJSON or LandXML corridor: read as batch reads it
  const geojson = isGeoJsonCorridor(input.text) || isLandXml(input.text);
  const parsed = geojson ? null : parseSections(input.text, name);
  if (geojson || parsed?.batch || (parsed && parsed.sections.length > 1)) {
    const id = parsed?.batch?.id ?? basename(name, extname(name));
    const { runBatch } = await import('./batch/run-batch');
    return runBatch(
      file,
      {
        ...options,
        out: undefined,
        report: request(options.out ?? join(dir, corridorReportName(id))),
      },
      out,
      err,
    );
  }
  if (options.template)
    throw new UserError('--template applies to a GeoJSON corridor; this is a section file');
  const { sections, messages } = parsed!;
  for (const m of messages) err(formatMessage({ ...m, file: input.name }));
  if (messages.some((m) => m.severity === 'error') || sections.length === 0) {
    err(`${input.name}: no report written`);
    return 1;
  }
  const { applyOverrides } = await import('./overrides');
  const section = applyOverrides(sections[0], options);
  let result: StationResult;
  // the probability of failure on each case's critical surface, where the section asks for it,
  // as `scarpline batch` computes it with the station's result (batch/worker.ts): where it
  // cannot be computed, the station's warning says why
  let probability: StationProbability[] | null = null;
  try {
    const analysed = analyzeSection(section);
    const { summary, warning } = stationProbabilityOrWarning(section, {}, analysed);
    probability = summary;
    result = warning ? { ...analysed, warnings: [...analysed.warnings, warning] } : analysed;
    if (warning) err(`${input.name}: ${section.id}: ${warning.message}`);
  } catch (e) {
    if (!(e instanceof AnalysisStopped)) throw e;
    err(`${input.name}: ${section.id}: ${e.message}; no report written`);
    return 1;
  }
  const path = options.out ?? join(dir, `${safe(section.id)}-section-report.pdf`);
  const pdf = await sectionReportPdf({
    section,
    result,
    probability,
    meta: metaOf(options, { source: input.name, solverVersion: result.solverVersion }),
  });
  writeFileSync(path, pdf);
  out(`wrote ${path}`);
  return exitCode(false, [result]);
}
