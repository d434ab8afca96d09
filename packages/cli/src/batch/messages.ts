/** Messages between the batch command and its worker threads. */
import type { ExportRecord, Section } from '@scarpline/core';

export interface Task {
  index: number;
  section: Section;
  /** Where to write the section's drawing; null for none. */
  svgPath: string | null;
  units: 'si' | 'us' | null;
}

/**
 * A worker's answer: the result as JSON text (for results.json) and the station's rows of the
 * results table, one per case and then the station's (small, so that a long corridor stays
 * small in memory), or why it failed.
 */
export type Reply =
  | { index: number; ok: true; json: string; records: ExportRecord[] }
  | { index: number; ok: false; error: string };
