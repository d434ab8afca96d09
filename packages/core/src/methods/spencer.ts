import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { rigorous } from './rigorous';
import type { SliceMethodResult } from './types';

/**
 * Spencer's method (Spencer 1967, Géotechnique 17(1)): interslice forces parallel, at one
 * inclination θ to the horizontal (X = E·tan θ); F and θ are solved together so that both
 * force and moment equilibrium hold. `lambda` of the result is tan θ. Any surface shape.
 *
 * @example Math.atan(spencer(slices, { seismic, pivot }).lambda!) * 180 / Math.PI // θ in degrees
 */
export function spencer(
  s: SliceSet,
  options: { seismic: Seismic; pivot: Point },
): SliceMethodResult {
  return rigorous(s, options, null, 'Spencer');
}
