import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { rigorous } from './rigorous';
import type { IntersliceFunction, SliceMethodResult } from './types';

/**
 * The interslice force function f(ξ) at ξ = (x − x_toe)/(x_crest − x_toe) ∈ [0, 1]: constant
 * 1 and the half-sine sin(πξ) of Morgenstern & Price (1965); a piecewise-linear function
 * through the given points [ξ, f], linear between them and held at the end points' values
 * beyond them (equal ξ gives a step; the later point holds from there).
 *
 * @example intersliceFunction({ shape: 'piecewise-linear', points: [[0, 0], [0.5, 1], [1, 0]] }, 0.25) // → 0.5
 */
export function intersliceFunction(fn: IntersliceFunction, xi: number): number {
  switch (fn.shape) {
    case 'constant':
      return 1;
    case 'half-sine':
      return Math.sin(Math.PI * xi);
    case 'piecewise-linear': {
      const p = fn.points;
      if (xi <= p[0][0]) return p[0][1];
      for (let i = 1; i < p.length; i++) {
        const [x1, f1] = p[i];
        if (xi < x1) {
          const [x0, f0] = p[i - 1];
          return x1 > x0 ? f0 + ((f1 - f0) * (xi - x0)) / (x1 - x0) : f1;
        }
      }
      return p[p.length - 1][1];
    }
  }
}

/** A function's name as a report gives it: the shape, and for points how many. */
export function intersliceName(fn: IntersliceFunction): string {
  return fn.shape === 'piecewise-linear'
    ? `piecewise-linear (${fn.points.length} points)`
    : fn.shape;
}

/**
 * The Morgenstern–Price method (Morgenstern & Price 1965, Géotechnique 15(1); solved as the
 * general limit equilibrium formulation of Fredlund & Krahn 1977, Can. Geotech. J. 14(3)):
 * X = λ·f(x)·E with a chosen f; F and λ are solved together for force and moment
 * equilibrium. With f constant it is Spencer's method.
 *
 * @example morgensternPrice(slices, { seismic, pivot, fn: { shape: 'half-sine' } }).lambda
 */
export function morgensternPrice(
  s: SliceSet,
  options: { seismic: Seismic; pivot: Point; fn: IntersliceFunction },
): SliceMethodResult {
  const n = s.n;
  const xa = s.xl[0];
  const L = s.xr[n - 1] - xa;
  const f = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    const x = i === 0 ? xa : s.xr[i - 1];
    f[i] = intersliceFunction(options.fn, (x - xa) / L);
  }
  return rigorous(s, options, f, 'Morgenstern–Price');
}
