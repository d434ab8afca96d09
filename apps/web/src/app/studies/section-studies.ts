import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DOCUMENT,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Section } from '@scarpline/core/model';
import { JOB_STATE_WORDS } from '@scarpline/core/verdict';
import {
  catchError,
  concat,
  distinctUntilChanged,
  EMPTY,
  exhaustMap,
  of,
  switchMap,
  tap,
  type Observable,
} from 'rxjs';
import { Auth } from '../core/auth';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { userName } from '../core/user-name';
import { WhenPipe } from '../shared/date-time';
import { pollActive } from '../shared/poll-active';
import { whileVisible } from '../shared/while-visible';
import { StudiesApi } from './studies-api';
import { StudyForm } from './study-form';
import { fsText } from '../sections/format';
import { betaText, pText } from './probability-format';
import { KIND_WORDS, requestText } from './study-model';
import { StudyResult } from './study-result';
import type { ProbabilitySummary, Study } from './study-types';

/** How often a queued or running study is read again. */
export const POLL_MS = 1500;

/**
 * How often the list is read again while the page is in view, for the studies asked elsewhere
 * (another tab, the command line, a colleague); at once when the page comes back into view.
 */
export const LIST_MS = 10_000;

const isActive = (s: Study) => s.status === 'queued' || s.status === 'running';

/** Two lists of ids alike (so that polling goes on while the same studies run). */
const sameIds = (a: readonly number[], b: readonly number[]) =>
  a.length === b.length && a.every((id, i) => id === b[i]);

/**
 * The section's studies (probability of failure, sensitivity, solving for a value, each made
 * by a worker on the section's current run): the list, newest first, with each one's state and
 * progress (read again while any is being made), the result or problem of the one opened, and
 * for engineers and administrators a form to ask for another. The list is read again every
 * LIST_MS while the page is in view, so that a study asked elsewhere appears without a reload.
 */
@Component({
  selector: 'sl-section-studies',
  imports: [WhenPipe, MatButtonModule, MatIconModule, MatProgressBarModule, StudyForm, StudyResult],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './section-studies.html',
  styleUrl: './section-studies.scss',
})
export class SectionStudies {
  private readonly api = inject(StudiesApi);
  private readonly auth = inject(Auth);
  private readonly doc = inject(DOCUMENT);

  readonly sectionId = input.required<number>();
  /** The section's current input (SI): its variables, inputs and cases. */
  readonly section = input.required<Section>();
  /** Whether the section has a finished run to study. */
  readonly finished = input(true);
  /** The run shown, and its probability of failure by case when its section file asks for one. */
  readonly run = input<number | null>(null);
  readonly summary = input<readonly ProbabilitySummary[] | null>(null);

  protected readonly requestText = requestText;
  protected readonly fsText = fsText;
  protected readonly pText = pText;
  protected readonly betaText = betaText;

  protected readonly mayAsk = computed(() => this.auth.hasRole('admin', 'engineer'));
  protected readonly kindWords = KIND_WORDS;
  protected readonly stateWords = JOB_STATE_WORDS;

  /** Newest first; null until read. */
  protected readonly studies = signal<Study[] | null>(null);
  protected readonly listProblem = signal<Problem | null>(null);
  protected readonly pollProblem = signal<Problem | null>(null);
  protected readonly refreshProblem = signal<Problem | null>(null);
  /** The study opened (its result or problem shown): the newest until another is opened. */
  protected readonly opened = signal<number | null>(null);
  private readonly tries = signal(0);

  private readonly listKey = computed(() => `${this.sectionId()}:${this.tries()}`);
  private readonly activeIds = computed(
    () => (this.studies() ?? []).filter(isActive).map((s) => s.id),
    { equal: sameIds },
  );

  protected readonly shown = computed((): Study | null => {
    const list = this.studies() ?? [];
    const id = this.opened();
    return list.find((s) => s.id === id) ?? list[0] ?? null;
  });

  protected readonly rows = computed(() => {
    const me = this.auth.user()?.id;
    return (this.studies() ?? []).map((s) => ({
      study: s,
      by: userName(s.requestedBy, me),
      percent:
        s.progress && s.progress.total > 0
          ? Math.round((100 * s.progress.done) / s.progress.total)
          : null,
    }));
  });

  constructor() {
    toObservable(this.listKey)
      .pipe(
        distinctUntilChanged(),
        switchMap(() => {
          this.listProblem.set(null);
          this.refreshProblem.set(null);
          const id = this.sectionId();
          // once read, read again while the page is in view (a failed first read waits for Try again)
          return this.api.list(id).pipe(
            switchMap((list) => concat(of(list), this.reread(id))),
            catchError((err: unknown) => {
              this.listProblem.set(toProblem(err));
              return EMPTY;
            }),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((list) => this.replace(list));

    // While any study is queued or running, read each of them every POLL_MS; stop once none is.
    pollActive(this.activeIds, (id) => this.poll(id), POLL_MS)
      .pipe(takeUntilDestroyed())
      .subscribe((fresh) => this.merge(fresh.filter((s): s is Study => s !== null)));
  }

  private poll(id: number): Observable<Study | null> {
    return this.api.study(id).pipe(
      tap(() => this.pollProblem.set(null)),
      catchError((err: unknown) => {
        this.pollProblem.set(toProblem(err));
        return of(null);
      }),
    );
  }

  /** The list every LIST_MS while the page is in view (a read at a time); its problem said. */
  private reread(sectionId: number): Observable<Study[]> {
    return whileVisible(this.doc, LIST_MS).pipe(
      exhaustMap(() =>
        this.api.list(sectionId).pipe(
          tap(() => this.refreshProblem.set(null)),
          catchError((err: unknown) => {
            this.refreshProblem.set(toProblem(err));
            return EMPTY;
          }),
        ),
      ),
    );
  }

  /**
   * The list as read, and before it any study of the section held that is newer than all it
   * holds: one just asked from the form, whose answer overtook a read already on its way.
   */
  private replace(list: readonly Study[]): void {
    const section = this.sectionId();
    const newest = list.length === 0 ? 0 : Math.max(...list.map((s) => s.id));
    this.studies.update((held) => [
      ...(held ?? []).filter((s) => s.sectionId === section && s.id > newest),
      ...list,
    ]);
  }

  private merge(fresh: readonly Study[]): void {
    if (fresh.length === 0) return;
    this.studies.update((list) => (list ?? []).map((s) => fresh.find((f) => f.id === s.id) ?? s));
  }

  protected retry(): void {
    this.tries.update((n) => n + 1);
  }

  protected onAsked(s: Study): void {
    this.studies.update((list) => [s, ...(list ?? []).filter((x) => x.id !== s.id)]);
    this.opened.set(s.id);
  }
}
