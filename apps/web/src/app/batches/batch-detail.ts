import { WhenPipe } from '../shared/date-time';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import {
  catchError,
  combineLatest,
  concat,
  defer,
  distinctUntilChanged,
  EMPTY,
  filter,
  map,
  of,
  share,
  skip,
  switchMap,
  throttleTime,
} from 'rxjs';
import { Auth } from '../core/auth';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { ProjectsApi } from '../projects/projects-api';
import { ReviewPanel } from '../reviews/review-panel';
import { CorridorReports } from '../reports/corridor-reports';
import { Caution } from '../shared/caution';
import { loadState, type Loaded } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { BatchEvents, type LiveProgress } from './batch-events';
import type {
  Batch,
  ResultCollection,
  ResultFeature,
  ReviewRequestResult,
  SectionListItem,
  StoredInput,
} from './batch-types';
import { BatchesApi, type ExportKind } from './batches-api';
import { CaseCharts } from './case-charts';
import { ChainageChart } from './chainage-chart';
import { ProbabilityChart } from './probability-chart';
import { batchCases } from './design-cases';
import { keepLast, nothingYet } from './keep-last';
import { PlanView } from './plan-view';
import { batchUnits } from './scales';
import { SectionTable } from './section-table';
import { userName } from '../core/user-name';
import { JOB_STATE_WORDS, VERDICTS } from '@scarpline/core/verdict';
import { verdictView } from '../shared/verdict';

/** Saves a fetched file through an object URL (the download carried the bearer token). */
function save(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/**
 * One batch: its header, live progress (server-sent events, polling when they fail), the FS
 * along the chainage, the plan, the sections table, the exports and the review.
 */
@Component({
  selector: 'sl-batch-detail',
  imports: [
    WhenPipe,
    FormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    Caution,
    PageState,
    CaseCharts,
    ChainageChart,
    ProbabilityChart,
    PlanView,
    SectionTable,
    ReviewPanel,
    CorridorReports,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './batch-detail.html',
  styleUrl: './batch-detail.scss',
})
export class BatchDetail {
  private readonly api = inject(BatchesApi);
  private readonly events = inject(BatchEvents);
  private readonly router = inject(Router);
  private readonly projects = inject(ProjectsApi);
  protected readonly auth = inject(Auth);
  protected readonly jobWords = JOB_STATE_WORDS;

  /** The batch id from the route. */
  readonly id = input.required<string>();
  protected readonly batchId = computed(() => Number(this.id()));

  private readonly reloadTick = signal(0);
  /** Bumped when the results change: the table, the chart and the plan read them again. */
  protected readonly version = signal(0);
  private readonly liveRetry = signal(0);
  protected readonly liveProblem = signal<Problem | null>(null);

  protected readonly state = toSignal(
    combineLatest([toObservable(this.batchId), toObservable(this.reloadTick)]).pipe(
      switchMap(([id]) => loadState(this.api.batch(id))),
      keepLast<Batch>(),
    ),
    { initialValue: nothingYet<Batch>() },
  );
  /** The batch of this route (not the one before it while the next loads). */
  protected readonly batch = computed(() => {
    const b = this.state().value;
    return b && b.id === this.batchId() ? b : null;
  });

  /** The running batch to follow (with the retry count, so "Try again" follows anew). */
  private readonly following = computed(() => {
    const b = this.batch();
    return b && b.status === 'running' ? `${b.id}:${this.liveRetry()}` : null;
  });

  private readonly live$ = toObservable(this.following).pipe(
    distinctUntilChanged(),
    switchMap((key) => {
      if (key === null) return of(null);
      const id = Number(key.split(':')[0]);
      this.liveProblem.set(null);
      return concat(
        this.events.follow(id).pipe(
          catchError((err: unknown) => {
            this.liveProblem.set(toProblem(err));
            return EMPTY;
          }),
        ),
        // Once at the end (or when following fails): read the batch and its results again.
        defer(() => {
          this.refresh();
          return EMPTY;
        }),
      );
    }),
    share(),
  );
  protected readonly live = toSignal(this.live$, { initialValue: null as LiveProgress | null });

  protected readonly status = computed(() => this.live()?.status ?? this.batch()?.status ?? null);
  protected readonly progress = computed(
    () => this.live()?.progress ?? this.batch()?.progress ?? null,
  );
  protected readonly finishedAt = computed(
    () => this.live()?.finishedAt ?? this.batch()?.finishedAt ?? null,
  );
  protected readonly isFinished = computed(() => this.status() === 'done');
  protected readonly percent = computed(() => Math.round((this.progress()?.fraction ?? 0) * 100));

  private readonly sectionsKey = computed(() => ({ id: this.batchId(), v: this.version() }));
  protected readonly all = toSignal(
    toObservable(this.sectionsKey).pipe(
      switchMap(({ id }) => loadState(this.api.allSections(id))),
      keepLast<SectionListItem[]>(),
    ),
    { initialValue: nothingYet<SectionListItem[]>() },
  );
  protected readonly plan = toSignal(
    toObservable(this.sectionsKey).pipe(
      switchMap(({ id }) => loadState(this.api.resultsGeoJson(id))),
      keepLast<ResultCollection>(),
    ),
    { initialValue: nothingYet<ResultCollection>() },
  );

  /** The files the batch was submitted with, read again with the batch. */
  protected readonly inputs = toSignal<Loaded<StoredInput[]>, Loaded<StoredInput[]>>(
    combineLatest([toObservable(this.batchId), toObservable(this.reloadTick)]).pipe(
      switchMap(([id]) => loadState(this.api.inputs(id))),
    ),
    { initialValue: { state: 'loading' } },
  );
  /** The submitted file being fetched (its id), and why the last fetch failed. */
  protected readonly fetchingInput = signal<number | null>(null);
  protected readonly inputProblem = signal<Problem | null>(null);

  /** The project's name for the way back (the batch carries only its id). */
  protected readonly projectName = toSignal(
    toObservable(computed(() => this.batch()?.projectId ?? null)).pipe(
      distinctUntilChanged(),
      switchMap((id) =>
        id === null
          ? of(null)
          : this.projects.get(id).pipe(
              map((p) => p.name),
              catchError(() => of(null)),
            ),
      ),
    ),
    { initialValue: null },
  );

  protected readonly canAskReview = computed(() => this.auth.hasRole('admin', 'engineer'));
  protected readonly submittedByText = computed(() => {
    const b = this.batch();
    return b ? userName(b.submitter, this.auth.user()?.id) : '';
  });
  /** The design cases of the batch; one (or none) shows the batch as a single case is. */
  protected readonly cases = computed(() => batchCases(this.batch(), this.all().value ?? []));
  protected readonly manyCases = computed(() => this.cases().length > 1);
  /** The done sections of each case by verdict (Batch.caseCounts), in the core's words. */
  protected readonly caseCounts = computed(() => {
    const counts = this.batch()?.caseCounts ?? {};
    return this.cases().map((c) => ({
      name: c.name,
      verdicts: VERDICTS.filter((v) => (counts[c.name]?.[v] ?? 0) > 0).map((v) => ({
        ...verdictView(v),
        count: counts[c.name]?.[v] ?? 0,
      })),
    }));
  });
  /** The units of the batch's sections, for the plan's scale bar. */
  protected readonly units = computed(() => batchUnits(this.all().value ?? []));

  /** The export being fetched: a kind, or the spreadsheet with its slice sheets. */
  protected readonly downloading = signal<ExportKind | 'xlsx-slices' | null>(null);
  protected readonly downloadProblem = signal<Problem | null>(null);

  protected readonly asking = signal(false);
  protected readonly askComment = signal('');
  protected readonly askBusy = signal(false);
  protected readonly askProblem = signal<Problem | null>(null);
  protected readonly asked = signal<ReviewRequestResult | null>(null);

  constructor() {
    // While the batch runs, refresh the results when the counts move, at most every 2 s.
    this.live$
      .pipe(
        filter((l): l is LiveProgress => l !== null),
        map((l) => l.progress.done + l.progress.failed),
        distinctUntilChanged(),
        skip(1),
        throttleTime(2000, undefined, { leading: true, trailing: true }),
        takeUntilDestroyed(),
      )
      .subscribe(() => this.version.update((n) => n + 1));
  }

  /** The batch and everything under it, read again (after a review, or at the end of a run). */
  reload(): void {
    this.refresh();
  }

  private refresh(): void {
    this.reloadTick.update((n) => n + 1);
    this.version.update((n) => n + 1);
  }

  protected followAgain(): void {
    this.liveRetry.update((n) => n + 1);
  }

  /** Whether any station carries a probability of failure (its chart is drawn then). */
  protected hasProbability(items: readonly SectionListItem[]): boolean {
    return items.some((s) => (s.probability?.length ?? 0) > 0);
  }

  protected openSection(id: number): void {
    void this.router.navigate(['/sections', id]);
  }

  /** A feature of the results names its section by its id in the input: the listed key. */
  protected openFeature(f: ResultFeature): void {
    const id = this.all().value?.find((s) => s.key === f.properties.section_id)?.id;
    if (id !== undefined) this.openSection(id);
  }

  protected download(kind: ExportKind, slices = false): void {
    const b = this.batch();
    if (!b || this.downloading()) return;
    this.downloading.set(slices ? 'xlsx-slices' : kind);
    this.downloadProblem.set(null);
    this.api.download(b.id, kind, { slices }).subscribe({
      next: (d) => {
        save(d.blob, d.fileName);
        this.downloading.set(null);
      },
      error: (err: unknown) => {
        this.downloadProblem.set(toProblem(err));
        this.downloading.set(null);
      },
    });
  }

  protected downloadInput(file: StoredInput): void {
    const b = this.batch();
    if (!b || this.fetchingInput() !== null) return;
    this.fetchingInput.set(file.id);
    this.inputProblem.set(null);
    this.api.downloadInput(b.id, file).subscribe({
      next: (d) => {
        save(d.blob, d.fileName);
        this.fetchingInput.set(null);
      },
      error: (err: unknown) => {
        this.inputProblem.set(toProblem(err));
        this.fetchingInput.set(null);
      },
    });
  }

  /** A size in bytes, in words a person reads (1 kB = 1000 bytes). */
  protected sizeText(bytes: number): string {
    if (bytes < 1000) return `${bytes} bytes`;
    if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
    return `${(bytes / 1_000_000).toFixed(1)} MB`;
  }

  protected startAsk(): void {
    this.asking.set(true);
    this.asked.set(null);
    this.askProblem.set(null);
  }

  protected sendAsk(): void {
    const b = this.batch();
    if (!b || this.askBusy()) return;
    this.askBusy.set(true);
    this.askProblem.set(null);
    this.api.requestReview(b.id, this.askComment().trim()).subscribe({
      next: (r) => {
        this.asked.set(r);
        this.asking.set(false);
        this.askComment.set('');
        this.askBusy.set(false);
      },
      error: (err: unknown) => {
        this.askProblem.set(toProblem(err));
        this.askBusy.set(false);
      },
    });
  }
}
