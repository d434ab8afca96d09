import type { DisplacementRelation } from './sliding-block';

/**
 * Jibson (2007), "Regression models for estimating coseismic landslide displacement",
 * Engineering Geology 91, 209–218, eq. 7 — the rigid-block Newmark displacement on the critical
 * acceleration ratio and the moment magnitude M:
 *
 *   log D = −2.710 + log[(1 − ac/amax)^2.335 · (ac/amax)^−1.478] + 0.424·M   (log base 10)
 *
 * D: the median displacement in centimetres; ac, amax: the yield (critical) acceleration and
 * the peak horizontal ground acceleration, in g. Scatter: standard deviation of log D 0.454
 * (R² = 87 %). Data: the same 2270 records from 30 earthquakes as eq. 6. Coefficients, σ and
 * R² as stated in the USGS's description of the equation in its SLAMMER program, in the
 * USGS's ground-failure code and in Kramer & Stewart, Geotechnical Earthquake Engineering,
 * 2nd ed. 2024, eq. 10.29 and Example 10.4.
 *
 * Ranges: moment magnitudes 5.3–7.6 (the USGS's ground-failure code states this range);
 * critical accelerations 0.02–0.4 g (value from memory of the paper); ac/amax: we warn
 * outside 0.05–0.95 (our screening bound, as for eq. 6). Needs the magnitude: no estimate
 * without it.
 *
 * @example 10 ** jibson2007Magnitude.log10Median(0.67, 6.7)! // ≈ 0.18 (cm; Kramer & Stewart, Example 10.4)
 */
export const jibson2007Magnitude: DisplacementRelation = {
  id: 'jibson-2007-magnitude',
  source: 'Jibson (2007), eq. 7',
  log10Median: (r, magnitude) =>
    magnitude === null
      ? null
      : -2.71 + Math.log10((1 - r) ** 2.335 * r ** -1.478) + 0.424 * magnitude,
  sigmaLog10: 0.454,
  ratioRange: [0.05, 0.95],
  magnitudeRange: [5.3, 7.6],
  kyRange: [0.02, 0.4],
};
