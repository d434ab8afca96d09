/**
 * The kind of a design case in words, as tables and headings show it: the trade's names of the
 * design conditions (the core's CASE_KINDS codes, written out).
 */
import type { CaseKind } from '@scarpline/core/result';

export const CASE_KIND_WORDS: Readonly<Record<CaseKind, string>> = {
  'end-of-construction': 'end of construction',
  'long-term': 'long term',
  'steady-seepage': 'steady seepage',
  'rapid-drawdown': 'rapid drawdown',
  seismic: 'seismic',
  surcharge: 'surcharge',
  other: 'other',
};

/** The kind in words; a code this app does not know is shown as it came. */
export function caseKindWords(kind: string): string {
  return (CASE_KIND_WORDS as Record<string, string | undefined>)[kind] ?? kind;
}
