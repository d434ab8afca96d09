/**
 * The shapes of probabilistic analysis, sensitivity and solving for a value: what a section
 * file asks for (normalised, in SI) and what each analysis gives back (plain JSON, in SI).
 * Import-free, so that the drawings and the web app can read the results without the solver.
 */

/** A distribution of one random variable, in SI (angles in degrees, as in the section). */
export type Distribution =
  | { kind: 'normal'; mean: number; sd: number }
  /** Lognormal: the mean and SD of the variable itself (not of its logarithm). */
  | { kind: 'lognormal'; mean: number; sd: number }
  | { kind: 'uniform'; min: number; max: number }
  | { kind: 'triangular'; min: number; mode: number; max: number }
  /** A normal distribution cut at min and max (the mean and SD of the normal before the cut). */
  | { kind: 'truncated-normal'; mean: number; sd: number; min: number; max: number };

export type DistributionKind = Distribution['kind'];

/** One random variable: a numeric input of the section (its target, see target.ts) and its distribution. */
export interface RandomVariable {
  /** The variable's name in results and plots (the target when the file names none). */
  name: string;
  /** The input it varies, e.g. `materials.clay.cohesion`, `water.level`, `seismic.kh`. */
  target: string;
  distribution: Distribution;
}

/** A correlation coefficient between two variables (by name), applied to their normal scores. */
export interface Correlation {
  between: [string, string];
  coefficient: number;
}

export type SamplingMethod = 'monte-carlo' | 'latin-hypercube';

/**
 * `critical`: each realisation on the deterministic critical surface of its case (fast, the
 * common practice); `search`: the critical surface searched again in each realisation.
 */
export type RealisationSurface = 'critical' | 'search';

/** The probabilistic analysis a section asks for (the section file's `probability`), in SI. */
export interface ProbabilitySpec {
  variables: RandomVariable[];
  correlations: Correlation[];
  seed: number;
  method: SamplingMethod;
  realisations: number;
  surface: RealisationSurface;
}

/** A bar of a histogram: realisations with from ≤ FS < to. */
export interface HistogramBin {
  from: number;
  to: number;
  count: number;
}

/** An estimate of a probability counted from realisations, with its standard error √(P(1 − P)/N). */
export interface CountedProbability {
  p: number;
  standardError: number;
}

/** The reliability index β and the probability Φ(−β) it implies, for one assumed form of the distribution of FS. */
export interface Reliability {
  beta: number | null;
  pf: number | null;
}

/** The probabilistic result of one design case. */
export interface CaseProbability {
  case: string;
  requiredFs: number | null;
  /** The method and the FS of the deterministic analysis (mean values). */
  method: string;
  deterministicFs: number | null;
  surface: RealisationSurface;
  /** Realisations asked, and those that gave an FS (a realisation with no admissible surface or no convergence gives none). */
  realisations: number;
  valid: number;
  meanFs: number | null;
  sdFs: number | null;
  minFs: number | null;
  maxFs: number | null;
  /** P(FS < 1) counted, with its standard error. */
  pFailure: CountedProbability;
  /** P(FS < required FS) counted, with its standard error (null without a requirement). */
  pBelowRequired: CountedProbability | null;
  /** β = (μ − 1)/σ, and Φ(−β). */
  betaNormal: Reliability;
  /** β = ln(μ/√(1 + V²))/√ln(1 + V²), V = σ/μ, and Φ(−β). */
  betaLognormal: Reliability;
  histogram: HistogramBin[];
  /** The empirical CDF at up to 200 points [FS, P(F ≤ FS)]. */
  cdf: [number, number][];
  /** P(FS < 1) and its standard error after n realisations, at about 40 n. */
  convergence: { n: number; p: number; standardError: number }[];
}

/** The probabilistic result of a section: each case, in SI. */
export interface ProbabilityResult {
  id: string;
  title: string;
  station: number | null;
  method: SamplingMethod;
  seed: number;
  variables: RandomVariable[];
  correlations: Correlation[];
  cases: CaseProbability[];
  caution: string;
}

/** The Taylor series method (USACE ETL 1110-2-547, 1997) on one case. */
export interface TaylorCase {
  case: string;
  fsMean: number | null;
  /** Each variable: F at its mean ± one SD and its share of the variance (ΔFᵢ²/σF²). */
  terms: {
    variable: string;
    sd: number;
    fsMinus: number | null;
    fsPlus: number | null;
    share: number | null;
  }[];
  /**
   * The correlations' share of the variance, 2 Σ ρᵢⱼ ΔFᵢ ΔFⱼ / σF² (negative where they lower
   * it, as c′ with φ′ usually does); the shares then sum to 1. Null without correlations.
   */
  correlationShare: number | null;
  sdFs: number | null;
  betaNormal: Reliability;
  betaLognormal: Reliability;
  analyses: number;
}

export interface TaylorResult {
  id: string;
  title: string;
  cases: TaylorCase[];
  caution: string;
}

/** The FS of one case as one variable moves through its range (the others at their means). */
export interface SensitivitySeries {
  variable: string;
  target: string;
  /** [value, FS or null where no FS was found]. */
  points: [number, number | null][];
  /** The least and greatest FS over the range (the tornado's bar). */
  fsLow: number | null;
  fsHigh: number | null;
  /** The range's ends (the distribution's 1st and 99th percentile, or its bounds). */
  from: number;
  to: number;
}

export interface SensitivityCase {
  case: string;
  fsAtMeans: number | null;
  /** By variable, widest FS range first (the tornado's order). */
  series: SensitivitySeries[];
}

export interface SensitivityResult {
  id: string;
  title: string;
  station: number | null;
  cases: SensitivityCase[];
  caution: string;
}

/** One analysis made while solving for a value. */
export interface SolveStep {
  value: number;
  fs: number | null;
}

/** The critical surface at the solved value (SI). */
export type SolvedSurface =
  | { type: 'circle'; center: [number, number]; radius: number }
  | { type: 'polyline'; points: [number, number][] }
  | { type: 'plane'; angle: number; depth: number };

/** The value of one input at which a case's critical FS equals a target. */
export interface SolveResult {
  id: string;
  title: string;
  case: string;
  target: string;
  targetFs: number;
  range: [number, number];
  /** true: `value` gives the target FS (within the tolerance); false: `reason` says why not. */
  found: boolean;
  value: number | null;
  fs: number | null;
  method: string | null;
  surface: SolvedSurface | null;
  analyses: number;
  steps: SolveStep[];
  reason: string | null;
  caution: string;
}
