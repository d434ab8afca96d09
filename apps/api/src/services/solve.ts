/**
 * Solving one section (the worker's job): analyse it in the worker's thread within the time
 * limit, write how it ended once per run, close the batch.
 *
 * Delivery is at least once (a job whose worker died is handed out again), so every write is
 * idempotent and a section ends exactly once: its move from queued/running to done/failed is a
 * conditional update, the result is written in the same transaction, and only the job that
 * made the move sends mail. A job for an older run (superseded by a re-run), or for a section
 * that has already ended, does nothing but make sure its batch is closed. Every step waits for
 * the database when it is away (a restart) instead of failing the job.
 */
import crypto from 'node:crypto';
import { SOLVER_VERSION, unsolvedReason } from '@scarpline/core';
import type { SectionResult } from '@scarpline/core/result';
import { Op, QueryTypes } from 'sequelize';
import { config } from '../config';
import { sequelize, whenDatabaseIsBack } from '../db';
import { log } from '../log';
import { ResultRow, SectionRow, type SectionStatus } from '../models';
import type { SectionJob } from '../queue';
import type { Solver } from '../solver';
import { batchFinished, sectionBelowFs } from './mail';

export function inputHash(input: object): string {
  return crypto.createHash('sha256').update(JSON.stringify(input)).digest('hex');
}

/**
 * How a job ended: `done`, `unsolved` (no method converged: failed with the reasons), `stopped`
 * (its work bound or time limit: failed with what to change, never retried), `skipped` (an
 * older run, or a section that had already ended), `abandoned` (the worker is stopping: the job
 * is left to the queue, which hands it out again).
 */
export type JobEnd = 'done' | 'unsolved' | 'stopped' | 'skipped' | 'abandoned';

/** A failure worth another attempt (the queue retries it, then hands it to the dead letters). */
export class JobFailed extends Error {
  override name = 'JobFailed';
}

const WAITING: SectionStatus[] = ['queued', 'running'];

/** Runs a database step, waiting for the database while it is away (logged once a step). */
function step<T>(what: string, operation: () => Promise<T>, signal?: AbortSignal): Promise<T> {
  return whenDatabaseIsBack(operation, {
    signal,
    onWait: (e, attempt) => {
      if (attempt === 1) {
        log.warn({ err: e }, `database unavailable (${what}): waiting for it to come back`);
      }
    },
  });
}

/**
 * Runs a section's job in `solver` (one attempt; `attempt` counts from 0). Resolves with how it
 * ended; throws JobFailed (or another error) for the queue to retry.
 */
export async function solveSection(
  job: SectionJob,
  attempt: number,
  solver: Solver,
  signal?: AbortSignal,
): Promise<JobEnd> {
  const where = { id: job.sectionId, run: job.run, status: { [Op.in]: WAITING } };
  const section = await step('read the section', () => SectionRow.findByPk(job.sectionId), signal);
  if (!section || section.run !== job.run || !WAITING.includes(section.status)) {
    if (section) await step('close the batch', () => closeBatchIfLast(section.batchId), signal);
    return 'skipped';
  }
  await step('mark it running', () => SectionRow.update({ status: 'running' }, { where }), signal);
  const startedAt = new Date();
  const outcome = await solver.solve(section.input, config.jobTimeout * 1000);
  const finishedAt = new Date();
  if (outcome.kind === 'aborted') return 'abandoned';

  if (outcome.kind === 'error') {
    const reason = `attempt ${attempt + 1}: ${outcome.reason}`.slice(0, 2000);
    // Back to queued until the retry takes it (or the dead letters end it).
    await step(
      'record the failed attempt',
      () => SectionRow.update({ status: 'queued', failReason: reason }, { where }),
      signal,
    );
    throw new JobFailed(reason);
  }

  let ended: boolean;
  let end: JobEnd;
  let result: SectionResult | null = null;
  if (outcome.kind === 'stopped') {
    end = 'stopped';
    ended = await step(
      'end it failed',
      async () => {
        const [n] = await SectionRow.update(
          { status: 'failed', failReason: outcome.reason.slice(0, 2000) },
          { where },
        );
        return n > 0;
      },
      signal,
    );
  } else {
    result = outcome.result;
    end = result.verdict === 'no-fs' ? 'unsolved' : 'done';
    ended = await step(
      'write the result',
      () => writeResult(section, job.run, attempt, result!, startedAt, finishedAt),
      signal,
    );
  }
  if (!ended) {
    // Another delivery of this job ended the section first.
    await step('close the batch', () => closeBatchIfLast(section.batchId), signal);
    return 'skipped';
  }
  log.info(
    {
      sectionId: section.id,
      batchId: section.batchId,
      run: job.run,
      end,
      attempt: attempt + 1,
      ms: finishedAt.getTime() - startedAt.getTime(),
    },
    'section ended',
  );
  if (result?.verdict === 'below') {
    const r = result;
    await step(
      'mail',
      () => sectionBelowFs(section, r.governing?.fs ?? null, r.requiredFs),
      signal,
    );
  }
  await step('close the batch', () => closeBatchIfLast(section.batchId), signal);
  return end;
}

/**
 * Writes a result and ends the section in one transaction, if the section still waits for
 * this run; false (and nothing written) when it has already ended.
 */
async function writeResult(
  section: SectionRow,
  run: number,
  attempt: number,
  result: SectionResult,
  startedAt: Date,
  finishedAt: Date,
): Promise<boolean> {
  const unsolved = result.verdict === 'no-fs';
  const reason = unsolved ? unsolvedReason(result.results) : null;
  const governing = result.results.find((m) => m.method === result.governing?.method);
  return sequelize.transaction(async (transaction) => {
    const [n] = await SectionRow.update(
      { status: unsolved ? 'failed' : 'done', failReason: reason },
      { where: { id: section.id, run, status: { [Op.in]: WAITING } }, transaction },
    );
    if (n === 0) return false;
    await ResultRow.upsert(
      {
        sectionId: section.id,
        run,
        verdict: result.verdict,
        governingMethod: result.governing?.method ?? null,
        governingFs: result.governing?.fs ?? null,
        requiredFs: result.requiredFs,
        methods: result.results,
        criticalSurface: governing?.surface ?? null,
        warnings: result.warnings,
        search: result.search,
        reason,
        solverVersion: SOLVER_VERSION,
        inputHash: inputHash(section.input),
        startedAt,
        finishedAt,
        durationMs: finishedAt.getTime() - startedAt.getTime(),
        attempt: attempt + 1,
        input: section.input,
      },
      {
        transaction,
        // Sequelize writes these names into ON CONFLICT as they are: the column names.
        conflictFields: ['section_id' as 'sectionId', 'run'],
      },
    );
    return true;
  });
}

/**
 * Dead letter: the retries are used up (errors, or a worker that died each time); the section
 * ends failed with the last attempt's reason, once.
 */
export async function giveUp(job: SectionJob, signal?: AbortSignal): Promise<boolean> {
  const section = await step('read the section', () => SectionRow.findByPk(job.sectionId), signal);
  if (!section || section.run !== job.run) return false;
  const reason = `gave up after ${config.retryLimit + 1} attempts: ${
    section.failReason ?? 'each attempt ended with its worker (it was stopped or it died)'
  }`.slice(0, 2000);
  const [n] = await step(
    'end it failed',
    () =>
      SectionRow.update(
        { status: 'failed', failReason: reason },
        { where: { id: section.id, run: job.run, status: { [Op.in]: WAITING } } },
      ),
    signal,
  );
  if (n > 0) {
    log.info(
      { sectionId: section.id, batchId: section.batchId, run: job.run, end: 'gave-up' },
      'section ended',
    );
  }
  await step('close the batch', () => closeBatchIfLast(section.batchId), signal);
  return n > 0;
}

/**
 * Marks the batch done when no section is queued or running. Each worker checks after its own
 * commit, so the last one always sees every other; the conditional update closes it once.
 */
export async function closeBatchIfLast(batchId: number): Promise<boolean> {
  const rows = await sequelize.query(
    `UPDATE batches SET status = 'done', finished_at = now(), updated_at = now()
      WHERE id = $1 AND status = 'running'
        AND NOT EXISTS (SELECT 1 FROM sections WHERE batch_id = $1 AND status IN ('queued', 'running'))
      RETURNING id`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  if (rows.length === 0) return false;
  log.info({ batchId }, 'batch finished');
  // A notice, not part of the result: a failure to send it never undoes the close.
  await batchFinished(batchId).catch((e: Error) =>
    log.warn({ err: e, batchId }, `mail: batch finished not sent (${e.message})`),
  );
  return true;
}
