import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { ReviewQueue } from './review-queue';
import type { Batch, BatchStatus } from '../batches/batch-types';
import type { ReviewState } from './review-types';
import { aBatch, progressOf } from '../testing/batch-fixtures';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

const NAMES: Record<number, string> = { 1: 'Ada Admin', 2: 'Evan Engineer' };

function batch(
  id: number,
  status: BatchStatus,
  state: ReviewState,
  submittedBy: number,
  below = 0,
): Batch {
  return aBatch({
    id,
    name: `batch-${id}`,
    status,
    submitter: { id: submittedBy, name: NAMES[submittedBy] },
    createdAt: `2026-12-0${id}T08:00:00.000Z`,
    finishedAt: status === 'done' ? `2026-12-0${id}T09:00:00.000Z` : null,
    progress: { ...progressOf(12, 12), belowRequiredFs: below },
    review: { state, latest: null, history: [] },
  });
}

describe('ReviewQueue', () => {
  let fixture: ComponentFixture<ReviewQueue>;
  let backend: HttpTestingController;

  beforeEach(async () => {
    signInAs('admin', { id: 1 });
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReviewQueue);
    await fixture.whenStable();
  });

  afterEach(() => verifyAndReset(backend));

  const el = () => fixture.nativeElement as HTMLElement;

  it('lists the finished, pending batches of every project; one’s own apart', async () => {
    backend.expectOne('/api/v1/projects').flush([
      { id: 1, name: 'Wendlecombe bypass', description: null, createdAt: '' },
      { id: 2, name: 'Second corridor', description: null, createdAt: '' },
    ]);
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/projects/1/batches')
      .flush([
        batch(1, 'done', 'pending', 2, 5),
        batch(2, 'running', 'pending', 2),
        batch(3, 'done', 'approved', 2),
      ]);
    backend.expectOne('/api/v1/projects/2/batches').flush([batch(4, 'done', 'pending', 1)]);
    await fixture.whenStable();

    const queue = el().querySelector('[data-testid="review-queue"]') as HTMLElement;
    const others = queue.querySelector('table[data-group="others"]') as HTMLElement;
    const mine = queue.querySelector('table[data-group="mine"]') as HTMLElement;
    expect(others.querySelectorAll('tbody tr').length).toBe(1);
    expect(others.textContent).toContain('batch-1');
    expect(others.textContent).toContain('5 below the required FS');
    expect(others.querySelector('a')?.getAttribute('href')).toBe('/batches/1');
    expect(mine.querySelectorAll('tbody tr').length).toBe(1);
    expect(mine.textContent).toContain('batch-4');
    expect(mine.textContent).toContain('Second corridor');
    expect(queue.textContent).toContain('Submitted by you (another reviewer signs off)');
    expect(queue.textContent).not.toContain('batch-2');
    expect(queue.textContent).not.toContain('batch-3');
    // Who submitted: by name, "(you)" for the signed-in admin (user 1).
    expect(others.querySelector('tbody td:nth-of-type(4)')?.textContent).toContain('Evan Engineer');
    expect(others.textContent).not.toContain('(you)');
    expect(mine.querySelector('tbody td:nth-of-type(4)')?.textContent).toContain('Ada Admin (you)');
    expect(queue.textContent).not.toContain('user #');
  });

  it('says so when nothing waits', async () => {
    backend
      .expectOne('/api/v1/projects')
      .flush([{ id: 1, name: 'Wendlecombe bypass', description: null, createdAt: '' }]);
    await fixture.whenStable();
    backend.expectOne('/api/v1/projects/1/batches').flush([batch(3, 'done', 'returned', 2)]);
    await fixture.whenStable();
    expect(el().querySelector('[data-testid="review-queue"]')?.textContent).toContain(
      'Nothing waits for review',
    );
  });

  it('shows the problem when the projects cannot be read', async () => {
    backend
      .expectOne('/api/v1/projects')
      .flush({ title: 'Service Unavailable', status: 503 }, { status: 503, statusText: 'x' });
    await fixture.whenStable();
    expect(el().querySelector('[role="alert"]')?.textContent).toContain('Service Unavailable');
  });
});
