import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { rigorous } from './rigorous';
import type { IntersliceFunction, SliceMethodResult } from './types';

/**
 * The interslice force function f(ξ) at ξ = (x − x_toe)/(x_crest − x_toe) ∈ [0, 1]:
 * constant 1; half-sine sin(πξ); clipped sine sin(a + (π − 2a)ξ) with sin a = `end`
 * (so f = end at both ends, 1 in the middle); trapezoid rising linearly from `end` to 1
 * over the first and last `ramp` of the length (Fredlund & Krahn 1977 use these shapes).
 */
export function intersliceFunction(fn: IntersliceFunction, xi: number): number {
  switch (fn.shape) {
    case 'constant':
      return 1;
    case 'half-sine':
      return Math.sin(Math.PI * xi);
    case 'clipped-sine': {
      const a = Math.asin(Math.min(0.999, Math.max(0, fn.end ?? 0.5)));
      return Math.sin(a + (Math.PI - 2 * a) * xi);
    }
    case 'trapezoid': {
      const e = fn.end ?? 0;
      const r = Math.min(0.5, Math.max(1e-6, fn.ramp ?? 0.25));
      const up = Math.min(1, Math.min(xi, 1 - xi) / r);
      return e + (1 - e) * Math.max(0, up);
    }
  }
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
