/**
 * Prometheus metrics (prom-client). The API process counts its requests; a worker process
 * counts its jobs and sends those figures with each heartbeat, and the API's /metrics serves
 * them summed over the workers (services/metrics.ts), so that one scrape of any API process
 * shows the whole service.
 */
import client from 'prom-client';

/** The API process's own figures: requests, and Node's (CPU, memory, event loop). */
export const apiRegistry = new client.Registry();
/** A worker process's figures: its jobs. */
export const workerRegistry = new client.Registry();

export const httpDuration = new client.Histogram({
  name: 'scarpline_http_request_duration_seconds',
  help: 'Time to answer an HTTP request, by method, route (as registered) and status',
  labelNames: ['method', 'route', 'status'] as const,
  buckets: [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10],
  registers: [apiRegistry],
});

export const jobsTotal = new client.Counter({
  name: 'scarpline_jobs_total',
  help: 'Jobs a worker ended, by queue and outcome (done, unsolved, stopped, error, skipped, gave-up)',
  labelNames: ['queue', 'outcome'] as const,
  registers: [workerRegistry],
});

export const jobDuration = new client.Histogram({
  name: 'scarpline_job_duration_seconds',
  help: 'Time a worker spent on a section job, by outcome',
  labelNames: ['outcome'] as const,
  buckets: [0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30, 60, 120, 300],
  registers: [workerRegistry],
});

export const queueJobs = new client.Gauge({
  name: 'scarpline_queue_jobs',
  help: 'Jobs in the queues by state: created and retry wait, active are being worked on',
  labelNames: ['queue', 'state'] as const,
  registers: [apiRegistry],
});

export const workersAliveGauge = new client.Gauge({
  name: 'scarpline_workers_alive',
  help: 'Worker processes whose heartbeat is recent (within WORKER_STALE_SECONDS)',
  registers: [apiRegistry],
});

export const batchesStalledGauge = new client.Gauge({
  name: 'scarpline_batches_stalled',
  help: 'Running batches whose sections wait while no worker is alive',
  registers: [apiRegistry],
});

export const databaseUpGauge = new client.Gauge({
  name: 'scarpline_database_up',
  help: '1 when this API process reached the database at the scrape, else 0',
  registers: [apiRegistry],
});

let processMetrics = false;

/** Node's own figures for the API process (once). */
export function collectProcessMetrics(): void {
  if (processMetrics) return;
  processMetrics = true;
  client.collectDefaultMetrics({ register: apiRegistry });
}

export { client };
