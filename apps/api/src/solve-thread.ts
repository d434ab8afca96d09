/**
 * The thread a worker analyses sections in (solver.ts starts it): it loads the solver once,
 * says `ready`, then answers each { section, deadline } with the result, the reason the
 * analysis stopped (AnalysisStopped: its work bound, or the deadline it asked about every few
 * hundred trial surfaces), or the error it ended with. Being a thread, the worker can end it
 * when it does not stop by itself.
 *
 * The section may come as its JSON text (as the database gives it) and the result goes back
 * as the few fields the worker looks at plus the JSON text of the columns it writes (the
 * station's summary, its probability of failure where the section asks for it on the critical
 * surface, and a row per design case): turning
 * objects into text and back is done here, beside the analysis, and not on the worker's main
 * thread, which only passes the text on to the database.
 */
import crypto from 'node:crypto';
import { parentPort } from 'node:worker_threads';
import {
  AnalysisStopped,
  analyzeSection,
  caseOf,
  stationProbabilityOrWarning,
  stationUnsolvedReason,
  type Section,
  type StationProbability,
} from '@scarpline/core';
import type { CaseResult, StationResult } from '@scarpline/core/result';
import type { SolvedCase, SolvedSection, ThreadAnswer, ThreadJob } from './solver';

const port = parentPort;
if (!port) throw new Error('solve-thread.js runs as a worker thread (see solver.ts)');

/** The hash of a section's input stored with its result (sha256 of its JSON). */
function inputHash(input: unknown): string {
  return crypto.createHash('sha256').update(JSON.stringify(input)).digest('hex');
}

const text = (v: unknown) => (v === null || v === undefined ? null : JSON.stringify(v));

/** What the worker writes of a case: the columns the filters read, its reports as JSON text. */
function solvedCase(c: CaseResult): SolvedCase {
  const governing = c.results.find((m) => m.method === c.governing?.method);
  return {
    name: c.name,
    kind: c.kind,
    verdict: c.verdict,
    governing: c.governing,
    requiredFs: c.requiredFs,
    ratio: c.ratio,
    json: {
      governs: JSON.stringify(c.governs),
      methods: JSON.stringify(c.results),
      criticalSurface: text(governing?.surface),
      warnings: JSON.stringify(c.warnings),
      search: text(c.search),
      drawdown: text(c.drawdown),
      seismic: text(c.seismic),
      requiredReinforcement: text(c.requiredReinforcement),
    },
  };
}

/**
 * What the worker writes of a station's result: its summary (the station's verdict, its
 * governing case — the first when none governs — with that case's method, FS, requirement and
 * ratio), its own warnings, and every case.
 */
function solved(
  result: StationResult,
  input: unknown,
  probability: StationProbability[] | null,
): SolvedSection {
  const shown = caseOf(result);
  return {
    verdict: result.verdict,
    governingCase: result.governing?.case ?? null,
    governing: shown.governing,
    requiredFs: shown.requiredFs,
    ratio: shown.ratio,
    reason: result.verdict === 'no-fs' ? stationUnsolvedReason(result.cases) : null,
    solverVersion: result.solverVersion,
    caution: result.caution,
    inputHash: inputHash(input),
    json: { warnings: JSON.stringify(result.warnings), probability: text(probability) },
    cases: result.cases.map(solvedCase),
  };
}

port.on('message', ({ section, deadline }: ThreadJob) => {
  let answer: ThreadAnswer;
  try {
    const input: unknown = typeof section === 'string' ? JSON.parse(section) : section;
    const options = { shouldStop: () => Date.now() > deadline };
    const analysed = analyzeSection(input as Section, options);
    // where the section asks for it: each case's probability of failure on its critical surface
    // (a variable a case cannot take, or the time limit reached in the realisations, leaves the
    // station without it and with a warning that says why, not without its result)
    const { summary, warning } = stationProbabilityOrWarning(input as Section, options, analysed);
    const result = warning ? { ...analysed, warnings: [...analysed.warnings, warning] } : analysed;
    answer = { kind: 'result', result: solved(result, input, summary) };
  } catch (e) {
    answer =
      e instanceof AnalysisStopped
        ? { kind: 'stopped', code: e.code, message: e.message }
        : { kind: 'error', message: e instanceof Error ? e.message : String(e) };
  }
  port.postMessage(answer);
});
port.postMessage({ kind: 'ready' } satisfies ThreadAnswer);
