/**
 * The words of a probabilistic analysis, one home for every output that shows one (the CLI's
 * tables, the PDF reports): a probability as a percentage, a distribution with its parameters,
 * the sampling and where each realisation is analysed, and what a counted P(FS < 1) rests on.
 */
import type { UnitSystem } from '../model/types';
import { fromSi, UNIT_LABELS } from '../model/units';
import { parseTarget, targetQuantity, type Target } from './target';
import type {
  Distribution,
  RandomVariable,
  RealisationSurface,
  SamplingMethod,
  ProbabilitySpec,
} from './types';

/** The decimals of a probability in percent: two, four below 0.1 %. */
const percentDecimals = (p: number) => (p < 0.001 ? 4 : 2);

/**
 * A probability as a percentage: two decimals, four below 0.1 % (or `decimals`), none at 0; a
 * dash when not a number.
 *
 * @example percentText(0.01234) // → '1.23 %'
 */
export const percentText = (p: number, decimals = percentDecimals(p)): string =>
  !Number.isFinite(p) ? '—' : p === 0 ? '0 %' : `${(100 * p).toFixed(decimals)} %`;

/**
 * A counted probability and its standard error, both to the probability's decimals.
 *
 * @example countedText({ p: 0.0065, standardError: 0.000804 }) // → '0.65 % ± 0.08 %'
 */
export const countedText = (c: { p: number; standardError: number }): string =>
  `${percentText(c.p)} ± ${percentText(c.standardError, percentDecimals(c.p))}`;

/** A value with five significant digits and no trailing zeros, e.g. 0.4 or 27. */
export const valueText = (v: number): string => String(Number(v.toPrecision(5)));

/** How each sampling method is named. */
export const SAMPLING_WORDS: Record<SamplingMethod, string> = {
  'monte-carlo': 'Monte Carlo sampling',
  'latin-hypercube': 'Latin hypercube sampling',
};

/** Where each realisation is analysed. */
export const REALISATION_SURFACE_WORDS: Record<RealisationSurface, string> = {
  critical: "on each case's critical surface at the means",
  search: 'the critical surface searched again in each realisation',
};

/** What a counted probability rests on. */
export const COUNTED_WORDS =
  'P(FS < 1) is counted: the share of the N realisations with FS below 1, with its standard error √(P(1 − P)/N)';

/** The reliability index β in each assumed form of the distribution of FS (μ, σ: its mean and SD). */
export const BETA_WORDS = {
  normal: 'β (FS normal) = (μ − 1)/σ',
  lognormal: 'β (FS lognormal) = ln(μ/√(1 + V²))/√(ln(1 + V²)), V = σ/μ',
} as const;

/**
 * A distribution in words, each parameter written by `value` (default: as the section holds
 * it, in SI, valueText).
 *
 * @example distributionWords({ kind: 'normal', mean: 27, sd: 2 }) // → 'normal, mean 27, SD 2'
 */
export function distributionWords(
  d: Distribution,
  value: (v: number) => string = valueText,
): string {
  switch (d.kind) {
    case 'normal':
    case 'lognormal':
      return `${d.kind}, mean ${value(d.mean)}, SD ${value(d.sd)}`;
    case 'truncated-normal':
      return `truncated normal, mean ${value(d.mean)}, SD ${value(d.sd)}, ${value(d.min)} … ${value(d.max)}`;
    case 'uniform':
      return `uniform, ${value(d.min)} … ${value(d.max)}`;
    case 'triangular':
      return `triangular, ${value(d.min)} … ${value(d.mode)} … ${value(d.max)}`;
  }
}

/** Whether a target's values are angles (in degrees, as in the section). */
const isAngle = (t: Target): boolean =>
  (t.kind === 'material' &&
    (t.parameter === 'frictionAngle' || t.parameter === 'frictionAngleBeyond')) ||
  ((t.kind === 'load' || t.kind === 'infinite-slope') && t.parameter === 'angle') ||
  (t.kind === 'reinforcement' && t.parameter === 'inclination');

/**
 * A random variable's distribution in the section's units: lengths, pressures and the like
 * with their unit, angles in degrees, ratios and coefficients as they are.
 *
 * @example variableDistributionWords(v, 'si') // → 'lognormal, mean 4 kPa, SD 1.6 kPa'
 */
export function variableDistributionWords(v: RandomVariable, units: UnitSystem): string {
  const t = parseTarget(v.target);
  const kind = t.ok ? targetQuantity(t.target) : null;
  const angle = t.ok && isAngle(t.target);
  return distributionWords(v.distribution, (x) =>
    kind
      ? `${valueText(fromSi(x, kind, units))} ${UNIT_LABELS[units][kind]}`
      : `${valueText(x)}${angle ? '°' : ''}`,
  );
}

/**
 * The run in a line: how many variables, the sampling, the seed, N and where each realisation
 * is analysed.
 *
 * @example probabilityBasisWords(spec) // → '5 random variables, Latin hypercube sampling, seed 520, N = 10000, …'
 */
export function probabilityBasisWords(spec: ProbabilitySpec): string {
  const n = spec.variables.length;
  return `${n} random variable${n === 1 ? '' : 's'}, ${SAMPLING_WORDS[spec.method]}, seed ${spec.seed}, N = ${spec.realisations}, ${REALISATION_SURFACE_WORDS[spec.surface]}`;
}
