/**
 * The result contract: what analyzeSection returns, in the section's own units, for the CLI,
 * the API, the web app and the drawings alike. schemas/result.schema.json describes the same
 * shape as JSON; a test checks every example's result against it.
 */
import type { MethodId, Point, SearchSurface, UnitSystem } from './model/types';
import type { Verdict } from './verdict';
import type { ReinforcementReport, RequiredReinforcementReport } from './reinforcement/types';

export type {
  CrossingReport,
  ReinforcementReport,
  RequiredReinforcementReport,
} from './reinforcement/types';
/** The results of a probabilistic analysis, a sensitivity and a solve (types: no solver comes). */
export type * from './probability/types';

export { howFoundWords } from './search-words';
export { limitWords } from './reinforcement/limit-words';
export { caseOf, caseView } from './case-view';

/** One slice as reported (section coordinates and units; forces per unit run). */
export interface SliceReport {
  /** x of the slice middle, width b, base inclination α (degrees, positive where the base rises to the right). */
  x: number;
  width: number;
  alpha: number;
  baseLength: number;
  weight: number;
  porePressure: number;
  /** Effective base normal force N′ and mobilised shear S. */
  normal: number;
  shear: number;
  /**
   * Interslice normal E and shear X on the slice's right side, null where the method does not
   * compute them (Bishop's simplified method assumes X = 0 and solves for neither; Janbu's
   * gives E only); thrust: height of the line of thrust there (null where undefined).
   */
  interslice: { E: number | null; X: number | null; thrust: number | null };
  material: string;
  /**
   * The strength the base took: c (c′ or Su, kPa) and φ (degrees; 0 for Su), and for a
   * strength that varies with stress the stress it was taken at (kPa): the effective normal
   * stress σ′n on the base (`normal`: Hoek–Brown, shear–normal points, bilinear) or the
   * vertical effective stress σ′v (`vertical`: Su from σ′v); null for a fixed strength.
   * Absent in results of earlier versions.
   */
  cohesion?: number;
  frictionAngle?: number;
  strengthAt?: { kind: 'normal' | 'vertical'; stress: number } | null;
  /** The reinforcement force on the slice in the equilibrium (kN per m run); absent without reinforcement. */
  reinforcement?: number;
}

export type ReportedSurface =
  | { type: 'circle'; center: Point; radius: number }
  | { type: 'polyline'; points: Point[] }
  | { type: 'plane'; angle: number; depth: number }
  | { type: 'log-spiral'; pole: Point; r0: number; r1: number; points: Point[] };

export interface Warning {
  code: string;
  message: string;
}

export interface MethodReport {
  method: MethodId;
  fs: number | null;
  converged: boolean;
  iterations: number;
  reason?: string;
  surface: ReportedSurface | null;
  /** The slip surface actually used, after following a rigid base and cutting at a crack. */
  base?: Point[];
  ends?: { upper: Point; lower: Point };
  crack?: { x: number; depth: number; waterDepth: number; waterForce: number } | null;
  slices: SliceReport[];
  warnings: Warning[];
  /** Janbu: F0 and f0 (fs = f0·F0). */
  fsUncorrected?: number;
  correction?: number;
  /** Spencer and Morgenstern–Price: λ (X = λ f E); Spencer: θ = atan λ (degrees). */
  lambda?: number;
  theta?: number;
  intersliceFunction?: string;
  /** φ = 0 circle: weight of the mass and its lever arm about the centre. */
  massWeight?: number;
  leverArm?: number;
  /** Where some base's strength depends on its normal stress: the method's solutions until it settled. */
  strengthIterations?: number;
  /** Each reinforcing element of the section: its crossings with this surface and their forces. */
  reinforcement?: ReinforcementReport[];
}

export interface SectionResult {
  id: string;
  title: string;
  station: number | null;
  units: UnitSystem;
  case: string | null;
  requiredFs: number | null;
  results: MethodReport[];
  governing: { method: MethodId; fs: number } | null;
  /** The governing FS against the required FS (verdict.ts); never `input-error` here. */
  verdict: Verdict;
  warnings: Warning[];
  /** What the search did, when the surface was searched for. */
  search: SearchReport | null;
  solverVersion: string;
  caution: string;
  /**
   * The probability of failure of each case on its critical surface, where the section asks
   * for it (a `probability` block with surface `critical`; station-probability.ts); absent or
   * null otherwise.
   */
  probability?: StationProbability[] | null;
}

/**
 * The summary of one case's probabilistic analysis a corridor's station carries (the CSV's
 * pf, pf_se, beta_normal and beta_lognormal; the full result is the core's CaseProbability).
 */
export interface StationProbability {
  case: string;
  realisations: number;
  valid: number;
  meanFs: number | null;
  sdFs: number | null;
  /** P(FS < 1) counted, with its standard error. */
  pFailure: { p: number; standardError: number };
  /** P(FS < required FS) counted (null without a requirement). */
  pBelowRequired: { p: number; standardError: number } | null;
  betaNormal: number | null;
  betaLognormal: number | null;
}

/** A grid of circle centres, in the section's units: x and y ranges and the number of centres along each. */
export interface GridReport {
  x: [number, number];
  y: [number, number];
  nx: number;
  ny: number;
}

/** The search, in the section's units: trials, grid moves, the FS map over the centres, the trial surfaces near the least FS. */
export interface SearchReport {
  type: SearchSurface['type'];
  /** The method the circles were searched with (the critical surface of each method is evaluated exactly). */
  method: MethodId;
  /** The method the noncircular polylines were searched with, when they were. */
  noncircularMethod?: MethodId;
  trials: number;
  moves: { reason: string; grid: GridReport }[];
  grid: GridReport | null;
  /** fs[j][i]: the lowest FS over the radii at the centre (xs[i], ys[j]); null where no circle was admissible. */
  map: { xs: number[]; ys: number[]; fs: (number | null)[][] } | null;
  /**
   * The trial surfaces within `within` of the least FS (FS ≤ (1 + within)·least; analysis.trialBand):
   * how many the search tried, and the distinct ones kept for the drawing (at most 100, lowest first).
   */
  trialBand: {
    within: number;
    count: number;
    surfaces: { surface: ReportedSurface; fs: number }[];
  };
  /** How the critical circle was found and confirmed, for a checker. */
  howFound: HowFound | null;
}

/** Where a trial circle came from: a stage of the search, and the boundary it touched. */
export interface CircleOrigin {
  stage: 'grid' | 'ground-ranges' | 'polish';
  /** The material below the stratum boundary the circle was made to touch, or null. */
  touching: string | null;
}

/** The search's account of the critical circle: candidates, polishes, confirmation. */
export interface HowFound {
  /** Trial circles by stage: the grid (with the circles tangent to each boundary), the ground ranges, the polishes. */
  candidates: { grid: number; groundRanges: number; polish: number };
  /** The stratum boundaries (named by the material below each) that circles were made tangent to. */
  boundaries: string[];
  /** Each polish: its start and end FS, the circles it tried, and the boundary it kept touching (null when free). */
  polishes: {
    from: number;
    to: number;
    start: CircleOrigin;
    evaluations: number;
    touching: string | null;
  }[];
  /** Where the critical circle came from (for a polish: the boundary its chain of polishes kept touching, or started touching). */
  critical: CircleOrigin;
  /** The critical circle's FS as the search found it, and cut afresh and solved by Bishop's method in full. */
  confirmation: { method: MethodId; searched: number; exact: number | null };
}

// --- design cases (issue: every station under every case) -------------------------------

/**
 * The kind of a design case. The kind decides what is computed besides the factor of safety:
 * `rapid-drawdown` runs the three-stage drawdown (and the drained drawdown beside it);
 * `seismic` adds the yield coefficient and the permanent displacement. The others are names
 * of the trade for a set of water, strength and loads (EM 1110-2-1902, 2003, ch. 3).
 */
export const CASE_KINDS = [
  'end-of-construction',
  'long-term',
  'steady-seepage',
  'rapid-drawdown',
  'seismic',
  'surcharge',
  'other',
] as const;
export type CaseKind = (typeof CASE_KINDS)[number];

/** One estimate of the permanent displacement of a sliding block (section units: mm or in). */
export interface DisplacementEstimate {
  /** `jibson-2007` (eq. 6), `jibson-2007-magnitude` (eq. 7, with M) or `ambraseys-menu-1988`. */
  relation: string;
  /** Median displacement and the value one standard deviation (of the log) above it. */
  median: number;
  plusOneSd: number;
  /** Whether the inputs lie within the data the relation was fitted to. */
  inRange: boolean;
  warnings: Warning[];
}

/** The earthquake part of a seismic case. */
export interface SeismicReport {
  /** The yield coefficient: the kh at which the least FS of the search is 1.0, with its surface; null when none in range. */
  ky: number | null;
  kySurface: ReportedSurface | null;
  /** Analyses (full searches) the root finding took. */
  analyses: number;
  /** Design peak ground acceleration as a fraction of g, and the magnitude when given. */
  pga: number | null;
  magnitude: number | null;
  displacements: DisplacementEstimate[];
  /** The allowable displacement the user gave, and whether the governing estimate (the largest median) is within it. */
  allowable: number | null;
  within: boolean | null;
}

/** Which stage set the strength of a slice in a rapid-drawdown analysis. */
export type DrawdownStage = 'drained' | 'undrained' | 'drained-lower';

/** The rapid-drawdown part of a case: the three-stage F and the drained-drawdown F beside it. */
export interface DrawdownReport {
  /** Stage 1 (before drawdown, effective stresses), stage 2 (undrained), stage 3 (drained where lower): F of each, by the governing method. */
  stages: { stage: 1 | 2 | 3; fs: number | null }[];
  /**
   * F with post-drawdown pore pressures and drained strengths everywhere, on the same surface:
   * the comparison the three-stage F is normally at or below (stage 3 keeps the lower of the
   * two strengths on each base).
   */
  drainedFs: number | null;
  /** Per slice of the governing surface: the strength used and the stage that set it. */
  slices: { x: number; material: string; strength: number; stage: DrawdownStage }[];
}

/**
 * The result of one design case: the factors of safety of its methods on its critical surface,
 * as a single-case section result always was, with the case's kind and requirement.
 */
export interface CaseResult {
  name: string;
  kind: CaseKind;
  requiredFs: number | null;
  /** The methods whose FS govern this case (the rest are for comparison). */
  governs: MethodId[];
  results: MethodReport[];
  governing: { method: MethodId; fs: number } | null;
  /** governing FS / required FS (null without either). */
  ratio: number | null;
  verdict: Verdict;
  warnings: Warning[];
  search: SearchReport | null;
  drawdown?: DrawdownReport;
  seismic?: SeismicReport;
  /** Where the section asks for it and the case is below its requirement: the extra reinforcement that meets it. */
  requiredReinforcement?: RequiredReinforcementReport;
}

/**
 * The result of a station: every case, and the station's verdict — it meets the requirement
 * only when every case does; the governing case has the lowest FS / required FS (or, for a
 * displacement, the largest displacement / allowable).
 */
export interface StationResult {
  id: string;
  title: string;
  station: number | null;
  units: UnitSystem;
  cases: CaseResult[];
  governing: {
    case: string;
    method: MethodId;
    fs: number;
    requiredFs: number | null;
    ratio: number | null;
  } | null;
  verdict: Verdict;
  /** Warnings of the station as a whole (e.g. `no-significant-slope`). */
  warnings: Warning[];
  solverVersion: string;
  caution: string;
}
