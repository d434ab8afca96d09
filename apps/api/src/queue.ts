/** pg-boss 10 in the application database: one job per section, retries, dead letters. */
import PgBoss from 'pg-boss';
import type { Transaction } from 'sequelize';
import { config } from './config';
import type pg from 'pg';

export const SECTION_QUEUE = 'section-analysis';
export const DEAD_QUEUE = 'section-analysis-dead';

export interface SectionJob {
  sectionId: number;
  run: number;
}

let boss: PgBoss | null = null;

/** The process's pg-boss, started and with its queues created (idempotent). */
export async function queue(): Promise<PgBoss> {
  if (boss) return boss;
  const b = new PgBoss({
    connectionString: config.databaseUrl,
    schema: 'pgboss',
    max: 4,
    maintenanceIntervalSeconds: config.queueMaintenance,
  });
  b.on('error', (e) => console.error('queue:', e.message));
  await b.start();
  if (!(await b.getQueue(DEAD_QUEUE))) await b.createQueue(DEAD_QUEUE, { name: DEAD_QUEUE });
  if (!(await b.getQueue(SECTION_QUEUE))) {
    await b.createQueue(SECTION_QUEUE, {
      name: SECTION_QUEUE,
      retryLimit: config.retryLimit,
      retryDelay: config.retryDelay,
      retryBackoff: true,
      expireInSeconds: config.jobTimeout,
      deadLetter: DEAD_QUEUE,
    });
  }
  boss = b;
  return b;
}

export async function stopQueue(): Promise<void> {
  if (!boss) return;
  const b = boss;
  boss = null;
  await b.stop({ graceful: true, wait: true, timeout: 5000 });
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
      expireInSeconds: config.jobTimeout,
      deadLetter: DEAD_QUEUE,
    })),
    { db },
  );
}
