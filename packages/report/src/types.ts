import type { Section } from '@scarpline/core/model';
import type { StationProbability, StationResult } from '@scarpline/core/result';

/** Who checked the calculation and what they decided; null/absent: not reviewed. */
export interface ReviewRecord {
  /** e.g. 'not reviewed' | 'approved' | 'returned' | 'awaiting review' (words shown as given) */
  state: string;
  reviewer?: string;
  /** ISO */
  date?: string;
  decision?: string;
  comment?: string;
}

export interface ReportMeta {
  project?: string;
  corridor?: string;
  /** batch name / file name */
  source?: string;
  run?: number;
  /** ISO, the report's date */
  date: string;
  solverVersion: string;
  submittedBy?: string;
  review?: ReviewRecord | null;
}

export interface SectionReportInput {
  /** the normalised section (SI) as analyzeSection takes it */
  section: Section;
  /** analyzeSection's result */
  result: StationResult;
  /**
   * The probability of failure of each case on its critical surface (stationProbability's
   * summary), where the section asks for it; absent or null: none shown.
   */
  probability?: StationProbability[] | null;
  meta: ReportMeta;
}

export interface CorridorStation {
  section: Section;
  /** null: not analysed (failed / waiting) — `reason` says why */
  result: StationResult | null;
  reason?: string;
  /** the station's probability of failure by case (stationProbability's summary), or none */
  probability?: StationProbability[] | null;
  /** the section's own run, submitter and review record */
  meta: ReportMeta;
}

export interface CorridorReportInput {
  /** the corridor's (the batch's) record; review = the batch's sign-off */
  meta: ReportMeta;
  stations: CorridorStation[];
  /** section pages of every station / of those below requirement / none */
  appendix: 'all' | 'below' | 'none';
  /**
   * Stations of the corridor's file that did not read (no section to show): counted among the
   * stations not analysed, with why. Optional, beside the interface the service builds on.
   */
  unread?: { label: string; station: number | null; reason: string }[];
  /** called as section pages are laid out */
  onProgress?: (done: number, total: number) => void;
}
