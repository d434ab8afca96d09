/** @scarpline/core — the pure solver: section model, geometry, slicing, methods. */
export * from './model/types';

// --- input: parsing, validation, units, normalisation ---
export { parseSections, type ParsedSections } from './input/parse-sections';
export { formatMessage } from './input/format-message';
export { sectionDocument, readSectionDocument } from './input/section-document';
export type { Message, BatchHeader, SectionEntry } from './input/types';
export { INPUT_LIMITS, MAX_SECTIONS } from './input/limits';
export { screenText, type Refusal, type Screened } from './input/screen-text';
export { screenData, badCharacter, countValues } from './input/screen-data';
export { capMessages } from './input/cap-messages';
export { SECTION_FORMAT, BATCH_FORMAT, corridorSectionId } from './formats';
export {
  US_TO_SI,
  UNIT_LABELS,
  QUANTITY_KINDS,
  FOOT_IN_M,
  POUND_IN_KG,
  STANDARD_GRAVITY,
  POUND_FORCE_IN_N,
  toSi,
  fromSi,
  rawSectionToSi,
  type QuantityKind,
} from './model/units';
export type * from './model/raw-section';
export { normaliseSection } from './model/normalise-section';
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

// --- methods and the front door ---
export { ordinary } from './methods/ordinary';
export { bishop, bishopIteration } from './methods/bishop';
export { janbu, janbuCorrection } from './methods/janbu';
export { spencer } from './methods/spencer';
export { morgensternPrice, intersliceFunction } from './methods/morgenstern-price';
export { swedishCircle, type SwedishCircleResult } from './methods/swedish-circle';
export { logSpiral, type LogSpiralResult, type SpiralGeometry } from './methods/log-spiral';
export {
  infiniteSlope,
  type InfiniteSlopeInput,
  type InfiniteSlopeResult,
} from './methods/infinite-slope';
export { statics, type Statics } from './methods/statics';
export { defaultPivot } from './methods/pivot';
export type { SliceMethodResult, MethodWarning } from './methods/types';
export { analyzeSection, CAUTION, SOLVER_VERSION } from './analyze';
export { resultInUnits } from './result-units';
export { AnalysisStopped, WORK_LIMIT, WorkMeter, type AnalyzeOptions } from './work-limit';
export { howFoundWords } from './search-words';
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
} from './result';

// --- drawing and corridor input
export { drawSection, type DrawableResult, type DrawSectionOptions } from './draw/draw-section';
export { drawChainage, type ChainagePoint, type DrawChainageOptions } from './draw/draw-chainage';
export { chainageLabel } from './draw/chainage-label';
export {
  parseGeoJsonCorridor,
  isGeoJsonCorridor,
  type ParsedCorridor,
  type CorridorEntry,
  type CorridorFeature,
  type HeaderFile,
} from './input/geojson-corridor';

// --- the one vocabulary of results and the export table
export {
  VERDICTS,
  VERDICT_WORDS,
  VERDICT_SHORT,
  JOB_STATES,
  JOB_STATE_WORDS,
  FS_DECIMALS,
  verdictOf,
  fsText,
  fsRounded,
  type Verdict,
  type JobState,
} from './verdict';
export {
  EXPORT_COLUMNS,
  exportRecord,
  unanalysedRecord,
  distinctWarnings,
  unsolvedReason,
  csvRecord,
  exportCsvHeader,
  exportCsvRow,
  exportFeature,
  exportCollection,
  type ExportColumn,
  type ExportRecord,
  type ExportValue,
  type ExportableResult,
  type ExportFeature,
} from './export/export-table';
