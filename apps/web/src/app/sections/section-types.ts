/**
 * The shapes of GET /sections/{id} and GET /sections/{id}/runs (apps/api services/sections.ts
 * and services/runs.ts). The stored input is the solver's normalised section (SI) and the
 * results are the solver's reports (in the section's units): their types come from the core's
 * subpaths (/model, /result, /input), imported for their types only.
 */
import type { Message } from '@scarpline/core/input';
import type { Section } from '@scarpline/core/model';
import type { ProbabilitySummary } from '../studies/study-types';
import type {
  CaseKind,
  DrawdownReport,
  MethodReport,
  ReportedSurface,
  RequiredReinforcementReport,
  SectionResult,
  SeismicReport,
  Warning,
} from '@scarpline/core/result';
import type { MethodId } from '@scarpline/core/model';
import type { Verdict } from '@scarpline/core/verdict';
import type { SectionStatus } from '../batches/batch-types';
import type { UserRef } from '../core/models';
import type { ReviewSummary } from '../reviews/review-types';

export type {
  DesignCase,
  Load,
  Material,
  Reinforcement,
  MethodId,
  Point,
  Strength,
  UnitSystem,
} from '@scarpline/core/model';
export type {
  CaseKind,
  CrossingReport,
  DisplacementEstimate,
  DrawdownReport,
  DrawdownStage,
  MethodReport,
  ReinforcementReport,
  ReportedSurface,
  RequiredReinforcementReport,
  SeismicReport,
  SliceReport,
  Warning,
} from '@scarpline/core/result';

/** The stored input: the validated, normalised section as the solver took it (SI). */
export type SectionInput = Section;

/**
 * The search report of a result. The core exports its own name `SearchReport` for the
 * drawing's narrower type (without `noncircularMethod`), so the result's is taken from
 * SectionResult.
 */
export type SearchReport = NonNullable<SectionResult['search']>;

/**
 * One design case of a run's result (the core's CaseResult, its `results` named `methods` as
 * in RunResult): its requirement, its methods on its critical surface, its verdict, and the
 * rapid-drawdown or earthquake report of a case of that kind.
 */
export interface CaseView {
  name: string;
  kind: CaseKind;
  requiredFs: number | null;
  /** The methods whose FS govern the case (the others are for comparison). */
  governs: MethodId[];
  governing: { method: MethodId; fs: number } | null;
  /** The governing FS over the required FS; null without either, or with no significant slope. */
  ratio: number | null;
  verdict: Verdict;
  warnings: Warning[];
  methods: MethodReport[];
  criticalSurface: ReportedSurface | null;
  /** With the current result of GET /sections/{id} only; null otherwise or without a search. */
  search: SearchReport | null;
  drawdown?: DrawdownReport;
  seismic?: SeismicReport;
  /** A case below its requirement whose section asks for it: the extra reinforcement that meets it. */
  requiredReinforcement?: RequiredReinforcementReport;
}

/**
 * One run's result as the API stores it (resultView): the solver's result (its verdict in the
 * core's codes) with the run, the timings (ISO strings) and the attempt the API adds;
 * `methods` is the solver's `results`, `criticalSurface` the governing method's surface.
 */
export interface RunResult extends Pick<
  SectionResult,
  'governing' | 'requiredFs' | 'verdict' | 'warnings' | 'solverVersion' | 'caution'
> {
  run: number;
  reason: string | null;
  criticalSurface: ReportedSurface | null;
  methods: MethodReport[];
  inputHash: string;
  timings: { startedAt: string | null; finishedAt: string | null; durationMs: number | null };
  attempt: number;
  /** Only on the current run's result. */
  search?: SearchReport | null;
  /**
   * The case with the lowest FS / required FS, whose methods, surface and search the fields
   * above are (the verdict is the station's, over every case); absent from an API before
   * design cases.
   */
  governingCase?: string | null;
  /** Every design case, in the order the section lists them. */
  cases?: CaseView[];
}

/**
 * A warning of the input checks (validate.ts `messageView`: the core's message with `text`,
 * it as one line), located in the submitted file (edited-section.json after a re-run with
 * edits). A section keeps those about it, without the ids of the sections a message concerns.
 */
export interface InputWarning extends Omit<Message, 'sections'> {
  severity: 'warning';
  text: string;
}

/** GET /sections/{id} (sectionView). */
export interface SectionView {
  id: number;
  batchId: number;
  key: string;
  station: number | null;
  /** The chainage in the file's units ("1+240"); not every version of the API sends it. */
  stationLabel?: string | null;
  status: SectionStatus;
  run: number;
  failReason: string | null;
  /** The user id of who submitted the batch (they may not review it). */
  submittedBy: number;
  /** Who submitted the batch, by name. */
  submitter: UserRef;
  input: SectionInput;
  /** The warnings of the input checks about the section's current input, located in its file. */
  inputWarnings: InputWarning[];
  result: RunResult | null;
  previous: RunResult[];
  review: ReviewSummary;
  /**
   * The run's probability of failure by case, when the section has a probability block on the
   * critical surface (the section job computes it); absent from an API before it.
   */
  probability?: ProbabilitySummary[] | null;
  caution: string;
}

/** One run in GET /sections/{id}/runs. */
export interface RunEntry {
  run: number;
  current: boolean;
  /** The merge patch that started the run; null for the run as submitted. */
  changes: unknown;
  /** The user id of who started the run with edits; null for the run as submitted. */
  editedBy: number | null;
  /** Who started the run with edits, by name; null for the run as submitted. */
  editor: UserRef | null;
  input: SectionInput | null;
  result: RunResult | null;
}

export interface RunsView {
  sectionId: number;
  key: string;
  run: number;
  runs: RunEntry[];
  caution: string;
}

/** The body of POST /sections/{id}/runs: a JSON merge patch of the section document, in SI. */
export type SectionPatch = Record<string, unknown>;
