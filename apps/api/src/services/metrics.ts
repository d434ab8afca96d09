/**
 * The text /metrics answers: this API process's figures (its requests, Node's own), the
 * service's state read from the database at the scrape (queue depth, workers alive, batches
 * stalled, whether the database answered), and the workers' job figures as they sent them with
 * their heartbeats, summed over the workers (prom-client's aggregation, as for a cluster).
 */
import {
  apiRegistry,
  batchesStalledGauge,
  client,
  collectProcessMetrics,
  databaseUpGauge,
  queueJobs,
  workersAliveGauge,
} from '../metrics';
import { DEAD_QUEUE, SECTION_QUEUE, queueDepth } from '../queue';
import { stalledBatchCount, workerMetrics, workersAlive } from './workers';

const STATES = ['created', 'retry', 'active'];

export async function metricsText(): Promise<{ contentType: string; text: string }> {
  collectProcessMetrics();
  let snapshots: object[] = [];
  try {
    const [depth, alive, stalled, sent] = await Promise.all([
      queueDepth(),
      workersAlive(),
      stalledBatchCount(),
      workerMetrics(),
    ]);
    for (const queue of [SECTION_QUEUE, DEAD_QUEUE]) {
      for (const state of STATES) {
        const jobs = depth.find((d) => d.queue === queue && d.state === state)?.jobs ?? 0;
        queueJobs.set({ queue, state }, jobs);
      }
    }
    workersAliveGauge.set(alive);
    batchesStalledGauge.set(stalled);
    databaseUpGauge.set(1);
    snapshots = sent;
  } catch {
    databaseUpGauge.set(0);
  }
  const workers = client.AggregatorRegistry.aggregate(snapshots);
  const text = `${await apiRegistry.metrics()}\n${await workers.metrics()}`;
  return { contentType: apiRegistry.contentType, text };
}
