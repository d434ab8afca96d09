import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { findRoot } from '../numeric/find-root';
import { failed } from './failed';
import { march } from './march';
import { sliceForces } from './slice-forces';
import { solveFs } from './solve-fs';
import { type Statics, statics } from './statics';
import type { SliceMethodResult } from './types';

/** Trial interslice ratios λ, scanned outward from 0 for the crossing of Fm(λ) and Ff(λ). */
const LAMBDA_GRID: readonly number[] = Array.from({ length: 61 }, (_, i) => -3 + i * 0.1);

/**
 * Newton's method on the two residuals (force left at the upper end, moment about the
 * pivot) in (F, λ), with a forward-difference Jacobian and a backtracking line search,
 * started from the moment-equilibrium F at λ = 0. Returns null when it does not settle, and
 * the caller falls back to the bracketing procedure.
 */
function newton(
  st: Statics,
  f: Float64Array | null,
  N: Float64Array,
  E: Float64Array,
  F0: number,
): { F: number; lambda: number; passes: number } | null {
  let scale = 0;
  let arm = 1e-9;
  for (let i = 0; i < st.n; i++) {
    scale += Math.abs(st.Hx[i]) + Math.abs(st.Hy[i]) + Math.abs(st.C[i]);
    arm = Math.max(arm, Math.abs(st.aS[i]));
  }
  let passes = 0;
  const res = (F: number, l: number): [number, number] => {
    passes++;
    const r = march(st, F, l, f, N, E);
    return [r.En / scale, r.M / (scale * arm)];
  };
  let F = F0;
  let l = 0;
  let r = res(F, l);
  if (!Number.isFinite(r[0]) || !Number.isFinite(r[1])) return null;
  for (let it = 0; it < 40; it++) {
    const norm = Math.hypot(r[0], r[1]);
    if (norm < 1e-13) return { F, lambda: l, passes };
    const hF = 1e-7 * F;
    const hl = 1e-7;
    const rF = res(F + hF, l);
    const rl = res(F, l + hl);
    const a = (rF[0] - r[0]) / hF;
    const b = (rl[0] - r[0]) / hl;
    const c = (rF[1] - r[1]) / hF;
    const d = (rl[1] - r[1]) / hl;
    const det = a * d - b * c;
    if (!Number.isFinite(det) || det === 0) return null;
    const dF = (-r[0] * d + b * r[1]) / det;
    const dl = (-a * r[1] + c * r[0]) / det;
    let t = 1;
    let accepted = false;
    while (t > 1e-4) {
      const Fn = F + t * dF;
      const ln = l + t * dl;
      if (Fn > 0 && Math.abs(ln) <= 3) {
        const rn = res(Fn, ln);
        if (Number.isFinite(rn[0]) && Number.isFinite(rn[1]) && Math.hypot(rn[0], rn[1]) < norm) {
          F = Fn;
          l = ln;
          r = rn;
          accepted = true;
          break;
        }
      }
      t /= 2;
    }
    if (!accepted) return Math.hypot(r[0], r[1]) < 1e-11 ? { F, lambda: l, passes } : null;
  }
  return null;
}

/**
 * Complete equilibrium with X = λ·f(x)·E: solved first by Newton's method in (F, λ); where
 * that does not settle, by the bracketing procedure: for each trial λ the factor of safety for moment
 * equilibrium Fm(λ) and for force equilibrium Ff(λ) are found by bracketing; the solution
 * is the λ where they agree (Fredlund & Krahn 1977, the GLE procedure). `f` holds f at the
 * n + 1 slice edges, or null for f = 1 (Spencer).
 */
export function rigorous(
  s: SliceSet,
  options: { seismic: Seismic; pivot: Point },
  f: Float64Array | null,
  name: string,
): SliceMethodResult {
  const st = statics(s, options.seismic, options.pivot);
  const n = s.n;
  const work = new Float64Array(2 * n);
  const N = work.subarray(0, n);
  const E = work.subarray(n);
  let passes = 0;
  const start = solveFs(st, 0, f, 'moment', 1, N, E);
  passes += start.passes;
  const quick = start.converged ? newton(st, f, N, E, start.fs) : null;
  if (quick) {
    const forces = sliceForces(s, st, quick.F, quick.lambda, f, true);
    return {
      fs: quick.F,
      converged: true,
      iterations: passes + quick.passes,
      lambda: quick.lambda,
      ...forces,
      pivot: options.pivot,
      warnings: forces.warnings,
    };
  }
  let guess = start.converged ? start.fs : 1;
  let fm = NaN;
  const gap = (lambda: number) => {
    const m = solveFs(st, lambda, f, 'moment', guess, N, E);
    const k = solveFs(st, lambda, f, 'force', m.converged ? m.fs : guess, N, E);
    passes += m.passes + k.passes;
    if (!m.converged || !k.converged) return NaN;
    guess = m.fs;
    fm = m.fs;
    return m.fs - k.fs;
  };
  const root = findRoot(gap, LAMBDA_GRID, 0, 1e-12);
  if (!root.converged) {
    return failed(
      n,
      passes,
      `${name}: no pair (F, λ) satisfies both force and moment equilibrium`,
      options.pivot,
    );
  }
  const lambda = root.x;
  gap(lambda);
  const F = fm;
  if (!(F > 0) || !Number.isFinite(F)) {
    return failed(
      n,
      passes,
      `${name}: no pair (F, λ) satisfies both force and moment equilibrium`,
      options.pivot,
    );
  }
  const forces = sliceForces(s, st, F, lambda, f, true);
  return {
    fs: F,
    converged: true,
    iterations: passes,
    lambda,
    ...forces,
    pivot: options.pivot,
    warnings: forces.warnings,
  };
}
