import { dateTimeText } from '../shared/date-time';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Auth } from '../core/auth';
import { toProblem } from '../core/problem';
import type { Problem } from '../core/models';
import type { Decision, ReviewEntry, ReviewState, ReviewSummary } from './review-types';
import { ReviewsApi } from './reviews-api';

const STATE_WORDS: Record<ReviewState, { icon: string; text: string }> = {
  pending: { icon: 'hourglass_empty', text: 'pending' },
  approved: { icon: 'verified', text: 'approved' },
  returned: { icon: 'undo', text: 'returned' },
};

export function reviewerName(r: ReviewEntry): string {
  return r.reviewer.name ?? `user #${r.reviewer.id}`;
}

let panels = 0;

const at = dateTimeText;

/**
 * The review state of a batch or a section (pending, approved or returned: by whom, when,
 * the comment), and for a reviewer or an admin a comment with "Sign off" and "Return". Never
 * on one's own submission, and not before the run has finished.
 */
@Component({
  selector: 'sl-review-panel',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './review-panel.html',
  styleUrl: './review-panel.scss',
})
export class ReviewPanel {
  private readonly api = inject(ReviewsApi);
  private readonly auth = inject(Auth);
  private readonly snack = inject(MatSnackBar);

  /** What is reviewed. */
  readonly kind = input.required<'batch' | 'section'>();
  /** The batch or section id. */
  readonly targetId = input.required<number>();
  /** The user id who submitted the batch (a reviewer may not review their own). */
  readonly submittedBy = input<number | null>(null);
  /** The review as the API returns it inside the batch or section (null: none yet). */
  readonly review = input<ReviewSummary | null>(null);
  /** False while the batch is still running: no sign-off yet. */
  readonly finished = input(true);
  /** For a section: the review of its whole batch, shown beside the section's own. */
  readonly batchReview = input<ReviewSummary | null>(null);
  /** Emits after a decision was recorded, so the page reloads. */
  readonly changed = output<void>();

  protected readonly uid = `sl-review-${++panels}`;
  protected readonly comment = new FormControl('', {
    nonNullable: true,
    validators: [Validators.maxLength(5000)],
  });
  protected readonly busy = signal(false);
  protected readonly problem = signal<Problem | null>(null);
  protected readonly needComment = signal(false);

  protected readonly state = computed<ReviewState>(() => this.review()?.state ?? 'pending');
  protected readonly words = computed(() => STATE_WORDS[this.state()]);
  protected readonly latest = computed(() => this.review()?.latest ?? null);
  protected readonly earlier = computed(() => {
    const r = this.review();
    if (!r) return [];
    return r.history.filter((h) => h.id !== r.latest?.id);
  });
  protected readonly batchWords = computed(() => {
    const b = this.batchReview();
    return b ? STATE_WORDS[b.state] : null;
  });

  /** Admins and reviewers decide; everyone else only reads. */
  protected readonly mayReview = computed(() => this.auth.hasRole('admin', 'reviewer'));
  protected readonly own = computed(() => {
    const me = this.auth.user();
    const by = this.submittedBy();
    return me !== null && by !== null && me.id === by;
  });

  protected readonly reviewerName = reviewerName;
  protected readonly at = at;

  protected decide(decision: Decision): void {
    this.problem.set(null);
    const text = this.comment.value.trim();
    if (decision === 'returned' && text === '') {
      this.needComment.set(true);
      this.comment.markAsTouched();
      return;
    }
    if (this.comment.invalid) return;
    this.needComment.set(false);
    this.busy.set(true);
    this.api.review(this.kind(), this.targetId(), { decision, comment: text }).subscribe({
      next: () => {
        this.busy.set(false);
        this.comment.reset('');
        const what = this.kind() === 'batch' ? 'Batch' : 'Section';
        this.snack.open(
          decision === 'approved' ? `${what} signed off.` : `${what} returned with your comment.`,
          'OK',
          { duration: 4000 },
        );
        this.changed.emit();
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.problem.set(toProblem(err));
      },
    });
  }
}
