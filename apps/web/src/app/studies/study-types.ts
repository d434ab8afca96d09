/**
 * The shapes of the API's section studies (apps/api services/studies): a probabilistic
 * analysis, a sensitivity or a solve of one section's current input, made by a worker. The
 * results are the core's (plain JSON, SI), imported for their types only: nothing of the solver
 * comes into the browser.
 */
import type {
  ProbabilityResult,
  RealisationSurface,
  SamplingMethod,
  SensitivityResult,
  SolveResult,
  TaylorResult,
} from '@scarpline/core/result';
import type { StationProbability } from '@scarpline/core/result';
import type { JobState } from '@scarpline/core/verdict';
import type { UserRef } from '../core/models';

export type StudyKind = 'probability' | 'sensitivity' | 'solve';

/** The state of a study's making: the core's job states (queued, running, done, failed). */
export type StudyStatus = JobState;

/** A random variable as a section document writes it (SI, as the API stores the section). */
export interface VariableDocument {
  name?: string;
  target: string;
  distribution: 'normal' | 'lognormal' | 'uniform' | 'triangular' | 'truncated-normal';
  mean?: number;
  sd?: number;
  cov?: number;
  min?: number;
  max?: number;
  mode?: number;
}

/** A section document's `probability` block (schemas/section.schema.json $defs/probability). */
export interface ProbabilityDocument {
  variables: VariableDocument[];
  correlations?: { between: [string, string]; coefficient: number }[];
  seed?: number;
  method?: SamplingMethod;
  realisations?: number;
  surface?: RealisationSurface;
}

export type StudyRequest =
  | { kind: 'probability'; probability?: ProbabilityDocument }
  | { kind: 'sensitivity'; probability?: ProbabilityDocument; case?: string }
  | {
      kind: 'solve';
      target: string;
      case?: string;
      targetFs?: number;
      range: [number, number];
    };

export type StudyResult =
  | { kind: 'probability'; probability: ProbabilityResult; taylor: TaylorResult }
  | { kind: 'sensitivity'; sensitivity: SensitivityResult }
  | { kind: 'solve'; solve: SolveResult };

export interface Study {
  id: number;
  sectionId: number;
  batchId: number;
  /** The section run it studies. */
  run: number;
  kind: StudyKind;
  status: StudyStatus;
  /** As the API accepted it (defaults filled). */
  request: StudyRequest;
  progress: { done: number; total: number } | null;
  /** When done. */
  result: StudyResult | null;
  /** When failed. */
  problem: { title: string; detail?: string } | null;
  requestedBy: UserRef;
  createdAt: string;
  finishedAt: string | null;
  caution: string;
}

/**
 * A station's probability of one case, as a batch's section rows and a section carry it once
 * the section's own `probability` block (surface: critical) was run with it: the core's.
 */
export type ProbabilitySummary = StationProbability;
