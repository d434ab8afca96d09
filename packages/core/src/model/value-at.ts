import type { Polyline } from './types';

/**
 * The elevation of a polyline (x non-decreasing) at x, approached from the left or from the
 * right. Where several vertices share x (a vertical step) the first is the value from the left
 * and the last the value from the right; beyond the ends the polyline is flat.
 *
 * @example valueAt([[0, 0], [5, 0], [5, 3], [10, 3]], 5, 'left') // → 0 (and 3 from the right)
 */
export function valueAt(line: Polyline, x: number, side: 'left' | 'right'): number {
  const n = line.length;
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (line[mid][0] < x) lo = mid + 1;
    else hi = mid;
  }
  if (lo < n && line[lo][0] === x) {
    if (side === 'left') return line[lo][1];
    let last = lo;
    while (last + 1 < n && line[last + 1][0] === x) last++;
    return line[last][1];
  }
  if (lo === 0) return line[0][1];
  if (lo === n) return line[n - 1][1];
  const [x0, y0] = line[lo - 1];
  const [x1, y1] = line[lo];
  return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
}
