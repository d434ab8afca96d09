import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { Role } from '../core/models';
import { ReviewPanel } from './review-panel';
import type { ReviewSummary } from './review-types';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';

const RETURNED: ReviewSummary = {
  state: 'returned',
  latest: {
    id: 4,
    batchId: 1,
    sectionId: 7,
    run: 1,
    scope: 'section',
    decision: 'returned',
    comment: 'Check the piezometric line at the toe.',
    reviewer: { id: 3, name: 'Rhea Reviewer' },
    at: '2026-12-01T10:00:00.000Z',
  },
  history: [],
};

describe('ReviewPanel', () => {
  let fixture: ComponentFixture<ReviewPanel>;
  let backend: HttpTestingController;

  async function setup(
    role: Role,
    userId: number,
    inputs: { submittedBy?: number | null; finished?: boolean; review?: ReviewSummary } = {},
  ): Promise<void> {
    signInAs(role, { id: userId });
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReviewPanel);
    fixture.componentRef.setInput('kind', 'section');
    fixture.componentRef.setInput('targetId', 7);
    fixture.componentRef.setInput('submittedBy', inputs.submittedBy ?? 2);
    fixture.componentRef.setInput('finished', inputs.finished ?? true);
    fixture.componentRef.setInput(
      'review',
      inputs.review ?? { state: 'pending', latest: null, history: [] },
    );
    await fixture.whenStable();
  }

  afterEach(() => verifyAndReset(backend));

  const el = () => fixture.nativeElement as HTMLElement;
  const q = (id: string) => el().querySelector<HTMLElement>(`[data-testid="${id}"]`);

  async function write(text: string): Promise<void> {
    const box = q('review-comment') as HTMLTextAreaElement;
    box.value = text;
    box.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  it('shows the state to a viewer, with no comment box and no buttons', async () => {
    await setup('viewer', 4, { review: RETURNED });
    expect(q('review-state')?.textContent).toContain('returned');
    expect(q('review-state')?.textContent).toContain('Rhea Reviewer');
    expect(el().textContent).toContain('Check the piezometric line at the toe.');
    expect(q('sign-off')).toBeNull();
    expect(q('return')).toBeNull();
    expect(q('review-comment')).toBeNull();
  });

  it('shows the note instead of the buttons on one’s own submission', async () => {
    await setup('admin', 2, { submittedBy: 2 });
    expect(q('own-submission-note')?.textContent).toContain('You submitted this batch');
    expect(q('sign-off')).toBeNull();
    expect(q('return')).toBeNull();
  });

  it('offers no sign-off before the run has finished', async () => {
    await setup('reviewer', 3, { finished: false });
    expect(q('sign-off')).toBeNull();
    expect(q('review-not-finished')).not.toBeNull();
  });

  it('refuses a return without a comment and sends nothing', async () => {
    await setup('reviewer', 3);
    expect(q('review-state')?.textContent).toContain('pending');
    q('return')?.click();
    await fixture.whenStable();
    expect(q('return-needs-comment')?.textContent).toContain('a return needs a comment');
    backend.expectNone('/api/v1/sections/7/reviews');
    await write('   ');
    q('return')?.click();
    await fixture.whenStable();
    backend.expectNone('/api/v1/sections/7/reviews');
  });

  it('signs off with the right body and emits changed', async () => {
    await setup('reviewer', 3);
    let changed = 0;
    fixture.componentInstance.changed.subscribe(() => changed++);
    await write('  Checked against the borehole logs.  ');
    q('sign-off')?.click();
    await fixture.whenStable();
    const req = backend.expectOne('/api/v1/sections/7/reviews');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({
      decision: 'approved',
      comment: 'Checked against the borehole logs.',
    });
    expect(changed).toBe(0);
    req.flush(
      { ...RETURNED.latest, decision: 'approved', caution: 'c' },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();
    expect(changed).toBe(1);
    expect(document.body.textContent).toContain('Section signed off.');
  });

  it('returns with a comment to a batch', async () => {
    await setup('admin', 1);
    fixture.componentRef.setInput('kind', 'batch');
    fixture.componentRef.setInput('targetId', 5);
    await fixture.whenStable();
    await write('Sections 1040 to 1100 need the new strengths.');
    q('return')?.click();
    await fixture.whenStable();
    const req = backend.expectOne('/api/v1/batches/5/reviews');
    expect(req.request.body).toEqual({
      decision: 'returned',
      comment: 'Sections 1040 to 1100 need the new strengths.',
    });
    req.flush({ ...RETURNED.latest, caution: 'c' });
  });

  it('shows the API’s refusal and does not emit', async () => {
    await setup('reviewer', 3);
    let changed = 0;
    fixture.componentInstance.changed.subscribe(() => changed++);
    q('sign-off')?.click();
    await fixture.whenStable();
    backend.expectOne('/api/v1/sections/7/reviews').flush(
      {
        title: 'Conflict',
        status: 409,
        detail: 'Section wcb-main@1000 is running; review it when its run ends.',
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    expect(q('review-problem')?.textContent).toContain(
      'Section wcb-main@1000 is running; review it when its run ends.',
    );
    expect(changed).toBe(0);
  });
});
