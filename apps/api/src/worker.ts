/**
 * The queue worker of a process: takes section jobs a few at a time (WORKER_FETCH) and dead
 * letters one at a time, and runs them (services/solve.ts), the analysis in a thread it can stop
 * (solver.ts); writes a heartbeat every HEARTBEAT_SECONDS (services/workers.ts).
 *
 * The analysis thread is kept busy: the next jobs are taken while the thread analyses, and how a
 * section ended is written behind it (EndWriter) while the thread goes on with the next, the
 * ends that arrive meanwhile written together and their jobs completed together. A job is
 * completed only after its end is written (at least once: a worker that dies leaves its jobs to
 * the queue, which hands them out again after they expire). An end without a result (stopped,
 * error) is written before the next section starts.
 *
 * Nothing the database does ends it: a fetch while it is away finds nothing, every write waits
 * for it, and the job is completed or failed once it is back. pg-boss's own `work()` is not used,
 * since it completes and fails jobs without waiting for the answer (a database going away then
 * ends the process).
 */
import { setTimeout as delay } from 'node:timers/promises';
import type PgBoss from 'pg-boss';
import { config } from './config';
import { whenDatabaseIsBack } from './db';
import { log } from './log';
import { jobDuration, jobsTotal, workerRegistry } from './metrics';
import {
  DEAD_QUEUE,
  REPORT_QUEUE,
  SECTION_QUEUE,
  STUDY_QUEUE,
  onNewJobs,
  onQueueStop,
  queue,
  restartJobClock,
  type ReportJob,
  type SectionJob,
  type StudyJob,
} from './queue';
import { closeReports } from './reports/pool';
import { runCorridorReport } from './services/reports';
import { runStudyJob } from './services/studies';
import { closeStudies } from './studies/pool';
import {
  closeBatches,
  endSections,
  giveUp,
  markRunning,
  readSections,
  recordFailedAttempt,
  waitsFor,
  type HeldSection,
  type JobEnd,
  type SectionEnd,
} from './services/solve';
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
async function consume<T extends object>(
  boss: PgBoss,
  name: string,
  pollMs: number,
  signal: AbortSignal,
  handle: (job: PgBoss.JobWithMetadata<T>) => Promise<void>,
): Promise<void> {
  while (!signal.aborted) {
    // pg-boss's fetch answers [] when the database cannot be reached.
    const jobs = await boss
      .fetch<T>(name, { batchSize: 1, includeMetadata: true })
      .catch(() => [] as PgBoss.JobWithMetadata<T>[]);
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
function settle<T>(what: string, operation: () => Promise<T>, signal: AbortSignal): Promise<T> {
  return whenDatabaseIsBack(operation, {
    signal,
    onWait: (e, attempt) => {
      if (attempt === 1) log.warn({ err: e }, `database unavailable (${what}): waiting`);
    },
  });
}

/** Completes jobs of the section queue with their output: pg-boss takes ids and output together (its typings give one or the other). */
function completeJobs(boss: PgBoss, ids: string[], output: object): Promise<void> {
  const complete = boss.complete.bind(boss) as unknown as (
    name: string,
    ids: string[],
    data: object,
  ) => Promise<void>;
  return complete(SECTION_QUEUE, ids, output);
}

/**
 * A job taken longer ago than this has its clock in the queue restarted as it starts
 * (queue.ts restartJobClock), so that waiting its turn in the worker never eats into its time.
 */
const RESTART_CLOCK_AFTER_MS = 1000;

/** How long the first of a few ends waits for the others before they are written. */
const WRITE_DELAY_MS = 100;

/**
 * Writes how sections ended behind the analysis, a few together: a write starts when
 * WORKER_FETCH ends wait, or WRITE_DELAY_MS after the first of them (or at once when asked),
 * and the ends handed over while it is under way are written together next; then their jobs
 * are completed together (by how they ended). Fewer, larger statements leave more of the
 * machine to the analysis.
 */
class EndWriter {
  private pending: { end: SectionEnd; jobId: string }[] = [];
  private writing: Promise<void> | null = null;
  private timer: NodeJS.Timeout | null = null;

  constructor(
    private readonly boss: PgBoss,
    private readonly signal: AbortSignal,
  ) {}

  /** Ends handed over and not yet written. */
  get backlog(): number {
    return this.pending.length;
  }

  add(end: SectionEnd, jobId: string): void {
    this.pending.push({ end, jobId });
    if (this.pending.length >= config.workerFetch) this.flush();
    else this.timer ??= setTimeout(() => this.flush(), WRITE_DELAY_MS);
  }

  /** Starts writing what waits, now. */
  flush(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    if (this.pending.length > 0) this.writing ??= this.drain();
  }

  /** Writes what waits now; resolves when every end handed over is written (or on stopping). */
  idle(): Promise<void> {
    this.flush();
    return this.writing ?? Promise.resolve();
  }

  private async drain(): Promise<void> {
    try {
      while (this.pending.length > 0 && !this.signal.aborted) {
        await this.write(this.pending.splice(0));
      }
    } catch (e) {
      // Stopping: the jobs stay active and the queue hands them out again after they expire.
      if (!this.signal.aborted) log.error({ err: e }, 'section ends not written');
    } finally {
      this.writing = null;
    }
  }

  private async write(group: { end: SectionEnd; jobId: string }[]): Promise<void> {
    const { boss, signal } = this;
    let ends: JobEnd[];
    try {
      ends = await endSections(
        group.map((g) => g.end),
        signal,
      );
    } catch (e) {
      if (signal.aborted) throw e;
      // One at a time, so that an end that cannot be written holds up no other.
      if (group.length > 1) {
        for (const g of group) await this.write([g]);
        return;
      }
      const [{ end, jobId }] = group;
      const message = `the section's end was not written: ${(e as Error).message}`;
      log.warn(
        { err: e, sectionId: end.job.sectionId, attempt: end.attempt + 1 },
        `section job failed; the queue tries it again or gives it up: ${message}`,
      );
      jobsTotal.inc({ queue: SECTION_QUEUE, outcome: 'error' });
      await settle('fail the job', () => boss.fail(SECTION_QUEUE, jobId, { message }), signal);
      return;
    }
    const now = Date.now();
    const byEnd = new Map<JobEnd, string[]>();
    for (const [i, { end, jobId }] of group.entries()) {
      const outcome = ends[i];
      jobDuration.observe({ outcome }, (now - end.startedAt.getTime()) / 1000);
      jobsTotal.inc({ queue: SECTION_QUEUE, outcome });
      byEnd.set(outcome, [...(byEnd.get(outcome) ?? []), jobId]);
    }
    for (const [end, ids] of byEnd) {
      await settle('complete the jobs', () => completeJobs(boss, ids, { end }), signal);
    }
  }
}

/** A pause that ends early when woken (new jobs were submitted) or when `signal` aborts. */
class Pause {
  private wakeUp: (() => void) | null = null;

  wake(): void {
    this.wakeUp?.();
  }

  async for(ms: number, signal: AbortSignal): Promise<void> {
    const woken = new AbortController();
    this.wakeUp = () => woken.abort();
    try {
      await delay(ms, undefined, { signal: AbortSignal.any([signal, woken.signal]) });
    } catch {
      // woken, or stopping
    } finally {
      this.wakeUp = null;
    }
  }
}

/** A job taken from the queue and its section (undefined: gone), waiting for its turn. */
interface Taken {
  job: Job;
  section: HeldSection | undefined;
  takenAt: number;
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
  const writer = new EndWriter(boss, signal);
  const idle = new Pause();
  const stopListening = onNewJobs(() => idle.wake());

  /** Analyses a taken job's section and hands how it ended to the writer. */
  const section = async ({ job, section, takenAt }: Taken) => {
    const data = job.data;
    if (!section || !waitsFor(section, data)) {
      // An older run, or a section that has already ended (or is gone): only close its batch.
      if (section) await closeBatches([section.batchId], signal);
      jobsTotal.inc({ queue: SECTION_QUEUE, outcome: 'skipped' });
      await settle(
        'complete the job',
        () => boss.complete(SECTION_QUEUE, job.id, { end: 'skipped' }),
        signal,
      );
      return;
    }
    if (Date.now() - takenAt > RESTART_CLOCK_AFTER_MS) {
      const ours = await settle(
        'restart the job clock',
        () => restartJobClock(job.id, job.retryCount),
        signal,
      );
      // The queue took it back meanwhile: its next delivery ends it.
      if (!ours) return;
    }
    current = data.sectionId;
    const marking = markRunning(data, signal);
    // Awaited after the analysis; heard meanwhile, so that a stop while it waits ends nothing.
    marking.catch(() => undefined);
    const startedAt = new Date();
    const outcome = await solver.solve(section.input, config.jobTimeout * 1000);
    const finishedAt = new Date();
    current = null;
    await marking;
    // Stopping: the job stays active and the queue hands it out again after it expires.
    if (signal.aborted || outcome.kind === 'aborted') return;
    const attempt = job.retryCount;
    if (outcome.kind === 'error') {
      await writer.idle();
      const failure = await recordFailedAttempt(data, attempt, outcome.reason, signal);
      log.warn(
        { err: failure, sectionId: data.sectionId, attempt: attempt + 1 },
        `section job failed; the queue tries it again or gives it up: ${failure.message}`,
      );
      jobDuration.observe({ outcome: 'error' }, (Date.now() - startedAt.getTime()) / 1000);
      jobsTotal.inc({ queue: SECTION_QUEUE, outcome: 'error' });
      const message = failure.message;
      await settle('fail the job', () => boss.fail(SECTION_QUEUE, job.id, { message }), signal);
      return;
    }
    const common = { job: data, attempt, section, startedAt, finishedAt };
    if (outcome.kind === 'result') {
      writer.add({ ...common, kind: 'result', result: outcome.result }, job.id);
    } else {
      writer.add({ ...common, kind: 'stopped', reason: outcome.reason }, job.id);
      await writer.idle();
    }
  };

  /** Takes section jobs, WORKER_FETCH at a time, and analyses them one after another. */
  const sections = async () => {
    const taken: Taken[] = [];
    let taking: Promise<number> | null = null;
    /** Takes more jobs (unless it is taking already); resolves with how many it took. */
    const take = () =>
      (taking ??= (async () => {
        try {
          // pg-boss's fetch answers [] when the database cannot be reached.
          const jobs = await boss
            .fetch<SectionJob>(SECTION_QUEUE, {
              batchSize: config.workerFetch,
              includeMetadata: true,
            })
            .catch(() => [] as Job[]);
          if (jobs.length === 0) return 0;
          const read = await readSections(
            jobs.map((j) => j.data),
            signal,
          );
          const now = Date.now();
          // In the queue's order (its fetch answers in any): older first, a batch by section.
          jobs.sort(
            (a, b) =>
              b.priority - a.priority ||
              a.createdOn.getTime() - b.createdOn.getTime() ||
              a.data.sectionId - b.data.sectionId,
          );
          for (const job of jobs) {
            taken.push({ job, section: read.get(job.data.sectionId), takenAt: now });
          }
          return jobs.length;
        } catch (e) {
          if (!signal.aborted) log.error({ err: e, queue: SECTION_QUEUE }, 'jobs not taken');
          return 0;
        } finally {
          taking = null;
        }
      })());
    while (!signal.aborted) {
      // The next jobs are taken while the thread analyses the last one in hand.
      if (taken.length <= 1) void take();
      if (taken.length === 0) {
        writer.flush();
        if ((await take()) === 0) await idle.for(500, signal);
        continue;
      }
      // Ends written behind the analysis: never more than two fetches' worth waiting.
      if (writer.backlog >= 2 * config.workerFetch) await writer.idle();
      const next = taken.shift()!;
      try {
        await section(next);
      } catch (e) {
        if (!signal.aborted) {
          log.error({ err: e, jobId: next.job.id, queue: SECTION_QUEUE }, 'job not handled');
        }
      }
    }
    await writer.idle();
  };

  const dead = async (job: Job) => {
    const ended = await giveUp(job.data, signal);
    jobsTotal.inc({ queue: DEAD_QUEUE, outcome: ended ? 'gave-up' : 'skipped' });
    await settle('complete the dead letter', () => boss.complete(DEAD_QUEUE, job.id), signal);
  };

  /** Lays out a corridor report (on a report thread: the analysis goes on meanwhile). */
  const report = async (job: PgBoss.JobWithMetadata<ReportJob>) => {
    try {
      await runCorridorReport(job.data.reportId);
    } catch (e) {
      jobsTotal.inc({ queue: REPORT_QUEUE, outcome: 'error' });
      const message = (e as Error).message;
      log.warn({ err: e, reportId: job.data.reportId }, `report not made: ${message}`);
      await settle(
        'fail the report job',
        () => boss.fail(REPORT_QUEUE, job.id, { message }),
        signal,
      );
      return;
    }
    jobsTotal.inc({ queue: REPORT_QUEUE, outcome: 'done' });
    await settle('complete the report job', () => boss.complete(REPORT_QUEUE, job.id), signal);
  };

  /** Computes a step of a section study (on a study thread: the analysis goes on meanwhile). */
  const study = async (job: PgBoss.JobWithMetadata<StudyJob>) => {
    try {
      await runStudyJob(job.data);
    } catch (e) {
      if (signal.aborted) return;
      jobsTotal.inc({ queue: STUDY_QUEUE, outcome: 'error' });
      const message = (e as Error).message;
      log.warn({ err: e, studyId: job.data.studyId }, `study step not done: ${message}`);
      await settle('fail the study job', () => boss.fail(STUDY_QUEUE, job.id, { message }), signal);
      return;
    }
    jobsTotal.inc({ queue: STUDY_QUEUE, outcome: 'done' });
    await settle('complete the study job', () => boss.complete(STUDY_QUEUE, job.id), signal);
  };

  const loops = Promise.all([
    sections(),
    consume(boss, DEAD_QUEUE, 1000, signal, dead),
    consume(boss, REPORT_QUEUE, 1000, signal, report),
    consume(boss, STUDY_QUEUE, 250, signal, study),
  ]);
  log.info(
    { worker: heartbeat.id, timeLimitSeconds: config.jobTimeout, fetch: config.workerFetch },
    'worker: taking jobs',
  );

  let stopped: Promise<void> | null = null;
  const stop = () =>
    (stopped ??= (async () => {
      stopping.abort();
      await solver.close();
      await closeReports();
      await closeStudies();
      await loops;
      await stopListening();
      await heartbeat.stop();
      log.info({ worker: heartbeat.id }, 'worker: stopped');
    })());
  onQueueStop(stop);
  return { id: heartbeat.id, stop };
}
