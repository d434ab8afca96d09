/** pg-boss 10 in the application database: one job per section, retries, dead letters. */
import { setTimeout as delay } from 'node:timers/promises';
import { Client } from 'pg';
import PgBoss from 'pg-boss';
import { QueryTypes, type Transaction } from 'sequelize';
import { config } from './config';
import { sequelize } from './db';
import { log } from './log';
import type pg from 'pg';

export const SECTION_QUEUE = 'section-analysis';
export const DEAD_QUEUE = 'section-analysis-dead';
/** Corridor reports to lay out (one job a report; services/reports.ts). */
export const REPORT_QUEUE = 'corridor-report';
/** Section studies to compute: a whole study, a chunk of its realisations, or its chunks combined (services/studies.ts). */
export const STUDY_QUEUE = 'section-study';
/** The channel a submission notifies (at its commit) that new section jobs wait. */
const NEW_JOBS_CHANNEL = 'scarpline_section_jobs';

export interface ReportJob {
  reportId: number;
}

export type StudyJob =
  | { studyId: number; step: 'run' }
  | { studyId: number; step: 'chunk'; position: number }
  | { studyId: number; step: 'combine' };

export interface SectionJob {
  sectionId: number;
  run: number;
}

/**
 * How long a job may stay active before the queue's maintenance takes it back and hands it to
 * another worker (its worker died): the time limit of an analysis (JOB_TIMEOUT), which the worker
 * enforces itself, plus time to write the result.
 */
export function expireSeconds(): number {
  return Math.ceil(config.jobTimeout + Math.max(5, config.jobTimeout / 10));
}

/** How long a report job may stay active before the queue takes it back: its limit, and time to store it. */
export function reportExpireSeconds(): number {
  return Math.ceil(config.reportTimeoutMs / 1000 + 60);
}

/** How long a study job may stay active before the queue takes it back: its limit, and time to write it. */
export function studyExpireSeconds(): number {
  return Math.ceil(config.studyTimeoutMs / 1000 + 60);
}

let boss: PgBoss | null = null;
let starting: Promise<PgBoss> | null = null;
/** What stops with the queue: the worker loops of this process (worker.ts). */
const stoppers = new Set<() => Promise<void>>();

async function start(): Promise<PgBoss> {
  const b = new PgBoss({
    connectionString: config.databaseUrl,
    schema: 'pgboss',
    max: config.queuePoolMax,
    maintenanceIntervalSeconds: config.queueMaintenance,
  });
  // pg-boss reports the errors of its pool, maintenance and monitoring here (a database that
  // restarts, say); without a listener an 'error' event would end the process.
  b.on('error', (e: Error) => log.warn({ err: e }, `queue: ${e.message}`));
  try {
    await b.start();
    // Processes starting at once would deadlock creating the queues: one at a time, under a
    // transaction's advisory lock (pg-boss's own SQL runs on its pool meanwhile).
    await sequelize.transaction(async (transaction) => {
      await sequelize.query("SELECT pg_advisory_xact_lock(hashtext('scarpline:queues'))", {
        transaction,
      });
      if (!(await b.getQueue(DEAD_QUEUE))) await b.createQueue(DEAD_QUEUE, { name: DEAD_QUEUE });
      if (!(await b.getQueue(REPORT_QUEUE))) {
        // A report is laid out in a thread ended at REPORT_TIMEOUT_MS: a job still active well
        // after that was left by a worker that died, and goes to another once.
        await b.createQueue(REPORT_QUEUE, {
          name: REPORT_QUEUE,
          retryLimit: 1,
          expireInSeconds: reportExpireSeconds(),
        });
      }
      if (!(await b.getQueue(STUDY_QUEUE))) {
        // A study's step runs in a thread ended at STUDY_TIMEOUT_MS: a job still active well
        // after that was left by a worker that died, and goes to another once.
        await b.createQueue(STUDY_QUEUE, {
          name: STUDY_QUEUE,
          retryLimit: 1,
          expireInSeconds: studyExpireSeconds(),
        });
      }
      if (!(await b.getQueue(SECTION_QUEUE))) {
        await b.createQueue(SECTION_QUEUE, {
          name: SECTION_QUEUE,
          retryLimit: config.retryLimit,
          retryDelay: config.retryDelay,
          retryBackoff: true,
          expireInSeconds: expireSeconds(),
          deadLetter: DEAD_QUEUE,
        });
      }
    });
  } catch (e) {
    await b.stop({ graceful: false, wait: false }).catch(() => undefined);
    throw e;
  }
  return b;
}

/** The process's pg-boss, started and with its queues created (idempotent; retried after a failure). */
export async function queue(): Promise<PgBoss> {
  if (boss) return boss;
  starting ??= start().then(
    (b) => {
      boss = b;
      starting = null;
      return b;
    },
    (e: unknown) => {
      starting = null;
      throw e;
    },
  );
  return starting;
}

/** Whether this process's queue has started. */
export function queueStarted(): boolean {
  return boss !== null;
}

/** Registers something to stop before the queue does (a worker's loops); returns its removal. */
export function onQueueStop(stop: () => Promise<void>): () => void {
  stoppers.add(stop);
  return () => stoppers.delete(stop);
}

export async function stopQueue(): Promise<void> {
  const waiting = [...stoppers];
  stoppers.clear();
  await Promise.all(waiting.map((s) => s()));
  if (starting) await starting.catch(() => undefined);
  if (!boss) return;
  const b = boss;
  boss = null;
  await b.stop({ graceful: true, wait: true, timeout: 5000 });
}

/** Jobs of the section queues waiting (created, retry) and being worked on (active), by queue. */
export async function queueDepth(): Promise<{ queue: string; state: string; jobs: number }[]> {
  const rows = await sequelize.query<{ name: string; state: string; n: string }>(
    `SELECT name, state::text AS state, count(*) AS n FROM pgboss.job
      WHERE name IN ($1, $2) AND state IN ('created', 'retry', 'active')
      GROUP BY name, state`,
    { bind: [SECTION_QUEUE, DEAD_QUEUE], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ queue: r.name, state: r.state, jobs: Number(r.n) }));
}

/**
 * Restarts the expiry clock of a job this worker took some time ago and is about to start: a
 * job taken together with others waits its turn in the worker, and its time in the queue's
 * hands (expireSeconds) is counted from here, as if it had been taken now. False when the job
 * is no longer this worker's (it expired meanwhile: the queue has taken it back).
 */
export async function restartJobClock(id: string, retryCount: number): Promise<boolean> {
  const rows = await sequelize.query(
    `UPDATE pgboss.job SET started_on = now()
      WHERE name = $1 AND id = $2 AND state = 'active' AND retry_count = $3 RETURNING id`,
    { bind: [SECTION_QUEUE, id, retryCount], type: QueryTypes.SELECT },
  );
  return rows.length > 0;
}

/**
 * Enqueues one job per section inside the caller's transaction, so a batch and its jobs are
 * written together or not at all.
 */
export async function enqueueSections(jobs: SectionJob[], transaction: Transaction): Promise<void> {
  if (jobs.length === 0) return;
  const b = await queue();
  // The transaction's own pg client, so pg-boss's SQL runs inside it, untouched.
  const client = (transaction as Transaction & { connection: pg.ClientBase }).connection;
  const db = { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
  await b.insert(
    jobs.map((data) => ({
      name: SECTION_QUEUE,
      data,
      retryLimit: config.retryLimit,
      retryDelay: config.retryDelay,
      retryBackoff: true,
      expireInSeconds: expireSeconds(),
      deadLetter: DEAD_QUEUE,
    })),
    { db },
  );
  // Delivered at the commit: the idle workers take the jobs at once instead of at their next poll.
  await client.query(`NOTIFY ${NEW_JOBS_CHANNEL}`);
}

/** Enqueues a corridor report's job inside the caller's transaction (with its row). */
export async function enqueueReport(job: ReportJob, transaction: Transaction): Promise<void> {
  const b = await queue();
  const client = (transaction as Transaction & { connection: pg.ClientBase }).connection;
  const db = { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
  await b.insert(
    [{ name: REPORT_QUEUE, data: job, retryLimit: 1, expireInSeconds: reportExpireSeconds() }],
    { db },
  );
}

/**
 * Enqueues study jobs: inside the caller's transaction (with the rows they concern) when one is
 * given, else at once.
 */
export async function enqueueStudies(jobs: StudyJob[], transaction?: Transaction): Promise<void> {
  if (jobs.length === 0) return;
  const b = await queue();
  const inserts = jobs.map((data) => ({
    name: STUDY_QUEUE,
    data,
    retryLimit: 1,
    expireInSeconds: studyExpireSeconds(),
  }));
  if (!transaction) return b.insert(inserts);
  const client = (transaction as Transaction & { connection: pg.ClientBase }).connection;
  const db = { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
  await b.insert(inserts, { db });
}

/**
 * Calls `wake` whenever new section jobs are submitted (enqueueSections' notice). A hint only:
 * the worker polls the queue anyway. Returns the function that stops it.
 */
export function onNewJobs(wake: () => void): () => Promise<void> {
  return listen(NEW_JOBS_CHANNEL, () => wake());
}

/**
 * Calls `onNotice` with the payload of each PostgreSQL notification on `channel`, over a
 * connection of its own, and once with null when it starts listening (notices may have been
 * missed before); while the database is away it connects again (every second, up to 15 s
 * apart). Returns the function that stops it.
 */
export function listen(
  channel: string,
  onNotice: (payload: string | null) => void,
): () => Promise<void> {
  const stopping = new AbortController();
  // Made once: a listener added after the abort would never hear it.
  const stopped = new Promise<void>((r) =>
    stopping.signal.addEventListener('abort', () => r(), { once: true }),
  );
  let client: Client | null = null;
  const run = async () => {
    for (let pause = 1000; !stopping.signal.aborted; pause = Math.min(pause * 2, 15000)) {
      const c = new Client({ connectionString: config.databaseUrl });
      const lost = new Promise<void>((resolve) => {
        c.on('error', () => resolve());
        c.on('end', () => resolve());
      });
      c.on('notification', (n) => onNotice(n.payload ?? null));
      try {
        await c.connect();
        await c.query(`LISTEN ${channel}`);
        client = c;
        pause = 1000;
        if (!stopping.signal.aborted) onNotice(null);
        await Promise.race([lost, stopped]);
      } catch {
        // the database is away: try again after the pause
      }
      client = null;
      await c.end().catch(() => undefined);
      await delay(pause, undefined, { signal: stopping.signal }).catch(() => undefined);
    }
  };
  const listening = run();
  return async () => {
    stopping.abort();
    await client?.end().catch(() => undefined);
    await listening;
  };
}
