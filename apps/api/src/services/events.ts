/**
 * Live progress of a batch: polls the database and reports the progress object whenever it
 * changes, then a final `done`. The transport (server-sent events) is the route's business.
 */
import crypto from 'node:crypto';
import { setTimeout as delay } from 'node:timers/promises';
import { CAUTION } from '@scarpline/core/caution';
import { config } from '../config';
import { Batch } from '../models';
import { progress } from './batches';

export type BatchEvent =
  | { event: 'progress'; data: Awaited<ReturnType<typeof progress>> }
  | {
      event: 'done';
      data: {
        id: number;
        status: string;
        finishedAt: Date | null;
        progress: Awaited<ReturnType<typeof progress>>;
        caution: string;
      };
    };

/**
 * Calls `emit` with a `progress` event at once and whenever the progress changes (read every
 * `intervalMs`), and a `done` event when the batch has finished; resolves after `done`, or when
 * `signal` aborts (the client went away), or when the batch disappears.
 */
export async function followBatch(
  batchId: number,
  emit: (e: BatchEvent) => void,
  signal: AbortSignal,
  intervalMs = config.eventPollMs,
): Promise<void> {
  let last = '';
  while (!signal.aborted) {
    const batch = await Batch.findByPk(batchId);
    if (!batch || signal.aborted) return;
    const p = await progress(batchId);
    const key = JSON.stringify(p);
    if (key !== last) {
      last = key;
      emit({ event: 'progress', data: p });
    }
    if (batch.status === 'done') {
      emit({
        event: 'done',
        data: {
          id: batch.id,
          status: batch.status,
          finishedAt: batch.finishedAt,
          progress: p,
          caution: CAUTION,
        },
      });
      return;
    }
    try {
      await delay(intervalMs, undefined, { signal });
    } catch {
      return; // aborted while waiting
    }
  }
}

/** A weak entity tag for a JSON representation. */
export function etagOf(body: unknown): string {
  const hash = crypto.createHash('sha1').update(JSON.stringify(body)).digest('base64url');
  return `W/"${hash}"`;
}
