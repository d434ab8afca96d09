/**
 * @scarpline/core — the pure solver: section model, geometry, slicing, methods; and, through
 * the entry modules each importable alone (package.json `exports`: model, input, units,
 * formats, caution, verdict, result, draw, export), everything else the callers use.
 */
// --- the parts each importable alone (package.json `exports`): model, input, units, formats
export * from './model';
export { caseKindOf, caseSection, designCases, sectionOfCase } from './model/design-cases';
export * from './input';
export * from './formats';
export * from './units';
export { lowerEnvelope } from './geometry/lower-envelope';

// --- geometry and slicing ---
export { yAt } from './geometry/y-at';
export { polygonArea } from './geometry/polygon-area';
export { circlePolygonMoments, type AreaMoments } from './geometry/circle-polygon-moments';
export { polylineCrossings } from './geometry/polyline-crossings';
export { prepareSection, type PreparedSection, type Geometry } from './slices/prepare-section';
export { type BasePiece } from './slices/base-curve';
export {
  sliceWorkspace,
  cutCircle,
  cutSurface,
  type SliceWorkspace,
  type RejectCode,
} from './slices/cut-surface';
export {
  sliceSurface,
  type SliceSet,
  type SliceOutcome,
  type SlicedSurface,
  type RejectedSurface,
  type CrackInfo,
} from './slices/slice-surface';

// --- search ---
export {
  searchSection,
  cohesionlessSlope,
  type SearchOutcome,
  type CohesionlessSlope,
} from './search/search-section';
export { bishopCircleEvaluator } from './search/circle-evaluator';
export { bishopSearchEvaluation, type SearchEvaluation } from './search/search-evaluation';
export { searchWarnings } from './search/search-warnings';
export { boundaries, touchRadius, type Boundary } from './search/boundaries';
export {
  searchSettings,
  slopeZone,
  type SearchSettings,
  type GridSettings,
  type GroundRangeSettings,
} from './search/search-settings';
export { gridSearch, type GridOutcome } from './search/grid-search';
export { groundRangesSearch } from './search/ground-ranges-search';
export { noncircularSearch } from './search/noncircular-search';
export { refineCircle, refineTouching, type Polish } from './search/refine-circle';
export { Trials, type CircleTrial, type CircleEvaluator, type TrialStage } from './search/trials';
export { nelderMead } from './numeric/nelder-mead';
export { seededRandom } from './numeric/seeded-random';

// --- earthquake: the yield coefficient and the sliding-block displacement ---
export {
  yieldCoefficient,
  type FsAtKh,
  type PseudoStaticAnalysis,
  type YieldCoefficient,
  type YieldOptions,
  type YieldOutcome,
} from './seismic/yield-coefficient';
export { slidingBlockEstimate, type DisplacementRelation } from './seismic/sliding-block';
export { jibson2007 } from './seismic/jibson-2007';
export { jibson2007Magnitude } from './seismic/jibson-2007-magnitude';
export { ambraseysMenu1988 } from './seismic/ambraseys-menu-1988';
export { DISPLACEMENT_RELATIONS } from './seismic/relations';
export {
  seismicReport,
  type SeismicOutcome,
  type SeismicReportOptions,
} from './seismic/seismic-report';

// --- methods and the front door ---
export { ordinary } from './methods/ordinary';
export { bishop, bishopIteration } from './methods/bishop';
export { janbu, janbuCorrection } from './methods/janbu';
export { spencer } from './methods/spencer';
export { morgensternPrice, intersliceFunction } from './methods/morgenstern-price';
export { phiZeroCircle, type PhiZeroCircleResult } from './methods/phi-zero-circle';
export { logSpiral, type LogSpiralResult, type SpiralGeometry } from './methods/log-spiral';
export {
  infiniteSlope,
  type InfiniteSlopeInput,
  type InfiniteSlopeResult,
} from './methods/infinite-slope';
export { statics, type Statics } from './methods/statics';
export { defaultPivot } from './methods/pivot';
export type { SliceMethodResult, MethodWarning } from './methods/types';
export { analyzeSection, SOLVER_VERSION } from './analyze';
export { howFoundWords } from './search-words';
export * from './case-words';
export { METHOD_WORDS, type MethodWords } from './method-words';
export { limitWords } from './reinforcement/limit-words';
export * from './caution';
// --- rapid drawdown (Duncan, Wright & Wong 1990)
export { analyzeDrawdown, type DrawdownAnalysis } from './drawdown/analyze-drawdown';
export { drawdownSections, type DrawdownSections } from './drawdown/drawdown-sections';
export { resolveDrainage, type Drainage, type MaterialDrainage } from './drawdown/drainage';
export {
  undrainedStrength,
  consolidationRatio,
  failureRatio,
  drawdownEnvelopes,
  type DrawdownEnvelopes,
} from './drawdown/undrained-strength';
export { threeStages, type ThreeStages } from './drawdown/three-stages';
export { drawdownCircleEvaluator } from './drawdown/drawdown-evaluator';
export { drawdownSearchEvaluation } from './drawdown/drawdown-evaluation';
export { withBaseStrengths, baseStrengths, type BaseStrengths } from './slices/base-strengths';
// --- strengths that vary with the stress on each slice base
export {
  solveWithStresses,
  solveSlices,
  strengthRules,
  touchesRules,
  STRESS_ITERATIONS,
  type StrengthRules,
  type StressSolution,
} from './slices/stress-dependent';
export { hoekBrownConstants, hoekBrownEnvelope, hoekBrownPoint } from './strength/hoek-brown';
export { undrainedRatioSu } from './strength/undrained-ratio';
export { shearNormalEnvelope } from './strength/shear-normal';
export { bilinearEnvelope } from './strength/bilinear';
export { strengthEnvelope, strengthQuantities, verticalStressStrength } from './strength/registry';
export type { NormalStressEnvelope } from './strength/types';
export { AnalysisStopped, WORK_LIMIT, WorkMeter, type AnalyzeOptions } from './work-limit';
export { METHODS, methodsFor, type MethodEntry } from './methods/registry';
export type {
  SectionResult,
  MethodReport,
  SliceReport,
  ReportedSurface,
  Warning,
  GridReport,
  GridReport as SearchGrid,
  SearchReport,
  HowFound,
  CircleOrigin,
  CaseKind,
  CaseResult,
  StationResult,
  StationProbability,
  SeismicReport,
  DisplacementEstimate,
  DrawdownReport,
  DrawdownStage,
} from './result';
export { CASE_KINDS } from './result';
export { caseOf, caseView } from './case-view';
export { stationResult, stationVerdict, MIN_RELIEF, FS_CAP } from './station-result';

// --- drawing, the one vocabulary of results and the export table
export * from './draw';
export * from './verdict';
export * from './export';

// --- probability of failure, sensitivity, solving for a value (issue 19)
export * from './probability';
// --- map coordinates: a corridor's projected system (proj4), its lines in WGS 84
export {
  parseCrs,
  lineInCrs,
  crsDefinition,
  BUILT_IN_CRS,
  type Crs,
  type CrsProblem,
} from './geo/crs';
export {
  wgs84Line,
  isProjectedLine,
  type ProjectedLine,
  type Wgs84Geometry,
} from './geo/wgs84-geometry';
export {
  stationProbability,
  stationProbabilityOrWarning,
  probabilitySummary,
  runsStationProbability,
} from './station-probability';
