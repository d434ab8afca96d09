import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { Subject } from 'rxjs';
import { BatchDetail } from './batch-detail';
import { BatchEvents, type LiveProgress } from './batch-events';
import type { Batch, BatchProgress } from './batch-types';

function progress(done: number, failed = 0, total = 3): BatchProgress {
  return {
    total,
    done,
    failed,
    queued: total - done - failed,
    running: 0,
    belowRequiredFs: 0,
    fraction: (done + failed) / total,
  };
}

function batch(status: 'running' | 'done', p: BatchProgress): Batch {
  return {
    id: 5,
    projectId: 1,
    name: 'wcb-live',
    title: 'Live test',
    status,
    source: 'json',
    submittedBy: 9,
    createdAt: '2026-01-01T00:00:00Z',
    finishedAt: status === 'done' ? '2026-01-01T00:05:00Z' : null,
    progress: p,
    review: { state: 'pending', latest: null, history: [] },
    caution: 'Results need review.',
  };
}

describe('BatchDetail', () => {
  let backend: HttpTestingController;
  let live: Subject<LiveProgress>;
  let followed: number[];

  beforeEach(() => {
    sessionStorage.setItem(
      'scarpline.session',
      JSON.stringify({
        token: 't',
        expiresAt: new Date(Date.now() + 3600_000).toISOString(),
        user: { id: 2, email: 'e@x.example', name: 'E', role: 'engineer' },
      }),
    );
    live = new Subject<LiveProgress>();
    followed = [];
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        {
          provide: BatchEvents,
          useValue: {
            follow: (id: number) => {
              followed.push(id);
              return live.asObservable();
            },
          },
        },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => sessionStorage.clear());

  /** Answers every request for the batch's sections and results (empty batch data). */
  function flushData(): void {
    for (const r of backend.match((req) => req.url === '/api/v1/batches/5/sections')) {
      r.flush({ page: 1, pageSize: 50, total: 0, items: [], caution: 'c' });
    }
    for (const r of backend.match('/api/v1/batches/5/results.geojson')) {
      r.flush({ type: 'FeatureCollection', name: 'wcb-live', caution: 'c', features: [] });
    }
    for (const r of backend.match('/api/v1/projects/1')) {
      r.flush({ id: 1, name: 'Wendlecombe', description: null, createdAt: '' });
    }
  }

  it('follows a running batch live, then reads it again once it is done', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('running', progress(0)));
    await fixture.whenStable();
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const text = (id: string) =>
      el.querySelector(`[data-testid=${id}]`)?.textContent?.replace(/\s+/g, ' ').trim();
    expect(followed).toEqual([5]);
    expect(text('batch-status')).toBe('running');
    expect(text('batch-progress')).toBe('0 done · 0 failed · 3 total');
    expect(el.querySelector('sl-caution')).not.toBeNull();

    live.next({ status: 'running', progress: progress(1, 1), finishedAt: null, via: 'events' });
    await fixture.whenStable();
    expect(text('batch-progress')).toBe('1 done · 1 failed · 3 total');

    live.next({
      status: 'done',
      progress: progress(2, 1),
      finishedAt: '2026-01-01T00:05:00Z',
      via: 'events',
    });
    live.complete();
    await fixture.whenStable();
    expect(text('batch-status')).toBe('done');
    expect(text('batch-progress')).toBe('2 done · 1 failed · 3 total');
    // the end of the stream reads the batch and its results once more
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(2, 1)));
    await fixture.whenStable();
    expect(backend.match((r) => r.url === '/api/v1/batches/5/sections').length).toBeGreaterThan(0);
    flushData();
    await fixture.whenStable();
    expect(text('batch-status')).toBe('done');
    expect(followed).toEqual([5]); // a finished batch is not followed again
    fixture.destroy();
  });

  it('does not follow a batch that has finished', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(3)));
    await fixture.whenStable();
    flushData();
    await fixture.whenStable();
    expect(followed).toEqual([]);
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=batch-progress]')?.textContent).toContain('3 total');
    expect(el.querySelector('[data-testid=download-csv]')).not.toBeNull();
    expect(el.querySelector('[data-testid=download-geojson]')).not.toBeNull();
    fixture.destroy();
  });

  it('shows the problem when the batch cannot be read', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/batches/5')
      .flush(
        { title: 'Not found', status: 404, detail: 'No such batch.' },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();
    expect(
      (fixture.nativeElement as HTMLElement).querySelector('[role=alert]')?.textContent,
    ).toContain('No such batch.');
    fixture.destroy();
  });
});
