import type { Point, Polyline } from '../model/types';
import { valueAt } from '../model/value-at';

function hasVertexAt(line: Polyline, x: number): boolean {
  return line.some((p) => p[0] === x);
}

/**
 * Pointwise minimum of two polylines over their common x-range, with a vertex added wherever
 * they cross. Both inputs must have x non-decreasing; a vertical step (two vertices at the same
 * x) is kept as a step. The result keeps the vertices of whichever polyline is the lower one
 * there, and is empty when the x-ranges do not overlap. Used to clip a stratum boundary under
 * the ground and under the boundary above it.
 *
 * @example
 * lowerEnvelope([[0, 0], [10, 10]], [[0, 5], [10, 5]]);
 * // → [[0, 0], [5, 5], [10, 5]]
 */
export function lowerEnvelope(a: Polyline, b: Polyline): Polyline {
  if (a.length === 0 || b.length === 0) return [];
  const lo = Math.max(a[0][0], b[0][0]);
  const hi = Math.min(a[a.length - 1][0], b[b.length - 1][0]);
  if (lo > hi) return [];
  if (lo === hi) {
    return [[lo, Math.min(valueAt(a, lo, 'right'), valueAt(b, lo, 'right'))]];
  }

  const xs = new Set<number>([lo, hi]);
  for (const p of a) if (p[0] > lo && p[0] < hi) xs.add(p[0]);
  for (const p of b) if (p[0] > lo && p[0] < hi) xs.add(p[0]);
  const breaks = [...xs].sort((u, v) => u - v);

  const out: Polyline = [];
  const push = (p: Point): void => {
    const last = out[out.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) out.push(p);
  };

  for (let k = 0; k < breaks.length; k++) {
    const x = breaks[k];
    const aL = valueAt(a, x, 'left');
    const bL = valueAt(b, x, 'left');
    const aR = valueAt(a, x, 'right');
    const bR = valueAt(b, x, 'right');
    const left = Math.min(aL, bL);
    const right = Math.min(aR, bR);
    // Keep a vertex only where the lower polyline has one (or the envelope steps or ends there);
    // a vertex of the upper polyline would only add a collinear point.
    const lowerHasVertex =
      ((aL === left || aR === right) && hasVertexAt(a, x)) ||
      ((bL === left || bR === right) && hasVertexAt(b, x));
    if (k === 0) push([x, right]);
    else if (k === breaks.length - 1) push([x, left]);
    else if (left !== right) {
      push([x, left]);
      push([x, right]);
    } else if (lowerHasVertex) push([x, left]);

    if (k + 1 < breaks.length) {
      // Between two breaks both polylines are straight: they cross at most once.
      const x1 = breaks[k + 1];
      const a1 = valueAt(a, x1, 'left');
      const b1 = valueAt(b, x1, 'left');
      const d0 = aR - bR;
      const d1 = a1 - b1;
      if ((d0 < 0 && d1 > 0) || (d0 > 0 && d1 < 0)) {
        const t = d0 / (d0 - d1);
        push([x + t * (x1 - x), aR + t * (a1 - aR)]);
      }
    }
  }
  return out;
}
