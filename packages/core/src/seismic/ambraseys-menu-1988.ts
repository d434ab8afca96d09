import type { DisplacementRelation } from './sliding-block';

/**
 * Ambraseys & Menu (1988), "Earthquake-induced ground displacements", Earthquake Engineering
 * and Structural Dynamics 16, 985–1006 — the median permanent displacement of a rigid sliding
 * block on the critical acceleration ratio:
 *
 *   log u = 0.90 + log[(1 − ac/amax)^2.53 · (ac/amax)^−1.09]   (log base 10)
 *
 * u: the median displacement in centimetres; ac, amax: the yield (critical) acceleration and
 * the peak horizontal ground acceleration, in g (ac computed with the residual strength of the
 * soil). Scatter: standard deviation of log u 0.30. Data: 50 near-field records from 11
 * earthquakes of surface-wave magnitude 6.6–7.3 (the range stated in the paper's summary).
 * Coefficients, σ, the lower bound 0.1 of ac/amax and the data as set out in Kramer & Stewart,
 * Geotechnical Earthquake Engineering, 2nd ed. 2024, eq. 10.28; coefficients also in the USGS's
 * SLAMMER program. The upper bound 0.9 of ac/amax is a value from memory of the paper.
 *
 * @example 10 ** ambraseysMenu1988.log10Median(0.5, null)! // ≈ 2.93 (cm)
 */
export const ambraseysMenu1988: DisplacementRelation = {
  id: 'ambraseys-menu-1988',
  source: 'Ambraseys & Menu (1988)',
  log10Median: (r) => 0.9 + Math.log10((1 - r) ** 2.53 * r ** -1.09),
  sigmaLog10: 0.3,
  ratioRange: [0.1, 0.9],
  magnitudeRange: [6.6, 7.3],
  kyRange: null,
};
