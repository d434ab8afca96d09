import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { Batch } from '../batches/batch-types';
import type { ReviewEntry } from '../reviews/review-types';
import { dateTimeText } from '../shared/date-time';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { aBatch } from '../testing/batch-fixtures';
import { signInAs } from '../testing/sign-in-as';
import { CorridorReports, POLL_MS } from './corridor-reports';
import type { Report } from './report-types';

const LIST = '/api/v1/batches/5/reports';

/** A corridor report of batch 5 asked by Evan Engineer (user 2), queued unless said otherwise. */
function aReport(fields: Partial<Report> = {}): Report {
  return {
    id: 31,
    kind: 'corridor',
    batchId: 5,
    sectionId: null,
    run: null,
    appendix: 'below',
    status: 'queued',
    progress: { done: 0, total: 0 },
    reviewId: null,
    requestedBy: 2,
    reason: null,
    createdAt: '2026-12-02T09:40:00Z',
    finishedAt: null,
    download: null,
    caution: 'Results need review.',
    ...fields,
  };
}

const REVIEW: ReviewEntry = {
  id: 12,
  batchId: 5,
  sectionId: null,
  run: null,
  scope: 'batch',
  decision: 'approved',
  comment: 'Checked.',
  reviewer: { id: 4, name: 'Rita Reviewer' },
  at: '2026-12-01T15:00:00Z',
};

function batch(fields: Partial<Batch> = {}): Batch {
  return aBatch({
    id: 5,
    review: { state: 'approved', latest: REVIEW, history: [REVIEW] },
    ...fields,
  });
}

describe('CorridorReports', () => {
  let fixture: ComponentFixture<CorridorReports>;
  let backend: HttpTestingController;

  async function open(role: Parameters<typeof signInAs>[0], b: Batch = batch(), id = 2) {
    signInAs(role, { id, name: role === 'engineer' ? 'Evan Engineer' : `The ${role}` });
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CorridorReports);
    fixture.componentRef.setInput('batch', b);
    await fixture.whenStable();
  }

  afterEach(() => {
    vi.useRealTimers();
    vi.restoreAllMocks();
    fixture?.destroy();
    verifyAndReset(backend);
  });

  const el = () => fixture.nativeElement as HTMLElement;
  const all = (id: string) => Array.from(el().querySelectorAll(`[data-testid="${id}"]`));
  /** The text of an element as read, without its icons' ligature names. */
  const text = (e: Element | null | undefined) => {
    if (!e) return undefined;
    const copy = e.cloneNode(true) as Element;
    copy.querySelectorAll('mat-icon').forEach((i) => i.remove());
    return copy.textContent?.replace(/\s+/g, ' ').trim();
  };

  it('asks for a report with the chosen station pages and lists it queued', async () => {
    await open('engineer');
    backend.expectOne(LIST).flush({ reports: [], caution: 'c' });
    await fixture.whenStable();
    expect(text(el().querySelector('[data-testid="no-reports"]'))).toContain('No corridor report');

    const every = el().querySelector<HTMLInputElement>(
      '[data-testid="report-appendix"] input[value="all"]',
    )!;
    every.click();
    await fixture.whenStable();
    const make = el().querySelector<HTMLButtonElement>('[data-testid="make-report"]')!;
    expect(make.disabled).toBe(false);
    make.click();
    await fixture.whenStable();
    expect(make.disabled).toBe(true); // while it is asked for
    const req = backend.expectOne(LIST);
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ appendix: 'all' });
    req.flush(aReport({ appendix: 'all' }), { status: 202, statusText: 'Accepted' });
    await fixture.whenStable();

    const rows = all('report-row');
    expect(rows).toHaveLength(1);
    expect(text(rows[0].querySelector('[data-testid="report-status"]'))).toBe('queued');
    expect(text(rows[0])).toContain('by Evan Engineer (you)');
    expect(text(rows[0])).toContain('with every station’s page');
    expect(text(rows[0])).toContain('Records no review');
    expect(rows[0].querySelector('[data-testid="download-report"]')).toBeNull();
    expect(make.disabled).toBe(false);
  });

  it('reads a report being made every POLL_MS, moving its progress, and stops once it is done', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    await open('reviewer', batch(), 4);
    backend.expectOne(LIST).flush({
      reports: [aReport({ status: 'running', progress: { done: 1, total: 4 } })],
      caution: 'c',
    });
    await fixture.whenStable();
    const bar = () => el().querySelector('mat-progress-bar');
    expect(text(el().querySelector('[data-testid="report-status"]'))).toBe('running');
    expect(bar()?.getAttribute('aria-valuenow')).toBe('25');
    expect(text(el().querySelector('[data-testid="report-progress"]'))).toBe('1 of 4 pages');
    backend.expectNone('/api/v1/reports/31');

    vi.advanceTimersByTime(POLL_MS);
    backend
      .expectOne('/api/v1/reports/31')
      .flush(aReport({ status: 'running', progress: { done: 3, total: 4 } }));
    await fixture.whenStable();
    expect(bar()?.getAttribute('aria-valuenow')).toBe('75');
    expect(text(el().querySelector('[data-testid="report-progress"]'))).toBe('3 of 4 pages');

    vi.advanceTimersByTime(POLL_MS);
    backend.expectOne('/api/v1/reports/31').flush(
      aReport({
        status: 'done',
        progress: { done: 4, total: 4 },
        finishedAt: '2026-12-02T09:42:00Z',
        download: '/api/v1/reports/31/file',
      }),
    );
    await fixture.whenStable();
    expect(text(el().querySelector('[data-testid="report-status"]'))).toBe('done');
    expect(bar()).toBeNull();
    expect(el().querySelector('[data-testid="download-report"]')).not.toBeNull();

    // done: no more reading
    vi.advanceTimersByTime(POLL_MS * 4);
    backend.expectNone('/api/v1/reports/31');
  });

  it('stops reading when the component is destroyed', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    await open('engineer');
    backend.expectOne(LIST).flush({ reports: [aReport()], caution: 'c' });
    await fixture.whenStable();
    vi.advanceTimersByTime(POLL_MS);
    backend.expectOne('/api/v1/reports/31').flush(aReport());
    fixture.destroy();
    vi.advanceTimersByTime(POLL_MS * 4);
    backend.expectNone('/api/v1/reports/31');
  });

  it("downloads a made report's file under the server's name, and says which review it records", async () => {
    await open('viewer', batch(), 7);
    backend.expectOne(LIST).flush({
      reports: [
        aReport({
          status: 'done',
          reviewId: 12,
          requestedBy: 4,
          finishedAt: '2026-12-02T09:42:00Z',
          download: '/api/v1/reports/31/file',
        }),
      ],
      caution: 'c',
    });
    await fixture.whenStable();
    const row = all('report-row')[0];
    expect(text(row)).toContain('by Rita Reviewer');
    expect(text(row)).toContain(
      `records the review of ${dateTimeText(REVIEW.at)} (approved by Rita Reviewer)`,
    );

    const saved: string[] = [];
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push(this.download);
    });
    const created = vi.spyOn(URL, 'createObjectURL').mockImplementation(() => 'blob:pdf');
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    const button = row.querySelector<HTMLButtonElement>('[data-testid="download-report"]')!;
    button.click();
    await fixture.whenStable();
    expect(text(button)).toBe('Fetching the PDF…');
    const req = backend.expectOne('/api/v1/reports/31/file');
    expect(req.request.method).toBe('GET');
    expect(req.request.responseType).toBe('blob');
    const name = 'wcb-main-corridor-report-sections-below-2026-12-02.pdf';
    req.flush(new Blob(['%PDF-1.7'], { type: 'application/pdf' }), {
      headers: { 'Content-Disposition': `attachment; filename="${name}"` },
    });
    await fixture.whenStable();
    expect(saved).toEqual([name]);
    expect((created.mock.calls[0][0] as Blob).type).toBe('application/pdf');
    expect(button.disabled).toBe(false);
  });

  it("shows a refusal's title and detail (422 for every station's page beyond the bound)", async () => {
    await open('engineer');
    backend.expectOne(LIST).flush({ reports: [], caution: 'c' });
    await fixture.whenStable();
    el()
      .querySelector<HTMLInputElement>('[data-testid="report-appendix"] input[value="all"]')!
      .click();
    el().querySelector<HTMLButtonElement>('[data-testid="make-report"]')!.click();
    await fixture.whenStable();
    const detail =
      'Every station’s page is given for batches of at most 200 sections; this one has 350.';
    backend
      .expectOne(LIST)
      .flush(
        { type: 'about:blank', title: 'Invalid input', status: 422, detail },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
    await fixture.whenStable();
    expect(text(el().querySelector('[role="alert"]'))).toBe(
      `The report was not asked for: Invalid input — ${detail}`,
    );
    expect(all('report-row')).toHaveLength(0);
  });

  it("shows a 409 of the file (still being made) from the Blob's problem+json", async () => {
    await open('engineer');
    backend.expectOne(LIST).flush({ reports: [aReport({ status: 'done' })], caution: 'c' });
    await fixture.whenStable();
    el().querySelector<HTMLButtonElement>('[data-testid="download-report"]')!.click();
    const problem = { title: 'Conflict', status: 409, detail: 'The report is still being made.' };
    backend
      .expectOne('/api/v1/reports/31/file')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 409,
        statusText: 'Conflict',
      });
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
    expect(text(el().querySelector('[role="alert"]'))).toBe(
      'The download failed: Conflict — The report is still being made.',
    );
  });

  it('shows the reason of a failed report', async () => {
    await open('engineer');
    backend.expectOne(LIST).flush({
      reports: [aReport({ status: 'failed', reason: 'The storage could not be reached.' })],
      caution: 'c',
    });
    await fixture.whenStable();
    expect(text(el().querySelector('[data-testid="report-status"]'))).toBe('failed');
    expect(text(el().querySelector('[data-testid="report-reason"]'))).toBe(
      'Not made: The storage could not be reached.',
    );
    expect(el().querySelector('[data-testid="download-report"]')).toBeNull();
  });

  it('offers no Make button to a viewer or an integration, only the downloads', async () => {
    for (const role of ['viewer', 'integration'] as const) {
      await open(role, batch(), 7);
      backend.expectOne(LIST).flush({ reports: [aReport({ status: 'done' })], caution: 'c' });
      await fixture.whenStable();
      expect(el().querySelector('[data-testid="make-report"]')).toBeNull();
      expect(el().querySelector('[data-testid="report-appendix"]')).toBeNull();
      expect(el().querySelector('[data-testid="report-not-allowed"]')).not.toBeNull();
      expect(el().querySelector('[data-testid="download-report"]')).not.toBeNull();
      fixture.destroy();
      verifyAndReset(backend);
    }
  });

  it('disables Make while the batch runs, saying why, and reads the list again once it is done', async () => {
    await open('admin', batch({ status: 'running' }));
    backend.expectOne(LIST).flush({ reports: [], caution: 'c' });
    await fixture.whenStable();
    expect(el().querySelector<HTMLButtonElement>('[data-testid="make-report"]')!.disabled).toBe(
      true,
    );
    expect(text(el().querySelector('[data-testid="report-wait"]'))).toContain(
      'once the batch has finished',
    );

    fixture.componentRef.setInput('batch', batch({ status: 'done' }));
    await fixture.whenStable();
    backend.expectOne(LIST).flush({ reports: [], caution: 'c' });
    await fixture.whenStable();
    expect(el().querySelector<HTMLButtonElement>('[data-testid="make-report"]')!.disabled).toBe(
      false,
    );
    expect(el().querySelector('[data-testid="report-wait"]')).toBeNull();
  });
});
