/**
 * The shapes of GET /sections/{id} and GET /sections/{id}/runs (apps/api services/sections.ts
 * and services/rerun.ts), with the result of the solver as packages/core/src/analyze.ts
 * reports it. Results are in the section's units; the stored input is normalised to SI.
 */
import type { UserRef } from '../batches/batch-types';
import type { ReviewSummary } from '../reviews/review-types';

export type Point = [number, number];
export type UnitSystem = 'si' | 'us';

export type MethodId =
  | 'ordinary'
  | 'bishop'
  | 'janbu'
  | 'spencer'
  | 'morgenstern-price'
  | 'swedish-circle'
  | 'log-spiral'
  | 'infinite-slope';

// ---- the stored input: the normalised section (packages/core/src/model/types.ts), SI ----

export interface MohrCoulombStrength {
  model: 'mohr-coulomb';
  cohesion: number;
  frictionAngle: number;
}

export interface UndrainedStrength {
  model: 'undrained';
  su: number;
  suRate: number;
  suDatum: number | null;
}

export interface RigidStrength {
  model: 'rigid';
}

export type Strength = MohrCoulombStrength | UndrainedStrength | RigidStrength;

export interface Material {
  name: string;
  unitWeight: number;
  saturatedUnitWeight: number;
  strength: Strength;
}

export type Water =
  | { kind: 'none'; unitWeight: number }
  | { kind: 'piezometric'; line: Point[]; unitWeight: number }
  | { kind: 'ru'; ru: number; unitWeight: number };

export type Load =
  | { type: 'strip'; from: number; to: number; pressure: number }
  | { type: 'line'; x: number; force: number; angle: number };

export interface SurfaceSpec {
  type: 'circle' | 'polyline' | 'grid' | 'ground-ranges' | 'noncircular' | 'auto';
  [setting: string]: unknown;
}

export interface Analysis {
  methods: MethodId[];
  slices: number;
  interslice?: { shape: string; end?: number; ramp?: number };
  surface: SurfaceSpec | null;
  infiniteSlope: { angle: number; depth: number; waterRatio: number } | null;
  case: string | null;
  requiredFs: number | null;
  searchEachMethod?: boolean;
}

export interface SectionInput {
  format: string;
  id: string;
  title: string;
  description?: string;
  station: number | null;
  offset: number | null;
  units: UnitSystem;
  ground: Point[];
  materials: Record<string, Material>;
  strata: { material: string; top: Point[] }[];
  water: Water;
  loads: Load[];
  seismic: { kh: number; kv: number };
  crack: { depth: number | 'auto'; waterDepth: number } | null;
  analysis: Analysis;
}

// ---- the result (packages/core/src/analyze.ts), in the section's units ----

export interface Warning {
  code: string;
  message: string;
}

export interface SliceReport {
  x: number;
  width: number;
  /** Degrees, positive where the base rises to the right. */
  alpha: number;
  baseLength: number;
  weight: number;
  porePressure: number;
  /** Effective base normal force N′ and mobilised shear S. */
  normal: number;
  shear: number;
  /** On the slice's right side; thrust: height of the line of thrust there (null where undefined). */
  interslice: { E: number; X: number; thrust: number | null };
  material: string;
}

export type ReportedSurface =
  | { type: 'circle'; center: Point; radius: number }
  | { type: 'polyline'; points: Point[] }
  | { type: 'plane'; angle: number; depth: number }
  | { type: 'log-spiral'; pole: Point; r0: number; r1: number; points: Point[] };

export interface MethodReport {
  method: MethodId;
  fs: number | null;
  converged: boolean;
  iterations: number;
  reason?: string;
  surface: ReportedSurface | null;
  base?: Point[];
  ends?: { upper: Point; lower: Point };
  crack?: { x: number; depth: number; waterDepth: number; waterForce: number } | null;
  slices: SliceReport[];
  warnings: Warning[];
  fsUncorrected?: number;
  correction?: number;
  lambda?: number;
  theta?: number;
  intersliceFunction?: string;
  massWeight?: number;
  leverArm?: number;
}

export interface SearchReport {
  type: 'grid' | 'ground-ranges' | 'noncircular' | 'auto';
  method: MethodId;
  noncircularMethod?: MethodId;
  trials: number;
  moves: { reason: string; grid: unknown }[];
  grid: unknown;
  map: { xs: number[]; ys: number[]; fs: (number | null)[][] } | null;
  lowest: { surface: ReportedSurface; fs: number }[];
}

/** pass / fail against the required FS; none: no FS required; failed: nothing solved. */
export type ResultStatus = 'pass' | 'fail' | 'none' | 'failed';

/** One run's result as the API stores it (resultView). */
export interface RunResult {
  run: number;
  status: ResultStatus;
  governing: { method: MethodId; fs: number } | null;
  requiredFs: number | null;
  passes: boolean | null;
  reason: string | null;
  criticalSurface: ReportedSurface | null;
  methods: MethodReport[];
  warnings: Warning[];
  solverVersion: string;
  inputHash: string;
  timings: { startedAt: string | null; finishedAt: string | null; durationMs: number | null };
  attempt: number;
  /** Only on the current run's result. */
  search?: SearchReport | null;
  caution: string;
}

export type SectionStatus = 'queued' | 'running' | 'done' | 'failed';

/**
 * A warning of the input checks (validate.ts `messageView`), located in the submitted file
 * (edited-section.json after a re-run with edits); `text` is it as one line.
 */
export interface InputWarning {
  severity: 'warning';
  file: string;
  line: number;
  column: number;
  /** Where in the file's data, e.g. sections[3].materials.clay.unitWeight; empty for the file. */
  path: string;
  code: string;
  message: string;
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
