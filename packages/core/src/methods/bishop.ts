import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { failed } from './failed';
import { mAlphaWarning } from './m-alpha-warning';
import { march } from './march';
import { sliceForces } from './slice-forces';
import { solveFs } from './solve-fs';
import { statics } from './statics';
import type { SliceMethodResult } from './types';

/**
 * Bishop's simplified method (Bishop 1955, Géotechnique 5(1), eq. for F with interslice
 * shear neglected): vertical equilibrium of each slice gives
 *   N = [W(1 + kv) − Qy − (c′l − u·l·tan φ′) sin α / F] / mα,  mα = cos α + sin α tan φ′ / F,
 * and moment equilibrium about the circle centre gives F. Without loads this is the familiar
 *   F = Σ{[c′b + (W − u b) tan φ′] / mα} / Σ W sin α.
 * Solved by the classic fixed-point iteration, with a bracketing search as the fallback.
 * Warns where mα < 0.2 (Whitman & Bailey 1967).
 *
 * @example bishop(sliced.slices, { seismic: { kh: 0, kv: 0 }, pivot: [25, 42] }).fs
 */
export function bishop(
  s: SliceSet,
  options: { seismic: Seismic; pivot: Point },
): SliceMethodResult {
  const st = statics(s, options.seismic, options.pivot);
  const n = s.n;
  const N = new Float64Array(n);
  const E = new Float64Array(n);
  let F = 1;
  let iterations = 0;
  let converged = false;
  for (; iterations < 60;) {
    iterations++;
    const r = march(st, F, 0, null, N, E);
    if (!Number.isFinite(r.M)) break;
    let resist = 0;
    let drive = 0;
    for (let i = 0; i < n; i++) {
      resist += (st.C[i] + N[i] * st.t[i]) * st.aS[i];
      drive -= N[i] * st.aN[i] + st.M0[i];
    }
    const next = resist / drive;
    if (!(next > 0) || !Number.isFinite(next)) break;
    if (Math.abs(next - F) <= 1e-10 * next) {
      F = next;
      converged = true;
      break;
    }
    F = next;
  }
  if (!converged) {
    const root = solveFs(st, 0, null, 'moment', 1, N, E);
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
