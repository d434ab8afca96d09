import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { switchMap } from 'rxjs';
import { userName } from '../core/user-name';
import { Auth } from '../core/auth';
import { loadState, type Loaded } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { fsText, when } from './format';
import { methodName } from '../shared/method-names';
import { verdictView } from '../shared/verdict';
import type { RunEntry, RunsView } from './section-types';
import { SectionsApi } from './sections-api';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

/** The edits of a run as lines "materials.clay.strength.frictionAngle → 24". */
export function describeChanges(changes: unknown): string[] {
  if (changes === null || changes === undefined) return [];
  const out: string[] = [];
  const walk = (v: Json, path: string) => {
    if (Array.isArray(v)) {
      out.push(`${path} → ${v.length} points`);
    } else if (v !== null && typeof v === 'object') {
      const entries = Object.entries(v);
      if (entries.length === 0) out.push(`${path} → {}`);
      for (const [k, x] of entries) walk(x, path ? `${path}.${k}` : k);
    } else {
      out.push(`${path} → ${v === null ? 'removed' : String(v)}`);
    }
  };
  // the edits of a run are a JSON merge patch, as the API stored it
  walk(changes as Json, '');
  return out;
}

/** Who started a run: the editor by name ("(you)" for the signed-in user), or the batch. */
export function runBy(entry: RunEntry, me: number | null | undefined): string {
  if (entry.editor) return userName(entry.editor, me);
  // An id without a name on record (users are deactivated, never deleted: not expected).
  if (entry.editedBy !== null) return `user #${entry.editedBy}`;
  return entry.run === 1 ? 'submitted with the batch' : '—';
}

/** Every run of the section, newest first: when, by whom, what was edited, its FS, its verdict. */
@Component({
  selector: 'sl-run-history',
  imports: [MatIconModule, PageState],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @switch (loaded().state) {
      @case ('ready') {
        <div class="scroll" tabindex="0" role="region" aria-label="Runs, scrolls sideways">
          <table data-testid="run-history">
            <thead>
              <tr>
                <th scope="col" class="sl-num">Run</th>
                <th scope="col">When</th>
                <th scope="col">By</th>
                <th scope="col">Edited</th>
                <th scope="col" class="sl-num">Governing FS</th>
                <th scope="col">Against required</th>
              </tr>
            </thead>
            <tbody>
              @for (r of rows(); track r.entry.run) {
                <tr [class.current]="r.entry.current" [attr.data-run]="r.entry.run">
                  <th scope="row" class="sl-num">
                    {{ r.entry.run }}
                    @if (r.entry.current) {
                      <span class="current-mark">current</span>
                    }
                  </th>
                  <td>{{ r.when }}</td>
                  <td>{{ r.by }}</td>
                  <td>
                    @if (r.changes.length === 0) {
                      <span class="muted">{{ r.entry.run === 1 ? 'as submitted' : '—' }}</span>
                    } @else {
                      <ul class="changes">
                        @for (c of r.changes; track $index) {
                          <li>
                            <code>{{ c }}</code>
                          </li>
                        }
                      </ul>
                    }
                  </td>
                  <td class="sl-num">{{ r.fs }}</td>
                  <td>
                    @if (r.verdict; as v) {
                      <span
                        class="verdict"
                        [class.sl-pass]="v.code === 'meets'"
                        [class.sl-fail]="v.code === 'below' || v.code === 'no-fs'"
                        [class.muted]="v.code === 'no-requirement' || v.code === 'input-error'"
                      >
                        <mat-icon aria-hidden="true">{{ v.icon }}</mat-icon> {{ v.words }}
                      </span>
                    } @else {
                      <span class="muted">not finished</span>
                    }
                  </td>
                </tr>
              }
            </tbody>
          </table>
        </div>
      }
      @default {
        <sl-page-state
          [state]="loaded().state"
          [problem]="problem()"
          loadingText="Loading the runs…"
          (retry)="tries.set(tries() + 1)"
        />
      }
    }
  `,
  styles: `
    .scroll {
      overflow-x: auto;
    }
    table {
      border-collapse: collapse;
      width: 100%;
      min-width: 640px;
      font-size: 14px;
    }
    th,
    td {
      padding: 7px 10px;
      border-bottom: 1px solid var(--sl-line);
      text-align: left;
      vertical-align: top;
    }
    thead th {
      color: var(--sl-muted);
      font-weight: 600;
      font-size: 13px;
    }
    .sl-num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
    tr.current {
      background: var(--sl-clay-soft);
    }
    .current-mark {
      display: block;
      font-size: 11px;
      font-weight: 600;
      color: var(--sl-clay);
      text-transform: uppercase;
      letter-spacing: 0.04em;
    }
    .changes {
      margin: 0;
      padding: 0;
      list-style: none;
    }
    code {
      font-size: 12px;
      overflow-wrap: anywhere;
    }
    .muted {
      color: var(--sl-muted);
    }
    .verdict {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      font-weight: 600;
    }
    .verdict mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
    }
  `,
})
export class RunHistory {
  private readonly api = inject(SectionsApi);
  private readonly auth = inject(Auth);

  readonly sectionId = input.required<number>();
  /** Changes when the run or its status changes: the list is fetched again. */
  readonly version = input<string>('');

  protected readonly tries = signal(0);
  private readonly request = computed(() => ({
    id: this.sectionId(),
    version: this.version(),
    tries: this.tries(),
  }));
  protected readonly loaded = toSignal(
    toObservable(this.request).pipe(switchMap(({ id }) => loadState(this.api.runs(id)))),
    { initialValue: { state: 'loading' } satisfies Loaded<RunsView> },
  );
  protected readonly problem = computed(() => {
    const l = this.loaded();
    return l.state === 'error' ? l.problem : null;
  });

  protected readonly rows = computed(() => {
    const l = this.loaded();
    if (l.state !== 'ready') return [];
    const me = this.auth.user()?.id;
    return l.value.runs.map((entry: RunEntry) => {
      const r = entry.result;
      const verdict = r ? verdictView(r.verdict) : null;
      return {
        entry,
        when: when(r?.timings.finishedAt ?? r?.timings.startedAt ?? null),
        by: runBy(entry, me),
        changes: describeChanges(entry.changes),
        fs: r?.governing ? `${fsText(r.governing.fs)} (${methodName(r.governing.method)})` : '—',
        verdict,
      };
    });
  });
}
