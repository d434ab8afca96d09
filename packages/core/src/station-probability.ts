/**
 * The probability of failure a corridor's station carries: where its section asks for a
 * probabilistic analysis on the critical surface (its `probability` block, surface `critical`),
 * each case's P(FS < 1) and P(FS < required) counted with their standard errors, the mean and
 * SD of FS and β in its normal and lognormal forms, summed up from the core's full result
 * (probability/probability.ts). A section that searches again in each realisation is left to a
 * study of its own (the service's studies, `scarpline probability --search`): too long for a
 * corridor's run.
 */
import { analyzeProbability } from './probability/probability';
import type { CaseProbability, ProbabilityResult } from './probability/types';
import type { Section } from './model/types';
import type { StationProbability } from './result';
import type { AnalyzeOptions } from './work-limit';

/**
 * One case's summary.
 *
 * @example probabilitySummary(result.cases[0]).pFailure.p // → 0.012
 */
export function probabilitySummary(c: CaseProbability): StationProbability {
  return {
    case: c.case,
    realisations: c.realisations,
    valid: c.valid,
    meanFs: c.meanFs,
    sdFs: c.sdFs,
    pFailure: c.pFailure,
    pBelowRequired: c.pBelowRequired,
    betaNormal: c.betaNormal.beta,
    betaLognormal: c.betaLognormal.beta,
  };
}

/** Whether a corridor's run computes the station's probability: a `probability` block on the critical surface. */
export function runsStationProbability(section: Section): boolean {
  return section.probability?.surface === 'critical';
}

/**
 * The station's probability of failure by case (null where the section does not ask for one on
 * the critical surface), with the full result beside it. Throws what analyzeProbability throws
 * (ProbabilityInputError, AnalysisStopped at the work bound or the caller's stop).
 *
 * @example stationProbability(section)?.summary[0].pFailure.p // → 0.012
 */
export function stationProbability(
  section: Section,
  options: AnalyzeOptions = {},
): { summary: StationProbability[]; result: ProbabilityResult } | null {
  if (!section.probability || !runsStationProbability(section)) return null;
  const result = analyzeProbability(section, section.probability, options);
  return { summary: result.cases.map(probabilitySummary), result };
}
