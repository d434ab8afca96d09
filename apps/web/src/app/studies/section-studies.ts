import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { Section } from '@scarpline/core/model';
import { JOB_STATE_WORDS } from '@scarpline/core/verdict';
import { catchError, distinctUntilChanged, EMPTY, of, switchMap, tap, type Observable } from 'rxjs';
import { Auth } from '../core/auth';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { userName } from '../core/user-name';
import { WhenPipe } from '../shared/date-time';
import { pollActive } from '../shared/poll-active';
import { StudiesApi } from './studies-api';
import { StudyForm } from './study-form';
import { fsText } from '../sections/format';
import { betaText, pText } from './probability-format';
import { KIND_WORDS, requestText } from './study-model';
import { StudyResult } from './study-result';
import type { ProbabilitySummary, Study } from './study-types';

/** How often a queued or running study is read again. */
export const POLL_MS = 1500;

const isActive = (s: Study) => s.status === 'queued' || s.status === 'running';

/** Two lists of ids alike (so that polling goes on while the same studies run). */
const sameIds = (a: readonly number[], b: readonly number[]) =>
  a.length === b.length && a.every((id, i) => id === b[i]);

/**
 * The section's studies (probability of failure, sensitivity, solving for a value, each made
 * by a worker on the section's current run): the list, newest first, with each one's state and
 * progress (read again while any is being made), the result or problem of the one opened, and
 * for engineers and administrators a form to ask for another.
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
          return this.api.list(this.sectionId()).pipe(
            catchError((err: unknown) => {
              this.listProblem.set(toProblem(err));
              return EMPTY;
            }),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((list) => this.studies.set(list));

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
