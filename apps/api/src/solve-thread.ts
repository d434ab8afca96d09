/**
 * The thread a worker analyses sections in (solver.ts starts it): it loads the solver once,
 * says `ready`, then answers each { section, deadline } with the result, the reason the
 * analysis stopped (AnalysisStopped: its work bound, or the deadline it asked about every few
 * hundred trial surfaces), or the error it ended with. Being a thread, the worker can end it
 * when it does not stop by itself.
 */
import { parentPort } from 'node:worker_threads';
import { AnalysisStopped, analyzeSection, type Section } from '@scarpline/core';
import type { ThreadAnswer, ThreadJob } from './solver';

const port = parentPort;
if (!port) throw new Error('solve-thread.js runs as a worker thread (see solver.ts)');

port.on('message', ({ section, deadline }: ThreadJob) => {
  let answer: ThreadAnswer;
  try {
    const result = analyzeSection(section as Section, { shouldStop: () => Date.now() > deadline });
    answer = { kind: 'result', result };
  } catch (e) {
    answer =
      e instanceof AnalysisStopped
        ? { kind: 'stopped', code: e.code, message: e.message }
        : { kind: 'error', message: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage(answer);
});
port.postMessage({ kind: 'ready' } satisfies ThreadAnswer);
