import type { Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { failed } from './failed';
import { mAlphaWarning } from './m-alpha-warning';
import { defaultPivot } from './pivot';
import { sliceForces } from './slice-forces';
import { solveFs } from './solve-fs';
import { statics } from './statics';
import type { SliceMethodResult } from './types';

/**
 * Janbu's correction factor f0 for the simplified method (Janbu 1973; curve fit
 * f0 = 1 + b1·[d/L − 1.4·(d/L)²] with b1 = 0.69 for c only, 0.31 for φ only and 0.50 for
 * c and φ — values from memory of the fit as reproduced in the slope-stability literature).
 * d is the greatest depth of the surface below the chord joining its ends, L that chord.
 */
export function janbuCorrection(s: SliceSet): number {
  const x0 = s.xl[0];
  const y0 = s.yBaseL[0];
  const x1 = s.xr[s.n - 1];
  const y1 = s.yBaseR[s.n - 1];
  const L = Math.hypot(x1 - x0, y1 - y0);
  let d = 0;
  let anyC = false;
  let anyPhi = false;
  for (let i = 0; i < s.n; i++) {
    const dist = ((x1 - x0) * (y0 - s.yBaseR[i]) - (y1 - y0) * (x0 - s.xr[i])) / L;
    d = Math.max(d, dist);
    if (s.cohesion[i] > 0) anyC = true;
    if (s.tanPhi[i] > 0) anyPhi = true;
  }
  const b1 = anyC && anyPhi ? 0.5 : anyC ? 0.69 : 0.31;
  const r = d / L;
  return 1 + b1 * (r - 1.4 * r * r);
}

/**
 * Janbu's simplified method (Janbu 1954, 1973): interslice shear neglected, N from vertical
 * equilibrium of each slice (as in Bishop's method), F from horizontal force equilibrium of
 * the whole mass,
 *   F0 = Σ [c′l + (N − u l) tan φ′] cos α / Σ (N sin α + kh·W − Qx),
 * then corrected for the neglected interslice shear: F = f0·F0. Any surface shape.
 *
 * @example janbu(sliced.slices, { seismic: { kh: 0, kv: 0 } }).fsUncorrected
 */
export function janbu(s: SliceSet, options: { seismic: Seismic }): SliceMethodResult {
  const pivot = defaultPivot(s);
  const st = statics(s, options.seismic, pivot);
  const n = s.n;
  const N = new Float64Array(n);
  const E = new Float64Array(n);
  const root = solveFs(st, 0, null, 'force', 1, N, E);
  if (!root.converged) {
    return failed(
      n,
      root.passes,
      'Janbu: no factor of safety satisfies horizontal force equilibrium with positive base forces',
    );
  }
  const F0 = root.fs;
  const f0 = janbuCorrection(s);
  const forces = sliceForces(s, st, F0, 0, null, false);
  return {
    fs: f0 * F0,
    fsUncorrected: F0,
    correction: f0,
    converged: true,
    iterations: root.passes,
    ...forces,
    warnings: [...mAlphaWarning(st, F0), ...forces.warnings],
  };
}
