import type { DisplacementRelation } from './sliding-block';

/**
 * Jibson (2007), "Regression models for estimating coseismic landslide displacement",
 * Engineering Geology 91, 209–218, eq. 6 — the rigid-block Newmark displacement on the critical
 * acceleration ratio alone:
 *
 *   log D = 0.215 + log[(1 − ac/amax)^2.341 · (ac/amax)^−1.438]   (log base 10)
 *
 * D: the median displacement in centimetres; ac, amax: the yield (critical) acceleration and
 * the peak horizontal ground acceleration, in g. Scatter: standard deviation of log D 0.510
 * (R² = 84 %). Data: rigorous Newmark integrations of 2270 single-component strong-motion
 * records from 30 earthquakes (coefficients, σ, R² and data as stated in the USGS's
 * description of the equation in its SLAMMER program, and in Kramer & Stewart, Geotechnical
 * Earthquake Engineering, 2nd ed. 2024, §10.9.2).
 *
 * Ranges: moment magnitudes 5.3–7.6 (the USGS's ground-failure code states this range for
 * eq. 6 and 7); critical accelerations 0.02–0.4 g (value from memory of the paper). The paper
 * states no window of ac/amax that we could confirm: we warn outside 0.05–0.95, where the form
 * tends to infinity or to zero and few data lie (our screening bound, not the paper's). The
 * author recommends the relation for regional mapping and preliminary screening, not for
 * site-specific design (Jibson 2007, abstract).
 *
 * @example 10 ** jibson2007.log10Median(0.5, null)! // ≈ 0.877 (cm)
 */
export const jibson2007: DisplacementRelation = {
  id: 'jibson-2007',
  source: 'Jibson (2007), eq. 6',
  log10Median: (r) => 0.215 + Math.log10((1 - r) ** 2.341 * r ** -1.438),
  sigmaLog10: 0.51,
  ratioRange: [0.05, 0.95],
  magnitudeRange: [5.3, 7.6],
  kyRange: [0.02, 0.4],
};
