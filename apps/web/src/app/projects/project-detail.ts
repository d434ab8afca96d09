import { DecimalPipe } from '@angular/common';
import { WhenPipe } from '../shared/date-time';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import {
  catchError,
  combineLatest,
  concat,
  EMPTY,
  expand,
  map,
  of,
  switchMap,
  timer,
  type Observable,
} from 'rxjs';
import type { Batch } from '../batches/batch-types';
import { userName } from '../core/user-name';
import { Auth } from '../core/auth';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { Caution } from '../shared/caution';
import { loadState } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { ProjectsApi } from './projects-api';

/** How often the list is read again while a batch of the project runs. */
export const REFRESH_MS = 4000;

/** The batches as the page shows them; `stale` when the last refresh failed. */
export type BatchList =
  | { state: 'loading' }
  | { state: 'error'; problem: Problem }
  | { state: 'ready'; value: Batch[]; stale: Problem | null };

export function anyRunning(batches: readonly Batch[]): boolean {
  return batches.some((b) => b.status === 'running');
}

/**
 * Reads the batches, then again every `ms` while any of them runs (timer + switchMap), and
 * stops when none runs. A failed refresh keeps the list and tries again at the next tick.
 */
export function followBatches(
  read: () => Observable<Batch[]>,
  ms = REFRESH_MS,
): Observable<BatchList> {
  const first = read().pipe(
    map((value): BatchList => ({ state: 'ready', value, stale: null })),
    catchError((err: unknown) => of<BatchList>({ state: 'error', problem: toProblem(err) })),
  );
  return concat(
    of<BatchList>({ state: 'loading' }),
    first.pipe(
      expand((last) =>
        last.state === 'ready' && anyRunning(last.value)
          ? timer(ms).pipe(
              switchMap(() => read()),
              map((value): BatchList => ({ state: 'ready', value, stale: null })),
              catchError((err: unknown) => of<BatchList>({ ...last, stale: toProblem(err) })),
            )
          : EMPTY,
      ),
    ),
  );
}

/** One project and its batches (newest first); a running batch keeps the list fresh. */
@Component({
  selector: 'sl-project-detail',
  imports: [
    WhenPipe,
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatTableModule,
    Caution,
    PageState,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './project-detail.html',
  styleUrl: './project-detail.scss',
})
export class ProjectDetail {
  private readonly api = inject(ProjectsApi);
  protected readonly auth = inject(Auth);

  /** The project id from the route. */
  readonly id = input.required<string>();
  protected readonly projectId = computed(() => Number(this.id()));
  private readonly tick = signal(0);
  private readonly key$ = combineLatest([toObservable(this.projectId), toObservable(this.tick)]);

  protected readonly project = toSignal(
    this.key$.pipe(switchMap(([id]) => loadState(this.api.get(id)))),
    { initialValue: { state: 'loading' as const } },
  );
  protected readonly batches = toSignal(
    this.key$.pipe(switchMap(([id]) => followBatches(() => this.api.batches(id)))),
    { initialValue: { state: 'loading' } satisfies BatchList },
  );

  protected readonly canSubmit = computed(() => this.auth.hasRole('admin', 'engineer'));
  protected readonly columns = ['name', 'status', 'progress', 'submitted', 'review'];

  protected reload(): void {
    this.tick.update((n) => n + 1);
  }

  /** Who submitted the batch, by name ("(you)" for the signed-in user). */
  protected submitter(b: Batch): string {
    return userName(b.submitter, this.auth.user()?.id);
  }
}
