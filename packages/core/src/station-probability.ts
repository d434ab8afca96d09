/**
 * The probability of failure a corridor's station carries: where its section asks for a
 * probabilistic analysis on the critical surface (its `probability` block, surface `critical`),
 * each case's P(FS < 1) and P(FS < required) counted with their standard errors, the mean and
 * SD of FS and β in its normal and lognormal forms, summed up from the core's full result
 * (probability/probability.ts). A section that searches again in each realisation is left to a
 * study of its own (the service's studies, `scarpline probability --search`): too long for a
 * corridor's run.
 */
import { type Critical, caseModels } from './probability/case-fs';
import { meanOf } from './probability/distributions';
import { ProbabilityInputError, analyzeProbability } from './probability/probability';
import { parseTarget, targetValue } from './probability/target';
import type { CaseProbability, ProbabilityResult, ProbabilitySpec } from './probability/types';
import type { Section } from './model/types';
import type { StationProbability, StationResult, Warning } from './result';
import { type AnalyzeOptions, AnalysisStopped } from './work-limit';

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
 * The critical surfaces at the variables' means taken from the station's deterministic result,
 * where that result is the analysis at the means: every variable's mean is exactly the value
 * the section has (in every case), and the result is in SI (a section in SI). Undefined
 * otherwise: the run searches at the means itself.
 */
function criticalsFrom(
  section: Section,
  spec: ProbabilitySpec,
  result: StationResult,
): Record<string, Critical> | undefined {
  if (section.units !== 'si' || result.units !== 'si') return undefined;
  const out: Record<string, Critical> = {};
  for (const model of caseModels(section)) {
    for (const v of spec.variables) {
      const t = parseTarget(v.target);
      const now = t.ok ? targetValue(model.section, t.target) : null;
      if (!now?.ok || now.value !== meanOf(v.distribution)) return undefined;
    }
    const c = result.cases.find((x) => x.name === model.name);
    if (!c) return undefined;
    const g = c.governing;
    const report = g ? c.results.find((m) => m.method === g.method && m.converged) : undefined;
    out[model.name] = g
      ? { fs: g.fs, method: g.method, surface: report?.surface ?? null }
      : { fs: null, method: null, surface: null };
  }
  return out;
}

/**
 * The station's probability of failure by case (null where the section does not ask for one on
 * the critical surface), with the full result beside it. Given the station's deterministic
 * result (analyzeSection's), its critical surfaces are reused where they are those at the
 * means (criticalsFrom), which spares a search per case and gives the same numbers. Throws
 * what analyzeProbability throws (ProbabilityInputError, AnalysisStopped at the work bound or
 * the caller's stop).
 *
 * @example stationProbability(section, {}, analyzeSection(section))?.summary[0].pFailure.p // → 0.012
 */
export function stationProbability(
  section: Section,
  options: AnalyzeOptions = {},
  deterministic?: StationResult,
): { summary: StationProbability[]; result: ProbabilityResult } | null {
  if (!section.probability || !runsStationProbability(section)) return null;
  const spec = section.probability;
  const criticals = deterministic ? criticalsFrom(section, spec, deterministic) : undefined;
  const result = analyzeProbability(section, spec, { ...options, criticals });
  return { summary: result.cases.map(probabilitySummary), result };
}

/**
 * A corridor run's station probability: the summary, or the warning that says why the station
 * has none while its FS and verdict stand — a variable that a case cannot take, or the
 * realisations stopped at the caller's time limit or the work bound. What the service's section
 * job and `scarpline batch` both attach to a station's result.
 *
 * @example stationProbabilityOrWarning(section, {}, result).warning?.code // → 'probability-not-computed'
 */
export function stationProbabilityOrWarning(
  section: Section,
  options: AnalyzeOptions,
  deterministic: StationResult,
): { summary: StationProbability[] | null; warning: Warning | null } {
  try {
    return {
      summary: stationProbability(section, options, deterministic)?.summary ?? null,
      warning: null,
    };
  } catch (e) {
    if (!(e instanceof ProbabilityInputError || e instanceof AnalysisStopped)) throw e;
    return {
      summary: null,
      warning: {
        code: 'probability-not-computed',
        message: `the probability of failure was not computed (the FS and the verdict stand): ${e.message}`,
      },
    };
  }
}
