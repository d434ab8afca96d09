import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { findRoot } from '../numeric/find-root';
import { failed } from './failed';
import { sliceForces } from './slice-forces';
import { solveFs } from './solve-fs';
import { statics } from './statics';
import type { SliceMethodResult } from './types';

/** Trial interslice ratios λ, scanned outward from 0 for the crossing of Fm(λ) and Ff(λ). */
const LAMBDA_GRID: readonly number[] = Array.from({ length: 61 }, (_, i) => -3 + i * 0.1);

/**
 * Complete equilibrium with X = λ·f(x)·E: for each trial λ the factor of safety for moment
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
  const N = new Float64Array(n);
  const E = new Float64Array(n);
  let passes = 0;
  let guess = 1;
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
