/**
 * The review shapes of the API (services/reviews.ts). The batches the queue lists are the
 * batch endpoints' `Batch` (batches/batch-types.ts).
 */

/** The words the API takes in POST …/reviews. */
export type Decision = 'approved' | 'returned';

/** pending: no review applies to the current result yet. */
export type ReviewState = Decision | 'pending';

/** One recorded decision (reviewView in services/reviews.ts). */
export interface ReviewEntry {
  id: number;
  batchId: number;
  sectionId: number | null;
  /** The section's run the decision was about; null for a whole batch. */
  run: number | null;
  scope: 'batch' | 'section';
  decision: Decision;
  comment: string;
  /** The name is missing when the reviewer's account is gone. */
  reviewer: { id: number; name?: string };
  at: string;
}

/** The review of a batch or a section as the API nests it in the batch or section. */
export interface ReviewSummary {
  state: ReviewState;
  latest: ReviewEntry | null;
  history: ReviewEntry[];
}

export interface ReviewBody {
  decision: Decision;
  comment: string;
}

/** The answer to POST …/reviews: the decision recorded, with the caution. */
export interface ReviewRecorded extends ReviewEntry {
  caution: string;
}
