/**
 * A worker thread of `scarpline probability` with the surface searched again in each
 * realisation: it is sent chunks (realisations from..to of one case of a seeded run) and
 * answers with their FS. The run is prepared once per case it is sent (the critical surfaces
 * at the means come with the task, so it does not search them again).
 */
import { parentPort } from 'node:worker_threads';
import {
  probabilityRun,
  realisationsFs,
  type Critical,
  type ProbabilityRun,
  type ProbabilitySpec,
  type Section,
} from '@scarpline/core';

export interface ChunkTask {
  section: Section;
  spec: ProbabilitySpec;
  caseName: string;
  criticals: Record<string, Critical>;
  from: number;
  to: number;
}

export type ChunkReply = { ok: true; fs: (number | null)[] } | { ok: false; error: string };

const runs = new Map<string, ProbabilityRun>();

parentPort?.on('message', (task: ChunkTask) => {
  let reply: ChunkReply;
  try {
    const key = `${task.section.id}\u0000${task.caseName}`;
    let run = runs.get(key);
    if (!run) {
      run = probabilityRun(task.section, task.spec, {
        caseName: task.caseName,
        criticals: task.criticals,
      });
      runs.set(key, run);
    }
    reply = { ok: true, fs: realisationsFs(run, 0, task.from, task.to) };
  } catch (e) {
    reply = { ok: false, error: e instanceof Error ? e.message : String(e) };
  }
  parentPort?.postMessage(reply);
});
