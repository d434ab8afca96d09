/** The queue worker: takes section jobs and dead letters and calls the solve service. */
import type PgBoss from 'pg-boss';
import { DEAD_QUEUE, SECTION_QUEUE, queue, type SectionJob } from './queue';
import { giveUp, solveSection } from './services/solve';

/** Registers this process's handlers; returns the pg-boss instance (stop it to end). */
export async function startWorker(): Promise<PgBoss> {
  const boss = await queue();
  // pg-boss waits out the polling interval after every fetch; a section takes milliseconds, so
  // a worker that just had a job asks for the next at once (notifyWorker skips the wait) and
  // only an idle one polls every 0.5 s.
  let workerId: string | undefined = undefined;
  workerId = await boss.work<SectionJob>(
    SECTION_QUEUE,
    { batchSize: 1, pollingIntervalSeconds: 0.5, includeMetadata: true },
    async ([job]) => {
      try {
        await solveSection(job.data, job.retryCount);
      } finally {
        if (workerId) boss.notifyWorker(workerId);
      }
    },
  );
  await boss.work<SectionJob>(DEAD_QUEUE, { pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) await giveUp(job.data);
  });
  return boss;
}
