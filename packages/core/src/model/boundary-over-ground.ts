import type { RawBoundary } from './raw-section';
import type { Polyline } from './types';
import { valueAt } from './value-at';

/**
 * A boundary (a constant elevation or a polyline) as a polyline over exactly the ground's
 * x-range: a constant becomes a level line, a polyline is cut at the ground's ends (the value
 * just inside the range is kept where a vertical step falls on an end). The polyline must
 * already span the range.
 *
 * @example boundaryOverGround(8, [[0, 20], [50, 30]]) // → [[0, 8], [50, 8]]
 */
export function boundaryOverGround(boundary: RawBoundary, ground: Polyline): Polyline {
  const x0 = ground[0][0];
  const x1 = ground[ground.length - 1][0];
  if (typeof boundary === 'number') {
    return [
      [x0, boundary],
      [x1, boundary],
    ];
  }
  const out: Polyline = [[x0, valueAt(boundary, x0, 'right')]];
  for (const [x, y] of boundary) if (x > x0 && x < x1) out.push([x, y]);
  out.push([x1, valueAt(boundary, x1, 'left')]);
  return out;
}
