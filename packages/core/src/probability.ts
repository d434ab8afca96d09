/**
 * Probabilistic analysis, sensitivity and solving for a value (the solver's; not in the
 * browser build): the one home of a section's numeric inputs (targets), the distributions and
 * the seeded sampling loop, the Taylor series method, one-at-a-time sensitivity and solving
 * for the value of an input at which the critical FS equals a target.
 */
export * from './probability/types';
export {
  parseTarget,
  targetValue,
  targetQuantity,
  applyValue,
  applyValues,
  type Target,
  type ParsedTarget,
  type TargetValue,
  type Applied,
} from './probability/target';
export {
  valueAtScore,
  quantile,
  meanOf,
  sdOf,
  plotRange,
  phi,
  phiInverse,
  lognormalParameters,
} from './probability/distributions';
export { cholesky, sampler, streamSeed, type Sampler } from './probability/sampling';
export {
  caseModels,
  criticalOf,
  fsOnSurface,
  fsWithSearch,
  type CaseModel,
  type CaseFs,
  type Critical,
} from './probability/case-fs';
export {
  analyzeProbability,
  probabilityRun,
  realisationsFs,
  realisationValues,
  caseProbability,
  probabilityResult,
  correlationMatrix,
  counted,
  betaNormal,
  betaLognormal,
  meanSd,
  ProbabilityInputError,
  type ProbabilityOptions,
  type ProbabilityRun,
  type RunCase,
} from './probability/probability';
export { taylorSeries } from './probability/taylor';
export { sensitivity } from './probability/sensitivity';
export { solveForValue, type SolveRequest, type SolveOptions } from './probability/solve-value';
export {
  normaliseProbability,
  DEFAULT_REALISATIONS,
  type RawProbability,
} from './probability/normalise-probability';
export {
  countedText,
  percentText,
  valueText,
  distributionWords,
  variableDistributionWords,
  probabilityBasisWords,
  SAMPLING_WORDS,
  REALISATION_SURFACE_WORDS,
  COUNTED_WORDS,
  BETA_WORDS,
} from './probability/probability-words';
