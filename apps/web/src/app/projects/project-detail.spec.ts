import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Batch } from '../batches/batch-types';
import type { UserRef } from '../core/models';
import { ProjectDetail, REFRESH_MS } from './project-detail';
import { aBatch, progressOf } from '../testing/batch-fixtures';
import { apiTestProviders } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

const EVAN: UserRef = { id: 2, name: 'Evan Engineer' };

function batch(
  id: number,
  status: 'running' | 'done',
  done: number,
  submitter: UserRef = EVAN,
): Batch {
  return aBatch({ id, status, progress: progressOf(done, 4), submitter });
}

describe('ProjectDetail', () => {
  let backend: HttpTestingController;

  function setup() {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(ProjectDetail);
    fixture.componentRef.setInput('id', '1');
    return fixture;
  }

  /** Answers the page's request for the project itself. */
  function answerProject(name = 'W'): void {
    backend
      .expectOne('/api/v1/projects/1')
      .flush({ id: 1, name, description: null, createdAt: '' });
  }

  afterEach(() => {
    backend.verify();
    sessionStorage.clear();
    vi.useRealTimers();
  });

  // With fake timers, change detection is run by hand (TestBed.tick) rather than awaited.
  it('lists the batches with links, and reads them again only while one runs', () => {
    vi.useFakeTimers();
    signInAs('engineer', { id: 2 });
    const fixture = setup();
    TestBed.tick();
    answerProject('Wendlecombe');
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
    signInAs('engineer', { id: 2 });
    const fixture = setup();
    TestBed.tick();
    answerProject();
    backend.expectOne('/api/v1/projects/1/batches').flush([batch(2, 'running', 1)]);
    fixture.destroy();
    vi.advanceTimersByTime(REFRESH_MS * 3);
    backend.expectNone('/api/v1/projects/1/batches');
  });

  it('names who submitted each batch, with "(you)" for the signed-in user', async () => {
    signInAs('viewer', { id: 2 });
    const fixture = setup();
    await fixture.whenStable();
    answerProject();
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
    signInAs('viewer', { id: 2 });
    const fixture = setup();
    await fixture.whenStable();
    answerProject();
    backend.expectOne('/api/v1/projects/1/batches').flush([]);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=submit-link]')).toBeNull();
    expect(el.textContent).toContain('No batches in this project yet.');
  });
});
