/**
 * Health of an API process: liveness (it answers) and readiness: the database answers, the queue
 * runs in this process, at least one worker's heartbeat is recent, and file storage answers
 * with its bucket there. Each check has a short
 * bound, so that a database that does not answer makes /ready answer 503 in seconds, not hang.
 */
import { config } from '../config';
import { sequelize } from '../db';
import { queue, queueDepth } from '../queue';
import { checkBucket } from '../storage';
import { workerState } from './workers';

const CHECK_MS = 3000;

export interface Check {
  ok: boolean;
  detail: string;
}

export interface Readiness {
  ready: boolean;
  checks: {
    database: Check;
    queue: Check;
    workers: Check & { alive: number };
    storage: Check;
  };
}

function bounded<T>(what: string, p: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<never>((_, reject) => {
    timer = setTimeout(
      () => reject(new Error(`${what} did not answer within ${CHECK_MS} ms`)),
      CHECK_MS,
    );
  });
  return Promise.race([p, late]).finally(() => clearTimeout(timer));
}

const failed = (e: unknown): Check => ({ ok: false, detail: (e as Error).message });

export function liveness() {
  return { status: 'ok', uptimeSeconds: Math.round(process.uptime()) };
}

export async function readiness(): Promise<Readiness> {
  const [database, queueCheck, workers, storage] = await Promise.all([
    bounded('the database', sequelize.query('SELECT 1')).then(
      (): Check => ({ ok: true, detail: 'answers' }),
      failed,
    ),
    bounded(
      'the queue',
      (async () => {
        await queue();
        const depth = await queueDepth();
        const waiting = depth.filter((d) => d.state !== 'active').reduce((n, d) => n + d.jobs, 0);
        return { ok: true, detail: `running; ${waiting} jobs waiting` };
      })(),
    ).catch(failed),
    bounded('the heartbeats', workerState()).then(
      ({ alive, tooSoon }) => ({
        ok: alive > 0 || tooSoon,
        alive,
        detail:
          alive > 0
            ? `${alive} alive`
            : tooSoon
              ? 'the database has just started: waiting for the workers to write their heartbeats'
              : `no worker has written a heartbeat in the last ${config.workerStaleSeconds} s`,
      }),
      (e: unknown) => ({ ...failed(e), alive: 0 }),
    ),
    bounded('file storage', checkBucket()).then((detail): Check => ({ ok: true, detail }), failed),
  ]);
  return {
    ready: database.ok && queueCheck.ok && workers.ok && storage.ok,
    checks: { database, queue: queueCheck, workers, storage },
  };
}
