import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import {
  catchError,
  combineLatest,
  EMPTY,
  expand,
  of,
  scan,
  startWith,
  Subject,
  switchMap,
  timer,
  type Observable,
} from 'rxjs';
import { userName } from '../core/user-name';
import { Auth } from '../core/auth';
import { ReviewPanel } from '../reviews/review-panel';
import type { Batch } from '../batches/batch-types';
import { Caution } from '../shared/caution';
import { loadState, type Loaded } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { fsText, plain, when } from './format';
import { methodName } from '../shared/method-names';
import { CaseTable } from './case-table';
import { DrawdownReportView } from './drawdown-report';
import { MethodTable } from './method-table';
import { SeismicReportView } from './seismic-report';
import { ReinforcementTable } from './reinforcement-table';
import { RequiredReinforcementView } from './required-reinforcement';
import { RerunForm } from './rerun-form';
import { RunHistory } from './run-history';
import { SectionDrawing } from './section-drawing';
import { SectionInputView } from './section-input';
import type { CaseView, RunResult, SectionView } from './section-types';
import { SectionsApi } from './sections-api';
import { SliceTable } from './slice-table';
import { SectionStudies } from '../studies/section-studies';
import { WarningList } from './warning-list';
import { JOB_STATE_WORDS } from '@scarpline/core/verdict';
import { howFoundWords } from '@scarpline/core/result';
import { verdictView } from '../shared/verdict';

/** How often a queued or running section is asked for again. */
export const POLL_MS = 2000;

const isActive = (s: SectionView) => s.status === 'queued' || s.status === 'running';

/** Keeps showing what is there while it is fetched again. */
function keepShown<T>(prev: Loaded<T>, next: Loaded<T>): Loaded<T> {
  return next.state === 'loading' && prev.state === 'ready' ? prev : next;
}

/**
 * One section: its header (station, key, batch, status, run, governing method, FS against the
 * required FS), the caution, the drawing, the methods, the slices, the warnings, the input, a
 * re-run with edited parameters, the runs, and the review. Follows a queued or running run
 * until it ends.
 */
@Component({
  selector: 'sl-section-detail',
  imports: [
    RouterLink,
    MatIconModule,
    Caution,
    PageState,
    SectionDrawing,
    CaseTable,
    DrawdownReportView,
    SeismicReportView,
    ReinforcementTable,
    RequiredReinforcementView,
    MethodTable,
    SliceTable,
    WarningList,
    SectionInputView,
    RerunForm,
    RunHistory,
    ReviewPanel,
    SectionStudies,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './section-detail.html',
  styleUrl: './section-detail.scss',
})
export class SectionDetail {
  private readonly api = inject(SectionsApi);
  private readonly snack = inject(MatSnackBar);
  private readonly title = inject(Title);
  protected readonly auth = inject(Auth);

  /** The route's :id. */
  readonly id = input.required<string>();

  private readonly sectionId = computed(() => Number(this.id()));
  private readonly refresh$ = new Subject<void>();

  protected readonly loaded = toSignal(
    toObservable(this.sectionId).pipe(
      switchMap((id) =>
        this.refresh$.pipe(
          startWith(undefined),
          switchMap(() => this.follow(id)),
          scan(keepShown<SectionView>, { state: 'loading' } as Loaded<SectionView>),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } satisfies Loaded<SectionView> },
  );
  protected readonly section = computed(() => {
    const l = this.loaded();
    return l.state === 'ready' ? l.value : null;
  });
  protected readonly problem = computed(() => {
    const l = this.loaded();
    return l.state === 'error' ? l.problem : null;
  });

  private readonly batchTick = signal(0);
  private readonly batchId = computed(() => this.section()?.batchId ?? null);
  /** The batch, for its name and its own review; the page works without it. */
  protected readonly batch = toSignal(
    combineLatest([toObservable(this.batchId), toObservable(this.batchTick)]).pipe(
      switchMap(([id]) =>
        id === null ? of(null) : this.api.batch(id).pipe(catchError(() => of<Batch | null>(null))),
      ),
    ),
    { initialValue: null },
  );

  protected readonly active = computed(() => {
    const s = this.section();
    return s !== null && isActive(s);
  });
  /** Changes when the run or its state changes: the drawing and the runs are fetched again. */
  protected readonly version = computed(() => {
    const s = this.section();
    return s ? `${s.run}:${s.status}:${s.result?.timings.finishedAt ?? ''}` : '';
  });
  protected readonly fileName = computed(() => {
    const s = this.section();
    if (!s) return 'section.svg';
    const safe = (t: string) => t.replace(/[^A-Za-z0-9._-]+/g, '_');
    const c = this.drawnCase();
    return `${safe(s.key)}-run${s.run}${c === null ? '' : `-${safe(c)}`}.svg`;
  });
  protected readonly submittedBy = computed(() => this.section()?.submittedBy ?? null);
  /** Who submitted the batch, by name ("(you)" for the signed-in user). */
  protected readonly submitterText = computed(() => {
    const s = this.section();
    return s ? userName(s.submitter, this.auth.user()?.id) : '';
  });
  protected readonly mayRerun = computed(() => this.auth.hasRole('admin', 'engineer'));
  protected readonly station = computed(() => {
    const s = this.section();
    if (!s) return '';
    return s.stationLabel ?? (s.station === null ? '' : plain(s.station, 3));
  });
  /** The verdict in the core's words, with an icon (never by colour alone). */
  protected readonly verdict = computed(() => {
    const r = this.section()?.result;
    return r ? verdictView(r.verdict) : null;
  });

  /** The design cases of the current result (one, or none from an API before them). */
  protected readonly cases = computed<readonly CaseView[]>(
    () => this.section()?.result?.cases ?? [],
  );
  /** Several cases: side by side, one of them shown; one case: the page as it always was. */
  protected readonly manyCases = computed(() => this.cases().length > 1);
  /** The case shown: the governing one until another is picked (kept while it still exists). */
  protected readonly picked = linkedSignal<
    { names: string[]; governing: string | null },
    string | null
  >({
    source: () => ({
      names: this.cases().map((c) => c.name),
      governing: this.section()?.result?.governingCase ?? null,
    }),
    computation: (src, prev) =>
      prev?.value != null && src.names.includes(prev.value)
        ? prev.value
        : (src.governing ?? src.names[0] ?? null),
  });
  /** The case shown, with its drawdown or earthquake report (also of a station's one case). */
  protected readonly shownCase = computed(() => {
    const cases = this.cases();
    if (cases.length === 1) return cases[0];
    return cases.find((c) => c.name === this.picked()) ?? null;
  });
  /** What the methods, slices and warnings show: the picked case's, or the result's. */
  protected readonly shown = computed(() => {
    const r = this.section()?.result;
    if (!r) return null;
    const c = this.manyCases() ? this.shownCase() : null;
    if (c === null) {
      return {
        methods: r.methods,
        governing: r.governing,
        requiredFs: r.requiredFs,
        warnings: r.warnings,
        search: r.search ?? null,
      };
    }
    return {
      methods: c.methods,
      governing: c.governing,
      requiredFs: c.requiredFs,
      warnings: c.warnings,
      search: c.search,
    };
  });
  /** Whether any method of the shown result reports reinforcement. */
  protected readonly reinforced = computed(() =>
    (this.shown()?.methods ?? []).some((m) => (m.reinforcement?.length ?? 0) > 0),
  );
  /** The drawing's case: named only when there are several (one case draws as before). */
  protected readonly drawnCase = computed(() => (this.manyCases() ? this.picked() : null));
  /** The pseudo-static kh of the shown case, from the section's input. */
  protected readonly caseKh = computed(() => {
    const s = this.section();
    const c = this.shownCase();
    if (!s || !c) return null;
    const spec = s.input.cases?.find((k) => k.name === c.name);
    return spec ? spec.seismic.kh : s.input.seismic.kh;
  });

  protected readonly fsText = fsText;
  protected readonly jobWords = JOB_STATE_WORDS;
  protected readonly methodName = methodName;
  protected readonly plain = plain;
  protected readonly when = when;
  /** The search's account of the critical circle, in the core's words (null without a search). */
  protected howFound(r: Pick<RunResult, 'search'>): string[] | null {
    const h = r.search?.howFound;
    return h ? howFoundWords(h) : null;
  }

  constructor() {
    effect(() => {
      const s = this.section();
      if (s) this.title.setTitle(`${s.key} · Section · Scarpline`);
    });
    // Say so when a followed run ends.
    let wasActive: { id: number; run: number } | null = null;
    effect(() => {
      const s = this.section();
      if (!s) return;
      if (isActive(s)) {
        wasActive = { id: s.id, run: s.run };
      } else if (wasActive && wasActive.id === s.id && wasActive.run === s.run) {
        wasActive = null;
        const g = s.result?.governing;
        this.snack.open(
          g
            ? `Run ${s.run} finished: FS ${fsText(g.fs)} (${methodName(g.method)}).`
            : `Run ${s.run} finished without a factor of safety.`,
          'OK',
          { duration: 6000 },
        );
      }
    });
  }

  /** The section, then again every POLL_MS while its run is queued or running. */
  private follow(id: number): Observable<Loaded<SectionView>> {
    if (!Number.isInteger(id) || id <= 0) {
      return of({
        state: 'error',
        problem: { title: 'Not found', status: 404, detail: 'No such section.' },
      });
    }
    const once = () => loadState(this.api.section(id));
    return once().pipe(
      expand((l) =>
        l.state === 'ready' && isActive(l.value) ? timer(POLL_MS).pipe(switchMap(once)) : EMPTY,
      ),
    );
  }

  protected reload(): void {
    this.refresh$.next();
    this.batchTick.update((n) => n + 1);
  }

  protected onQueued(view: SectionView): void {
    this.snack.open(`Queued as run ${view.run}.`, 'OK', { duration: 4000 });
    this.refresh$.next();
  }

  protected onReviewed(): void {
    this.reload();
  }
}
