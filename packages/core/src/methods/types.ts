import type { Point } from '../model/types';

/** A warning a method raises: a stable code and a sentence for the engineer. */
export interface MethodWarning {
  code:
    | 'm-alpha-small'
    | 'negative-normal'
    | 'thrust-outside'
    | 'no-convergence'
    | 'cohesionless-circle'
    | 'not-applicable'
    | 'stress-iteration'
    | 'stress-range';
  message: string;
}

/**
 * What a method of slices returns, in SI and in the sliding orientation of its SliceSet.
 * Per-slice arrays have one entry a slice; `E`, `X` and `thrust` are at each slice's right
 * edge (the last one is the residual at the upper end, zero at equilibrium).
 */
export interface SliceMethodResult {
  fs: number;
  converged: boolean;
  iterations: number;
  /** Why it did not converge (absent when converged). */
  reason?: string;
  /** Total base normal force N and effective N′ = N − u·l (kN/m). */
  normalTotal: Float64Array;
  normal: Float64Array;
  /** Mobilised base shear S = (c′l + N′ tan φ′)/F (kN/m). */
  shear: Float64Array;
  E: Float64Array;
  X: Float64Array;
  /** Elevation of the line of thrust at the right edge (NaN where no interslice force). */
  thrust: Float64Array;
  /** Interslice force ratio λ (X = λ·f(x)·E); θ = atan λ for Spencer. */
  lambda?: number;
  /** Janbu: uncorrected F0 and the correction factor f0. */
  fsUncorrected?: number;
  correction?: number;
  /** The point moments were taken about. */
  pivot?: Point;
  warnings: MethodWarning[];
}

export type { IntersliceFunction } from '../model/types';
