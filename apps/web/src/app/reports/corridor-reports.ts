import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { JOB_STATE_WORDS } from '@scarpline/core/verdict';
import { catchError, distinctUntilChanged, EMPTY, of, switchMap, tap, type Observable } from 'rxjs';
import type { Batch } from '../batches/batch-types';
import { Auth } from '../core/auth';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { userName } from '../core/user-name';
import { reviewerName } from '../reviews/review-panel';
import { dateTimeText, WhenPipe } from '../shared/date-time';
import { saveFile } from '../shared/download';
import { pollActive } from '../shared/poll-active';
import type { Appendix, Report } from './report-types';
import { ReportsApi } from './reports-api';

/** How often a queued or running report is read again. */
export const POLL_MS = 1500;

/** The choices of section pages, in our words, the API's default first. */
export const APPENDIX_CHOICES: readonly { value: Appendix; label: string; words: string }[] = [
  {
    value: 'below',
    label: 'Stations below requirement',
    words: 'with the pages of the stations below requirement',
  },
  { value: 'all', label: 'Every station', words: 'with every station’s page' },
  { value: 'none', label: 'None (summary only)', words: 'summary only, no station pages' },
];

function isActive(r: Report): boolean {
  return r.status === 'queued' || r.status === 'running';
}

/** Two lists of report ids alike (so that polling goes on while the same reports are made). */
function sameIds(a: readonly number[], b: readonly number[]): boolean {
  return a.length === b.length && a.every((id, i) => id === b[i]);
}

/** A report as the list shows it. */
interface ReportRow {
  report: Report;
  by: string | null;
  appendixWords: string;
  statusWords: string;
  percent: number | null;
  review: string | null;
}

/**
 * The corridor reports of a batch (PDF, made by a worker): a choice of section pages and
 * "Make corridor report" for the roles that may ask, once the batch has finished; the reports
 * asked for, newest first, with their progress (read again while any is being made), the
 * review each records, and a download of each one made.
 */
@Component({
  selector: 'sl-corridor-reports',
  imports: [WhenPipe, MatButtonModule, MatIconModule, MatProgressBarModule, MatRadioModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './corridor-reports.html',
  styleUrl: './corridor-reports.scss',
})
export class CorridorReports {
  private readonly api = inject(ReportsApi);
  private readonly auth = inject(Auth);

  /** The batch the reports are of (its status, submitter and review history are read). */
  readonly batch = input.required<Batch>();

  protected readonly choices = APPENDIX_CHOICES;
  protected readonly appendix = signal<Appendix>('below');
  protected readonly canAsk = computed(() => this.auth.hasRole('admin', 'engineer', 'reviewer'));
  protected readonly running = computed(() => this.batch().status === 'running');

  /** The batch's reports, newest first; null until read. */
  protected readonly reports = signal<Report[] | null>(null);
  protected readonly listProblem = signal<Problem | null>(null);
  protected readonly pollProblem = signal<Problem | null>(null);
  protected readonly askBusy = signal(false);
  protected readonly askProblem = signal<Problem | null>(null);
  /** The report whose file is being fetched. */
  protected readonly downloading = signal<number | null>(null);
  protected readonly downloadProblem = signal<Problem | null>(null);
  private readonly tries = signal(0);

  /** Read the list again for another batch, when the batch finishes, and on "Try again". */
  private readonly listKey = computed(
    () => `${this.batch().id}:${this.batch().status}:${this.tries()}`,
  );
  /** The reports being made, whose state is read every POLL_MS. */
  private readonly activeIds = computed(
    () => (this.reports() ?? []).filter(isActive).map((r) => r.id),
    { equal: sameIds },
  );

  /** Who is who: the submitter, the reviewers of the batch and oneself, by user id. */
  private readonly names = computed(() => {
    const b = this.batch();
    const names = new Map<number, string>([[b.submitter.id, b.submitter.name]]);
    for (const r of b.review.history) {
      if (r.reviewer.name) names.set(r.reviewer.id, r.reviewer.name);
    }
    const me = this.auth.user();
    if (me) names.set(me.id, me.name);
    return names;
  });

  protected readonly rows = computed((): ReportRow[] => {
    const names = this.names();
    const me = this.auth.user()?.id;
    const history = this.batch().review.history;
    return (this.reports() ?? []).map((r) => {
      const name = names.get(r.requestedBy);
      const review = r.reviewId === null ? null : history.find((h) => h.id === r.reviewId);
      return {
        report: r,
        by: name === undefined ? null : userName({ id: r.requestedBy, name }, me),
        appendixWords:
          APPENDIX_CHOICES.find((c) => c.value === r.appendix)?.words ?? 'no station pages',
        statusWords: JOB_STATE_WORDS[r.status],
        percent:
          r.status === 'running' && r.progress.total > 0
            ? Math.round((100 * r.progress.done) / r.progress.total)
            : null,
        review:
          r.reviewId === null
            ? null
            : review
              ? `records the review of ${dateTimeText(review.at)} (${review.decision} by ${reviewerName(review)})`
              : `records review #${r.reviewId}`,
      };
    });
  });

  constructor() {
    toObservable(this.listKey)
      .pipe(
        distinctUntilChanged(),
        switchMap(() => {
          this.listProblem.set(null);
          return this.api.batchReports(this.batch().id).pipe(
            catchError((err: unknown) => {
              this.listProblem.set(toProblem(err));
              return EMPTY;
            }),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((list) => this.reports.set(list.reports));

    // While any report is queued or running, read each of them every POLL_MS; stop once none is.
    pollActive(this.activeIds, (id) => this.poll(id), POLL_MS)
      .pipe(takeUntilDestroyed())
      .subscribe((fresh) => this.merge(fresh.filter((r): r is Report => r !== null)));
  }

  /** One report read again; null when that failed (the problem is shown, the next try goes on). */
  private poll(id: number): Observable<Report | null> {
    return this.api.report(id).pipe(
      tap(() => this.pollProblem.set(null)),
      catchError((err: unknown) => {
        this.pollProblem.set(toProblem(err));
        return of(null);
      }),
    );
  }

  private merge(fresh: readonly Report[]): void {
    if (fresh.length === 0) return;
    this.reports.update((list) => (list ?? []).map((r) => fresh.find((f) => f.id === r.id) ?? r));
  }

  protected retry(): void {
    this.tries.update((n) => n + 1);
  }

  protected make(): void {
    if (this.askBusy() || this.running()) return;
    this.askBusy.set(true);
    this.askProblem.set(null);
    this.api.ask(this.batch().id, this.appendix()).subscribe({
      next: (r) => {
        this.reports.update((list) => [r, ...(list ?? []).filter((x) => x.id !== r.id)]);
        this.askBusy.set(false);
      },
      error: (err: unknown) => {
        this.askProblem.set(toProblem(err));
        this.askBusy.set(false);
      },
    });
  }

  protected download(r: Report): void {
    if (this.downloading() !== null) return;
    this.downloading.set(r.id);
    this.downloadProblem.set(null);
    this.api.file(r.id).subscribe({
      next: (d) => {
        saveFile(d.blob, d.fileName);
        this.downloading.set(null);
      },
      error: (err: unknown) => {
        this.downloadProblem.set(toProblem(err));
        this.downloading.set(null);
      },
    });
  }
}
