/**
 * Reports a checker signs: a section's PDF (made on request, on a report thread of the API) and
 * a corridor's (made by a worker job that reports its progress). Both are laid out by
 * @scarpline/report from the stored input and results, carry the review record that applies
 * when they are made, and are kept in object storage (services/files.ts) with a row here; a
 * section's report is made again only when its run or its review has changed since.
 */
import { Op, QueryTypes } from 'sequelize';
import { CAUTION } from '@scarpline/core/caution';
import type { MethodId, Section } from '@scarpline/core/model';
import type {
  CaseResult,
  DrawdownReport,
  MethodReport,
  RequiredReinforcementReport,
  SearchReport,
  SeismicReport,
  StationProbability,
  StationResult,
  Warning,
} from '@scarpline/core/result';
import type { CorridorStation, ReportMeta, ReviewRecord } from '@scarpline/report';
import { REPORT_LIMITS } from '@scarpline/report';
import type { Response } from 'express';
import { sequelize } from '../db';
import { conflict, invalid, notFound } from '../errors';
import { PoolError } from '../intake/thread-pool';
import {
  Batch,
  CaseResultRow,
  Project,
  ReportRow,
  ResultRow,
  Review,
  SectionRow,
  StoredFile,
  type Appendix,
} from '../models';
import { enqueueReport, REPORT_QUEUE } from '../queue';
import { makeReport, poolFailure } from '../reports/pool';
import { audit } from './audit';
import { assertProject, type Principal } from './auth';
import { loadBatch } from './batches';
import { sendStoredFile, storeFile } from './files';
import { sectionReviewStates } from './reviews';
import { casesOf, loadSection } from './sections';
import { stationLabel, userRefs } from './views';

const PDF = 'application/pdf';
/** The progress of a corridor report is written at most this often (ms). */
const PROGRESS_EVERY_MS = 500;

const safe = (t: string) => t.replace(/[^A-Za-z0-9._+-]+/g, '_');
const day = (d: Date) => d.toISOString().slice(0, 10);

/** A stored case as the core's CaseResult. */
function caseResultOf(c: CaseResultRow): CaseResult {
  return {
    name: c.name,
    kind: c.kind,
    requiredFs: c.requiredFs,
    governs: c.governs as MethodId[],
    results: c.methods as MethodReport[],
    governing:
      c.governingMethod !== null && c.governingFs !== null
        ? { method: c.governingMethod as MethodId, fs: c.governingFs }
        : null,
    ratio: c.ratio,
    verdict: c.verdict,
    warnings: c.warnings as Warning[],
    search: (c.search as SearchReport | null) ?? null,
    ...(c.drawdown ? { drawdown: c.drawdown as DrawdownReport } : {}),
    ...(c.seismic ? { seismic: c.seismic as SeismicReport } : {}),
    ...(c.requiredReinforcement
      ? { requiredReinforcement: c.requiredReinforcement as RequiredReinforcementReport }
      : {}),
  };
}

/** A stored run's result as the core gave it (analyzeSection's StationResult). */
export function stationResultOf(
  input: Section,
  r: ResultRow,
  cases: readonly CaseResultRow[],
): StationResult {
  return {
    id: input.id,
    title: input.title,
    station: input.station ?? null,
    units: input.units,
    cases: cases.map(caseResultOf),
    governing:
      r.governingCase !== null && r.governingMethod !== null && r.governingFs !== null
        ? {
            case: r.governingCase,
            method: r.governingMethod as MethodId,
            fs: r.governingFs,
            requiredFs: r.requiredFs,
            ratio: r.ratio,
          }
        : null,
    verdict: r.verdict,
    warnings: r.warnings as Warning[],
    solverVersion: r.solverVersion,
    caution: CAUTION,
  };
}

/** A stored run's probability of failure by case (its section's critical-surface probability block), or null. */
const probabilityOf = (r: ResultRow): StationProbability[] | null =>
  (r.probability as StationProbability[] | null) ?? null;

/** A review as the report's record of it (who, when, what, why); none: not reviewed. */
function reviewRecord(review: Review | null, names: Map<number, { name: string }>): ReviewRecord {
  if (!review) return { state: 'not reviewed' };
  return {
    state: review.decision,
    reviewer: names.get(review.reviewerId)?.name ?? `user ${review.reviewerId}`,
    date: review.createdAt.toISOString(),
    decision: review.decision,
    comment: review.comment,
  };
}

/** The latest review of a whole batch, or null. */
function latestBatchReview(batchId: number): Promise<Review | null> {
  return Review.findOne({
    where: { batchId, sectionId: null },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
}

/** Who submitted the run: the batch's submitter, and who edited this run where someone did. */
function submittedBy(
  batch: Batch,
  section: SectionRow | null,
  names: Map<number, { name: string }>,
): string {
  const submitter = names.get(batch.submittedBy)?.name ?? `user ${batch.submittedBy}`;
  const editor = section?.editedBy ?? null;
  if (editor === null) return submitter;
  return `${submitter}; run ${section!.run} edited by ${names.get(editor)?.name ?? `user ${editor}`}`;
}

/** The record common to a batch's reports: project, corridor, source, date, submitter. */
async function batchMeta(batch: Batch, now: Date): Promise<Omit<ReportMeta, 'solverVersion'>> {
  const project = await Project.findByPk(batch.projectId, { attributes: ['name'] });
  return {
    project: project?.name,
    corridor: batch.title ? `${batch.title} (${batch.name})` : batch.name,
    source: batch.source,
    date: now.toISOString(),
  };
}

/**
 * The stations of a batch as a corridor report takes them: each section's input, its current
 * result (null with the reason when it has none), run, submitter and the review that applies.
 */
async function corridorStations(batch: Batch, now: Date): Promise<CorridorStation[]> {
  const sections = await SectionRow.findAll({
    where: { batchId: batch.id },
    order: [['position', 'ASC']],
  });
  const results = await ResultRow.findAll({
    where: { [Op.or]: sections.map((s) => ({ sectionId: s.id, run: s.run })) },
  });
  const bySection = new Map(results.map((r) => [r.sectionId as number, r]));
  const cases = await casesOf(results, { search: true });
  const reviews = await sectionReviewStates(batch.id);
  const names = await userRefs([
    batch.submittedBy,
    ...sections.map((s) => s.editedBy ?? null),
    ...[...reviews.values()].map((r) => r?.reviewerId ?? null),
  ]);
  const common = await batchMeta(batch, now);
  return sections.map((s) => {
    const input = s.input as Section;
    const r = bySection.get(s.id);
    const meta: ReportMeta = {
      ...common,
      run: s.run,
      solverVersion: r?.solverVersion ?? '',
      submittedBy: submittedBy(batch, s, names),
      review: reviewRecord(reviews.get(s.id) ?? null, names),
    };
    if (!r) {
      return {
        section: input,
        result: null,
        reason: s.failReason ?? `not analyzed (${s.status})`,
        meta,
      };
    }
    return {
      section: input,
      result: stationResultOf(input, r, cases.get(r.id) ?? []),
      probability: probabilityOf(r),
      meta,
    };
  });
}

/** A report as the API shows it: what it is, how far it is, and where to download it. */
export function reportView(r: ReportRow) {
  return {
    id: r.id,
    kind: r.kind,
    batchId: r.batchId,
    sectionId: r.sectionId,
    run: r.run,
    appendix: r.appendix,
    status: r.status,
    progress: { done: r.done, total: r.total },
    reviewId: r.reviewId,
    requestedBy: r.requestedBy,
    reason: r.reason ?? null,
    createdAt: r.createdAt,
    finishedAt: r.finishedAt ?? null,
    download: r.status === 'done' && r.fileId !== null ? `/api/v1/reports/${r.id}/file` : null,
    caution: CAUTION,
  };
}

/** The name of a section report's file: corridor, station (or section), run, date. */
function sectionFileName(batch: Batch, s: SectionRow, now: Date): string {
  const where = stationLabel(s) ?? s.key;
  return `${safe(batch.name)}-${safe(where)}-run${s.run}-report-${day(now)}.pdf`;
}

/** The name of a corridor report's file: corridor, which section pages, date. */
function corridorFileName(batch: Batch, appendix: Appendix | null, now: Date): string {
  const pages = appendix && appendix !== 'none' ? `-sections-${appendix}` : '';
  return `${safe(batch.name)}-corridor-report${pages}-${day(now)}.pdf`;
}

/**
 * A section's report for its current run, as a stored file: the one made before for the same
 * run and the same review, or a new one laid out now on a report thread and stored. 409 while
 * the section has no result for its run.
 */
export async function sectionReport(p: Principal, sectionId: number) {
  const s = await loadSection(p, sectionId);
  const batch = await loadBatch(p, s.batchId);
  const r = await ResultRow.findOne({ where: { sectionId: s.id, run: s.run } });
  if (!r) throw conflict(`Section ${s.key} has no result for run ${s.run} yet.`);
  const review = (await sectionReviewStates(batch.id)).get(s.id) ?? null;
  const made = await ReportRow.findOne({
    where: {
      kind: 'section',
      sectionId: s.id,
      run: s.run,
      reviewId: review?.id ?? null,
      status: 'done',
      fileId: { [Op.ne]: null },
    },
    order: [['id', 'DESC']],
  });
  const kept = made ? await StoredFile.findByPk(made.fileId!) : null;
  if (made && kept) return { report: made, file: kept, name: kept.name };

  const now = new Date();
  const names = await userRefs([batch.submittedBy, s.editedBy ?? null, review?.reviewerId ?? null]);
  const input = s.input as Section;
  const cases = (await casesOf([r], { search: true })).get(r.id) ?? [];
  let pdf: Buffer;
  try {
    pdf = await makeReport({
      kind: 'section',
      input: {
        section: input,
        result: stationResultOf(input, r, cases),
        probability: probabilityOf(r),
        meta: {
          ...(await batchMeta(batch, now)),
          run: s.run,
          solverVersion: r.solverVersion,
          submittedBy: submittedBy(batch, s, names),
          review: reviewRecord(review, names),
        },
      },
    });
  } catch (e) {
    if (e instanceof PoolError)
      throw invalid(`The report of section ${s.key} was not made: ${poolFailure(e)}.`);
    throw e;
  }
  const name = sectionFileName(batch, s, now);
  const file = await storeFile({
    kind: 'report',
    name,
    contentType: PDF,
    body: pdf,
    batchId: batch.id,
    sectionId: s.id,
    createdBy: p.userId,
  });
  const report = await ReportRow.create({
    kind: 'section',
    batchId: batch.id,
    sectionId: s.id,
    run: s.run,
    appendix: null,
    status: 'done',
    done: 1,
    total: 1,
    reviewId: review?.id ?? null,
    fileId: file.id,
    requestedBy: p.userId,
    finishedAt: new Date(),
  });
  return { report, file, name };
}

/**
 * Asks for a corridor report of a finished batch: a row (queued) and a worker job, together.
 * 409 while the batch runs; 422 when every section's page is asked for in a batch longer than
 * the report's bound.
 */
export async function requestCorridorReport(p: Principal, batchId: number, appendix: string) {
  const batch = await loadBatch(p, batchId);
  if (!(['all', 'below', 'none'] as const).includes(appendix as Appendix)) {
    throw invalid('appendix is one of all, below, none.', { field: 'appendix' });
  }
  if (batch.status !== 'done') {
    throw conflict('The batch is still running; ask for its report when it is done.');
  }
  if (appendix === 'all' && batch.total > REPORT_LIMITS.maxAppendixSections) {
    throw invalid(
      `A corridor report appends the pages of at most ${REPORT_LIMITS.maxAppendixSections} sections; this batch has ${batch.total}. Ask for the sections below requirement only (appendix=below), or none.`,
      { field: 'appendix' },
    );
  }
  const review = await latestBatchReview(batch.id);
  const report = await sequelize.transaction(async (t) => {
    const row = await ReportRow.create(
      {
        kind: 'corridor',
        batchId: batch.id,
        sectionId: null,
        run: null,
        appendix: appendix as Appendix,
        status: 'queued',
        total: batch.total,
        reviewId: review?.id ?? null,
        fileId: null,
        requestedBy: p.userId,
      },
      { transaction: t },
    );
    await enqueueReport({ reportId: row.id }, t);
    await audit(p.userId, 'report', 'batch', batch.id, { reportId: row.id, appendix }, t);
    return row;
  });
  return reportView(report);
}

/** A report the principal may see (through its batch's project); 404 otherwise. */
export async function loadReport(p: Principal, reportId: number): Promise<ReportRow> {
  const r = await ReportRow.findByPk(reportId);
  if (!r) throw notFound('report');
  const b = await Batch.findByPk(r.batchId, { attributes: ['id', 'projectId'] });
  if (!b) throw notFound('report');
  assertProject(p, b.projectId, 'report');
  return r;
}

/** A batch's corridor reports, newest first (the last REPORT_LIST of them). */
export async function listReports(p: Principal, batchId: number) {
  const batch = await loadBatch(p, batchId);
  const rows = await ReportRow.findAll({
    where: { batchId: batch.id, kind: 'corridor' },
    order: [['id', 'DESC']],
    limit: REPORT_LIST,
  });
  return { reports: rows.map(reportView), caution: CAUTION };
}

/** How many of a batch's corridor reports the list shows. */
export const REPORT_LIST = 20;

/** Streams a made report's file; 409 while it is being made, 404 when it failed or is gone. */
export async function sendReport(p: Principal, reportId: number, res: Response): Promise<void> {
  const r = await loadReport(p, reportId);
  if (r.status === 'queued' || r.status === 'running') {
    throw conflict(`Report ${r.id} is ${r.status}; download it when it is done.`);
  }
  const file = r.fileId !== null ? await StoredFile.findByPk(r.fileId) : null;
  if (r.status === 'failed' || !file) {
    throw notFound(`report ${r.id}'s file`);
  }
  await sendStoredFile(res, file, file.name);
}

/**
 * A worker's part: lays out a queued corridor report on a report thread (its progress written
 * as it goes), stores it and marks it done; or marks it failed with the reason. A report that
 * is done already (a job delivered twice) is left as it is.
 */
export async function runCorridorReport(reportId: number): Promise<void> {
  const row = await ReportRow.findByPk(reportId);
  if (!row || row.status === 'done') return;
  const batch = await Batch.findByPk(row.batchId);
  if (!batch) return;
  await row.update({ status: 'running', done: 0 });
  const now = new Date();
  try {
    const stations = await corridorStations(batch, now);
    const review = row.reviewId !== null ? await Review.findByPk(row.reviewId) : null;
    const names = await userRefs([batch.submittedBy, review?.reviewerId ?? null]);
    const solverVersions = [...new Set(stations.map((s) => s.meta.solverVersion).filter(Boolean))];
    let written = 0;
    let writing: Promise<unknown> = Promise.resolve();
    const pdf = await makeReport(
      {
        kind: 'corridor',
        input: {
          meta: {
            ...(await batchMeta(batch, now)),
            solverVersion: solverVersions.join(', '),
            submittedBy: submittedBy(batch, null, names),
            review: reviewRecord(review, names),
          },
          stations,
          appendix: row.appendix ?? 'below',
        },
      },
      (done, total) => {
        if (Date.now() - written < PROGRESS_EVERY_MS && done < total) return;
        written = Date.now();
        writing = writing.then(() => row.update({ done, total }).catch(() => undefined));
      },
    );
    await writing;
    const file = await storeFile({
      kind: 'report',
      name: corridorFileName(batch, row.appendix, now),
      contentType: PDF,
      body: pdf,
      batchId: batch.id,
      createdBy: row.requestedBy,
    });
    await row.update({ status: 'done', fileId: file.id, done: row.total, finishedAt: new Date() });
  } catch (e) {
    const reason =
      e instanceof PoolError ? poolFailure(e) : e instanceof Error ? e.message : String(e);
    await row.update({ status: 'failed', reason, finishedAt: new Date() });
    // A thread stopped at its limit would stop again: only other failures are tried again.
    if (!(e instanceof PoolError)) throw e;
  }
}

/**
 * Fails the corridor reports the queue has given up on: queued or running, and no job of
 * theirs waiting or active any more (the worker laying one out ended, a kill or a crash, on its
 * try and on its retry; the queue then fails the job, and nothing else would end the report).
 * A report's job is queued in the transaction that writes its row, and ends after the row.
 * Called by the API's stall watch; returns the ids it failed.
 */
export async function failOrphanedReports(): Promise<number[]> {
  const rows = await sequelize.query<{ id: number }>(
    `UPDATE reports r SET status = 'failed', reason = $2, finished_at = now(), updated_at = now()
      WHERE r.kind = 'corridor' AND r.status IN ('queued', 'running')
        AND NOT EXISTS (
          SELECT 1 FROM pgboss.job j
           WHERE j.name = $1 AND j.state IN ('created', 'retry', 'active')
             AND j.data->>'reportId' = r.id::text)
      RETURNING r.id`,
    {
      bind: [
        REPORT_QUEUE,
        'the worker laying it out stopped before it finished, on every try (a worker that was killed or ran out of memory): ask for the report again',
      ],
      type: QueryTypes.SELECT,
    },
  );
  return rows.map((r) => r.id);
}
