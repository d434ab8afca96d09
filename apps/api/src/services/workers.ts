/**
 * Workers, as the API sees them: each worker process writes a heartbeat every
 * HEARTBEAT_SECONDS (worker_heartbeats, on the database's clock); a worker is alive while its
 * last one is younger than WORKER_STALE_SECONDS. A running batch whose sections wait while no
 * worker is alive is stalled: its progress says so, and the API's stall watch marks it
 * (batches.stalled_since) and tells the administrators once per stall.
 */
import crypto from 'node:crypto';
import os from 'node:os';
import { QueryTypes } from 'sequelize';
import { config } from '../config';
import { sequelize } from '../db';
import { log } from '../log';
import { WorkerHeartbeat } from '../models';
import { batchStalled } from './mail';
import { failOrphanedReports } from './reports';
import { failOrphanedStudies } from './studies';

/** Heartbeats older than this are deleted by the stall watch. */
const FORGET_AFTER_SECONDS = 3600;

export interface Heartbeat {
  id: string;
  /** Writes one heartbeat now; false when the database could not be reached. */
  beat(): Promise<boolean>;
  /** Stops beating and removes this worker's row (it is gone, not stale). */
  stop(): Promise<void>;
}

/**
 * Starts a worker process's heartbeat: at once, then every HEARTBEAT_SECONDS. `state` gives what
 * it is on and its job figures at each beat. A beat that fails (the database is away) is logged
 * once per outage and tried again at the next.
 */
export function startHeartbeat(state: {
  sectionId: () => number | null;
  metrics: () => Promise<object>;
}): Heartbeat {
  const id = `${os.hostname()}:${process.pid}:${crypto.randomBytes(4).toString('hex')}`;
  const startedAt = new Date();
  let failing = false;
  let stopped = false;
  const beat = async (): Promise<boolean> => {
    try {
      await sequelize.query(
        `INSERT INTO worker_heartbeats (id, host, pid, started_at, seen_at, section_id, metrics)
         VALUES ($1, $2, $3, $4, now(), $5, $6)
         ON CONFLICT (id) DO UPDATE
           SET seen_at = now(), section_id = EXCLUDED.section_id, metrics = EXCLUDED.metrics`,
        {
          bind: [
            id,
            os.hostname(),
            process.pid,
            startedAt,
            state.sectionId(),
            JSON.stringify(await state.metrics()),
          ],
        },
      );
      if (failing) log.info('heartbeat: written again');
      failing = false;
      return true;
    } catch (e) {
      if (!failing) log.warn({ err: e }, `heartbeat: not written (${(e as Error).message})`);
      failing = true;
      return false;
    }
  };
  let current: Promise<boolean> = beat();
  const timer = setInterval(() => {
    if (!stopped) current = beat();
  }, config.heartbeatSeconds * 1000);
  return {
    id,
    beat: () => (current = beat()),
    async stop() {
      stopped = true;
      clearInterval(timer);
      await current;
      await WorkerHeartbeat.destroy({ where: { id } }).catch((e: Error) =>
        log.warn({ err: e }, `heartbeat: row not removed (${e.message})`),
      );
    },
  };
}

/** How many workers are alive (a heartbeat within WORKER_STALE_SECONDS), read now. */
export async function workersAlive(): Promise<number> {
  return (await workerState()).alive;
}

/**
 * The workers alive, and whether the database started too recently to tell: less than
 * WORKER_STALE_SECONDS ago (a restart), when a worker that is alive may not have written its
 * heartbeat again yet. A batch is not called stalled then.
 */
export async function workerState(): Promise<{ alive: number; tooSoon: boolean }> {
  const [row] = await sequelize.query<{ n: string; too_soon: boolean }>(
    `SELECT (SELECT count(*) FROM worker_heartbeats
              WHERE seen_at > now() - make_interval(secs => $1)) AS n,
            now() - pg_postmaster_start_time() < make_interval(secs => $1) AS too_soon`,
    { bind: [config.workerStaleSeconds], type: QueryTypes.SELECT },
  );
  return { alive: Number(row.n), tooSoon: row.too_soon };
}

/** Whether a state means that no worker can be taking jobs. */
const noWorker = (s: { alive: number; tooSoon: boolean }) => s.alive === 0 && !s.tooSoon;

let cached: { at: number; state: Promise<{ alive: number; tooSoon: boolean }> } | null = null;

/**
 * Whether a worker may be taking jobs (one is alive, or the database has just started), read
 * at most once a second per process (every progress read asks, and an event stream reads
 * progress twice a second).
 */
export async function anyWorkerAlive(): Promise<boolean> {
  const now = Date.now();
  if (!cached || now - cached.at > 1000) {
    const state = workerState();
    cached = { at: now, state };
    state.catch(() => (cached = null));
  }
  return !noWorker(await cached.state);
}

/** The latest heartbeat of any worker, or null when none has ever written one (or all are forgotten). */
export async function lastHeartbeat(): Promise<Date | null> {
  const [row] = await sequelize.query<{ at: Date | null }>(
    'SELECT max(seen_at) AS at FROM worker_heartbeats',
    { type: QueryTypes.SELECT },
  );
  return row.at;
}

/** The job figures the workers sent with their heartbeats (prom-client's metrics as JSON). */
export async function workerMetrics(): Promise<object[]> {
  const rows = await WorkerHeartbeat.findAll({ attributes: ['metrics'] });
  return rows.map((r) => r.metrics).filter((m): m is object => Array.isArray(m));
}

/** The words a stalled batch is described with (events, e-mail). */
export function stalledWords(since: Date | null): string {
  return since
    ? `No worker has reported since ${since.toISOString()}: the sections wait until a worker is back, and then go on by themselves.`
    : 'No worker is running: the sections wait until a worker is started, and then go on by themselves.';
}

const PENDING = `EXISTS (SELECT 1 FROM sections s WHERE s.batch_id = b.id AND s.status IN ('queued', 'running'))`;

/**
 * One look of the stall watch: marks the running batches with waiting sections as stalled when
 * no worker is alive (each once: the conditional update is the guard, across API processes) and
 * tells the administrators; clears the mark of those that go on again or have ended; forgets
 * heartbeats older than an hour. Returns the batches newly stalled and those going on again.
 */
export async function checkStalls(): Promise<{ stalled: number[]; resumed: number[] }> {
  const state = await workerState();
  const stalled = !noWorker(state)
    ? []
    : await sequelize.query<{ id: number }>(
        `UPDATE batches b SET stalled_since = now()
            WHERE b.status = 'running' AND b.stalled_since IS NULL AND ${PENDING}
            RETURNING b.id`,
        { type: QueryTypes.SELECT },
      );
  const resumed = await sequelize.query<{ id: number }>(
    `UPDATE batches b SET stalled_since = NULL
      WHERE b.stalled_since IS NOT NULL AND ($1 OR b.status <> 'running' OR NOT ${PENDING})
      RETURNING b.id`,
    { bind: [state.alive > 0], type: QueryTypes.SELECT },
  );
  await sequelize.query(
    'DELETE FROM worker_heartbeats WHERE seen_at < now() - make_interval(secs => $1)',
    { bind: [FORGET_AFTER_SECONDS] },
  );
  if (stalled.length > 0) {
    const since = await lastHeartbeat();
    for (const { id } of stalled) {
      log.warn({ batchId: id, lastHeartbeat: since }, 'batch stalled: no worker is alive');
      await batchStalled(id, stalledWords(since));
    }
  }
  for (const { id } of resumed) log.info({ batchId: id }, 'batch no longer stalled');
  return { stalled: stalled.map((r) => r.id), resumed: resumed.map((r) => r.id) };
}

/**
 * Runs checkStalls, and the failing of the studies and corridor reports the queue gave up on
 * (failOrphanedStudies, failOrphanedReports), every HEARTBEAT_SECONDS (in the API process);
 * returns its stop.
 */
export function startStallWatch(): () => void {
  let running = false;
  let failing = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    Promise.all([checkStalls(), failOrphanedStudies(), failOrphanedReports()])
      .then(([, studies, reports]) => {
        for (const id of studies)
          log.warn({ studyId: id }, 'study failed: its worker stopped on every try');
        for (const id of reports)
          log.warn({ reportId: id }, 'corridor report failed: its worker stopped on every try');
        failing = false;
      })
      .catch((e: Error) => {
        if (!failing) log.warn({ err: e }, `stall watch: ${e.message}`);
        failing = true;
      })
      .finally(() => (running = false));
  }, config.heartbeatSeconds * 1000);
  timer.unref();
  return () => clearInterval(timer);
}

/** Batches the stall watch has marked stalled. */
export async function stalledBatchCount(): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(
    'SELECT count(*) AS n FROM batches WHERE stalled_since IS NOT NULL',
    { type: QueryTypes.SELECT },
  );
  return Number(row.n);
}
