import type { SliceSet } from './slice-set';

/**
 * A strength for each slice base, in place of the one the slicer took from the base's
 * material: c (kPa) and tan φ, and whether the base's pore pressure counts. On an
 * effective-stress base it does (S = c′l + (N − u l) tan φ′); on a total-stress base, such as
 * a base in undrained soil, it does not: the base takes u = 0 and its normal force is the
 * total one (common practice for a total-stress analysis). Index i is slice i of the slice set
 * it is applied to (sliding orientation). The arrays may be longer than the slice set.
 */
export interface BaseStrengths {
  cohesion: Float64Array;
  tanPhi: Float64Array;
  /** 1 where the base's pore pressure counts, 0 where it does not. */
  porePressureCounts: Uint8Array;
}

/** Base strengths with room for `capacity` slices (all zero: give every one before use). */
export function baseStrengths(capacity: number): BaseStrengths {
  return {
    cohesion: new Float64Array(capacity),
    tanPhi: new Float64Array(capacity),
    porePressureCounts: new Uint8Array(capacity),
  };
}

/**
 * The slices with these strengths: a slice set that shares every array of `s` but the base
 * strengths and the pore pressures, which it holds in arrays of its own (those of `into`, a
 * slice set this function returned before, when they are long enough: the search calls it for
 * every trial surface). `s` is not changed. Every method of slices reads its strengths from
 * the slice set, so every one honours them.
 *
 * @example bishop(withBaseStrengths(cut.slices, strengths), { seismic, pivot }).fs
 */
export function withBaseStrengths(s: SliceSet, b: BaseStrengths, into?: SliceSet): SliceSet {
  const n = s.n;
  const own = into && into.cohesion.length >= n && into.cohesion !== s.cohesion;
  const cohesion = own ? into.cohesion : new Float64Array(Math.max(n, 1));
  const tanPhi = own ? into.tanPhi : new Float64Array(Math.max(n, 1));
  const porePressure = own ? into.porePressure : new Float64Array(Math.max(n, 1));
  const u = s.porePressure;
  const counts = b.porePressureCounts;
  for (let i = 0; i < n; i++) {
    cohesion[i] = b.cohesion[i];
    tanPhi[i] = b.tanPhi[i];
    porePressure[i] = counts[i] ? u[i] : 0;
  }
  return { ...s, cohesion, tanPhi, porePressure };
}
