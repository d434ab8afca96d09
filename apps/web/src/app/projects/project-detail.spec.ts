import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Batch, UserRef } from '../batches/batch-types';
import { ProjectDetail, REFRESH_MS } from './project-detail';

const EVAN: UserRef = { id: 2, name: 'Evan Engineer' };

function batch(
  id: number,
  status: 'running' | 'done',
  done: number,
  submitter: UserRef = EVAN,
): Batch {
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
    progress: {
      total: 4,
      done,
      failed: 0,
      queued: 4 - done,
      running: 0,
      belowRequiredFs: 0,
      fraction: done / 4,
    },
    review: { state: 'pending', latest: null, history: [] },
    caution: 'Results need review.',
  };
}

function signInAs(role: 'engineer' | 'viewer'): void {
  sessionStorage.setItem(
    'scarpline.session',
    JSON.stringify({
      token: 't',
      expiresAt: new Date(Date.now() + 3600_000).toISOString(),
      user: { id: 2, email: 'a@x.example', name: 'A', role },
    }),
  );
}

describe('ProjectDetail', () => {
  let backend: HttpTestingController;

  function setup() {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    backend = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(ProjectDetail);
    fixture.componentRef.setInput('id', '1');
    return fixture;
  }

  afterEach(() => {
    backend.verify();
    sessionStorage.clear();
    vi.useRealTimers();
  });

  // With fake timers, change detection is run by hand (TestBed.tick) rather than awaited.
  it('lists the batches with links, and reads them again only while one runs', () => {
    vi.useFakeTimers();
    signInAs('engineer');
    const fixture = setup();
    TestBed.tick();
    backend
      .expectOne('/api/v1/projects/1')
      .flush({ id: 1, name: 'Wendlecombe', description: null, createdAt: '' });
    backend
      .expectOne('/api/v1/projects/1/batches')
      .flush([batch(2, 'running', 1), batch(1, 'done', 4)]);
    TestBed.tick();
    const el = fixture.nativeElement as HTMLElement;
    const links = Array.from(el.querySelectorAll('[data-testid=batch-link]'));
    expect(links.map((a) => a.getAttribute('href'))).toEqual(['/batches/2', '/batches/1']);
    expect(el.querySelector('[data-testid=batch-list]')?.textContent).toContain(
      '1 done · 0 failed · 4 total',
    );
    expect(el.querySelector('[data-testid=submit-link]')?.getAttribute('href')).toBe(
      '/projects/1/submit',
    );

    vi.advanceTimersByTime(REFRESH_MS - 1);
    backend.expectNone('/api/v1/projects/1/batches');
    vi.advanceTimersByTime(1);
    backend
      .expectOne('/api/v1/projects/1/batches')
      .flush([batch(2, 'running', 3), batch(1, 'done', 4)]);
    TestBed.tick();
    expect(el.querySelector('[data-testid=batch-list]')?.textContent).toContain(
      '3 done · 0 failed · 4 total',
    );

    vi.advanceTimersByTime(REFRESH_MS);
    backend
      .expectOne('/api/v1/projects/1/batches')
      .flush([batch(2, 'done', 4), batch(1, 'done', 4)]);
    vi.advanceTimersByTime(REFRESH_MS * 5);
    backend.expectNone('/api/v1/projects/1/batches'); // none runs: no more reading

    fixture.destroy();
  });

  it('stops reading when the page is left', () => {
    vi.useFakeTimers();
    signInAs('engineer');
    const fixture = setup();
    TestBed.tick();
    backend
      .expectOne('/api/v1/projects/1')
      .flush({ id: 1, name: 'W', description: null, createdAt: '' });
    backend.expectOne('/api/v1/projects/1/batches').flush([batch(2, 'running', 1)]);
    fixture.destroy();
    vi.advanceTimersByTime(REFRESH_MS * 3);
    backend.expectNone('/api/v1/projects/1/batches');
  });

  it('names who submitted each batch, with "(you)" for the signed-in user', async () => {
    signInAs('viewer'); // user 2
    const fixture = setup();
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/projects/1')
      .flush({ id: 1, name: 'W', description: null, createdAt: '' });
    backend
      .expectOne('/api/v1/projects/1/batches')
      .flush([batch(2, 'done', 4, { id: 7, name: 'Gina Gis' }), batch(1, 'done', 4)]);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const by = Array.from(el.querySelectorAll('[data-testid=batch-list] tr.mat-mdc-row')).map(
      (r) => /by (.*?) ·/.exec(r.textContent?.replace(/\s+/g, ' ') ?? '')?.[1],
    );
    expect(by).toEqual(['Gina Gis', 'Evan Engineer (you)']);
    expect(el.textContent).not.toContain('user #');
  });

  it('offers "Submit a batch" to engineers only', async () => {
    signInAs('viewer');
    const fixture = setup();
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/projects/1')
      .flush({ id: 1, name: 'W', description: null, createdAt: '' });
    backend.expectOne('/api/v1/projects/1/batches').flush([]);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=submit-link]')).toBeNull();
    expect(el.textContent).toContain('No batches in this project yet.');
  });
});
