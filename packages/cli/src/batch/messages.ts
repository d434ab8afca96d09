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
 * A worker's answer: the result as JSON text (for results.json) and the section's row of the
 * results table (small, so that a long corridor stays small in memory), or why it failed.
 */
export type Reply =
  | { index: number; ok: true; json: string; record: ExportRecord }
  | { index: number; ok: false; error: string };
