import { yAt } from '../geometry/y-at';
import type { Point, Polyline } from '../model/types';

/**
 * The parts of a circle that lie below the ground (within the ground's x-range), as
 * polylines sampled every few degrees along the lower half: how a trial circle is drawn
 * when only its centre and radius are known.
 *
 * @example circleBelowGround([20, 40], 15, [[0, 30], [50, 30]]) // → one arc from x ≈ 8.8 to 31.2
 */
export function circleBelowGround(
  center: Point,
  radius: number,
  ground: Polyline,
  steps = 180,
): Point[][] {
  const x0 = ground[0][0];
  const x1 = ground[ground.length - 1][0];
  const runs: Point[][] = [];
  let run: Point[] = [];
  for (let k = 0; k <= steps; k++) {
    const t = Math.PI + (Math.PI * k) / steps; // lower half, left to right
    const p: Point = [center[0] + radius * Math.cos(t), center[1] + radius * Math.sin(t)];
    const inside = p[0] >= x0 && p[0] <= x1 && p[1] <= yAt(ground, p[0]);
    if (inside) run.push(p);
    else if (run.length) {
      if (run.length > 1) runs.push(run);
      run = [];
    }
  }
  if (run.length > 1) runs.push(run);
  return runs;
}
