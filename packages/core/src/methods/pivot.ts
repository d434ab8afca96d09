import type { Point } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';

/**
 * A moment point for a noncircular surface (sliding orientation): above the middle of the
 * chord between the surface's ends, at half the chord's length above the highest ground.
 * Rigorous methods satisfy moment equilibrium about every point, so the choice only
 * affects the conditioning of the equations (common practice).
 */
export function defaultPivot(s: SliceSet): Point {
  const xa = s.xl[0];
  const xb = s.xr[s.n - 1];
  let top = -Infinity;
  for (let i = 0; i < s.n; i++) top = Math.max(top, s.yTopL[i], s.yTopR[i]);
  return [0.5 * (xa + xb), top + 0.5 * (xb - xa)];
}
