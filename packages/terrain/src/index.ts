export { Alignment, readAlignment, type AlignmentPoint, type Projection } from './alignment';
export {
  cutCorridor,
  sampleOffsets,
  stationList,
  MAX_SECTIONS,
  type BatchHeader,
  type CutInput,
  type CutSettings,
  type Stations,
  type StratumTop,
  type TerrainCorridor,
  type WaterLevel,
} from './cut';
export { messageLine, TerrainError, type TerrainMessage } from './errors';
export {
  corridorText,
  isTerrainJob,
  jobFiles,
  readTerrainJob,
  runTerrainJob,
  TERRAIN_FORMAT,
  type ReadFile,
  type RunOptions,
  type TerrainJob,
} from './job';
export {
  DEFAULT_RASTER_LIMITS,
  readRaster,
  sample,
  type NoValue,
  type Raster,
  type RasterLimits,
} from './raster';
