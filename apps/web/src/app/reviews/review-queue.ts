import { VERDICT_WORDS } from '@scarpline/core/verdict';
import { dateTimeText } from '../shared/date-time';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { userName } from '../core/user-name';
import { Auth } from '../core/auth';
import { Caution } from '../shared/caution';
import { loadState, type Loaded } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import { ReviewsApi, type QueuedBatch } from './reviews-api';

interface Row {
  item: QueuedBatch;
  by: string;
  when: string;
  finished: string;
}

const at = dateTimeText;

/** The finished batches that wait for a review; one's own submissions listed apart. */
@Component({
  selector: 'sl-review-queue',
  imports: [Caution, MatIconModule, PageState, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="sl-page">
      <h1>To review</h1>
      <p class="lead">
        Finished batches whose review is pending, oldest first. Open a batch to sign off or return
        it, or review its sections one by one.
      </p>
      <sl-caution />
      @if (loaded().state !== 'ready') {
        <sl-page-state
          [state]="loaded().state"
          [problem]="problem()"
          loadingText="Looking for batches to review…"
          (retry)="tries.set(tries() + 1)"
        />
      } @else if (others().length === 0 && mine().length === 0) {
        <div data-testid="review-queue">
          <sl-page-state state="empty" emptyText="Nothing waits for review" />
        </div>
      } @else {
        <div data-testid="review-queue">
          @for (g of groups(); track g.key) {
            @if (g.heading) {
              <h2>{{ g.heading }}</h2>
            }
            @if (g.rows.length === 0) {
              <sl-page-state state="empty" [emptyText]="g.emptyText" />
            } @else {
              <div class="scroll sl-card" tabindex="0" role="region" [attr.aria-label]="g.label">
                <table [attr.data-group]="g.key">
                  <thead>
                    <tr>
                      <th scope="col">Batch</th>
                      <th scope="col">Project</th>
                      <th scope="col" class="sl-num">Stations</th>
                      <th scope="col" class="sl-num">Below required FS</th>
                      <th scope="col">Submitted</th>
                      <th scope="col">Finished</th>
                    </tr>
                  </thead>
                  <tbody>
                    @for (r of g.rows; track r.item.batch.id) {
                      <tr data-testid="review-queue-row">
                        <th scope="row">
                          <a [routerLink]="['/batches', r.item.batch.id]">{{
                            r.item.batch.name
                          }}</a>
                          @if (r.item.batch.title) {
                            <div class="title">{{ r.item.batch.title }}</div>
                          }
                        </th>
                        <td>{{ r.item.project.name }}</td>
                        <td class="sl-num">{{ r.item.batch.progress.total }}</td>
                        <td class="sl-num">
                          @if (r.item.batch.progress.belowRequiredFs > 0) {
                            <span class="sl-fail fails">
                              <mat-icon aria-hidden="true">cancel</mat-icon>
                              {{ r.item.batch.progress.belowRequiredFs }} {{ belowWords }}
                            </span>
                          } @else {
                            <span class="sl-pass fails">
                              <mat-icon aria-hidden="true">check_circle</mat-icon> none
                            </span>
                          }
                          @if (r.item.batch.progress.failed > 0) {
                            <div class="unsolved">
                              {{ r.item.batch.progress.failed }} not solved
                            </div>
                          }
                        </td>
                        <td>
                          {{ r.by }}
                          <div class="when">{{ r.when }}</div>
                        </td>
                        <td>{{ r.finished }}</td>
                      </tr>
                    }
                  </tbody>
                </table>
              </div>
            }
          }
        </div>
      }
    </div>
  `,
  styles: `
    h1 {
      margin: 4px 0 4px;
    }
    h2 {
      font-size: 18px;
      margin: 24px 0 8px;
    }
    .lead {
      color: var(--sl-ink-soft);
      margin: 0 0 16px;
    }
    .scroll {
      overflow-x: auto;
      padding: 4px 8px;
    }
    table {
      border-collapse: collapse;
      width: 100%;
      min-width: 680px;
      font-size: 14px;
    }
    th,
    td {
      padding: 8px 10px;
      border-bottom: 1px solid var(--sl-line);
      text-align: left;
      vertical-align: top;
    }
    thead th {
      color: var(--sl-muted);
      font-weight: 600;
      font-size: 13px;
    }
    tbody th {
      font-weight: 500;
    }
    .sl-num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
    .title,
    .when,
    .unsolved {
      font-size: 13px;
      color: var(--sl-muted);
      font-weight: 400;
    }
    .fails {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      font-weight: 600;
    }
    .fails mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
    }
  `,
})
export class ReviewQueue {
  private readonly api = inject(ReviewsApi);
  private readonly auth = inject(Auth);

  protected readonly belowWords = VERDICT_WORDS.below;
  protected readonly tries = signal(0);
  protected readonly loaded = toSignal(
    toObservable(this.tries).pipe(switchMap(() => loadState(this.api.pending()))),
    { initialValue: { state: 'loading' } satisfies Loaded<QueuedBatch[]> },
  );
  protected readonly problem = computed(() => {
    const l = this.loaded();
    return l.state === 'error' ? l.problem : null;
  });

  private readonly rows = computed((): Row[] => {
    const l = this.loaded();
    if (l.state !== 'ready') return [];
    const me = this.auth.user()?.id;
    return [...l.value]
      .sort((a, b) =>
        (a.batch.finishedAt ?? a.batch.createdAt).localeCompare(
          b.batch.finishedAt ?? b.batch.createdAt,
        ),
      )
      .map((item) => ({
        item,
        by: userName(item.batch.submitter, me),
        when: at(item.batch.createdAt),
        finished: at(item.batch.finishedAt),
      }));
  });
  protected readonly mine = computed(() =>
    this.rows().filter((r) => r.item.batch.submittedBy === this.auth.user()?.id),
  );
  protected readonly others = computed(() =>
    this.rows().filter((r) => r.item.batch.submittedBy !== this.auth.user()?.id),
  );

  protected readonly groups = computed(() => {
    const mine = this.mine();
    const groups = [
      {
        key: 'others',
        heading: null as string | null,
        label: 'Batches waiting for review',
        emptyText: 'Nothing waits for review by you',
        rows: this.others(),
      },
    ];
    if (mine.length) {
      groups.push({
        key: 'mine',
        heading: 'Submitted by you (another reviewer signs off)',
        label: 'Submitted by you: another reviewer signs off',
        emptyText: '',
        rows: mine,
      });
    }
    return groups;
  });
}
