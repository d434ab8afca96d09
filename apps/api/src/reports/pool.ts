/**
 * The report pool: worker threads (intake/thread-pool.ts) that lay out PDF reports
 * (reports/thread.ts) — in the API for a section's report, in a worker for a corridor's — each
 * with a time limit (REPORT_TIMEOUT_MS: the thread is ended when it passes) and a memory limit
 * (REPORT_MEMORY_MB); when more than REPORT_QUEUE wait, the next is refused at once (503).
 */
import { config } from '../config';
import { unavailable } from '../errors';
import { lazyPool, PoolError } from '../intake/thread-pool';
import type { ReportTask } from './thread';

const pool = lazyPool(__filename, () => ({
  threads: config.reportThreads,
  queue: config.reportQueue,
  timeoutMs: config.reportTimeoutMs,
  memoryMb: config.reportMemoryMb,
}));

/** Why a report could not be made, in words for its requester (a PoolError's reason). */
export function poolFailure(e: PoolError): string {
  switch (e.reason) {
    case 'timeout':
      return `laying out the report took longer than its limit (${Math.round(config.reportTimeoutMs / 1000)} s) and was stopped`;
    case 'memory':
      return `laying out the report needed more memory than allowed (${config.reportMemoryMb} MB) and was stopped`;
    default:
      return `the report's thread ended before it was done (${e.message})`;
  }
}

/**
 * The PDF of a task, laid out on a report thread; `onProgress` hears a corridor's pages.
 * A full queue is a 503 (try again shortly); the other PoolErrors are thrown as they are.
 */
export async function makeReport(
  task: ReportTask,
  onProgress?: (done: number, total: number) => void,
): Promise<Buffer> {
  try {
    const bytes = (await pool.get().run(task, {
      onProgress: onProgress
        ? (p) => {
            const { done, total } = p as { done: number; total: number };
            onProgress(done, total);
          }
        : undefined,
    })) as Uint8Array;
    return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  } catch (e) {
    if (e instanceof PoolError && e.reason === 'busy') {
      throw unavailable('The service is making as many reports as it can; try again shortly.');
    }
    throw e;
  }
}

/** Ends the pool's threads (tests, shutdown); a later report starts it again. */
export function closeReports(): Promise<void> {
  return pool.close();
}
