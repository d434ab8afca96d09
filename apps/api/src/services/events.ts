/**
 * Live progress of a batch: one poller per batch reads the database and every stream of the
 * batch reports the progress object whenever it changes (with the caution), a `stalled` event
 * when its sections start to wait for want of a worker, then a final `done`. The transport
 * (server-sent events) is the route's business.
 */
import crypto from 'node:crypto';
import { setTimeout as delay } from 'node:timers/promises';
import { CAUTION } from '@scarpline/core/caution';
import { config } from '../config';
import { Batch } from '../models';
import { progress } from './batches';
import { onBatchClosed } from './solve';
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

/** What the poller of a batch read last: the batch's state, or that it is gone. */
type Snapshot =
  | {
      gone: false;
      id: number;
      status: string;
      finishedAt: Date | null;
      progress: Progress;
      /** The last heartbeat of any worker, read only while the batch is stalled. */
      lastHeartbeat: Date | null;
    }
  | { gone: true };

/** The one poller of a batch and the streams that follow it. */
interface Poller {
  listeners: Set<(s: Snapshot) => void>;
  latest: Snapshot | null;
  stop: AbortController;
  /** Reads at once instead of at the next tick (the batch was closed). */
  wake: () => void;
}

const pollers = new Map<number, Poller>();
/** Wakes the poller of a batch a worker closes, while any batch is polled. */
let closedListener: (() => Promise<void>) | null = null;

async function snapshot(batchId: number): Promise<Snapshot> {
  const batch = await Batch.findByPk(batchId);
  if (!batch) return { gone: true };
  const p = await progress(batchId);
  return {
    gone: false,
    id: batch.id,
    status: batch.status,
    finishedAt: batch.finishedAt,
    progress: p,
    lastHeartbeat: p.stalled ? await lastHeartbeat() : null,
  };
}

/**
 * Reads the batch every `intervalMs` for as long as anyone follows it, and gives each reading
 * to every follower. A reading that fails (the database is away) is tried again at the next
 * tick; the followers wait meanwhile.
 */
async function poll(batchId: number, poller: Poller, intervalMs: number): Promise<void> {
  const { signal } = poller.stop;
  while (!signal.aborted) {
    try {
      const s = await snapshot(batchId);
      poller.latest = s;
      for (const listener of [...poller.listeners]) listener(s);
    } catch {
      // the database is unreachable just now: read again at the next tick
    }
    const woken = new AbortController();
    poller.wake = () => woken.abort();
    try {
      await delay(intervalMs, undefined, { signal: AbortSignal.any([signal, woken.signal]) });
    } catch {
      if (signal.aborted) return; // nobody follows any more
    }
  }
}

/**
 * Follows a batch: `listener` gets every reading of the one poller of this batch, which is
 * started for the first follower and stopped after the last; a follower who joins gets the
 * latest reading at once. Returns the function that stops following.
 */
function follow(batchId: number, listener: (s: Snapshot) => void, intervalMs: number): () => void {
  let poller = pollers.get(batchId);
  if (!poller) {
    poller = { listeners: new Set(), latest: null, stop: new AbortController(), wake: () => {} };
    pollers.set(batchId, poller);
    closedListener ??= onBatchClosed((id) => {
      for (const [polled, q] of pollers) if (id === null || id === polled) q.wake();
    });
    void poll(batchId, poller, intervalMs);
  }
  const p = poller;
  p.listeners.add(listener);
  if (p.latest) listener(p.latest);
  return () => {
    p.listeners.delete(listener);
    if (p.listeners.size === 0 && pollers.get(batchId) === p) {
      pollers.delete(batchId);
      p.stop.abort();
      if (pollers.size === 0 && closedListener) {
        void closedListener();
        closedListener = null;
      }
    }
  };
}

/** How many batches are polled now (one poller each, however many streams follow them). */
export function pollerCount(): number {
  return pollers.size;
}

/**
 * Calls `emit` with a `progress` event at once and whenever the progress changes, and a `done`
 * event when the batch has finished; resolves after `done`, or when `signal` aborts (the client
 * went away), or when the batch disappears. Every stream of a batch shares one poller, which
 * reads the database every `intervalMs`.
 */
export async function followBatch(
  batchId: number,
  emit: (e: BatchEvent) => void,
  signal: AbortSignal,
  intervalMs = config.eventPollMs,
): Promise<void> {
  if (signal.aborted) return;
  let last = '';
  let stalled = false;
  await new Promise<void>((resolve) => {
    let ended = false;
    let stop: (() => void) | null = null;
    const end = () => {
      if (ended) return;
      ended = true;
      signal.removeEventListener('abort', end);
      stop?.();
      resolve();
    };
    signal.addEventListener('abort', end);
    stop = follow(
      batchId,
      (s) => {
        if (s.gone) return end();
        const key = JSON.stringify(s.progress);
        if (key !== last) {
          last = key;
          emit({ event: 'progress', data: { ...s.progress, caution: CAUTION } });
        }
        if (s.progress.stalled && !stalled) {
          emit({
            event: 'stalled',
            data: {
              id: s.id,
              message: stalledWords(s.lastHeartbeat),
              lastHeartbeat: s.lastHeartbeat,
              progress: s.progress,
              caution: CAUTION,
            },
          });
        }
        stalled = s.progress.stalled;
        if (s.status === 'done') {
          emit({
            event: 'done',
            data: {
              id: s.id,
              status: s.status,
              finishedAt: s.finishedAt,
              progress: s.progress,
              caution: CAUTION,
            },
          });
          end();
        }
      },
      intervalMs,
    );
    // the latest reading, given at once, may have ended it already
    if (ended) stop();
  });
}

/** A weak entity tag for a JSON representation. */
export function etagOf(body: unknown): string {
  const hash = crypto.createHash('sha1').update(JSON.stringify(body)).digest('base64url');
  return `W/"${hash}"`;
}
