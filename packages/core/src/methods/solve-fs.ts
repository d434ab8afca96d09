import { findRoot } from '../numeric/find-root';
import { march } from './march';
import type { Statics } from './statics';

/** Trial factors of safety scanned for a sign change of the residual (geometric, 0.02 to 500). */
export const FS_GRID: readonly number[] = (() => {
  const g: number[] = [];
  for (let F = 0.02; F < 500; F *= 1.2) g.push(F);
  return g;
})();

export interface FsRoot {
  fs: number;
  converged: boolean;
  /** Passes across the slices. */
  passes: number;
}

/**
 * The factor of safety that satisfies moment (or force) equilibrium for a fixed interslice
 * ratio λ and function f: a bracketing search on the residual of `march`, refined by Brent's
 * method, accepting only roots where the residual is small against the forces involved
 * (so that a pole of the residual is never taken for a root).
 */
export function solveFs(
  st: Statics,
  lambda: number,
  f: Float64Array | null,
  balance: 'moment' | 'force',
  guess: number,
  N: Float64Array,
  E: Float64Array,
  tol = 1e-10,
): FsRoot {
  let scale = 0;
  let arm = balance === 'moment' ? 1e-9 : 1;
  for (let i = 0; i < st.n; i++) {
    scale += Math.abs(st.Hx[i]) + Math.abs(st.Hy[i]) + Math.abs(st.C[i]);
    if (balance === 'moment') arm = Math.max(arm, Math.abs(st.aS[i]));
  }
  const residual = (F: number) => {
    const r = march(st, F, lambda, f, N, E);
    return balance === 'moment' ? r.M : r.En;
  };
  const root = findRoot(
    residual,
    FS_GRID,
    guess,
    tol,
    (F) => Math.abs(residual(F)) <= 1e-6 * scale * arm,
  );
  return { fs: root.x, converged: root.converged, passes: root.evaluations };
}
