/**
 * The intake pool's job, run in a worker thread (intake/pool.ts): reading a corridor batch's
 * body, uploaded files or a re-run's edits with the core. A refusal (a Problem: 400, 413, 422)
 * comes back as data, since an error loses its class on the way between threads. Loaded in a
 * worker thread, it answers the pool's `{ id, task }` messages (thread-pool.ts).
 */
import { isMainThread, parentPort } from 'node:worker_threads';
import type { Section } from '@scarpline/core/model';
import { Problem } from '../errors';
import { readEdits } from '../services/edits';
import { cutTerrainUpload, type TerrainUpload } from '../services/terrain-cut';
import { parseBatchBody, parseFiles, type InputFile } from '../services/validate';

export type IntakeTask =
  | { kind: 'batch'; text: string }
  | { kind: 'files'; files: InputFile[] }
  | { kind: 'edits'; stored: Section; text: string }
  | ({ kind: 'terrain' } & TerrainUpload);

export interface ProblemData {
  status: number;
  title: string;
  detail?: string;
  extra: Record<string, unknown>;
}

export type IntakeReply = { ok: true; value: unknown } | { ok: false; problem: ProblemData };

function run(task: IntakeTask): unknown {
  switch (task.kind) {
    case 'batch':
      return parseBatchBody(task.text);
    case 'files':
      return parseFiles(task.files);
    case 'edits':
      return readEdits(task.stored, task.text);
    case 'terrain':
      return cutTerrainUpload(task);
  }
}

export async function intake(task: IntakeTask): Promise<IntakeReply> {
  try {
    return { ok: true, value: await run(task) };
  } catch (e) {
    if (!(e instanceof Problem)) throw e;
    return {
      ok: false,
      problem: { status: e.status, title: e.title, detail: e.detail, extra: e.extra },
    };
  }
}

if (!isMainThread && parentPort) {
  const port = parentPort;
  port.on('message', ({ id, task }: { id: number; task: IntakeTask }) => {
    intake(task).then(
      (value) => port.postMessage({ id, ok: true, value }),
      (e: unknown) => {
        const error = e instanceof Error ? e : new Error(String(e));
        port.postMessage({ id, ok: false, error: { name: error.name, message: error.message } });
      },
    );
  });
}
