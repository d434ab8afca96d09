import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { failed } from './failed';
import { mAlphaWarning } from './m-alpha-warning';
import { sliceForces } from './slice-forces';
import { solveFs } from './solve-fs';
import { type Statics, statics } from './statics';
import type { SliceMethodResult } from './types';

/**
 * Bishop's fixed-point iteration (Bishop 1955) on prepared statics: with the base normal of
 * each slice from its vertical equilibrium, N = (−Hy − C sin α / F) / mα, mα = cos α +
 * sin α tan φ′ / F, F = Σ (C + N tan φ′)·aS / Σ −(N·aN + M0) (moments about the centre),
 * repeated from `guess` until F changes by less than `tol` relatively. Returns F (NaN where
 * mα turns negative, F leaves (0, 10⁶) or 60 passes do not settle); the passes made are
 * written to `passes.count` when given (the search's hot path allocates nothing). The search calls it on every
 * trial circle; bishop() calls it first and falls back to a bracketing search.
 *
 * @example bishopIteration(statics(slices, seismic, centre), 1, 1e-10) // → 1.42
 */
export function bishopIteration(
  st: Statics,
  guess: number,
  tol: number,
  passes?: { count: number },
): number {
  const { n, sin, cos, C, t, Hy, aN, aS, M0, Ry, Rm } = st;
  let F = guess > 0 ? guess : 1;
  for (let it = 1; it <= 60; it++) {
    const iF = 1 / F;
    // reinforcement divided by F: Hy + Ry/F and M0 + Rm/F (statics.ts)
    const rf = st.factored ? iF : 0;
    let resist = 0;
    let drive = 0;
    for (let i = 0; i < n; i++) {
      const den = t[i] * iF * sin[i] + cos[i];
      if (den <= 1e-9) {
        if (passes) passes.count = it;
        return NaN;
      }
      const hy = rf === 0 ? Hy[i] : Hy[i] + Ry[i] * rf;
      const N = (-hy - C[i] * iF * sin[i]) / den;
      resist += (C[i] + N * t[i]) * aS[i];
      drive -= N * aN[i] + (rf === 0 ? M0[i] : M0[i] + Rm[i] * rf);
    }
    const next = resist / drive;
    const done = Math.abs(next - F) <= tol * next;
    if (!(next > 0) || !(next < 1e6) || done) {
      if (passes) passes.count = it;
      return next > 0 && next < 1e6 ? next : NaN;
    }
    F = next;
  }
  if (passes) passes.count = 60;
  return NaN;
}

/**
 * Bishop's base normal forces at F on prepared statics, from the vertical equilibrium of each
 * slice as in bishopIteration: the total N into `total` and, when given, the effective
 * N′ = N − u·l into `effective`.
 */
export function bishopNormals(
  st: Statics,
  F: number,
  total: Float64Array,
  effective?: Float64Array,
): void {
  const { n, sin, cos, C, t, Hy, U, Ry } = st;
  const iF = 1 / F;
  const rf = st.factored ? iF : 0;
  for (let i = 0; i < n; i++) {
    const hy = Hy[i] + Ry[i] * rf;
    const N = (-hy - C[i] * iF * sin[i]) / (t[i] * iF * sin[i] + cos[i]);
    total[i] = N;
    if (effective) effective[i] = N - U[i];
  }
}

/**
 * Bishop's simplified method (Bishop 1955, Géotechnique 5(1), eq. for F with interslice
 * shear neglected): vertical equilibrium of each slice gives
 *   N = [W(1 + kv) − Qy − (c′l − u·l·tan φ′) sin α / F] / mα,  mα = cos α + sin α tan φ′ / F,
 * and moment equilibrium about the circle centre gives F. Without loads this is the familiar
 *   F = Σ{[c′b + (W − u b) tan φ′] / mα} / Σ W sin α.
 * Solved by the classic fixed-point iteration (bishopIteration), with a bracketing search as
 * the fallback. Warns where mα < 0.2 (Whitman & Bailey 1967).
 *
 * @example bishop(sliced.slices, { seismic: { kh: 0, kv: 0 }, pivot: [25, 42] }).fs
 */
export function bishop(
  s: SliceSet,
  options: { seismic: Seismic; pivot: Point },
): SliceMethodResult {
  const st = statics(s, options.seismic, options.pivot);
  const n = s.n;
  const passes = { count: 0 };
  let F = bishopIteration(st, 1, 1e-10, passes);
  let converged = F > 0;
  let iterations = passes.count;
  if (!converged) {
    const root = solveFs(st, 0, null, 'moment', 1, new Float64Array(n), new Float64Array(n));
    iterations += root.passes;
    converged = root.converged;
    F = root.fs;
  }
  if (!converged) {
    return failed(
      n,
      iterations,
      'Bishop: no factor of safety satisfies moment equilibrium with positive base forces',
      options.pivot,
    );
  }
  const forces = sliceForces(s, st, F, 0, null, false);
  // moment equilibrium alone: the horizontal interslice forces of the march do not close, so none are reported
  forces.E.fill(0);
  return {
    fs: F,
    converged,
    iterations,
    ...forces,
    pivot: options.pivot,
    warnings: [...mAlphaWarning(st, F), ...forces.warnings],
  };
}
