export interface NelderMeadResult {
  x: number[];
  fx: number;
  evaluations: number;
}

/**
 * Minimise f by the Nelder–Mead simplex method (Nelder & Mead 1965, The Computer Journal
 * 7(4); the standard coefficients reflection 1, expansion 2, contraction ½, shrink ½ as in
 * Lagarias et al. 1998, SIAM J. Optim. 9(1)). The first simplex is x0 plus `step[i]` along
 * each axis. f may return Infinity for an inadmissible point. Stops when the simplex's
 * values agree to `tol` or after `maxEvaluations`.
 *
 * (An npm package was preferred here, but the maintained Nelder–Mead implementations either
 * do not load as CommonJS on Node 20 or bring build tools in as runtime dependencies.)
 *
 * @example nelderMead(([a, b]) => (a - 1) ** 2 + (b + 2) ** 2, [0, 0], [1, 1]).x // ≈ [1, −2]
 */
export function nelderMead(
  f: (x: number[]) => number,
  x0: readonly number[],
  step: readonly number[],
  tol = 1e-7,
  maxEvaluations = 400,
): NelderMeadResult {
  const d = x0.length;
  let evaluations = 0;
  const value = (x: number[]) => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  const pts: number[][] = [[...x0]];
  for (let i = 0; i < d; i++) {
    const p = [...x0];
    p[i] += step[i];
    pts.push(p);
  }
  const vals = pts.map(value);
  const order = () => {
    const idx = pts.map((_, i) => i).sort((a, b) => vals[a] - vals[b]);
    const p = idx.map((i) => pts[i]);
    const v = idx.map((i) => vals[i]);
    for (let i = 0; i <= d; i++) {
      pts[i] = p[i];
      vals[i] = v[i];
    }
  };
  const combine = (a: number[], b: number[], t: number) => a.map((ai, i) => ai + t * (b[i] - ai));
  while (evaluations < maxEvaluations) {
    order();
    const spread = vals[d] - vals[0];
    if (Number.isFinite(spread) && Math.abs(spread) <= tol * (Math.abs(vals[0]) + tol)) break;
    const centroid = new Array<number>(d).fill(0);
    for (let i = 0; i < d; i++) for (let k = 0; k < d; k++) centroid[k] += pts[i][k] / d;
    const worst = pts[d];
    const xr = combine(centroid, worst, -1);
    const fr = value(xr);
    if (fr < vals[0]) {
      const xe = combine(centroid, worst, -2);
      const fe = value(xe);
      if (fe < fr) {
        pts[d] = xe;
        vals[d] = fe;
      } else {
        pts[d] = xr;
        vals[d] = fr;
      }
      continue;
    }
    if (fr < vals[d - 1]) {
      pts[d] = xr;
      vals[d] = fr;
      continue;
    }
    const outside = fr < vals[d];
    const xc = outside ? combine(centroid, worst, -0.5) : combine(centroid, worst, 0.5);
    const fc = value(xc);
    if (fc < (outside ? fr : vals[d])) {
      pts[d] = xc;
      vals[d] = fc;
      continue;
    }
    for (let i = 1; i <= d; i++) {
      pts[i] = combine(pts[0], pts[i], 0.5);
      vals[i] = value(pts[i]);
    }
  }
  order();
  return { x: pts[0], fx: vals[0], evaluations };
}
