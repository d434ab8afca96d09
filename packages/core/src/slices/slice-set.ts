/**
 * The slices of one slip surface, as parallel typed arrays (index i = slice i, ordered by
 * x). Coordinates are those of the sliding orientation: the mass moves toward −x, so the
 * upper (crest) end is on the right and the base inclination α = atan2(Δy_base, b) is
 * positive where the base rises to the right. When `mirrored` is true these are the
 * section's coordinates with x → −x. Forces in kN per m run, x right and y up.
 *
 * The arrays may be longer than `n` (a buffer reused from surface to surface): only the
 * first `n` entries are slices.
 */
export interface SliceSet {
  n: number;
  mirrored: boolean;
  /** Left and right edges. */
  xl: Float64Array;
  xr: Float64Array;
  /** Ground at the edges. */
  yTopL: Float64Array;
  yTopR: Float64Array;
  /** Slip surface at the edges (the base is the chord between them). */
  yBaseL: Float64Array;
  yBaseR: Float64Array;
  /** Soil area (m²) and soil weight W (kN/m), summed exactly by stratum, and its centroid. */
  area: Float64Array;
  weight: Float64Array;
  cx: Float64Array;
  cy: Float64Array;
  /** Pore pressure u at the middle of the base (kPa). */
  porePressure: Float64Array;
  /** Strength at the middle of the base: c′ or Su (kPa), and tan φ′ (0 for undrained). */
  cohesion: Float64Array;
  tanPhi: Float64Array;
  /** Base material, an index into PreparedSection.materials. */
  material: Int32Array;
  /**
   * Resultant of the forces on the slice's top and sides other than interslice forces:
   * ponded water, surcharges, line loads and the water in a tension crack. qm is their
   * moment about the origin, counter-clockwise positive (Σ x·Fy − y·Fx).
   */
  qx: Float64Array;
  qy: Float64Array;
  qm: Float64Array;
  /**
   * The reinforcement forces on the slice that are divided by the factor of safety (each
   * method takes rx/F, ry/F and rm/F beside the loads; methods/statics.ts), and their moment
   * about the origin as qm. Those applied at full value are in qx, qy, qm.
   */
  rx: Float64Array;
  ry: Float64Array;
  rm: Float64Array;
}

const FLOAT_KEYS = [
  'xl',
  'xr',
  'yTopL',
  'yTopR',
  'yBaseL',
  'yBaseR',
  'area',
  'weight',
  'cx',
  'cy',
  'porePressure',
  'cohesion',
  'tanPhi',
  'qx',
  'qy',
  'qm',
  'rx',
  'ry',
  'rm',
] as const;

/** An empty slice set with room for `capacity` slices. */
export function sliceSet(capacity: number): SliceSet {
  const s = { n: 0, mirrored: false, material: new Int32Array(capacity) } as SliceSet;
  for (const k of FLOAT_KEYS) s[k] = new Float64Array(capacity);
  return s;
}

/** A copy of the first `s.n` slices in arrays of their own, exactly `n` long. */
export function copySliceSet(s: SliceSet): SliceSet {
  const out = { n: s.n, mirrored: s.mirrored, material: s.material.slice(0, s.n) } as SliceSet;
  for (const k of FLOAT_KEYS) out[k] = s[k].slice(0, s.n);
  return out;
}
