/**
 * Where a worker analyses a section: a worker thread (solve-thread.ts) it can end. The time
 * limit is kept twice: the analysis is asked to stop itself a little before it (a tenth of the
 * limit, at least a second: analyzeSection's shouldStop, so it usually ends first with its own
 * account of what to change), and the thread is terminated at the limit if it has not answered. A new thread is started for the next
 * section after one was terminated, failed or ran out of memory.
 */
import fs from 'node:fs';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import type { CaseKind, StationResult } from '@scarpline/core/result';

/** What the worker sends its thread. */
export interface ThreadJob {
  /** The section, or its JSON text (as the database gives it: the thread parses it). */
  section: object | string;
  /** Date.now() past which the analysis stops itself. */
  deadline: number;
}

/**
 * A finished analysis as the thread hands it back (solve-thread.ts): the fields the worker
 * reads, and the JSON text of the columns it writes as they are. The station's summary: its
 * verdict over every case, its governing case's method, FS, requirement and ratio (the first
 * case's when none governs), and a row per case.
 */
export interface SolvedSection {
  verdict: StationResult['verdict'];
  /** The governing case by name; null when none governs. */
  governingCase: string | null;
  governing: { method: string; fs: number } | null;
  requiredFs: number | null;
  ratio: number | null;
  /** Why there is no factor of safety to compare (verdict no-fs), else null. */
  reason: string | null;
  solverVersion: string;
  caution: string;
  /** sha256 of the input's JSON, stored with the result. */
  inputHash: string;
  /** The station's own warnings; each case's probability of failure (StationProbability[]) or null. */
  json: { warnings: string; probability: string | null };
  /** Every case, in the order the section lists them. */
  cases: SolvedCase[];
}

/** One case of a finished analysis: what the filters read, and its reports as JSON text. */
export interface SolvedCase {
  name: string;
  kind: CaseKind;
  verdict: StationResult['verdict'];
  governing: { method: string; fs: number } | null;
  requiredFs: number | null;
  ratio: number | null;
  /** The governing methods, the per-method reports, the governing method's critical surface, the warnings, the search, the drawdown and seismic reports, the required reinforcement. */
  json: {
    governs: string;
    methods: string;
    criticalSurface: string | null;
    warnings: string;
    search: string | null;
    drawdown: string | null;
    seismic: string | null;
    requiredReinforcement: string | null;
  };
}

/** What the thread answers. */
export type ThreadAnswer =
  | { kind: 'ready' }
  | { kind: 'result'; result: SolvedSection }
  | { kind: 'stopped'; code: 'work-limit' | 'stopped'; message: string }
  | { kind: 'error'; message: string };

/** How an analysis ended. */
export type SolveOutcome =
  /** It finished (its verdict may still be no-fs). */
  | { kind: 'result'; result: SolvedSection }
  /** It was stopped by its work bound or its time limit: the reason says what to change. */
  | { kind: 'stopped'; reason: string }
  /** It failed (an exception, the thread's end, its memory): worth another attempt. */
  | { kind: 'error'; reason: string }
  /** The solver was closed while it ran (the worker is stopping). */
  | { kind: 'aborted' };

/**
 * When the analysis is asked to stop itself: a tenth of the limit before it, and at least a
 * second (half the limit when that is shorter), so that it notices between two of its checks
 * (every few hundred trial surfaces: up to some tenths of a second apart).
 */
export function softDeadline(limitMs: number): number {
  return limitMs - Math.max(limitMs / 10, Math.min(1000, limitMs / 2));
}
const WHAT_TO_CHANGE =
  'use fewer grid centres, radii, moves, ground-range points or slices, or give the surface';

/** The built thread beside this file, or (under the tests, which run src/) the API's build of it. */
export function threadFile(): string {
  const beside = path.join(__dirname, 'solve-thread.js');
  if (fs.existsSync(beside)) return beside;
  const built = path.resolve(__dirname, '../dist/solve-thread.js');
  if (fs.existsSync(built)) return built;
  throw new Error(`${built} is missing: build the API first (npm run build:node)`);
}

const seconds = (ms: number) => `${Number((ms / 1000).toFixed(3))} s`;

export class Solver {
  private thread: Worker | null = null;
  private ready: Promise<Worker> | null = null;
  private running: ((o: SolveOutcome) => void) | null = null;
  private closed = false;

  constructor(
    private readonly options: {
      /** The thread's script (a test's stand-in); default threadFile(). */
      file?: string;
      /** The heap the thread may grow to, in MB. */
      memoryMb?: number;
    } = {},
  ) {}

  /** Starts the thread ahead of the first section (loading the solver takes a moment). */
  async warm(): Promise<void> {
    await this.start();
  }

  /**
   * Analyses one section (or its JSON text) within `limitMs` (counted from when the thread has
   * the section). One at a time: the thread analyses one section at a time.
   */
  async solve(section: object | string, limitMs: number): Promise<SolveOutcome> {
    if (this.running) throw new Error('Solver.solve: one section at a time');
    if (this.closed) return { kind: 'aborted' };
    let thread: Worker;
    try {
      thread = await this.start();
    } catch (e) {
      return {
        kind: 'error',
        reason: `the analysis thread did not start: ${(e as Error).message}`,
      };
    }
    if (this.closed) return { kind: 'aborted' };
    return new Promise<SolveOutcome>((resolve) => {
      const finish = (outcome: SolveOutcome) => {
        if (!this.running) return;
        this.running = null;
        clearTimeout(timer);
        thread.off('message', onMessage);
        thread.off('error', onError);
        thread.off('exit', onExit);
        resolve(outcome);
      };
      const onMessage = (m: ThreadAnswer) => {
        if (m.kind === 'result') finish({ kind: 'result', result: m.result });
        else if (m.kind === 'stopped')
          finish({
            kind: 'stopped',
            reason:
              m.code === 'stopped'
                ? `${m.message} (the time limit is ${seconds(limitMs)} a section)`
                : m.message,
          });
        else if (m.kind === 'error')
          finish({ kind: 'error', reason: `solver error: ${m.message}` });
      };
      const onError = (e: Error & { code?: string }) => {
        this.forget(thread);
        finish({
          kind: 'error',
          reason:
            e.code === 'ERR_WORKER_OUT_OF_MEMORY'
              ? `the analysis ran out of memory (${this.options.memoryMb ?? 'the'} MB it may use)`
              : `the analysis thread failed: ${e.message}`,
        });
      };
      const onExit = (code: number) => {
        this.forget(thread);
        finish(
          this.closed
            ? { kind: 'aborted' }
            : { kind: 'error', reason: `the analysis thread ended (exit code ${code})` },
        );
      };
      const timer = setTimeout(() => {
        this.forget(thread);
        void thread.terminate();
        finish({
          kind: 'stopped',
          reason: `the analysis did not end within the time limit of ${seconds(limitMs)} a section and was stopped: ${WHAT_TO_CHANGE}`,
        });
      }, limitMs);
      this.running = finish;
      thread.on('message', onMessage);
      thread.once('error', onError);
      thread.once('exit', onExit);
      const job: ThreadJob = { section, deadline: Date.now() + softDeadline(limitMs) };
      thread.postMessage(job);
    });
  }

  /** Ends the thread; a section being analysed ends `aborted`. */
  async close(): Promise<void> {
    this.closed = true;
    const thread = this.thread;
    this.running?.({ kind: 'aborted' });
    this.thread = null;
    this.ready = null;
    if (thread) await thread.terminate();
  }

  private start(): Promise<Worker> {
    if (this.ready) return this.ready;
    const thread = new Worker(this.options.file ?? threadFile(), {
      resourceLimits: this.options.memoryMb
        ? { maxOldGenerationSizeMb: this.options.memoryMb }
        : undefined,
    });
    this.thread = thread;
    // Always heard, so that a thread that fails between sections never goes unheard.
    thread.on('error', () => this.forget(thread));
    thread.on('exit', () => this.forget(thread));
    const ready = new Promise<Worker>((resolve, reject) => {
      const onMessage = (m: ThreadAnswer) => {
        if (m.kind !== 'ready') return;
        cleanup();
        resolve(thread);
      };
      const onError = (e: Error) => {
        cleanup();
        this.forget(thread);
        reject(e);
      };
      const onExit = (code: number) => {
        cleanup();
        this.forget(thread);
        reject(new Error(`it ended (exit code ${code})`));
      };
      const cleanup = () => {
        thread.off('message', onMessage);
        thread.off('error', onError);
        thread.off('exit', onExit);
      };
      thread.on('message', onMessage);
      thread.once('error', onError);
      thread.once('exit', onExit);
    });
    this.ready = ready;
    return ready;
  }

  /** Drops a thread that has ended or is being ended, so that the next section starts another. */
  private forget(thread: Worker): void {
    if (this.thread !== thread) return;
    this.thread = null;
    this.ready = null;
  }
}
