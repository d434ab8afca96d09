import type { DisplacementEstimate, Warning } from '../result';

/**
 * A published regression of the permanent displacement of a rigid sliding block (Newmark 1965)
 * on the ratio r = ac/amax of the yield acceleration to the peak ground acceleration: the log
 * (base 10) of the median displacement in centimetres, its scatter, and the range of the data
 * it was fitted to.
 */
export interface DisplacementRelation {
  /** The relation's id in results (`jibson-2007`, …). */
  id: string;
  /** Author, year and equation, for messages. */
  source: string;
  /**
   * log10 of the median displacement D (cm) for 0 < r < 1 and the earthquake magnitude;
   * null when the relation needs an input that is not given (the magnitude).
   */
  log10Median(r: number, magnitude: number | null): number | null;
  /** Standard deviation of log10 D about the median. */
  sigmaLog10: number;
  /** The ac/amax the relation was fitted over, and the magnitudes and yield accelerations (g) of its data. */
  ratioRange: readonly [number, number];
  magnitudeRange: readonly [number, number];
  kyRange: readonly [number, number] | null;
}

const CM = 0.01;
const f3 = (x: number) => x.toFixed(3);

/**
 * The permanent displacement one relation estimates (in metres) for a yield coefficient ky > 0
 * and a peak ground acceleration pga > 0 (both fractions of g; ac/amax = ky/pga), with the
 * magnitude when given: the median and the value one standard deviation of the log above it
 * (median·10^σ, the 84th percentile of a lognormal scatter). ky ≥ pga gives zero: the block
 * never slides when the ground acceleration does not exceed its yield acceleration (Newmark
 * 1965), and every form on (1 − ac/amax) vanishes there. Outside the ranges of the relation's
 * data the estimate is still given, with a warning, and `inRange` false. Null when the relation
 * needs the magnitude and none is given.
 *
 * @example slidingBlockEstimate(jibson2007, 0.1, 0.3, null)?.median // ≈ 0.031 (m)
 */
export function slidingBlockEstimate(
  relation: DisplacementRelation,
  ky: number,
  pga: number,
  magnitude: number | null,
): DisplacementEstimate | null {
  if (!(ky > 0) || !(pga > 0)) {
    throw new RangeError(`sliding block: ky (${ky}) and pga (${pga}) must be positive`);
  }
  const r = ky / pga;
  if (r >= 1) {
    if (relation.log10Median(0.5, magnitude) === null) return null;
    return {
      relation: relation.id,
      median: 0,
      plusOneSd: 0,
      inRange: true,
      warnings: [
        {
          code: 'no-sliding',
          message: `${relation.source}: ky = ${f3(ky)} ≥ pga = ${f3(pga)} g, so the sliding block does not slide and the displacement is zero`,
        },
      ],
    };
  }
  const log10D = relation.log10Median(r, magnitude);
  if (log10D === null) return null;
  const warnings: Warning[] = [];
  const outside = (
    what: string,
    value: number,
    [low, high]: readonly [number, number],
    digits: number,
  ) => {
    if (value < low || value > high) {
      const f = (x: number) => x.toFixed(digits);
      warnings.push({
        code: 'displacement-outside-range',
        message: `${relation.source}: ${what} = ${f(value)} lies outside the ${f(low)}–${f(high)} of the data it was fitted to; the estimate is an extrapolation`,
      });
    }
  };
  outside('ac/amax', r, relation.ratioRange, 3);
  if (magnitude !== null) outside('M', magnitude, relation.magnitudeRange, 1);
  if (relation.kyRange) outside('ky (g)', ky, relation.kyRange, 3);
  const median = 10 ** log10D * CM;
  return {
    relation: relation.id,
    median,
    plusOneSd: median * 10 ** relation.sigmaLog10,
    inRange: warnings.length === 0,
    warnings,
  };
}
