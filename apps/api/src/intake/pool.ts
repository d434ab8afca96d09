/**
 * The intake pool: a few worker threads (thread-pool.ts) that read what people submit — a corridor
 * batch's body, uploaded files, a re-run's edits — with the core, so that no single request of
 * allowed size holds up the others on the main thread. Each job has a time limit (the thread
 * is ended when it passes) and each thread a memory limit (the thread dies, the process does
 * not); when more jobs wait than INTAKE_QUEUE the request is answered 503 at once.
 */
import type { Message } from '@scarpline/core/input';
import type { Section } from '@scarpline/core/model';
import { config } from '../config';
import { Problem, unavailable } from '../errors';
import type { TerrainCut, TerrainUpload } from '../services/terrain-cut';
import type { InputFile, Parsed } from '../services/validate';
import type { IntakeReply, IntakeTask } from './thread';
import { lazyPool, PoolError } from './thread-pool';

const pool = lazyPool(__filename, () => ({
  threads: config.intakeThreads,
  queue: config.intakeQueue,
  timeoutMs: config.intakeTimeoutMs,
  memoryMb: config.intakeMemoryMb,
}));

/** Jobs running and waiting now (for tests and metrics). */
export function intakeLoad(): { running: number; waiting: number } {
  return pool.current()?.load ?? { running: 0, waiting: 0 };
}

/** Ends the pool's threads (tests, shutdown); a later job starts it again. */
export function closeIntake(): Promise<void> {
  return pool.close();
}

async function run(task: IntakeTask): Promise<unknown> {
  const seconds = Math.round(config.intakeTimeoutMs / 100) / 10;
  let reply: IntakeReply;
  try {
    reply = (await pool.get().run(task)) as IntakeReply;
  } catch (e) {
    if (!(e instanceof PoolError)) throw e;
    if (e.reason === 'timeout') {
      throw new Problem(
        422,
        'Invalid input',
        `Reading the input took longer than its limit (${seconds} s) and was stopped; send it in smaller parts.`,
      );
    }
    if (e.reason === 'memory') {
      throw new Problem(
        422,
        'Invalid input',
        `Reading the input needed more memory than allowed (${config.intakeMemoryMb} MB) and was stopped; send it in smaller parts.`,
      );
    }
    if (e.reason === 'busy') {
      throw unavailable('The service is reading as many submissions as it can; try again shortly.');
    }
    throw e;
  }
  if (!reply.ok) {
    const { status, title, detail, extra } = reply.problem;
    throw new Problem(status, title, detail, extra);
  }
  return reply.value;
}

/** A corridor batch sent as JSON (its text), read (validate.ts parseBatchBody). */
export const readBatchText = (text: string) => run({ kind: 'batch', text }) as Promise<Parsed>;

/** Uploaded files, read (validate.ts parseFiles). */
export const readUploads = (files: InputFile[]) => run({ kind: 'files', files }) as Promise<Parsed>;

/** A terrain job with its files: the sections cut and read as an upload (terrain.ts). */
export const readTerrain = (upload: TerrainUpload) =>
  run({ kind: 'terrain', ...upload }) as Promise<TerrainCut>;

/** A re-run's edits (the body's text) on the stored section, read and checked (edits.ts). */
export const readEditsText = (stored: Section, text: string) =>
  run({ kind: 'edits', stored, text }) as Promise<{
    section: Section;
    warnings: Message[];
    changes: unknown;
  }>;
