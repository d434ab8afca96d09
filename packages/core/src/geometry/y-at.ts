import type { Polyline } from '../model/types';

/**
 * Elevation of a polyline at x by linear interpolation; flat beyond its ends. Where a
 * polyline has a vertical step (two vertices at the same x) the lower-index vertex wins
 * from the left and the higher-index vertex from the right of that x.
 *
 * @example yAt([[0, 0], [10, 5]], 4) // → 2
 */
export function yAt(line: Polyline, x: number): number {
  const n = line.length;
  if (x <= line[0][0]) return line[0][1];
  if (x >= line[n - 1][0]) return line[n - 1][1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (line[mid][0] <= x) lo = mid;
    else hi = mid;
  }
  const [x0, y0] = line[lo];
  const [x1, y1] = line[hi];
  const dx = x1 - x0;
  return dx > 0 ? y0 + ((y1 - y0) * (x - x0)) / dx : y1;
}
