/**
 * Live progress of a batch: polls the database and reports the progress object whenever it
 * changes (with the caution), a `stalled` event when its sections start to wait for want of a
 * worker, then a final `done`. The transport (server-sent events) is the route's business.
 */
import crypto from 'node:crypto';
import { setTimeout as delay } from 'node:timers/promises';
import { CAUTION } from '@scarpline/core/caution';
import { config } from '../config';
import { Batch } from '../models';
import { progress } from './batches';
import { lastHeartbeat, stalledWords } from './workers';

type Progress = Awaited<ReturnType<typeof progress>>;

export type BatchEvent =
  /** The progress object of GET /batches/:id, and the caution every result surface carries. */
  | { event: 'progress'; data: Progress & { caution: string } }
  /** The batch's sections wait and no worker is alive (progress.stalled turned true). */
  | {
      event: 'stalled';
      data: {
        id: number;
        message: string;
        lastHeartbeat: Date | null;
        progress: Progress;
        caution: string;
      };
    }
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
  let stalled = false;
  while (!signal.aborted) {
    const batch = await Batch.findByPk(batchId);
    if (!batch || signal.aborted) return;
    const p = await progress(batchId);
    const key = JSON.stringify(p);
    if (key !== last) {
      last = key;
      emit({ event: 'progress', data: { ...p, caution: CAUTION } });
    }
    if (p.stalled && !stalled) {
      const seen = await lastHeartbeat();
      emit({
        event: 'stalled',
        data: {
          id: batch.id,
          message: stalledWords(seen),
          lastHeartbeat: seen,
          progress: p,
          caution: CAUTION,
        },
      });
    }
    stalled = p.stalled;
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
