/** Messages between the batch command and its worker threads. */
import type { ExportRecord, Section, SheetSpec } from '@scarpline/core';

export interface Task {
  index: number;
  section: Section;
  /** Where to write the section's drawing; null for none. */
  svgPath: string | null;
  units: 'si' | 'us' | null;
  /** Answer with the section's slice sheet for results.xlsx too. */
  sliceSheet: boolean;
}

/**
 * A worker's answer: the result as JSON text (for results.json) and the station's rows of the
 * results table, one per case and then the station's (small, so that a long corridor stays
 * small in memory), and when asked its slice sheet of results.xlsx (named after the section: the
 * main thread makes the names unique), or why it failed.
 */
export type Reply =
  | { index: number; ok: true; json: string; records: ExportRecord[]; slices: SheetSpec | null }
  | { index: number; ok: false; error: string };
