import { WhenPipe } from '../shared/date-time';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { catchError, from, map, mergeMap, of, scan, startWith, switchMap } from 'rxjs';
import type { Batch } from '../batches/batch-types';
import { Auth } from '../core/auth';
import type { Project } from '../core/models';
import { toProblem } from '../core/problem';
import { Caution } from '../shared/caution';
import { loadState, valueOf } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { ProjectsApi } from './projects-api';

/** What the list shows of a project's batches: how many, and the newest one. */
export interface BatchSummary {
  count: number;
  latest: Batch | null;
  running: number;
}

export function summarise(batches: readonly Batch[]): BatchSummary {
  // The API lists a project's batches newest first.
  return {
    count: batches.length,
    latest: batches[0] ?? null,
    running: batches.filter((b) => b.status === 'running').length,
  };
}

/** The projects the user can see, each with its batches at a glance; a new one for staff. */
@Component({
  selector: 'sl-project-list',
  imports: [
    WhenPipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    Caution,
    PageState,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './project-list.html',
  styleUrl: './project-list.scss',
})
export class ProjectList {
  private readonly api = inject(ProjectsApi);
  private readonly router = inject(Router);
  protected readonly auth = inject(Auth);

  private readonly tick = signal(0);
  protected readonly loaded = toSignal(
    toObservable(this.tick).pipe(switchMap(() => loadState(this.api.list()))),
    { initialValue: { state: 'loading' as const } },
  );
  protected readonly projects = computed(() => valueOf(this.loaded()) ?? []);
  protected readonly pageState = computed(() => {
    const l = this.loaded();
    if (l.state !== 'ready') return l.state;
    return l.value.length === 0 ? 'empty' : 'ready';
  });

  /** Each project's batches, read a few at a time once the list is there (null: failed). */
  protected readonly summaries = toSignal(
    toObservable(this.projects).pipe(
      switchMap((list) =>
        from(list).pipe(
          mergeMap(
            (p: Project) =>
              this.api.batches(p.id).pipe(
                map((b) => [p.id, summarise(b)] as const),
                catchError(() => of([p.id, null] as const)),
              ),
            4,
          ),
          scan((acc, [id, s]) => new Map(acc).set(id, s), new Map<number, BatchSummary | null>()),
          startWith(new Map<number, BatchSummary | null>()),
        ),
      ),
    ),
    { initialValue: new Map<number, BatchSummary | null>() },
  );

  protected readonly canCreate = computed(() => this.auth.hasRole('admin', 'engineer'));
  protected readonly creating = signal(false);
  protected readonly busy = signal(false);
  protected readonly createError = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(200)]],
    description: ['', Validators.maxLength(2000)],
  });

  protected reload(): void {
    this.tick.update((n) => n + 1);
  }

  protected summaryOf(id: number): BatchSummary | null | undefined {
    return this.summaries().get(id);
  }

  protected create(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, description } = this.form.getRawValue();
    this.busy.set(true);
    this.createError.set(null);
    this.api
      .create({
        name: name.trim(),
        ...(description.trim() ? { description: description.trim() } : {}),
      })
      .subscribe({
        next: (p) => {
          this.busy.set(false);
          void this.router.navigate(['/projects', p.id]);
        },
        error: (err: unknown) => {
          this.busy.set(false);
          const p = toProblem(err);
          this.createError.set(p.detail ? `${p.title}: ${p.detail}` : p.title);
        },
      });
  }

  protected cancel(): void {
    this.creating.set(false);
    this.createError.set(null);
  }
}
