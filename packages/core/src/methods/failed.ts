import type { Point } from '../model/types';
import type { SliceMethodResult } from './types';

/** The result of a method that found no solution or does not apply: no number, the reason, a warning. */
export function failed(
  n: number,
  iterations: number,
  reason: string,
  pivot?: Point,
  code: 'no-convergence' | 'not-applicable' = 'no-convergence',
): SliceMethodResult {
  return {
    fs: NaN,
    converged: false,
    iterations,
    reason,
    normalTotal: new Float64Array(n),
    normal: new Float64Array(n),
    shear: new Float64Array(n),
    E: new Float64Array(n),
    X: new Float64Array(n),
    thrust: new Float64Array(n).fill(NaN),
    ...(pivot ? { pivot } : {}),
    warnings: [{ code, message: reason }],
  };
}
