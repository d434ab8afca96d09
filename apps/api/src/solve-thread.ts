/**
 * The thread a worker analyses sections in (solver.ts starts it): it loads the solver once,
 * says `ready`, then answers each { section, deadline } with the result, the reason the
 * analysis stopped (AnalysisStopped: its work bound, or the deadline it asked about every few
 * hundred trial surfaces), or the error it ended with. Being a thread, the worker can end it
 * when it does not stop by itself.
 *
 * The section may come as its JSON text (as the database gives it) and the result goes back
 * as the few fields the worker looks at plus the JSON text of the columns it writes: turning
 * objects into text and back is done here, beside the analysis, and not on the worker's main
 * thread, which only passes the text on to the database.
 */
import crypto from 'node:crypto';
import { parentPort } from 'node:worker_threads';
import {
  AnalysisStopped,
  analyzeSection,
  caseView,
  unsolvedReason,
  type Section,
} from '@scarpline/core';
import type { SectionResult } from '@scarpline/core/result';
import type { SolvedSection, ThreadAnswer, ThreadJob } from './solver';

const port = parentPort;
if (!port) throw new Error('solve-thread.js runs as a worker thread (see solver.ts)');

/** The hash of a section's input stored with its result (sha256 of its JSON). */
function inputHash(input: unknown): string {
  return crypto.createHash('sha256').update(JSON.stringify(input)).digest('hex');
}

/** What the worker writes of a result: the fields it reads, and the JSON columns as text. */
function solved(result: SectionResult, input: unknown): SolvedSection {
  const governing = result.results.find((m) => m.method === result.governing?.method);
  const surface = governing?.surface ?? null;
  return {
    verdict: result.verdict,
    governing: result.governing,
    requiredFs: result.requiredFs,
    reason: result.verdict === 'no-fs' ? unsolvedReason(result.results) : null,
    solverVersion: result.solverVersion,
    caution: result.caution,
    inputHash: inputHash(input),
    json: {
      methods: JSON.stringify(result.results),
      criticalSurface: surface === null ? null : JSON.stringify(surface),
      warnings: JSON.stringify(result.warnings),
      search: result.search === null ? null : JSON.stringify(result.search),
    },
  };
}

port.on('message', ({ section, deadline }: ThreadJob) => {
  let answer: ThreadAnswer;
  try {
    const input: unknown = typeof section === 'string' ? JSON.parse(section) : section;
    const result = analyzeSection(input as Section, { shouldStop: () => Date.now() > deadline });
    // the governing case, with the station's verdict over every case
    answer = {
      kind: 'result',
      result: solved({ ...caseView(result), verdict: result.verdict }, input),
    };
  } catch (e) {
    answer =
      e instanceof AnalysisStopped
        ? { kind: 'stopped', code: e.code, message: e.message }
        : { kind: 'error', message: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage(answer);
});
port.postMessage({ kind: 'ready' } satisfies ThreadAnswer);
