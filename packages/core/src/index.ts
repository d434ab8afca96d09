/** @scarpline/core — the pure solver: section model, geometry, slicing, methods. */
export * from './model/types';

// --- input: parsing, validation, units, normalisation ---

// --- geometry and slicing ---
export { yAt } from './geometry/y-at';
export { polygonArea } from './geometry/polygon-area';
export { circlePolygonMoments, type AreaMoments } from './geometry/circle-polygon-moments';
export { polylineCrossings } from './geometry/polyline-crossings';
export { prepareSection, type PreparedSection, type Geometry } from './slices/prepare-section';
export { type BasePiece } from './slices/base-curve';
export {
  sliceSurface,
  type SliceSet,
  type SliceOutcome,
  type SlicedSurface,
  type RejectedSurface,
  type CrackInfo,
} from './slices/slice-surface';
