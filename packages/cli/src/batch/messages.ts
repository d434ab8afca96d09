/** Messages between the batch command and its worker threads. */
import type { Section } from '@scarpline/core';

export interface Task {
  index: number;
  section: Section;
  /** Where to write the section's drawing; null for none. */
  svgPath: string | null;
  units: 'si' | 'us' | null;
}

/** What the batch keeps of a section: small, so that a long corridor stays small in memory. */
export interface Summary {
  id: string;
  station: number | null;
  case: string | null;
  governing: string | null;
  fs: number | null;
  requiredFs: number | null;
  passes: boolean | null;
  warnings: number;
  reason: string | null;
}

export type Reply =
  | { index: number; ok: true; json: string; summary: Summary }
  | { index: number; ok: false; error: string };
