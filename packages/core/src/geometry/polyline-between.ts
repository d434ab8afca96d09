import type { Polyline } from '../model/types';
import { yAt } from './y-at';

/**
 * The part of a polyline over [xa, xb], with end points interpolated.
 *
 * @example polylineBetween([[0, 0], [10, 10]], 2, 5) // → [[2, 2], [5, 5]]
 */
export function polylineBetween(line: Polyline, xa: number, xb: number): Polyline {
  const out: Polyline = [[xa, yAt(line, xa)]];
  for (const p of line) if (p[0] > xa && p[0] < xb) out.push([p[0], p[1]]);
  out.push([xb, yAt(line, xb)]);
  return out;
}
