/**
 * `npm run worker`: one process per core (WORKER_CONCURRENCY overrides), each taking one section
 * at a time, since the solver is CPU-bound. More workers on more machines against the same
 * database is how the service scales.
 */
import cluster from 'node:cluster';
import { config } from './config';
import { stopQueue } from './queue';
import { startSmtpFakeClient } from './worker-mail';
import { startWorker } from './worker';

async function child(): Promise<void> {
  startSmtpFakeClient();
  await startWorker();
  const stop = async () => {
    await stopQueue();
    process.exit(0);
  };
  process.once('SIGTERM', () => void stop());
  process.once('SIGINT', () => void stop());
}

if (cluster.isPrimary && config.workerConcurrency > 1) {
  console.log(`worker: starting ${config.workerConcurrency} processes`);
  for (let i = 0; i < config.workerConcurrency; i++) cluster.fork();
  cluster.on('exit', (w, code, signal) => {
    if (signal !== 'SIGTERM' && signal !== 'SIGINT' && code !== 0) {
      console.error(`worker: process ${w.process.pid} ended (${signal ?? code}); starting another`);
      cluster.fork();
    }
  });
  const stopAll = () => {
    for (const w of Object.values(cluster.workers ?? {})) w?.process.kill('SIGTERM');
  };
  process.once('SIGTERM', stopAll);
  process.once('SIGINT', stopAll);
} else {
  child().catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
