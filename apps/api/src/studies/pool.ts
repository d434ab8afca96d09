/**
 * The study pool: worker threads (intake/thread-pool.ts) that compute section studies
 * (studies/thread.ts) in a worker process, each with a time limit (STUDY_TIMEOUT_MS: the thread
 * is ended when it passes) and a memory limit (STUDY_MEMORY_MB).
 */
import { config } from '../config';
import { lazyPool, PoolError } from '../intake/thread-pool';
import type { StudyAnswer, StudyTask } from './thread';

const pool = lazyPool(__filename, () => ({
  threads: config.studyThreads,
  queue: config.studyQueue,
  timeoutMs: config.studyTimeoutMs,
  memoryMb: config.studyMemoryMb,
}));

/** Why a study's computation stopped, in words for its requester (a PoolError's reason). */
export function studyFailure(e: PoolError): string {
  switch (e.reason) {
    case 'timeout':
      return `the computation took longer than its limit (${Math.round(config.studyTimeoutMs / 1000)} s) and was stopped: ask for fewer realisations, fewer variables or a single case`;
    case 'memory':
      return `the computation needed more memory than allowed (${config.studyMemoryMb} MB) and was stopped`;
    default:
      return `the computation's thread ended before it was done (${e.message})`;
  }
}

/** A task computed on a study thread; `onProgress` hears (done, total) now and then. */
export async function computeOnThread(
  task: StudyTask,
  onProgress?: (done: number, total: number) => void,
): Promise<StudyAnswer> {
  return (await pool.get().run(task, {
    onProgress: onProgress
      ? (p) => {
          const { done, total } = p as { done: number; total: number };
          onProgress(done, total);
        }
      : undefined,
  })) as StudyAnswer;
}

/** Ends the pool's threads (tests, shutdown); a later study starts it again. */
export function closeStudies(): Promise<void> {
  return pool.close();
}
