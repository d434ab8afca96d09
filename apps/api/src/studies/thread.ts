/**
 * The study pool's job, run in a worker thread (studies/pool.ts): a section study's computation
 * with the core — a probabilistic analysis on the critical surface (with the Taylor series
 * check), the critical surfaces at the means a search-again run shares among its chunks, a
 * chunk of realisations i..j, the statistics of all the chunks, a sensitivity, a solve — CPU
 * work of seconds to minutes that never holds up the worker's other work and can be stopped at
 * its time limit. Answers the pool's `{ id, task }` messages (intake/thread-pool.ts) with the
 * result, and sends `{ id, progress }` as it goes.
 */
import { isMainThread, parentPort } from 'node:worker_threads';
import {
  analyzeProbability,
  caseProbability,
  probabilityResult,
  probabilityRun,
  realisationsFs,
  sensitivity,
  solveForValue,
  taylorSeries,
  type Critical,
  type ProbabilityResult,
  type ProbabilitySpec,
  type Section,
  type SensitivityResult,
  type SolveRequest,
  type SolveResult,
  type TaylorResult,
} from '@scarpline/core';

export type StudyTask =
  | { kind: 'probability'; section: Section; spec: ProbabilitySpec; caseName?: string }
  | { kind: 'criticals'; section: Section; spec: ProbabilitySpec; caseName?: string }
  | {
      kind: 'chunk';
      section: Section;
      spec: ProbabilitySpec;
      caseName: string;
      criticals: Record<string, Critical>;
      from: number;
      to: number;
    }
  | {
      kind: 'combine';
      section: Section;
      spec: ProbabilitySpec;
      caseName?: string;
      criticals: Record<string, Critical>;
      fs: Record<string, (number | null)[]>;
    }
  | {
      kind: 'sensitivity';
      section: Section;
      spec: ProbabilitySpec;
      caseName?: string;
      points?: number;
    }
  | { kind: 'solve'; section: Section; request: SolveRequest };

export type StudyAnswer =
  | { kind: 'probability'; probability: ProbabilityResult; taylor: TaylorResult }
  | { kind: 'criticals'; criticals: Record<string, Critical> }
  | { kind: 'chunk'; fs: (number | null)[] }
  | { kind: 'sensitivity'; sensitivity: SensitivityResult }
  | { kind: 'solve'; solve: SolveResult };

/** A task's computation; `progress` hears (done, total) now and then. */
export function computeStudy(
  task: StudyTask,
  progress: (done: number, total: number) => void,
): StudyAnswer {
  const only = task.kind !== 'solve' && task.caseName ? { caseName: task.caseName } : {};
  switch (task.kind) {
    case 'probability': {
      const probability = analyzeProbability(task.section, task.spec, {
        ...only,
        onProgress: progress,
      });
      return {
        kind: 'probability',
        probability,
        taylor: taylorSeries(task.section, task.spec, only),
      };
    }
    case 'criticals': {
      const run = probabilityRun(task.section, { ...task.spec, realisations: 1 }, only);
      const criticals: Record<string, Critical> = {};
      for (const rc of run.cases) criticals[rc.model.name] = rc.critical;
      return { kind: 'criticals', criticals };
    }
    case 'chunk': {
      const run = probabilityRun(task.section, task.spec, {
        caseName: task.caseName,
        criticals: task.criticals,
      });
      let done = 0;
      const total = task.to - task.from;
      const fs = realisationsFs(run, 0, task.from, task.to, () => progress(++done, total));
      return { kind: 'chunk', fs };
    }
    case 'combine': {
      const run = probabilityRun(task.section, task.spec, { ...only, criticals: task.criticals });
      const cases = run.cases.map((rc) => caseProbability(rc, task.spec, task.fs[rc.model.name]));
      return {
        kind: 'probability',
        probability: probabilityResult(task.section, task.spec, cases),
        taylor: taylorSeries(task.section, task.spec, { ...only, criticals: task.criticals }),
      };
    }
    case 'sensitivity':
      return {
        kind: 'sensitivity',
        sensitivity: sensitivity(task.section, task.spec, { ...only, points: task.points }),
      };
    case 'solve':
      return {
        kind: 'solve',
        solve: solveForValue(task.section, task.request, {
          onProgress: (n) => progress(n, 0),
        }),
      };
  }
}

if (!isMainThread && parentPort) {
  const port = parentPort;
  port.on('message', ({ id, task }: { id: number; task: StudyTask }) => {
    let last = 0;
    try {
      const value = computeStudy(task, (done, total) => {
        // at most a few progress messages a second
        if (Date.now() - last < 200) return;
        last = Date.now();
        port.postMessage({ id, progress: { done, total } });
      });
      port.postMessage({ id, ok: true, value });
    } catch (e) {
      const error = e instanceof Error ? e : new Error(String(e));
      port.postMessage({ id, ok: false, error: { name: error.name, message: error.message } });
    }
  });
}
