/**
 * `npm run worker`: one process per core (WORKER_CONCURRENCY overrides), each taking one section
 * at a time, since the solver is CPU-bound. More workers on more machines against the same
 * database is how the service scales. A process that cannot reach the database at start waits
 * for it; one that ends unexpectedly is started again by the first process.
 */
import cluster from 'node:cluster';
import { setTimeout as delay } from 'node:timers/promises';
import { config } from './config';
import { log, logAs } from './log';
import { stopQueue } from './queue';
import { startSmtpFakeClient } from './worker-mail';
import { startWorker } from './worker';

logAs('worker');

/** Logs what would otherwise end the process unheard, then ends it (it is started again). */
function fatal(what: string) {
  return (e: unknown) => {
    log.fatal({ err: e }, `${what}: ${e instanceof Error ? e.message : String(e)}`);
    process.exit(1);
  };
}

async function child(): Promise<void> {
  process.on('uncaughtException', fatal('uncaught exception'));
  process.on('unhandledRejection', fatal('unhandled rejection'));
  startSmtpFakeClient();
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    await stopQueue().catch((e: Error) => log.warn({ err: e }, `stopping: ${e.message}`));
    process.exit(0);
  };
  process.once('SIGTERM', () => void stop());
  process.once('SIGINT', () => void stop());
  for (let pause = 1000; !stopping; pause = Math.min(pause * 2, 15000)) {
    try {
      await startWorker();
      return;
    } catch (e) {
      log.warn({ err: e }, `worker: could not start (${(e as Error).message}); trying again`);
      await delay(pause);
    }
  }
}

if (cluster.isPrimary && config.workerConcurrency > 1) {
  log.info(`worker: starting ${config.workerConcurrency} processes`);
  for (let i = 0; i < config.workerConcurrency; i++) cluster.fork();
  cluster.on('exit', (w, code, signal) => {
    if (signal !== 'SIGTERM' && signal !== 'SIGINT' && code !== 0) {
      log.error(`worker: process ${w.process.pid} ended (${signal ?? code}); starting another`);
      cluster.fork();
    }
  });
  const stopAll = () => {
    for (const w of Object.values(cluster.workers ?? {})) w?.process.kill('SIGTERM');
  };
  process.once('SIGTERM', stopAll);
  process.once('SIGINT', stopAll);
} else {
  child().catch(fatal('worker'));
}
