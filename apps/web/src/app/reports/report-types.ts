/** The report shapes of the API (schemas/openapi.json `Report`; apps/api services/reports). */
import type { JobState } from '@scarpline/core/verdict';

/** A corridor report's section pages: every station's, those below requirement, or none. */
export type Appendix = 'all' | 'below' | 'none';

/** The state of a report's making: the core's job states (queued, running, done, failed). */
export type ReportStatus = JobState;

/** One PDF report: a section's (made on request) or a corridor's (made by a worker job). */
export interface Report {
  id: number;
  kind: 'section' | 'corridor';
  batchId: number;
  sectionId: number | null;
  /** The section's run a section report shows; null for a corridor report. */
  run: number | null;
  /** A corridor report's section pages; null for a section report. */
  appendix: Appendix | null;
  status: ReportStatus;
  /** The section pages laid out so far, of all it will have. */
  progress: { done: number; total: number };
  /** The review the report records; null: made before any review applied. */
  reviewId: number | null;
  /** The user id of who asked for it. */
  requestedBy: number;
  /** Why a failed report was not made. */
  reason: string | null;
  createdAt: string;
  finishedAt: string | null;
  /** Where to download it once done (GET /reports/{id}/file); null until then. */
  download: string | null;
  caution: string;
}

/** GET /batches/{id}/reports: the batch's corridor reports, newest first. */
export interface ReportList {
  reports: Report[];
  caution: string;
}
