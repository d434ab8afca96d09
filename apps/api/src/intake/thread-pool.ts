/**
 * A small pool of worker threads running one script, each taking one job at a time, with the
 * promises the intake needs: a job's time limit counts from when a thread starts it (not the
 * wait before) and ends that thread when it passes; a thread that runs out of memory or dies
 * answers its job and is replaced; at most `queue` jobs wait, and the next one is refused at
 * once; idle threads do not keep the process alive and end after a while.
 *
 * The script answers `{ id, task }` messages with `{ id, ok: true, value }` or
 * `{ id, ok: false, error: { name, message } }` (see thread.ts); before that it may send
 * `{ id, progress }` messages, which go to the job's `onProgress`.
 */
import path from 'node:path';
import { Worker } from 'node:worker_threads';

/**
 * The script of a pool's threads, `thread` beside the pool's module (its `__filename`): the
 * compiled thread.js; when the API runs from its TypeScript sources (Jest),
 * scripts/source-thread.js, which compiles thread.ts as it loads it.
 */
export function threadScript(poolFile: string): { script: string; workerData?: unknown } {
  const dir = path.dirname(poolFile);
  if (!poolFile.endsWith('.ts')) return { script: path.join(dir, 'thread.js') };
  return {
    script: path.resolve(dir, '../../scripts/source-thread.js'),
    workerData: { source: path.join(dir, 'thread.ts') },
  };
}

export interface ThreadPoolOptions {
  script: string;
  workerData?: unknown;
  threads: number;
  queue: number;
  timeoutMs: number;
  memoryMb: number;
  /** An idle thread ends after this long (it is started again when needed). */
  idleMs?: number;
}

/**
 * The pool of a pool file's thread script (threadScript), started at its first use with the
 * limits read then (the config, which tests change) and ended by `close` (tests, shutdown),
 * after which the next use starts it again; `current` is the running pool, if any.
 */
export function lazyPool(
  poolFile: string,
  limits: () => Omit<ThreadPoolOptions, 'script' | 'workerData'>,
): { get: () => ThreadPool; current: () => ThreadPool | null; close: () => Promise<void> } {
  let pool: ThreadPool | null = null;
  return {
    get: () => (pool ??= new ThreadPool({ ...threadScript(poolFile), ...limits() })),
    current: () => pool,
    close: async () => {
      const p = pool;
      pool = null;
      await p?.close();
    },
  };
}

/** Why a job was not done: its time passed, its thread ran out of memory or died, the queue was full. */
export class PoolError extends Error {
  constructor(
    readonly reason: 'timeout' | 'memory' | 'died' | 'busy' | 'closed',
    message: string,
  ) {
    super(message);
    this.name = 'PoolError';
  }
}

/** What a caller may hear of its job while it runs. */
export interface RunOptions {
  onProgress?: (progress: unknown) => void;
}

interface Job {
  id: number;
  task: unknown;
  onProgress?: (progress: unknown) => void;
  resolve: (value: unknown) => void;
  reject: (e: unknown) => void;
}

interface Slot {
  worker: Worker;
  job: Job | null;
  timer: NodeJS.Timeout | null;
  idle: NodeJS.Timeout | null;
}

export class ThreadPool {
  private readonly slots = new Set<Slot>();
  private readonly waiting: Job[] = [];
  private next = 1;
  private closed = false;

  constructor(private readonly options: ThreadPoolOptions) {}

  /** Jobs running and waiting now. */
  get load(): { running: number; waiting: number } {
    let running = 0;
    for (const s of this.slots) if (s.job) running++;
    return { running, waiting: this.waiting.length };
  }

  /** Runs a job on a thread; rejects with a PoolError when it cannot be done. */
  run(task: unknown, options: RunOptions = {}): Promise<unknown> {
    if (this.closed) return Promise.reject(new PoolError('closed', 'the pool is closed'));
    return new Promise((resolve, reject) => {
      const job: Job = { id: this.next++, task, onProgress: options.onProgress, resolve, reject };
      const slot = this.freeSlot();
      if (slot) return this.start(slot, job);
      if (this.waiting.length >= this.options.queue) {
        return reject(new PoolError('busy', 'every thread is busy and the queue is full'));
      }
      this.waiting.push(job);
    });
  }

  /** Ends every thread; jobs running or waiting are refused. */
  async close(): Promise<void> {
    this.closed = true;
    for (const job of this.waiting.splice(0)) {
      job.reject(new PoolError('closed', 'the pool is closed'));
    }
    const ending = [...this.slots].map((s) =>
      this.end(s, new PoolError('closed', 'the pool is closed')),
    );
    await Promise.all(ending);
  }

  /** An idle thread, or a new one when there are fewer than `threads`. */
  private freeSlot(): Slot | null {
    for (const s of this.slots) if (!s.job) return s;
    return this.slots.size < Math.max(1, this.options.threads) ? this.spawn() : null;
  }

  private spawn(): Slot {
    const worker = new Worker(this.options.script, {
      // Always an object: the geotiff package's `web-worker` dependency, loaded in a thread
      // (the terrain cut), reads its own settings from workerData and throws when there is none.
      workerData: this.options.workerData ?? {},
      resourceLimits: { maxOldGenerationSizeMb: this.options.memoryMb },
    });
    const slot: Slot = { worker, job: null, timer: null, idle: null };
    this.slots.add(slot);
    worker.on(
      'message',
      (reply: {
        id: number;
        ok?: boolean;
        value?: unknown;
        error?: { name: string; message: string };
        progress?: unknown;
      }) => {
        const job = slot.job;
        if (!job || job.id !== reply.id) return;
        if (reply.ok === undefined) {
          job.onProgress?.(reply.progress);
          return;
        }
        this.settle(slot);
        if (reply.ok) job.resolve(reply.value);
        else
          job.reject(Object.assign(new Error(reply.error?.message), { name: reply.error?.name }));
        this.afterJob(slot);
      },
    );
    worker.on('error', (e: Error & { code?: string }) => {
      const memory = e.code === 'ERR_WORKER_OUT_OF_MEMORY';
      void this.end(slot, new PoolError(memory ? 'memory' : 'died', e.message));
    });
    worker.on('exit', (code) => {
      void this.end(slot, new PoolError('died', `the thread ended (exit code ${code})`));
    });
    return slot;
  }

  private start(slot: Slot, job: Job): void {
    if (slot.idle) clearTimeout(slot.idle);
    slot.idle = null;
    slot.job = job;
    slot.worker.ref();
    slot.timer = setTimeout(() => {
      void this.end(
        slot,
        new PoolError('timeout', `the job took longer than ${this.options.timeoutMs} ms`),
      );
    }, this.options.timeoutMs);
    slot.worker.postMessage({ id: job.id, task: job.task });
  }

  private settle(slot: Slot): void {
    if (slot.timer) clearTimeout(slot.timer);
    slot.timer = null;
    slot.job = null;
  }

  /** After a job: the next waiting one, or idle (unref'd, ended after idleMs). */
  private afterJob(slot: Slot): void {
    const next = this.waiting.shift();
    if (next && this.slots.has(slot)) return this.start(slot, next);
    slot.worker.unref();
    slot.idle = setTimeout(() => void this.end(slot, null), this.options.idleMs ?? 60_000);
    slot.idle.unref();
  }

  /** Ends a thread (its job, if any, refused with `why`) and starts the next waiting job. */
  private async end(slot: Slot, why: PoolError | null): Promise<void> {
    if (!this.slots.delete(slot)) return;
    const job = slot.job;
    this.settle(slot);
    if (slot.idle) clearTimeout(slot.idle);
    if (job) job.reject(why ?? new PoolError('died', 'the thread ended'));
    await slot.worker.terminate().catch(() => undefined);
    if (this.closed) return;
    const next = this.waiting.shift();
    if (next) this.start(this.freeSlot() as Slot, next);
  }
}
