import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { BatchEvents, EVENT_SOURCE, POLL_MS, type LiveProgress } from './batch-events';
import type { Batch, BatchProgress } from './batch-types';
import { aBatch, progressOf } from '../testing/batch-fixtures';
import { apiTestProviders } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

/** An EventSource stand-in: the test dispatches the server's events by hand. */
class FakeEventSource extends EventTarget {
  closed = false;
  constructor(readonly url: string) {
    super();
  }
  close(): void {
    this.closed = true;
  }
  /** One server-sent event, as `event: type` + `data: JSON` arrives in the browser. */
  send(type: string, data: unknown): void {
    this.dispatchEvent(
      new MessageEvent(type, { data: typeof data === 'string' ? data : JSON.stringify(data) }),
    );
  }
  fail(): void {
    this.dispatchEvent(new Event('error'));
  }
}

/** Of four sections. */
const progress = (done: number): BatchProgress => progressOf(done, 4);

function batch(status: 'running' | 'done', p: BatchProgress): Batch {
  const submitter = { id: 3, name: 'Rhea Reviewer' };
  return aBatch({ id: 7, name: 'wcb-test', status, progress: p, submitter });
}

describe('BatchEvents', () => {
  let sources: FakeEventSource[];
  let events: BatchEvents;
  let backend: HttpTestingController;

  beforeEach(() => {
    signInAs('engineer', { id: 3 }, { token: 'tok/1+2' });
    sources = [];
    TestBed.configureTestingModule({
      providers: [
        ...apiTestProviders(),
        {
          provide: EVENT_SOURCE,
          useValue: (url: string) => {
            const s = new FakeEventSource(url);
            sources.push(s);
            return s;
          },
        },
        { provide: POLL_MS, useValue: 2000 },
      ],
    });
    events = TestBed.inject(BatchEvents);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    sessionStorage.clear();
    vi.useRealTimers();
  });

  it('opens the event stream with the token in the query and reads its messages', () => {
    const seen: LiveProgress[] = [];
    let completed = false;
    events.follow(7).subscribe({ next: (l) => seen.push(l), complete: () => (completed = true) });
    expect(sources).toHaveLength(1);
    expect(sources[0].url).toBe('/api/v1/batches/7/events?access_token=tok%2F1%2B2');

    sources[0].send('progress', progress(1));
    sources[0].send('progress', progress(1)); // unchanged: not repeated
    sources[0].send('progress', progress(3));
    expect(seen.map((l) => [l.status, l.progress.done, l.via])).toEqual([
      ['running', 1, 'events'],
      ['running', 3, 'events'],
    ]);
    expect(completed).toBe(false);

    sources[0].send('done', {
      id: 7,
      status: 'done',
      finishedAt: '2026-01-01T00:05:00Z',
      progress: progress(4),
      caution: 'Results need review.',
    });
    expect(seen.at(-1)).toEqual({
      status: 'done',
      progress: progress(4),
      finishedAt: '2026-01-01T00:05:00Z',
      via: 'events',
    });
    expect(completed).toBe(true);
    expect(sources[0].closed).toBe(true);
    backend.expectNone('/api/v1/batches/7');
  });

  it('falls back to polling GET /batches/:id every 2 s when the event stream errors', () => {
    vi.useFakeTimers();
    const seen: LiveProgress[] = [];
    let completed = false;
    events.follow(7).subscribe({ next: (l) => seen.push(l), complete: () => (completed = true) });
    sources[0].send('progress', progress(1));
    sources[0].fail();
    expect(sources[0].closed).toBe(true);

    vi.advanceTimersByTime(0);
    backend.expectOne('/api/v1/batches/7').flush(batch('running', progress(2)));
    vi.advanceTimersByTime(1999);
    backend.expectNone('/api/v1/batches/7'); // not before the 2 s are up
    vi.advanceTimersByTime(1);
    backend.expectOne('/api/v1/batches/7').flush(batch('running', progress(3)));
    expect(completed).toBe(false);
    vi.advanceTimersByTime(2000);
    backend.expectOne('/api/v1/batches/7').flush(batch('done', progress(4)));

    expect(seen.map((l) => [l.status, l.progress.done, l.via])).toEqual([
      ['running', 1, 'events'],
      ['running', 2, 'polling'],
      ['running', 3, 'polling'],
      ['done', 4, 'polling'],
    ]);
    expect(completed).toBe(true);
    vi.advanceTimersByTime(10_000);
    backend.expectNone('/api/v1/batches/7'); // stopped once done
    expect(sources).toHaveLength(1); // and never reopened the stream
  });

  it('falls back to polling when a message cannot be read', () => {
    vi.useFakeTimers();
    const seen: LiveProgress[] = [];
    events.follow(7).subscribe((l) => seen.push(l));
    sources[0].send('progress', '{not json');
    expect(sources[0].closed).toBe(true);
    vi.advanceTimersByTime(0);
    backend.expectOne('/api/v1/batches/7').flush(batch('done', progress(4)));
    expect(seen.map((l) => l.via)).toEqual(['polling']);
  });

  it('closes the event stream when the page unsubscribes', () => {
    const sub = events.follow(7).subscribe();
    sources[0].send('progress', progress(1));
    expect(sources[0].closed).toBe(false);
    sub.unsubscribe();
    expect(sources[0].closed).toBe(true);
  });

  it('stops polling when the page unsubscribes', () => {
    vi.useFakeTimers();
    const sub = events.follow(7).subscribe();
    sources[0].fail();
    vi.advanceTimersByTime(0);
    backend.expectOne('/api/v1/batches/7').flush(batch('running', progress(1)));
    sub.unsubscribe();
    vi.advanceTimersByTime(10_000);
    backend.expectNone('/api/v1/batches/7');
  });
});
