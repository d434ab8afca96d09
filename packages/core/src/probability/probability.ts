/**
 * Probabilistic analysis of a section: its random variables sampled (sampling.ts), each
 * realisation's FS on each case's deterministic critical surface or with the surface searched
 * again (case-fs.ts), and the statistics of FS per case (mean, SD, P(FS < 1) and P(FS <
 * required) counted with their standard errors, β in its normal and lognormal forms, the
 * histogram, the CDF, the convergence of P_f with N).
 *
 * A run is split so that a service can share it among workers: `probabilityRun` prepares it
 * (the critical surfaces, the sampler), `realisationsFs` gives the FS of realisations from..to
 * of one case, and `caseProbability` sums the FS of all realisations up; chunks computed
 * anywhere give exactly the numbers of one run.
 */
import { CAUTION } from '../caution';
import type { Section } from '../model/types';
import { type AnalyzeOptions, AnalysisStopped } from '../work-limit';
import {
  type CaseFs,
  type CaseModel,
  type Critical,
  caseModels,
  criticalOf,
  fsOnSurface,
  fsWithSearch,
} from './case-fs';
import { meanOf, phi, valueAtScore } from './distributions';
import { type Sampler, cholesky, sampler } from './sampling';
import { type Target, applyValues, parseTarget } from './target';
import type {
  CaseProbability,
  CountedProbability,
  HistogramBin,
  ProbabilityResult,
  ProbabilitySpec,
  Reliability,
} from './types';

/** What a run is given besides the section: the work bound of each analysis, a stop, progress. */
export interface ProbabilityOptions extends AnalyzeOptions {
  /** Called now and then with the realisations done and the total (over every case). */
  onProgress?: (done: number, total: number) => void;
  /** Only this case (by name); every case when not given. */
  caseName?: string;
  /** The deterministic critical surfaces by case, when already known (a chunk on another worker). */
  criticals?: Record<string, Critical>;
}

/** One case of a prepared run. */
export interface RunCase {
  model: CaseModel;
  critical: Critical;
  fs: CaseFs;
}

/** A run prepared: its cases, targets and sampler. */
export interface ProbabilityRun {
  spec: ProbabilitySpec;
  targets: Target[];
  cases: RunCase[];
  sampler: Sampler;
}

/** Why a run cannot start: a target the section does not have, correlations that cannot hold. */
export class ProbabilityInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProbabilityInputError';
  }
}

/** The correlation matrix of the variables (identity where no pair is given). */
export function correlationMatrix(spec: ProbabilitySpec): number[][] {
  const names = spec.variables.map((v) => v.name);
  const c = names.map((_, i) => names.map((__, j): number => (i === j ? 1 : 0)));
  for (const k of spec.correlations) {
    const i = names.indexOf(k.between[0]);
    const j = names.indexOf(k.between[1]);
    if (i < 0 || j < 0)
      throw new ProbabilityInputError(
        `correlation between ${k.between.join(' and ')}: no such variable`,
      );
    c[i][j] = c[j][i] = k.coefficient;
  }
  return c;
}

/** The targets of the variables, parsed; throws ProbabilityInputError on a bad one. */
export function targetsOf(spec: ProbabilitySpec): Target[] {
  return spec.variables.map((v) => {
    const t = parseTarget(v.target);
    if (!t.ok) throw new ProbabilityInputError(`variable ${v.name}: ${t.reason}`);
    return t.target;
  });
}

/**
 * An FS on a fixed surface that asks the caller's stop every 64 realisations (a search asks it
 * through its work meter; one surface has no meter) and throws AnalysisStopped when told.
 */
function stoppable(fs: CaseFs, shouldStop: (() => boolean) | undefined): CaseFs {
  if (!shouldStop) return fs;
  let n = 0;
  return (section) => {
    if ((++n & 63) === 0 && shouldStop())
      throw new AnalysisStopped(
        'stopped',
        `stopped at its time limit after ${(n - 1).toLocaleString('en-GB')} realisations on the critical surface: ask for fewer realisations`,
      );
    return fs(section);
  };
}

/**
 * Prepares a run: each case (or the one named) with its deterministic critical surface (or
 * the one given in options.criticals) and its FS function, and the seeded sampler.
 */
export function probabilityRun(
  section: Section,
  spec: ProbabilitySpec,
  options: ProbabilityOptions = {},
): ProbabilityRun {
  const targets = targetsOf(spec);
  const c = correlationMatrix(spec);
  const factor = spec.correlations.length > 0 ? cholesky(c) : null;
  if (spec.correlations.length > 0 && !factor)
    throw new ProbabilityInputError(
      'the correlations cannot hold together (their matrix is not positive definite)',
    );
  const cases = caseModels(section, options.caseName).map((model): RunCase => {
    // the deterministic analysis is at the variables' means
    const atMeans = valuesApplied(
      model.section,
      targets,
      spec.variables.map((v) => meanOf(v.distribution)),
      model.name,
    );
    const critical = options.criticals?.[model.name] ?? criticalOf(atMeans, options);
    const fs =
      spec.surface === 'search'
        ? fsWithSearch(options)
        : stoppable(fsOnSurface(atMeans, critical, targets), options.shouldStop);
    // realisations set the variables on the case as given (water.level shifts its own line)
    return { model, critical, fs };
  });
  return {
    spec,
    targets,
    cases,
    sampler: sampler(targets.length, spec.realisations, spec.seed, spec.method, factor),
  };
}

/** The case's section with the variables at the given values; throws where a target does not fit. */
export function valuesApplied(
  section: Section,
  targets: readonly Target[],
  values: ArrayLike<number>,
  caseName: string,
): Section {
  const a = applyValues(
    section,
    targets.map((target, k) => ({ target, value: values[k] })),
  );
  if (!a.ok) throw new ProbabilityInputError(`case ${caseName}: ${a.reason}`);
  return a.section;
}

/** The variables' values in realisation i (SI). */
export function realisationValues(run: ProbabilityRun, i: number): number[] {
  const z = run.sampler.scores(i);
  return run.spec.variables.map((v, k) => valueAtScore(v.distribution, z[k]));
}

/**
 * The FS of realisations from ≤ i < to of one case of a run (null where the realisation has
 * no FS: a value its input cannot take, no admissible surface, no convergence).
 *
 * @example realisationsFs(run, 0, 0, 100) // → [1.31, 1.27, …]
 */
export function realisationsFs(
  run: ProbabilityRun,
  caseIndex: number,
  from: number,
  to: number,
  onEach?: () => void,
): (number | null)[] {
  const rc = run.cases[caseIndex];
  const base = rc.model.section;
  const out: (number | null)[] = [];
  const pairs = run.targets.map((target) => ({ target, value: 0 }));
  for (let i = from; i < to; i++) {
    const values = realisationValues(run, i);
    for (let k = 0; k < pairs.length; k++) pairs[k].value = values[k];
    const a = applyValues(base, pairs);
    out.push(a.ok ? rc.fs(a.section) : null);
    onEach?.();
  }
  return out;
}

/**
 * Whether an SD of FS is a spread and not rounding: an FS that the variables do not move (the
 * critical surface misses every material they touch) differs between analyses by about 1e-14,
 * and has no β (not 10¹³). Below 1e-9 of the mean, the FS does not vary.
 */
const varies = (mean: number, sd: number) => sd > 1e-9 * Math.abs(mean);

/** A probability counted from N realisations, with its standard error √(P(1 − P)/N). */
export function counted(hits: number, n: number): CountedProbability {
  if (n === 0) return { p: NaN, standardError: NaN };
  const p = hits / n;
  return { p, standardError: Math.sqrt((p * (1 - p)) / n) };
}

/** β = (μ − 1)/σ of a normal FS, and Φ(−β). */
export function betaNormal(mean: number, sd: number): Reliability {
  if (!varies(mean, sd)) return { beta: null, pf: null };
  const beta = (mean - 1) / sd;
  return { beta, pf: phi(-beta) };
}

/** β = ln(μ/√(1 + V²))/√ln(1 + V²) of a lognormal FS (V = σ/μ), and Φ(−β). */
export function betaLognormal(mean: number, sd: number): Reliability {
  if (!varies(mean, sd) || !(mean > 0)) return { beta: null, pf: null };
  const v2 = (sd / mean) ** 2;
  const beta = Math.log(mean / Math.sqrt(1 + v2)) / Math.sqrt(Math.log(1 + v2));
  return { beta, pf: phi(-beta) };
}

/** Mean and sample SD (n − 1) of numbers. */
export function meanSd(xs: readonly number[]): { mean: number; sd: number } {
  const n = xs.length;
  if (n === 0) return { mean: NaN, sd: NaN };
  let s = 0;
  for (const x of xs) s += x;
  const mean = s / n;
  let q = 0;
  for (const x of xs) q += (x - mean) ** 2;
  return { mean, sd: n > 1 ? Math.sqrt(q / (n - 1)) : 0 };
}

function histogram(sorted: readonly number[], bins = 30): HistogramBin[] {
  if (sorted.length === 0) return [];
  const lo = sorted[0];
  const hi = sorted[sorted.length - 1];
  const w = hi > lo ? (hi - lo) / bins : 1;
  const out: HistogramBin[] = Array.from({ length: hi > lo ? bins : 1 }, (_, k) => ({
    from: lo + k * w,
    to: lo + (k + 1) * w,
    count: 0,
  }));
  for (const x of sorted) out[Math.min(out.length - 1, Math.floor((x - lo) / w))].count++;
  return out;
}

function cdf(sorted: readonly number[], points = 200): [number, number][] {
  const n = sorted.length;
  if (n === 0) return [];
  const step = Math.max(1, Math.floor(n / points));
  const out: [number, number][] = [];
  for (let i = step - 1; i < n; i += step) out.push([sorted[i], (i + 1) / n]);
  if (out[out.length - 1][0] !== sorted[n - 1]) out.push([sorted[n - 1], 1]);
  return out;
}

/**
 * The statistics of one case from the FS of all its realisations, in order (null: none). The
 * probabilities are counted over the realisations that gave an FS.
 */
export function caseProbability(
  rc: RunCase,
  spec: ProbabilitySpec,
  fs: readonly (number | null)[],
): CaseProbability {
  const valid = fs.filter((x): x is number => x !== null && Number.isFinite(x));
  const sorted = [...valid].sort((a, b) => a - b);
  const { mean, sd: spread } = meanSd(valid);
  const sd = varies(mean, spread) ? spread : 0;
  const required = rc.model.requiredFs;
  const below = (limit: number) => valid.reduce((k, x) => k + (x < limit ? 1 : 0), 0);
  const convergence: CaseProbability['convergence'] = [];
  const steps = Math.min(40, fs.length);
  let hits = 0;
  let seen = 0;
  let next = 1;
  for (let i = 0; i < fs.length; i++) {
    const x = fs[i];
    if (x !== null && Number.isFinite(x)) {
      seen++;
      if (x < 1) hits++;
    }
    if (i + 1 >= Math.ceil((next * fs.length) / steps)) {
      const c = counted(hits, seen);
      convergence.push({ n: i + 1, p: c.p, standardError: c.standardError });
      next++;
    }
  }
  const n = valid.length;
  return {
    case: rc.model.name,
    requiredFs: required,
    method: rc.critical.method ?? 'none',
    deterministicFs: rc.critical.fs,
    surface: spec.surface,
    realisations: fs.length,
    valid: n,
    meanFs: n ? mean : null,
    sdFs: n > 1 ? sd : null,
    minFs: n ? sorted[0] : null,
    maxFs: n ? sorted[n - 1] : null,
    pFailure: counted(below(1), n),
    pBelowRequired: required !== null ? counted(below(required), n) : null,
    betaNormal: n > 1 ? betaNormal(mean, sd) : { beta: null, pf: null },
    betaLognormal: n > 1 ? betaLognormal(mean, sd) : { beta: null, pf: null },
    histogram: histogram(sorted),
    cdf: cdf(sorted),
    convergence,
  };
}

/**
 * The probabilistic analysis of a section in one call: every case (or options.caseName), all
 * N realisations, the statistics per case; in SI with the caution. Throws
 * ProbabilityInputError where the section does not have a variable's target, AnalysisStopped
 * at the work bound or the caller's stop.
 *
 * @example analyzeProbability(section, section.probability!).cases[0].pFailure.p // → 0.012
 */
export function analyzeProbability(
  section: Section,
  spec: ProbabilitySpec,
  options: ProbabilityOptions = {},
): ProbabilityResult {
  const run = probabilityRun(section, spec, options);
  const total = run.cases.length * spec.realisations;
  let done = 0;
  const tick = () => {
    done++;
    if (options.onProgress && (done % 100 === 0 || done === total)) options.onProgress(done, total);
  };
  const cases = run.cases.map((rc, k) =>
    caseProbability(rc, spec, realisationsFs(run, k, 0, spec.realisations, tick)),
  );
  return probabilityResult(section, spec, cases);
}

/** The result of a section from its cases' statistics. */
export function probabilityResult(
  section: Section,
  spec: ProbabilitySpec,
  cases: CaseProbability[],
): ProbabilityResult {
  return {
    id: section.id,
    title: section.title,
    station: section.station,
    method: spec.method,
    seed: spec.seed,
    variables: spec.variables,
    correlations: spec.correlations,
    cases,
    caution: CAUTION,
  };
}
