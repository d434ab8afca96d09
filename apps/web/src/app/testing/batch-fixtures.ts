/** For specs only: batches as the API gives them (GET /batches/:id, /projects/:id/batches). */
import type { Batch, BatchProgress } from '../batches/batch-types';

/** `done` and `failed` of `total` sections, the rest queued; none below its required FS. */
export function progressOf(done: number, total: number, failed = 0): BatchProgress {
  return {
    total,
    done,
    failed,
    queued: total - done - failed,
    running: 0,
    belowRequiredFs: 0,
    fraction: total === 0 ? 1 : (done + failed) / total,
    stalled: false,
  };
}

/**
 * A batch with these fields; the others as a plain JSON submission by Evan Engineer (user 2),
 * pending review: `submittedBy` follows the submitter, and a done batch is finished and
 * complete unless the fields say otherwise.
 */
export function aBatch(fields: Partial<Batch> = {}): Batch {
  const id = fields.id ?? 1;
  const status = fields.status ?? 'done';
  const submitter = fields.submitter ?? { id: 2, name: 'Evan Engineer' };
  return {
    id,
    projectId: 1,
    name: `wcb-${id}`,
    title: null,
    status,
    source: 'json',
    submittedBy: submitter.id,
    submitter,
    createdAt: '2026-01-01T00:00:00Z',
    finishedAt: status === 'done' ? '2026-01-01T00:05:00Z' : null,
    progress: progressOf(status === 'done' ? 4 : 0, 4),
    review: { state: 'pending', latest: null, history: [] },
    caution: 'Results need review.',
    ...fields,
  };
}
