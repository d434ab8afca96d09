import { yAt } from '../geometry/y-at';
import type { Point, Polyline } from '../model/types';
import { nelderMead } from '../numeric/nelder-mead';
import { seededRandom } from '../numeric/seeded-random';
import type { NoncircularSettings } from './search-settings';
import type { CircleTrial } from './trials';

export interface NoncircularOutcome {
  points: Polyline;
  fs: number;
  trials: number;
  restarts: number;
}

/**
 * Noncircular search: a polyline of a few vertices, started from the best circle (its ends
 * on the ground, its inner vertices on the arc) and optimised by the Nelder–Mead simplex on
 * the two end abscissae and the inner vertices' elevations, then from random restarts around
 * the best so far (a multistart scheme). Every trial is kept kinematically admissible or
 * refused: x increasing, the surface concave upward (segment slopes never decreasing from
 * left to right), ends on the ground inside the section; the slicer refuses surfaces that
 * come out of the ground and makes those that dip into a rigid base follow its top.
 *
 * @example noncircularSearch(ground, best, settings, (pts) => spencerFs(pts)).fs
 */
export function noncircularSearch(
  ground: Polyline,
  start: CircleTrial,
  ends: [number, number],
  settings: NoncircularSettings,
  evaluate: (points: Polyline) => number,
): NoncircularOutcome | null {
  const nv = settings.vertices;
  const [xc, yc] = start.center;
  const r = start.radius;
  const xMin = ground[0][0];
  const xMax = ground[ground.length - 1][0];
  const L = ends[1] - ends[0];
  if (!(L > 0)) return null;
  let trials = 0;
  const build = (p: readonly number[]): Polyline | null => {
    const xl = p[0];
    const xr = p[1];
    if (!(xr - xl > 0.05 * L) || xl < xMin || xr > xMax) return null;
    const pts: Point[] = [[xl, yAt(ground, xl)]];
    for (let i = 1; i < nv - 1; i++) pts.push([xl + ((xr - xl) * i) / (nv - 1), p[1 + i]]);
    pts.push([xr, yAt(ground, xr)]);
    let prev = -Infinity;
    for (let i = 0; i + 1 < pts.length; i++) {
      const slope = (pts[i + 1][1] - pts[i][1]) / (pts[i + 1][0] - pts[i][0]);
      if (slope < prev - 1e-12) return null;
      prev = slope;
    }
    return pts;
  };
  const objective = (p: number[]) => {
    const pts = build(p);
    if (!pts) return Infinity;
    trials++;
    const f = evaluate(pts);
    return f > 0 ? f : Infinity;
  };
  const p0 = [ends[0], ends[1]];
  for (let i = 1; i < nv - 1; i++) {
    const x = ends[0] + (L * i) / (nv - 1);
    p0.push(yc - Math.sqrt(Math.max(0, r * r - (x - xc) ** 2)));
  }
  let depth = 0;
  for (let i = 2; i < p0.length; i++)
    depth = Math.max(depth, yAt(ground, ends[0] + (L * (i - 1)) / (nv - 1)) - p0[i]);
  depth = Math.max(depth, 0.05 * L);
  const step = [0.05 * L, 0.05 * L, ...new Array<number>(nv - 2).fill(0.15 * depth)];
  let best = nelderMead(objective, p0, step, 1e-7, 600);
  const rand = seededRandom(settings.seed);
  for (let k = 0; k < settings.restarts; k++) {
    const q = best.x.map((v, i) => v + (rand() - 0.5) * (i < 2 ? 0.3 * L : 1.2 * depth));
    if (!Number.isFinite(objective(q))) continue;
    const run = nelderMead(objective, q, step, 1e-7, 600);
    if (run.fx < best.fx) best = run;
  }
  const points = build(best.x);
  if (!points || !Number.isFinite(best.fx)) return null;
  return { points, fs: best.fx, trials, restarts: settings.restarts };
}
