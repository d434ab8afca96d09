import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';

/**
 * Placeholder: the review state of a batch or a section, with sign-off / return for a
 * reviewer (never on their own submission). Inputs and output are fixed; the body is to come.
 */
@Component({
  selector: 'sl-review-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '',
})
export class ReviewPanel {
  /** What is reviewed. */
  readonly kind = input.required<'batch' | 'section'>();
  /** The batch or section id. */
  readonly targetId = input.required<number>();
  /** The user id who submitted the batch (a reviewer may not review their own). */
  readonly submittedBy = input<number | null>(null);
  /** The review as the API returns it inside the batch or section (null: none yet). */
  readonly review = input<unknown>(null);
  /** False while the batch is still running: no sign-off yet. */
  readonly finished = input(true);
  /** Emits after a decision was recorded, so the page reloads. */
  readonly changed = output<void>();
}
