import { HttpErrorResponse } from '@angular/common/http';
import { inject, Injectable, InjectionToken } from '@angular/core';
import {
  catchError,
  distinctUntilChanged,
  exhaustMap,
  map,
  Observable,
  retry,
  takeWhile,
  throwError,
  timer,
} from 'rxjs';
import { Auth } from '../core/auth';
import type { BatchDoneEvent, BatchProgress, BatchStatus } from './batch-types';
import { BatchesApi } from './batches-api';

/** What the page needs of an EventSource (the browser's, or a fake in tests). */
export interface EventSourceLike {
  addEventListener(type: string, listener: (e: Event) => void): void;
  close(): void;
}

export type EventSourceFactory = (url: string) => EventSourceLike;

/** Opens the server-sent event stream; replaced in tests. */
export const EVENT_SOURCE = new InjectionToken<EventSourceFactory>('EVENT_SOURCE', {
  providedIn: 'root',
  factory: () => (url: string) => new EventSource(url),
});

/** How often GET /batches/:id is polled when the event stream is not available. */
export const POLL_MS = new InjectionToken<number>('POLL_MS', {
  providedIn: 'root',
  factory: () => 2000,
});

/** The live state of a batch as the stream reports it. */
export interface LiveProgress {
  status: BatchStatus;
  progress: BatchProgress;
  finishedAt: string | null;
  /** Where this came from: the event stream, or polling after the stream failed. */
  via: 'events' | 'polling';
}

function same(a: LiveProgress, b: LiveProgress): boolean {
  return (
    a.status === b.status &&
    a.finishedAt === b.finishedAt &&
    JSON.stringify(a.progress) === JSON.stringify(b.progress)
  );
}

function transient(err: unknown): boolean {
  return err instanceof HttpErrorResponse && (err.status === 0 || err.status >= 500);
}

/**
 * Live progress of one batch: the API's server-sent events (GET /batches/:id/events with
 * ?access_token=, since an EventSource cannot send headers), or, once the event stream errors,
 * GET /batches/:id every 2 s. Emits on every change and completes when the batch is done;
 * unsubscribing closes the event stream or stops the polling.
 */
@Injectable({ providedIn: 'root' })
export class BatchEvents {
  private readonly api = inject(BatchesApi);
  private readonly auth = inject(Auth);
  private readonly open = inject(EVENT_SOURCE);
  private readonly pollMs = inject(POLL_MS);

  follow(batchId: number): Observable<LiveProgress> {
    const token = this.auth.token();
    const events = token
      ? this.events(batchId, token)
      : throwError(() => new Error('Not signed in: no token for the event stream.'));
    return events.pipe(
      catchError(() => this.poll(batchId)),
      distinctUntilChanged(same),
    );
  }

  /** The event stream alone: errors when the EventSource does (or a message is unreadable). */
  events(batchId: number, token: string): Observable<LiveProgress> {
    return new Observable<LiveProgress>((sub) => {
      const url = `/api/v1/batches/${batchId}/events?access_token=${encodeURIComponent(token)}`;
      const source = this.open(url);
      let finishedAt: string | null = null;
      const read = <T>(e: Event): T => JSON.parse((e as MessageEvent<string>).data) as T;
      source.addEventListener('progress', (e) => {
        try {
          const progress = read<BatchProgress>(e);
          sub.next({ status: 'running', progress, finishedAt, via: 'events' });
        } catch (err) {
          sub.error(err);
        }
      });
      source.addEventListener('done', (e) => {
        try {
          const d = read<BatchDoneEvent>(e);
          finishedAt = d.finishedAt;
          source.close();
          sub.next({ status: d.status, progress: d.progress, finishedAt, via: 'events' });
          sub.complete();
        } catch (err) {
          sub.error(err);
        }
      });
      source.addEventListener('error', () => {
        sub.error(new Error('The live progress stream was interrupted.'));
      });
      return () => source.close();
    });
  }

  /** GET /batches/:id every pollMs until the batch is done (a request at a time). */
  poll(batchId: number): Observable<LiveProgress> {
    return timer(0, this.pollMs).pipe(
      exhaustMap(() =>
        this.api.batch(batchId).pipe(
          retry({
            count: 3,
            delay: (err: unknown) => (transient(err) ? timer(this.pollMs) : throwError(() => err)),
          }),
        ),
      ),
      map((b): LiveProgress => ({
        status: b.status,
        progress: b.progress,
        finishedAt: b.finishedAt,
        via: 'polling',
      })),
      takeWhile((l) => l.status !== 'done', true),
    );
  }
}
