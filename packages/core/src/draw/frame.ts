import { scaleLinear } from './scale-linear';
import type { Frame } from './types';

/** Data bounds of a drawing. */
export interface Bounds {
  xMin: number;
  xMax: number;
  yMin: number;
  yMax: number;
}

/**
 * A frame at true scale (one metre across is one metre up, as a cross-section must be
 * drawn): the bounds fill `maxWidth` pixels unless they would be taller than `maxHeight`,
 * then they fill the height and the frame is narrower (centred in the width).
 *
 * @example equalScaleFrame({ xMin: 0, xMax: 50, yMin: 20, yMax: 40 }, 60, 40, 800, 600).height // → 320
 */
export function equalScaleFrame(
  b: Bounds,
  left: number,
  top: number,
  maxWidth: number,
  maxHeight: number,
): Frame {
  const dx = Math.max(b.xMax - b.xMin, 1e-9);
  const dy = Math.max(b.yMax - b.yMin, 1e-9);
  const k = Math.min(maxWidth / dx, maxHeight / dy);
  const width = dx * k;
  const height = dy * k;
  const l = left + (maxWidth - width) / 2;
  return {
    left: l,
    top,
    width,
    height,
    x: scaleLinear([b.xMin, b.xMax], [l, l + width]),
    y: scaleLinear([b.yMin, b.yMax], [top + height, top]),
  };
}
