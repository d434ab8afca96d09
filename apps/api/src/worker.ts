/** The queue worker: takes section jobs and dead letters and calls the solve service. */
import type PgBoss from 'pg-boss';
import { DEAD_QUEUE, SECTION_QUEUE, queue, type SectionJob } from './queue';
import { giveUp, solveSection } from './services/solve';

/** Registers this process's handlers; returns the pg-boss instance (stop it to end). */
export async function startWorker(): Promise<PgBoss> {
  const boss = await queue();
  await boss.work<SectionJob>(
    SECTION_QUEUE,
    { batchSize: 1, pollingIntervalSeconds: 0.5, includeMetadata: true },
    async ([job]) => {
      await solveSection(job.data, job.retryCount);
    },
  );
  await boss.work<SectionJob>(DEAD_QUEUE, { pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) await giveUp(job.data);
  });
  return boss;
}
