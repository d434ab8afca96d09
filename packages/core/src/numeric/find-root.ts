import { brent, type RootResult } from './brent';

/**
 * A root of f scanned for on the points `grid` (ascending): the first sign change from
 * the point nearest `start` outward, then refined by Brent's method. Points where f is
 * not finite are skipped; a root that `accept` refuses (a pole, say) is passed over. Used where a residual is known to be monotonic only near the
 * physical root (factors of safety, interslice force ratios).
 *
 * @example findRoot((F) => 1.3 - F, [0.1, 0.5, 1, 2, 5], 1).x // → 1.3
 */
export function findRoot(
  f: (x: number) => number,
  grid: readonly number[],
  start: number,
  tol = 1e-10,
  accept: (x: number) => boolean = () => true,
): RootResult & { evaluations: number } {
  const n = grid.length;
  const vals = new Array<number>(n).fill(NaN);
  let evaluations = 0;
  const at = (i: number) => {
    if (Number.isNaN(vals[i])) {
      const v = f(grid[i]);
      evaluations++;
      vals[i] = Number.isFinite(v) ? v : Infinity;
    }
    return vals[i];
  };
  let k = 0;
  while (k + 1 < n && grid[k + 1] <= start) k++;
  // walk outward from k: intervals [k, k+1], [k−1, k], [k+1, k+2], …
  for (let step = 0; step < 2 * n; step++) {
    const i = step % 2 === 0 ? k + step / 2 : k - (step + 1) / 2;
    if (i < 0 || i + 1 >= n) {
      if (k + step / 2 >= n && k - (step + 1) / 2 < 0) break;
      continue;
    }
    const fa = at(i);
    const fb = at(i + 1);
    if (!Number.isFinite(fa) || !Number.isFinite(fb)) continue;
    if (fa === 0 && accept(grid[i]))
      return { x: grid[i], converged: true, iterations: 0, evaluations };
    if (fa * fb < 0) {
      const r = brent(f, grid[i], grid[i + 1], tol, 100, fa, fb);
      evaluations += r.iterations;
      if (r.converged && accept(r.x)) return { ...r, evaluations };
    }
  }
  return { x: NaN, converged: false, iterations: 0, evaluations };
}
