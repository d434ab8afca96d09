/**
 * `@scarpline/core/draw`: SVG drawings of a section and of the FS along the chainage, and the
 * pieces a chart of one's own draws with (linear scales, round ticks, chainage labels). A
 * drawing takes a result; nothing here runs the solver. Browser-safe.
 */
export { drawSection, type DrawableResult, type DrawSectionOptions } from './draw/draw-section';
export {
  drawChainage,
  CHAINAGE_MARK_WORDS,
  type ChainagePoint,
  type DrawChainageOptions,
} from './draw/draw-chainage';
export {
  chainageAxis,
  chainageLayout,
  chainageMarker,
  clippedMarker,
  CHAINAGE_STYLE,
  type ChainageAxis,
  type ChainageLayout,
  type ChainageMark,
  type PlacedStation,
} from './draw/chainage-layout';
export { chainageLabel } from './draw/chainage-label';
export { scaleLinear, type LinearScale } from './draw/scale-linear';
export { niceStep, niceTicks } from './draw/nice-ticks';
// --- probability and sensitivity (issue 19): each takes a result
export { drawProbability, type DrawProbabilityOptions } from './draw/draw-probability';
export { drawSensitivity, drawTornado, type DrawSensitivityOptions } from './draw/draw-sensitivity';
