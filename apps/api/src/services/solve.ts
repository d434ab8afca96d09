/** Solving one section (the worker's job): analyse, write the result once per run, close the batch. */
import crypto from 'node:crypto';
import { analyzeSection, SOLVER_VERSION, unsolvedReason, type Section } from '@scarpline/core';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../db';
import { ResultRow, SectionRow } from '../models';
import type { SectionJob } from '../queue';
import { batchFinished, sectionBelowFs } from './mail';

export function inputHash(input: object): string {
  return crypto.createHash('sha256').update(JSON.stringify(input)).digest('hex');
}

/**
 * Runs a section's job. Idempotent: the result is keyed by (section, run), so a retried or
 * duplicated job overwrites its own row. A job for an older run (superseded by a re-run) is
 * dropped. A section the solver cannot solve (no method converged: verdict `no-fs`) ends
 * `failed` with the reasons; an exception is rethrown so the queue retries it, and the dead-letter handler ends
 * it `failed` when the retries are used up.
 */
export async function solveSection(job: SectionJob, attempt = 0): Promise<void> {
  try {
    await solveOnce(job, attempt);
  } catch (e) {
    const reason = `attempt ${attempt + 1}: ${(e as Error).message}`.slice(0, 2000);
    await SectionRow.update({ failReason: reason }, { where: { id: job.sectionId, run: job.run } });
    throw e;
  }
}

async function solveOnce(job: SectionJob, attempt: number): Promise<void> {
  const section = await SectionRow.findByPk(job.sectionId);
  if (!section || section.run !== job.run) return;
  if (section.status === 'done' || section.status === 'failed') {
    const existing = await ResultRow.findOne({ where: { sectionId: section.id, run: job.run } });
    if (existing) return;
  }
  await section.update({ status: 'running' });
  const startedAt = new Date();
  let result;
  try {
    result = analyzeSection(section.input as Section);
  } catch (e) {
    throw new Error(`solver error: ${(e as Error).message}`);
  }
  const finishedAt = new Date();
  const unsolved = result.verdict === 'no-fs';
  const reason = unsolved ? unsolvedReason(result.results) : null;
  const governing = result.results.find((m) => m.method === result.governing?.method);
  await sequelize.transaction(async (transaction) => {
    await ResultRow.upsert(
      {
        sectionId: section.id,
        run: job.run,
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
    await section.update(
      { status: unsolved ? 'failed' : 'done', failReason: reason },
      { transaction },
    );
  });
  if (result.verdict === 'below')
    await sectionBelowFs(section, result.governing?.fs ?? null, result.requiredFs);
  await closeBatchIfLast(section.batchId);
}

/** Dead letter: the retries are used up (errors or time limit); the section ends failed. */
export async function giveUp(job: SectionJob): Promise<void> {
  const section = await SectionRow.findByPk(job.sectionId);
  if (!section || section.run !== job.run) return;
  if (section.status === 'done' || section.status === 'failed') return;
  await section.update({
    status: 'failed',
    failReason: section.failReason ?? 'the job ran out of time or retries',
  });
  await closeBatchIfLast(section.batchId);
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
  await batchFinished(batchId);
  return true;
}
