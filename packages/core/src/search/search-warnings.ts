import type { Warning } from '../result';
import type { SearchOutcome } from './search-section';

/**
 * What a search tells the engineer besides its surface: that it found no admissible surface,
 * and that its least FS is still on the edge of the grid after every move allowed.
 *
 * @example searchWarnings(searchSection(prepared, spec)).map((w) => w.code)
 */
export function searchWarnings(found: SearchOutcome): Warning[] {
  const warnings: Warning[] = [];
  if (!found.circle) {
    warnings.push({
      code: 'no-surface',
      message:
        'the search found no admissible slip surface: check the grid, the radii and the ground ranges',
    });
  }
  if (found.onEdge) {
    warnings.push({
      code: 'minimum-on-edge',
      message: `the lowest factor of safety is still on the edge of the search grid after ${found.grid?.moves.length ?? 0} moves: the true minimum may lie outside it; widen the grid`,
    });
  }
  return warnings;
}
