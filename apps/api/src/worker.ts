/**
 * The queue worker of a process: takes section jobs and dead letters one at a time and runs
 * them (services/solve.ts), the analysis in a thread it can stop (solver.ts); writes a heartbeat
 * every HEARTBEAT_SECONDS (services/workers.ts). Nothing the database does ends it: a fetch
 * while it is away finds nothing, every write waits for it, and the job is completed or failed
 * once it is back. pg-boss's own `work()` is not used, since it completes and fails jobs
 * without waiting for the answer (a database going away then ends the process).
 */
import { setTimeout as delay } from 'node:timers/promises';
import type PgBoss from 'pg-boss';
import { config } from './config';
import { whenDatabaseIsBack } from './db';
import { log } from './log';
import { jobDuration, jobsTotal, workerRegistry } from './metrics';
import { DEAD_QUEUE, SECTION_QUEUE, onQueueStop, queue, type SectionJob } from './queue';
import { giveUp, solveSection, type JobEnd } from './services/solve';
import { startHeartbeat } from './services/workers';
import { Solver } from './solver';

export interface RunningWorker {
  /** The heartbeat's id of this worker. */
  id: string;
  /** Stops taking jobs, ends the analysis under way (its job goes back to the queue), stops beating. */
  stop(): Promise<void>;
}

type Job = PgBoss.JobWithMetadata<SectionJob>;

/** Takes jobs of `name` one at a time until `signal` aborts; never throws. */
async function consume(
  boss: PgBoss,
  name: string,
  pollMs: number,
  signal: AbortSignal,
  handle: (job: Job) => Promise<void>,
): Promise<void> {
  while (!signal.aborted) {
    // pg-boss's fetch answers [] when the database cannot be reached.
    const jobs = await boss
      .fetch<SectionJob>(name, { batchSize: 1, includeMetadata: true })
      .catch(() => [] as Job[]);
    if (jobs.length === 0) {
      await delay(pollMs, undefined, { signal }).catch(() => undefined);
      continue;
    }
    for (const job of jobs) {
      try {
        await handle(job);
      } catch (e) {
        if (!signal.aborted) log.error({ err: e, jobId: job.id, queue: name }, 'job not handled');
      }
    }
  }
}

/** Completes or fails a job in the queue, waiting for the database if it is away. */
function settle(what: string, operation: () => Promise<unknown>, signal: AbortSignal) {
  return whenDatabaseIsBack(operation, {
    signal,
    onWait: (e, attempt) => {
      if (attempt === 1) log.warn({ err: e }, `database unavailable (${what}): waiting`);
    },
  });
}

/** Starts this process's worker (the queue, the analysis thread, the heartbeat, the loops). */
export async function startWorker(): Promise<RunningWorker> {
  const boss = await queue();
  const solver = new Solver({ memoryMb: config.solverMemoryMb });
  const stopping = new AbortController();
  const signal = stopping.signal;
  let current: number | null = null;
  const heartbeat = startHeartbeat({
    sectionId: () => current,
    metrics: () => workerRegistry.getMetricsAsJSON(),
  });
  await solver.warm().catch((e: Error) => log.warn({ err: e }, 'analysis thread: not started'));

  const section = async (job: Job) => {
    current = job.data.sectionId;
    const timer = jobDuration.startTimer();
    let end: JobEnd | 'error';
    let failure: Error | null = null;
    try {
      end = await solveSection(job.data, job.retryCount, solver, signal);
    } catch (e) {
      end = 'error';
      failure = e instanceof Error ? e : new Error(String(e));
    } finally {
      current = null;
    }
    // Stopping: the job stays active and the queue hands it out again after it expires.
    if (signal.aborted || end === 'abandoned') return;
    timer({ outcome: end });
    jobsTotal.inc({ queue: SECTION_QUEUE, outcome: end });
    if (failure) {
      log.warn(
        { err: failure, sectionId: job.data.sectionId, attempt: job.retryCount + 1 },
        `section job failed; the queue tries it again or gives it up: ${failure.message}`,
      );
      const message = failure.message;
      await settle('fail the job', () => boss.fail(SECTION_QUEUE, job.id, { message }), signal);
      return;
    }
    await settle('complete the job', () => boss.complete(SECTION_QUEUE, job.id, { end }), signal);
  };

  const dead = async (job: Job) => {
    const ended = await giveUp(job.data, signal);
    jobsTotal.inc({ queue: DEAD_QUEUE, outcome: ended ? 'gave-up' : 'skipped' });
    await settle('complete the dead letter', () => boss.complete(DEAD_QUEUE, job.id), signal);
  };

  const loops = Promise.all([
    consume(boss, SECTION_QUEUE, 500, signal, section),
    consume(boss, DEAD_QUEUE, 1000, signal, dead),
  ]);
  log.info({ worker: heartbeat.id, timeLimitSeconds: config.jobTimeout }, 'worker: taking jobs');

  let stopped: Promise<void> | null = null;
  const stop = () =>
    (stopped ??= (async () => {
      stopping.abort();
      await solver.close();
      await loops;
      await heartbeat.stop();
      log.info({ worker: heartbeat.id }, 'worker: stopped');
    })());
  onQueueStop(stop);
  return { id: heartbeat.id, stop };
}
