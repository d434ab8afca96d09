/** The review shapes of the API (services/reviews.ts) and the batch fields the queue reads. */
import type { UserRef } from '../batches/batch-types';

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

export type BatchStatus = 'running' | 'done' | string;

/** A batch as GET /batches/{id} and GET /projects/{id}/batches give it (batchView). */
export interface BatchSummary {
  id: number;
  projectId: number;
  name: string;
  title: string | null;
  status: BatchStatus;
  source: string;
  /** The user who submitted it: they may not review it. */
  submittedBy: number;
  /** Who submitted it, by name. */
  submitter: UserRef;
  createdAt: string;
  finishedAt: string | null;
  progress: {
    total: number;
    done: number;
    failed: number;
    queued: number;
    running: number;
    belowRequiredFs: number;
    fraction: number;
  };
  review: ReviewSummary;
  caution: string;
}
