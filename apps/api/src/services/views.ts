/** Small pieces shared by the section views, the lists and the exports. */
import { chainageLabel, type Section } from '@scarpline/core';
import type { ResultRow, SectionRow } from '../models';

/** A station as chainage in the units of the section's file ("1+240"); null without one. */
export function stationLabel(s: SectionRow): string | null {
  return s.station === null ? null : chainageLabel(s.station, (s.input as Section).units ?? 'si');
}

/** true / false against the required FS; null when none is required or nothing was solved. */
export function passes(r: ResultRow | null | undefined): boolean | null {
  return r?.status === 'pass' ? true : r?.status === 'fail' ? false : null;
}
