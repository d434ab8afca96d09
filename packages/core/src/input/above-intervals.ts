import { lowerEnvelope } from '../geometry/lower-envelope';
import type { Polyline } from '../model/types';
import { valueAt } from '../model/value-at';

/** An x-interval where one polyline is above another, and by how much at most. */
export interface AboveInterval {
  from: number;
  to: number;
  rise: number;
}

/**
 * The x-intervals (over the common x-range) where polyline p lies above polyline q, merged,
 * with the largest height of p over q in each. Differences within `tolerance` count as equal.
 *
 * @example aboveIntervals([[0, 0], [10, 10]], [[0, 5], [10, 5]]) // → [{ from: 5, to: 10, rise: 5 }]
 */
export function aboveIntervals(p: Polyline, q: Polyline, tolerance = 1e-9): AboveInterval[] {
  const env = lowerEnvelope(p, q);
  if (env.length < 2) return [];
  const lo = env[0][0];
  const hi = env[env.length - 1][0];
  const xs = [...new Set([...env.map((v) => v[0]), ...p.map((v) => v[0])])]
    .filter((x) => x >= lo && x <= hi)
    .sort((a, b) => a - b);
  const out: AboveInterval[] = [];
  let open: AboveInterval | null = null;
  for (let k = 0; k + 1 < xs.length; k++) {
    const x0 = xs[k];
    const x1 = xs[k + 1];
    const d0 = valueAt(p, x0, 'right') - valueAt(env, x0, 'right');
    const d1 = valueAt(p, x1, 'left') - valueAt(env, x1, 'left');
    if (d0 > tolerance || d1 > tolerance) {
      const rise = Math.max(d0, d1);
      if (open && open.to === x0) {
        open.to = x1;
        open.rise = Math.max(open.rise, rise);
      } else {
        open = { from: x0, to: x1, rise };
        out.push(open);
      }
    }
  }
  return out;
}
