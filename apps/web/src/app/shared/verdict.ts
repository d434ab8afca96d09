/**
 * The verdict of a section as the pages show it: the core's words (an import-free module, so
 * no solver code comes along) with an icon of its own, so that a verdict is never told by
 * colour alone.
 */
import { VERDICT_SHORT, VERDICT_WORDS, type Verdict } from '@scarpline/core/verdict';

export type { Verdict } from '@scarpline/core/verdict';

/** The Material icon of each verdict. */
export const VERDICT_ICONS: Readonly<Record<Verdict, string>> = {
  meets: 'check_circle',
  below: 'cancel',
  'no-fs': 'block',
  'no-requirement': 'remove_circle_outline',
  'no-slope': 'horizontal_rule',
  'input-error': 'report',
};

export interface VerdictView {
  code: Verdict;
  icon: string;
  /** The verdict in words: "below the required FS". */
  words: string;
  /** In a word or two, for a table cell: "below". */
  short: string;
}

/** How a page shows a verdict. */
export function verdictView(v: Verdict): VerdictView {
  return { code: v, icon: VERDICT_ICONS[v], words: VERDICT_WORDS[v], short: VERDICT_SHORT[v] };
}

/** A word with its first letter in capitals, for a button or a heading. */
export function capitalised(word: string): string {
  return word.charAt(0).toUpperCase() + word.slice(1);
}
