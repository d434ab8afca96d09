/**
 * Solving sections (the worker's jobs): read the sections a worker has taken, mark each running
 * as its analysis starts, write how each ended once per run, close the batch. The worker
 * (worker.ts) runs the analyses and hands their ends here, several at a time when they come
 * quicker than they are written.
 *
 * Delivery is at least once (a job whose worker died is handed out again), so every write is
 * idempotent and a section ends exactly once: its move from queued/running to done/failed is a
 * conditional update, the result is written in the same statement, and only the job that made
 * the move sends mail. A job for an older run (superseded by a re-run), or for a section that
 * has already ended, does nothing but make sure its batch is closed. Every step waits for the
 * database when it is away (a restart) instead of failing the job.
 */
import { QueryTypes } from 'sequelize';
import { config } from '../config';
import { sequelize, whenDatabaseIsBack } from '../db';
import { log } from '../log';
import { SectionRow, type SectionStatus } from '../models';
import { listen, type SectionJob } from '../queue';
import type { SolvedSection } from '../solver';
import { batchFinished, sectionBelowFs } from './mail';

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
const WAITING_SQL = `('queued', 'running')`;

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

/** A section as a worker holds it: what it needs to analyse it and to write how it ended. */
export interface HeldSection {
  id: number;
  run: number;
  batchId: number;
  key: string;
  status: SectionStatus;
  /** The section's input as JSON text (the analysis thread parses it). */
  input: string;
}

/** Whether a job's section still waits for it (same run, not ended). */
export function waitsFor(section: HeldSection | undefined, job: SectionJob): boolean {
  return !!section && section.run === job.run && WAITING.includes(section.status);
}

/** Reads the sections of the jobs a worker has taken, in one statement; by id. */
export async function readSections(
  jobs: SectionJob[],
  signal?: AbortSignal,
): Promise<Map<number, HeldSection>> {
  if (jobs.length === 0) return new Map();
  const rows = await step(
    'read the sections',
    () =>
      sequelize.query<HeldSection>(
        `SELECT id, run, batch_id AS "batchId", key, status, input::text AS input
           FROM sections WHERE id = ANY($1::int[])`,
        { bind: [jobs.map((j) => j.sectionId)], type: QueryTypes.SELECT },
      ),
    signal,
  );
  return new Map(rows.map((r) => [r.id, r]));
}

/** Marks a section running as its analysis starts (if it still waits for this run). */
export async function markRunning(job: SectionJob, signal?: AbortSignal): Promise<void> {
  await step(
    'mark it running',
    () =>
      sequelize.query(
        `UPDATE sections SET status = 'running', updated_at = now()
          WHERE id = $1 AND run = $2 AND status IN ${WAITING_SQL}`,
        { bind: [job.sectionId, job.run] },
      ),
    signal,
  );
}

/** How a section's analysis ended, as the worker hands it over to be written. */
export type SectionEnd = {
  job: SectionJob;
  /** The attempt, counted from 0. */
  attempt: number;
  section: HeldSection;
} & (
  | { kind: 'result'; result: SolvedSection; startedAt: Date; finishedAt: Date }
  /** Stopped by its work bound or time limit: `reason` says what to change. */
  | { kind: 'stopped'; reason: string; startedAt: Date; finishedAt: Date }
);

const RESULT_COLUMNS = `section_id, run, verdict, governing_case, governing_method, governing_fs,
  required_fs, ratio, warnings, reason, solver_version, input_hash, started_at, finished_at,
  duration_ms, attempt, probability`;

const CASE_COLUMNS = `position, name, kind, verdict, governing_method, governing_fs, required_fs,
  ratio, governs, methods, critical_surface, search, warnings, drawdown, seismic,
  required_reinforcement`;

const CASE_VALUES = CASE_COLUMNS.replace(/(\w+)/g, 'c.$1');

/**
 * Writes results and ends their sections in one statement (atomic as a transaction): only the
 * sections that still wait for the result's run end, and only those get a result row (the
 * section's input copied into it, in the database) and a row per design case. Returns the ids
 * of the sections it ended. One end per section and run (the caller's).
 */
async function writeResults(ends: (SectionEnd & { kind: 'result' })[]): Promise<Set<number>> {
  const col = <T>(f: (e: SectionEnd & { kind: 'result' }) => T) => ends.map(f);
  // the cases of every end, flat, each with its section and run
  const cases = ends.flatMap((e) => e.result.cases.map((c, position) => ({ e, c, position })));
  const caseCol = <T>(f: (x: (typeof cases)[number]) => T) => cases.map(f);
  const rows = await sequelize.query<{ id: number }>(
    `WITH r AS (
       SELECT * FROM unnest($1::int[], $2::int[], $3::text[], $4::text[], $5::text[], $6::float8[],
         $7::float8[], $8::float8[], $9::jsonb[], $10::text[], $11::text[], $12::text[],
         $13::timestamptz[], $14::timestamptz[], $15::int[], $16::int[], $35::jsonb[])
         AS r(${RESULT_COLUMNS})
     ), c AS (
       SELECT * FROM unnest($17::int[], $18::int[], $19::int[], $20::text[], $21::text[],
         $22::text[], $23::text[], $24::float8[], $25::float8[], $26::float8[], $27::jsonb[],
         $28::jsonb[], $29::jsonb[], $30::jsonb[], $31::jsonb[], $32::jsonb[], $33::jsonb[],
         $34::jsonb[])
         AS c(section_id, run, ${CASE_COLUMNS})
     ), ended AS (
       UPDATE sections s
          SET status = CASE WHEN r.verdict = 'no-fs' THEN 'failed' ELSE 'done' END,
              fail_reason = r.reason, updated_at = now()
         FROM r
        WHERE s.id = r.section_id AND s.run = r.run AND s.status IN ${WAITING_SQL}
       RETURNING s.id, s.input
     ), written AS (
       INSERT INTO results (${RESULT_COLUMNS}, input, created_at, updated_at)
       SELECT r.*, ended.input, now(), now() FROM r JOIN ended ON ended.id = r.section_id
       ON CONFLICT (section_id, run) DO UPDATE SET
         verdict = EXCLUDED.verdict, governing_case = EXCLUDED.governing_case,
         governing_method = EXCLUDED.governing_method, governing_fs = EXCLUDED.governing_fs,
         required_fs = EXCLUDED.required_fs, ratio = EXCLUDED.ratio,
         methods = NULL, critical_surface = NULL, search = NULL,
         warnings = EXCLUDED.warnings, reason = EXCLUDED.reason,
         solver_version = EXCLUDED.solver_version, input_hash = EXCLUDED.input_hash,
         started_at = EXCLUDED.started_at, finished_at = EXCLUDED.finished_at,
         duration_ms = EXCLUDED.duration_ms, attempt = EXCLUDED.attempt,
         probability = EXCLUDED.probability, input = EXCLUDED.input, updated_at = EXCLUDED.updated_at
       RETURNING id, section_id, run
     ), cased AS (
       INSERT INTO case_results (result_id, ${CASE_COLUMNS}, created_at, updated_at)
       SELECT written.id, ${CASE_VALUES}, now(), now()
         FROM c JOIN written ON written.section_id = c.section_id AND written.run = c.run
       ON CONFLICT (result_id, name) DO UPDATE SET
         position = EXCLUDED.position, kind = EXCLUDED.kind, verdict = EXCLUDED.verdict,
         governing_method = EXCLUDED.governing_method, governing_fs = EXCLUDED.governing_fs,
         required_fs = EXCLUDED.required_fs, ratio = EXCLUDED.ratio, governs = EXCLUDED.governs,
         methods = EXCLUDED.methods, critical_surface = EXCLUDED.critical_surface,
         search = EXCLUDED.search, warnings = EXCLUDED.warnings, drawdown = EXCLUDED.drawdown,
         seismic = EXCLUDED.seismic, required_reinforcement = EXCLUDED.required_reinforcement,
         updated_at = EXCLUDED.updated_at
     )
     SELECT id FROM ended`,
    {
      bind: [
        col((e) => e.job.sectionId),
        col((e) => e.job.run),
        col((e) => e.result.verdict),
        col((e) => e.result.governingCase),
        col((e) => e.result.governing?.method ?? null),
        col((e) => e.result.governing?.fs ?? null),
        col((e) => e.result.requiredFs),
        col((e) => e.result.ratio),
        col((e) => e.result.json.warnings),
        col((e) => e.result.reason?.slice(0, 2000) ?? null),
        col((e) => e.result.solverVersion),
        col((e) => e.result.inputHash),
        col((e) => e.startedAt),
        col((e) => e.finishedAt),
        col((e) => e.finishedAt.getTime() - e.startedAt.getTime()),
        col((e) => e.attempt + 1),
        caseCol((x) => x.e.job.sectionId),
        caseCol((x) => x.e.job.run),
        caseCol((x) => x.position),
        caseCol((x) => x.c.name),
        caseCol((x) => x.c.kind),
        caseCol((x) => x.c.verdict),
        caseCol((x) => x.c.governing?.method ?? null),
        caseCol((x) => x.c.governing?.fs ?? null),
        caseCol((x) => x.c.requiredFs),
        caseCol((x) => x.c.ratio),
        caseCol((x) => x.c.json.governs),
        caseCol((x) => x.c.json.methods),
        caseCol((x) => x.c.json.criticalSurface),
        caseCol((x) => x.c.json.search),
        caseCol((x) => x.c.json.warnings),
        caseCol((x) => x.c.json.drawdown),
        caseCol((x) => x.c.json.seismic),
        caseCol((x) => x.c.json.requiredReinforcement),
        col((e) => e.result.json.probability),
      ],
      type: QueryTypes.SELECT,
    },
  );
  return new Set(rows.map((r) => r.id));
}

/** Ends a section stopped by its work bound or time limit; false when it had already ended. */
async function endStopped(job: SectionJob, reason: string): Promise<boolean> {
  const rows = await sequelize.query(
    `UPDATE sections SET status = 'failed', fail_reason = $3, updated_at = now()
      WHERE id = $1 AND run = $2 AND status IN ${WAITING_SQL} RETURNING id`,
    { bind: [job.sectionId, job.run, reason.slice(0, 2000)], type: QueryTypes.SELECT },
  );
  return rows.length > 0;
}

/**
 * Writes how sections ended (results together, in one statement), logs each, mails a section
 * below its required FS, and closes the batches. Resolves with each end's JobEnd, in order: a
 * section that another delivery of its job had ended first is `skipped`. Throws when the
 * database fails otherwise (nothing of the statement that failed is written).
 */
export async function endSections(ends: SectionEnd[], signal?: AbortSignal): Promise<JobEnd[]> {
  // One end per section and run in a statement; a second (another delivery) is skipped.
  const seen = new Set<string>();
  const first = ends.map((e) => {
    const k = `${e.job.sectionId}:${e.job.run}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
  const results = ends.filter((e, i) => first[i] && e.kind === 'result') as (SectionEnd & {
    kind: 'result';
  })[];
  const ended =
    results.length > 0
      ? await step('write the results', () => writeResults(results), signal)
      : new Set<number>();
  const out: JobEnd[] = [];
  for (const [i, e] of ends.entries()) {
    let end: JobEnd;
    if (!first[i]) end = 'skipped';
    else if (e.kind === 'result') {
      end = !ended.has(e.job.sectionId)
        ? 'skipped'
        : e.result.verdict === 'no-fs'
          ? 'unsolved'
          : 'done';
    } else {
      const reason = e.reason;
      end = (await step('end it failed', () => endStopped(e.job, reason), signal))
        ? 'stopped'
        : 'skipped';
    }
    out.push(end);
    if (end === 'skipped') continue;
    log.info(
      {
        sectionId: e.job.sectionId,
        batchId: e.section.batchId,
        run: e.job.run,
        end,
        attempt: e.attempt + 1,
        ms: e.finishedAt.getTime() - e.startedAt.getTime(),
      },
      'section ended',
    );
  }
  // Mail after every end is logged: a worker that dies while mailing has logged them all.
  for (const [i, e] of ends.entries()) {
    if (out[i] === 'skipped' || e.kind !== 'result' || e.result.verdict !== 'below') continue;
    const r = e.result;
    const row = await step(
      'read the section',
      () => SectionRow.findByPk(e.section.id, { attributes: ['id', 'batchId', 'key'] }),
      signal,
    );
    if (row) {
      const below = r.cases
        .filter((c) => c.verdict === 'below')
        .map((c) => ({ name: c.name, fs: c.governing?.fs ?? null, requiredFs: c.requiredFs }));
      await step('mail', () => sectionBelowFs(row, below), signal);
    }
  }
  await closeBatches(
    ends.map((e) => e.section.batchId),
    signal,
  );
  return out;
}

/**
 * An attempt that failed (worth another): the section goes back to queued, with the reason,
 * until the retry takes it (or the dead letters end it). Returns the JobFailed to fail the job with.
 */
export async function recordFailedAttempt(
  job: SectionJob,
  attempt: number,
  reason: string,
  signal?: AbortSignal,
): Promise<JobFailed> {
  const message = `attempt ${attempt + 1}: ${reason}`.slice(0, 2000);
  await step(
    'record the failed attempt',
    () =>
      sequelize.query(
        `UPDATE sections SET status = 'queued', fail_reason = $3, updated_at = now()
          WHERE id = $1 AND run = $2 AND status IN ${WAITING_SQL}`,
        { bind: [job.sectionId, job.run, message] },
      ),
    signal,
  );
  return new JobFailed(message);
}

/** Makes sure each batch is closed when none of its sections waits any more (once each). */
export async function closeBatches(batchIds: number[], signal?: AbortSignal): Promise<void> {
  for (const id of new Set(batchIds)) {
    await step('close the batch', () => closeBatchIfLast(id), signal);
  }
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
        { where: { id: section.id, run: job.run, status: WAITING } },
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

/** The channel a batch's close is told on (its id), at the close's commit. */
const BATCH_CLOSED_CHANNEL = 'scarpline_batch_closed';

/**
 * Calls `closed` with a batch's id when a worker closes it (and with null when it starts
 * listening, or listens again after an outage: closes may have been missed). Returns the
 * function that stops it.
 */
export function onBatchClosed(closed: (batchId: number | null) => void): () => Promise<void> {
  return listen(BATCH_CLOSED_CHANNEL, (payload) =>
    closed(payload === null ? null : Number(payload)),
  );
}

/**
 * Marks the batch done when no section is queued or running, and tells those who listen
 * (onBatchClosed). Each worker checks after its own commit, so the last one always sees every
 * other; the conditional update closes it once.
 */
export async function closeBatchIfLast(batchId: number): Promise<boolean> {
  const rows = await sequelize.query(
    `UPDATE batches SET status = 'done', finished_at = now(), updated_at = now()
      WHERE id = $1 AND status = 'running'
        AND NOT EXISTS (SELECT 1 FROM sections WHERE batch_id = $1 AND status IN ('queued', 'running'))
      RETURNING id, pg_notify('${BATCH_CLOSED_CHANNEL}', id::text)`,
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
